// Setting units' measured figures side by side: which is the stronger, or why none is called so.
// Which way each figure is better, and which conditions must match, live with the figures
// (FIGURE_COMPARISON in figures.ts); this file only applies them.
import { AMPLIFIER_CATEGORIES, type Category } from "./quantities";
import type { Conditions } from "./schema";
import { FIGURE_COMPARISON, type FigureKey, type KeyFigure } from "./figures";

/** What a row of figures says about the units in it. `strongest`: indexes into the row. */
export type RowJudgement =
  | { kind: "stronger"; strongest: number[] }
  /** Every unit measured the same. */
  | { kind: "level" }
  /** Fewer than two units have the figure. */
  | { kind: "alone" }
  /** More is not better for this figure (gain), so nothing is marked. */
  | { kind: "no_direction" }
  /** The figures stand on different conditions; `differ` names them ("distortion limit", "weighting"). */
  | { kind: "not_comparable"; differ: string[] };

export interface RowEntry {
  figure: KeyFigure;
  category: Category;
}

const CONDITION_NAMES: Record<keyof Conditions, string> = {
  loadOhm: "load",
  frequencyHz: "test frequency",
  frequencyRange: "frequency range",
  powerW: "output level",
  voltageV: "signal level",
  atDistortion: "distortion limit",
  bandwidth: "measurement bandwidth",
  weighting: "weighting",
  channelsDriven: "channels driven",
  mainsV: "mains voltage",
  warmUpS: "warm-up",
  testToneHz: "test tone",
  distanceM: "measuring distance",
  speedRpm: "platter speed",
  tapeSpeedCmS: "tape speed",
  supply: "supply",
  sourceOhm: "source impedance",
  temperatureC: "temperature",
};

/** Amplifiers of any kind are one family; the rest compare only within their own category. */
export function compareFamily(category: Category): string {
  return AMPLIFIER_CATEGORIES.includes(category) ? "amplifier" : category;
}

/** Readings are typed, so 8 Ω and 8.000001 Ω are one load; a stated condition never matches an unstated one. */
function sameValue(a: unknown, b: unknown): boolean {
  if (a === undefined || b === undefined) return a === b;
  if (typeof a === "number" && typeof b === "number") return Math.abs(a - b) <= 1e-6 * Math.max(Math.abs(a), Math.abs(b));
  if (typeof a === "object" && typeof b === "object" && a !== null && b !== null) {
    const keys = new Set([...Object.keys(a), ...Object.keys(b)]);
    return [...keys].every((k) => sameValue(Reflect.get(a, k), Reflect.get(b, k)));
  }
  return a === b;
}

const allSame = <T>(xs: T[]) => xs.every((x) => sameValue(x, xs[0]));

/** Judges one row: `entries[i]` is unit i's figure (null when its sheet has none). */
export function judgeRow(key: FigureKey, entries: readonly (RowEntry | null)[]): RowJudgement {
  const present = entries.flatMap((e, i) => (e && Number.isFinite(e.figure.value) ? [{ ...e, i }] : []));
  if (present.length < 2) return { kind: "alone" };
  const rule = FIGURE_COMPARISON[key];
  if (!rule.better) return { kind: "no_direction" };

  const differ: string[] = [];
  if (!allSame(present.map((e) => compareFamily(e.category)))) differ.push("kind of unit");
  if (rule.sameQuantity && !allSame(present.map((e) => e.figure.quantity))) differ.push("measure (THD or THD+N)");
  for (const c of rule.sameConditions) if (!allSame(present.map((e) => e.figure.basis[c]))) differ.push(CONDITION_NAMES[c]);
  if (differ.length) return { kind: "not_comparable", differ };

  const better = rule.better;
  const score = (v: number) => (better === "higher" ? v : better === "lower" ? -v : -Math.abs(v));
  const scores = present.map((e) => score(e.figure.value));
  const top = Math.max(...scores);
  const strongest = present.filter((_, j) => sameValue(scores[j], top)).map((e) => e.i);
  return strongest.length === present.length ? { kind: "level" } : { kind: "stronger", strongest };
}
