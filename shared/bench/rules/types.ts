import type { Category, Quantity } from "../quantities";
import type { BenchSheet, Reading, Sweep } from "../schema";
import { type Kind } from "../units";
import { formatValue, type FormatOptions } from "../format";

export const OUTCOMES = ["consistent", "questionable", "implausible", "missing"] as const;
export type Outcome = (typeof OUTCOMES)[number];

/** A number a rule compared: value in base units (see `unit`), and how it reads. */
export type Figure = { label: string; value: number; unit: string; display: string };

export type RuleResult = {
  ruleId: string;
  title: string;
  outcome: Outcome;
  /** What the rule checks and why, in plain words (the same for every sheet). */
  explanation: string;
  /** The standard, textbook relation or "common practice" the rule rests on. */
  source: string;
  /** What this sheet's figures showed. */
  detail: string;
  /** Paths of the readings or sweeps compared, e.g. "readings.3", "sweeps.0". */
  refs: string[];
  compared: Figure[];
};

export type DerivedValue = { id: string; label: string; value: number; unit: string; display: string; refs: string[] };

/**
 * A unit that measures below its maker's rating (or a standard's tolerance): reported, not held against the sheet.
 * `percent`: how far it misses, in percent of the yardstick (88 W against 100 W rated → 12).
 */
export type Shortfall = { ruleId: string; detail: string; percent: number; refs: string[] };

export type SkippedRule = { ruleId: string; title: string; reason: string };

/**
 * A reading that means the unit is unsafe to connect (DC at a loudspeaker output, an oscillating output, a
 * turntable far off speed): it blocks the mark, the listing shows a warning and the desk holds it.
 */
export type Hazard = { ruleId: string; title: string; detail: string; refs: string[] };

export type Item = Reading & { ref: string };
export type SweepItem = Sweep & { ref: string };

/** The sheet indexed once per check, so every rule can look readings up cheaply. */
export type SheetIndex = {
  sheet: BenchSheet;
  category: Category;
  items: Item[];
  sweeps: SweepItem[];
  all(q: Quantity): Item[];
  measured(q: Quantity): Item[];
  rated(q: Quantity): Item[];
};

export type Emit = {
  result(r: { outcome: Outcome; detail: string; refs: string[]; compared?: Figure[] }): void;
  derive(d: { id: string; label: string; value: number; kind: Kind; refs: string[]; format?: FormatOptions; display?: string }): void;
  shortfall(s: { detail: string; percent: number; refs: string[] }): void;
  hazard(h: { detail: string; refs: string[] }): void;
};

export type Rule = {
  id: string;
  title: string;
  explanation: string;
  source: string;
  /** Categories the rule applies to; all when absent. */
  categories?: readonly Category[];
  /** Emits results; returns a reason when it has nothing to check on this sheet. */
  evaluate(ix: SheetIndex, out: Emit): string | void;
};

const BASE_UNIT: Record<Kind, string> = {
  power: "W",
  voltage: "V",
  ratio: "ratio",
  decibel: "dB",
  frequency: "Hz",
  time: "s",
  resistance: "Ω",
  slewRate: "V/s",
  number: "",
};

export function baseUnit(kind: Kind): string {
  return BASE_UNIT[kind];
}

/** A compared number with its unit and display text. */
export function fig(label: string, value: number, kind: Kind, opts?: FormatOptions & { display?: string }): Figure {
  return { label, value, unit: BASE_UNIT[kind], display: opts?.display ?? formatValue(value, kind, opts) };
}
