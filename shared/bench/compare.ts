// Setting units' measured figures side by side: which is the stronger, or why none is called so.
// Which way each figure is better, and which conditions must match, live with the figures
// (FIGURE_COMPARISON in figures.ts); this file only applies them.
import { AMPLIFIER_CATEGORIES, type Category } from "./quantities";
import { CONDITION_NAMES, sameConditionValue } from "./condition-match";
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

/** Amplifiers of any kind are one family; the rest compare only within their own category. */
export function compareFamily(category: Category): string {
  return AMPLIFIER_CATEGORIES.includes(category) ? "amplifier" : category;
}

// Listings' figures are typed, so 8 Ω and 8.000001 Ω are one load.
const SAME_WITHIN = 1e-6;
const allSame = <T>(xs: T[]) => xs.every((x) => sameConditionValue(x, xs[0], SAME_WITHIN));

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
  // Figures within the typing's rounding of the best tie with it.
  const strongest = present.filter((_, j) => top - scores[j] <= SAME_WITHIN * Math.abs(top)).map((e) => e.i);
  return strongest.length === present.length ? { kind: "level" } : { kind: "stronger", strongest };
}
