// The buyer's own re-measurement set beside the listing's bench sheet: the same quantity under the same
// conditions, within a stated tolerance per quantity (remeasure-tolerances.ts). Isomorphic and zod-free:
// the browser shows it while the buyer types, the server stores it with a contest or an acceptance.
import { QUANTITY_INFO, type Quantity } from "./quantities";
import type { BenchSheet, Conditions, Reading } from "./schema";
import { describeConditions, formatReadingValue, channelLabel } from "./describe";
import { formatNumber, formatValue } from "./format";
import { bestRiaaFit } from "./rules/phono";
import { CONDITION_NAMES, sameConditionValue } from "./condition-match";
import { REMEASURE_RULES, type RemeasureRule } from "./remeasure-tolerances";

export { REMEASURE_RULES, type RemeasureRule, type Tolerance } from "./remeasure-tolerances";

/** Bump when tolerances or pairing change; stored with each comparison. */
export const REMEASURE_VERSION = 1;

/** One figure the buyer measured, in the bench sheet's own shape: value in base units, unit as typed. */
export interface BuyerReading {
  quantity: Quantity;
  value: number;
  unit: string;
  /** The value exactly as typed, e.g. "47 W". */
  text?: string;
  channel?: Reading["channel"];
  conditions: Conditions;
  /** The sheet figure this re-measures ("readings.3", "sweeps.0"), when the buyer picked it from the listing. */
  ref?: string;
  origin?: "typed" | "capture";
  captureId?: string;
  note?: string;
}

export interface BuyerReadings {
  readings: BuyerReading[];
  /** ISO date the buyer measured on. */
  measuredOn?: string;
  /** What the buyer measured with, in their words. */
  equipment?: string;
}

export const REMEASURE_ROW_OUTCOMES = ["within", "outside", "not_comparable"] as const;
export type RemeasureRowOutcome = (typeof REMEASURE_ROW_OUTCOMES)[number];
export const REMEASURE_OUTCOMES = ["matches", "differs", "nothing_to_compare"] as const;
export type RemeasureOutcome = (typeof REMEASURE_OUTCOMES)[number];

export const REMEASURE_ROW_LABELS: Record<RemeasureRowOutcome, string> = {
  within: "Within tolerance",
  outside: "Outside tolerance",
  not_comparable: "Not comparable",
};
export const REMEASURE_OUTCOME_LABELS: Record<RemeasureOutcome, string> = {
  matches: "The buyer's figures match the bench sheet",
  differs: "The buyer's figures differ from the bench sheet",
  nothing_to_compare: "Nothing to compare",
};

export interface RemeasureSide {
  /** Base units. */
  value: number;
  unit: string;
  /** "66 W", "0.010 %" */
  display: string;
  conditionsText: string;
  channel?: Reading["channel"];
}

export interface RemeasureRow {
  quantity: Quantity;
  label: string;
  /** The buyer's conditions. */
  conditions: Conditions;
  conditionsText: string;
  /** The sheet's figure it was set against; null when none shares the conditions. */
  listed: (RemeasureSide & { ref: string; basis: "rated" | "measured" }) | null;
  measured: RemeasureSide & { index: number };
  /** Measured against listed, in the tolerance's own terms ("−1.55 dB (−30 %)", "×2.5"). */
  difference: { value: number; display: string } | null;
  tolerance: { text: string; source: string };
  outcome: RemeasureRowOutcome;
  /** Whether the buyer's figure is the better or the worse one, where the quantity has a better side. */
  direction?: "better" | "worse" | "same";
  /** Why a pair could not be formed, or what a rated figure means for the comparison. */
  reason?: string;
}

export interface Remeasurement {
  version: number;
  outcome: RemeasureOutcome;
  rows: RemeasureRow[];
  counts: Record<RemeasureRowOutcome, number>;
}

/** A figure of the sheet that a buyer may re-measure: a reading, or the worst RIAA deviation of a sweep. */
export interface ListedFigure {
  ref: string;
  quantity: Quantity;
  value: number;
  unit: string;
  display: string;
  channel?: Reading["channel"];
  basis: "rated" | "measured";
  conditions: Conditions;
}

/** Every figure of the sheet a buyer could re-measure, with its path; sweeps give their worst RIAA deviation. */
export function listedFigures(sheet: BenchSheet | null | undefined): ListedFigure[] {
  if (!sheet) return [];
  const out: ListedFigure[] = sheet.readings.map((r, i) => ({
    ref: `readings.${i}`,
    quantity: r.quantity,
    value: r.value,
    unit: r.unit,
    display: formatReadingValue(r),
    ...(r.channel ? { channel: r.channel } : {}),
    basis: r.basis,
    conditions: r.conditions,
  }));
  sheet.sweeps.forEach((s, i) => {
    if (s.kind !== "riaa") return;
    const fit = bestRiaaFit(s);
    if (!fit) return;
    const worst = Math.abs(fit.worstDb);
    out.push({
      ref: `sweeps.${i}`,
      quantity: "riaa_deviation",
      value: worst,
      unit: "dB",
      display: `±${formatValue(worst, "decibel", { sig: 2 })}`,
      ...(s.channel ? { channel: s.channel } : {}),
      basis: "measured",
      conditions: { ...s.conditions, frequencyRange: { lowHz: fit.lowHz, highHz: fit.highHz } },
    });
  });
  return out;
}

// A buyer's meter and the seller's differ a little: 8 Ω and 8.05 Ω are one load.
const SAME_WITHIN = 0.01;

/** The conditions (by name) that keep two readings of `quantity` apart; empty when they may be compared. Symmetric. */
export function differingConditions(quantity: Quantity, a: Conditions, b: Conditions): string[] {
  return REMEASURE_RULES[quantity].conditions.filter((k) => !sameConditionValue(a[k], b[k], SAME_WITHIN)).map((k) => CONDITION_NAMES[k]);
}

/** Channels pair when equal, or when either side is unstated or covers both. Symmetric. */
export function channelsPair(a: Reading["channel"], b: Reading["channel"]): boolean {
  return a === b || a === undefined || b === undefined || a === "both" || b === "both";
}

const EPS = 1e-9;

type Judged = { difference: RemeasureRow["difference"]; within: boolean; direction?: RemeasureRow["direction"] };

function signed(x: number, digits: number): string {
  const s = Math.abs(x).toFixed(digits);
  return x > 0 && Number(s) !== 0 ? `+${s}` : x < 0 && Number(s) !== 0 ? `−${s}` : s;
}

/** Measured against listed under the quantity's tolerance; `oneSided`: a rated limit, where only the worse side counts. */
function judge(q: Quantity, rule: RemeasureRule, listed: number, measured: number, oneSided: boolean): Judged | string {
  const t = rule.tolerance;
  const kind = QUANTITY_INFO[q].kind;
  const direction = directionOf(rule, listed, measured);
  let within: boolean;
  let difference: Judged["difference"];
  switch (t.kind) {
    case "none":
      return `${QUANTITY_INFO[q].label} is a rating, not a figure a buyer re-measures.`;
    case "db":
    case "factor": {
      if (!(listed > 0 && measured > 0)) return "A zero or negative figure cannot be compared as a ratio.";
      const ratio = measured / listed;
      if (t.kind === "db") {
        const db = t.scale * Math.log10(ratio);
        within = Math.abs(db) <= t.db + EPS;
        difference = { value: db, display: `${signed(db, 2)} dB (${signed((ratio - 1) * 100, 0)} %)` };
      } else {
        within = Math.max(ratio, 1 / ratio) <= t.factor * (1 + EPS);
        difference = { value: ratio, display: `×${formatNumber(ratio, 2)}` };
      }
      break;
    }
    case "points": {
      const d = measured - listed;
      within = Math.abs(d) <= t.amount * (1 + EPS) + EPS * Math.max(Math.abs(listed), Math.abs(measured));
      const display =
        kind === "ratio"
          ? `${signed(d * 100, 2)} percentage points`
          : kind === "decibel"
            ? `${signed(d, 1)} dB`
            : formatValue(d, kind, { signed: true });
      difference = { value: d, display };
      break;
    }
    case "relative": {
      if (listed === 0) return "A listed figure of zero cannot be compared as a percentage.";
      const f = (measured - listed) / Math.abs(listed);
      within = Math.abs(f) <= t.fraction + EPS;
      difference = { value: f, display: `${signed(f * 100, 0)} %` };
      break;
    }
  }
  if (oneSided && !within && direction === "better") within = true;
  return { difference, within, ...(direction ? { direction } : {}) };
}

function directionOf(rule: RemeasureRule, listed: number, measured: number): RemeasureRow["direction"] {
  if (!rule.better) return undefined;
  const score = (v: number) => (rule.better === "higher" ? v : rule.better === "lower" ? -v : -Math.abs(v));
  const d = score(measured) - score(listed);
  if (Math.abs(d) <= EPS * Math.max(Math.abs(listed), Math.abs(measured), 1)) return "same";
  return d > 0 ? "better" : "worse";
}

/** Among figures that pair, a measured one before a rating, the same channel before "both", then the listing's least favourable. */
function pickListed(rule: RemeasureRule, b: BuyerReading, xs: ListedFigure[]): ListedFigure {
  const rank = (x: ListedFigure) => (x.basis === "measured" ? 0 : 2) + (x.channel === b.channel ? 0 : 1);
  const score = (v: number) =>
    rule.better === "higher" ? v : rule.better === "lower" ? -v : rule.better === "nearer_zero" ? -Math.abs(v) : 0;
  return [...xs].sort((x, y) => rank(x) - rank(y) || score(x.value) - score(y.value) || x.ref.localeCompare(y.ref))[0];
}

function side(value: number, unit: string, display: string, conditions: Conditions, channel?: Reading["channel"]): RemeasureSide {
  return { value, unit, display, conditionsText: describeConditions(conditions), ...(channel ? { channel } : {}) };
}

function notPaired(b: BuyerReading, candidates: ListedFigure[], label: string): string {
  if (!candidates.length) return `The bench sheet has no ${lowerFirst(label)}${b.ref ? " at the figure you picked" : ""}.`;
  const channelled = candidates.filter((c) => channelsPair(c.channel, b.channel));
  if (!channelled.length) {
    const has = [...new Set(candidates.map((c) => channelLabel(c.channel)).filter(Boolean))].join(" and ");
    return `The bench sheet has ${lowerFirst(label)} for the ${has} channel only; yours is for the ${channelLabel(b.channel)}.`;
  }
  const nearest = channelled
    .map((c) => ({ c, differ: differingConditions(b.quantity, c.conditions, b.conditions) }))
    .sort((x, y) => x.differ.length - y.differ.length)[0];
  const theirs = describeConditions(nearest.c.conditions) || "no conditions";
  const yours = describeConditions(b.conditions) || "no conditions";
  const names = nearest.differ.length > 1 ? `${nearest.differ.slice(0, -1).join(", ")} and ${nearest.differ.at(-1)}` : nearest.differ[0];
  return `The ${names} ${nearest.differ.length > 1 ? "differ" : "differs"}: the sheet's figure is ${theirs}; yours is ${yours}.`;
}

function lowerFirst(label: string): string {
  return /^[A-Z][a-z]/.test(label) ? label[0].toLowerCase() + label.slice(1) : label;
}

function rowFor(b: BuyerReading, index: number, figures: ListedFigure[]): RemeasureRow {
  const rule = REMEASURE_RULES[b.quantity];
  const info = QUANTITY_INFO[b.quantity];
  const measured = {
    ...side(b.value, b.unit, formatReadingValue({ quantity: b.quantity, value: b.value, unit: b.unit }), b.conditions, b.channel),
    index,
  };
  const base = {
    quantity: b.quantity,
    label: info.label + (b.channel && b.channel !== "both" ? `, ${channelLabel(b.channel)}` : ""),
    conditions: b.conditions,
    conditionsText: describeConditions(b.conditions),
    measured,
    tolerance: { text: rule.toleranceText, source: rule.source },
  };
  const none = (reason: string, listed: RemeasureRow["listed"] = null): RemeasureRow => ({
    ...base,
    listed,
    difference: null,
    outcome: "not_comparable",
    reason,
  });
  if (rule.tolerance.kind === "none") return none(`${info.label} is a rating, not a figure a buyer re-measures.`);

  const candidates = figures.filter((f) => f.quantity === b.quantity && (!b.ref || f.ref === b.ref));
  const pairs = candidates.filter(
    (c) => channelsPair(c.channel, b.channel) && !differingConditions(b.quantity, c.conditions, b.conditions).length,
  );
  if (!pairs.length) return none(notPaired(b, candidates, info.label));

  const l = pickListed(rule, b, pairs);
  const listed = { ...side(l.value, l.unit, l.display, l.conditions, l.channel), ref: l.ref, basis: l.basis };
  const oneSided = l.basis === "rated" && rule.better !== null;
  const j = judge(b.quantity, rule, l.value, b.value, oneSided);
  if (typeof j === "string") return none(j, listed);
  const reason = oneSided
    ? `The sheet gives only the maker's rating here; a rating is a limit, so only a worse figure counts against it.`
    : undefined;
  return {
    ...base,
    listed,
    difference: j.difference,
    outcome: j.within ? "within" : "outside",
    ...(j.direction ? { direction: j.direction } : {}),
    ...(reason ? { reason } : {}),
  };
}

/** Sets each of the buyer's readings against the sheet figure that shares its quantity and conditions. */
export function compareRemeasurement(sheet: BenchSheet | null | undefined, buyer: BuyerReadings): Remeasurement {
  const figures = listedFigures(sheet);
  const rows = buyer.readings.map((b, i) =>
    sheet
      ? rowFor(b, i, figures)
      : {
          ...rowFor(b, i, []),
          reason: "The listing has no bench sheet to compare with.",
        },
  );
  const counts: Record<RemeasureRowOutcome, number> = { within: 0, outside: 0, not_comparable: 0 };
  for (const r of rows) counts[r.outcome]++;
  const outcome: RemeasureOutcome = counts.outside ? "differs" : counts.within ? "matches" : "nothing_to_compare";
  return { version: REMEASURE_VERSION, outcome, rows, counts };
}

/** The sheet's measured figures a buyer can re-measure, one per line of the entry form (ratings left out; a RIAA sweep gives its worst deviation). */
export function remeasurableFigures(sheet: BenchSheet | null | undefined): ListedFigure[] {
  return listedFigures(sheet).filter((f) => f.basis === "measured" && REMEASURE_RULES[f.quantity].tolerance.kind !== "none");
}
