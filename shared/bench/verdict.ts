// Runs every rule over a sheet and decides bench-verified.
import { QUANTITY_INFO, type Category, type Quantity } from "./quantities";
import { categoryNoun } from "./words";
import type { BenchSheet, Reading } from "./schema";
import { formatReadingValue } from "./describe";
import { RULES } from "./rules";
import { deriveFlatSweeps } from "./rules/phono";
import {
  OUTCOMES,
  baseUnit,
  type DerivedValue,
  type Emit,
  type Hazard,
  type Item,
  type Outcome,
  type Rule,
  type RuleResult,
  type SheetIndex,
  type Shortfall,
  type SkippedRule,
  type SweepItem,
} from "./rules/types";
import { formatValue } from "./format";

/** Bumped whenever a rule, threshold or requirement changes, so stored verdicts can be re-run. */
export const BENCH_RULES_VERSION = 2;

export type CaptureFigure = { ref: string; quantity: Quantity | "sweep"; label: string; display: string; captureId?: string };

export type Verdict = {
  category: Category;
  benchVerified: boolean;
  summary: string;
  counts: Record<Outcome, number>;
  results: RuleResult[];
  /** Rules for this category that found nothing to check, and why. */
  skipped: SkippedRule[];
  derived: DerivedValue[];
  /** Where the unit measures below its maker's rating or a standard's tolerance: reported, not held against it. */
  shortfalls: Shortfall[];
  /** Figures that came from captures (raw files analysed by the bench) rather than typed. */
  fromCaptures: CaptureFigure[];
  /** Readings that make the unit unsafe to connect: no mark, a warning on the listing, held for the desk. */
  hazards: Hazard[];
  rulesVersion: number;
};

const EMPTY: Item[] = [];

class Index implements SheetIndex {
  readonly category: Category;
  readonly items: Item[];
  readonly sweeps: SweepItem[];
  private readonly byAll = new Map<Quantity, Item[]>();
  private readonly byMeasured = new Map<Quantity, Item[]>();
  private readonly byRated = new Map<Quantity, Item[]>();

  constructor(readonly sheet: BenchSheet) {
    this.category = sheet.category;
    this.items = sheet.readings.map((r, i) => ({ ...r, conditions: r.conditions ?? {}, ref: `readings.${i}` }));
    this.sweeps = (sheet.sweeps ?? []).map((s, i) => ({ ...s, ref: `sweeps.${i}` }));
    for (const it of this.items) {
      push(this.byAll, it.quantity, it);
      push(it.basis === "measured" ? this.byMeasured : this.byRated, it.quantity, it);
    }
  }
  all(q: Quantity): Item[] {
    return this.byAll.get(q) ?? EMPTY;
  }
  measured(q: Quantity): Item[] {
    return this.byMeasured.get(q) ?? EMPTY;
  }
  rated(q: Quantity): Item[] {
    return this.byRated.get(q) ?? EMPTY;
  }
}

export function indexSheet(sheet: BenchSheet): SheetIndex {
  return new Index(sheet);
}

/** Collects what the rules emit; `rule` is the one running. */
class Collector implements Emit {
  rule: Rule | undefined;
  readonly results: RuleResult[] = [];
  readonly derived: DerivedValue[] = [];
  readonly shortfalls: Shortfall[] = [];
  readonly hazards: Hazard[] = [];
  result(r: Parameters<Emit["result"]>[0]): void {
    const rule = this.rule!;
    this.results.push({
      ruleId: rule.id,
      title: rule.title,
      outcome: r.outcome,
      explanation: rule.explanation,
      source: rule.source,
      detail: sentence(r.detail),
      refs: r.refs,
      compared: r.compared ?? [],
    });
  }
  derive(d: Parameters<Emit["derive"]>[0]): void {
    this.derived.push({
      id: d.id,
      label: d.label,
      value: d.value,
      unit: baseUnit(d.kind),
      display: d.display ?? formatValue(d.value, d.kind, d.format),
      refs: d.refs,
    });
  }
  hazard(h: Parameters<Emit["hazard"]>[0]): void {
    const rule = this.rule!;
    this.hazards.push({ ruleId: rule.id, title: rule.title, detail: sentence(h.detail), refs: h.refs });
  }
  shortfall(s: Parameters<Emit["shortfall"]>[0]): void {
    this.shortfalls.push({ ruleId: this.rule?.id ?? "", detail: sentence(s.detail), percent: s.percent, refs: s.refs });
  }
}

/** Details often open with a reading's name ("left THD 0.012 % …"); a sentence starts with a capital. */
function sentence(s: string): string {
  return s && s[0] !== s[0].toUpperCase() ? s[0].toUpperCase() + s.slice(1) : s;
}

function push<K, V>(m: Map<K, V[]>, k: K, v: V) {
  const a = m.get(k);
  if (a) a.push(v);
  else m.set(k, [v]);
}

/** Check a (schema-valid) bench sheet against every rule for its category. Pure and fast (well under 1 ms). */
export function checkBenchSheet(sheet: BenchSheet): Verdict {
  const ix = new Index(sheet);
  const out = new Collector();
  const { results, derived, shortfalls, hazards } = out;
  const skipped: SkippedRule[] = [];
  for (const rule of RULES) {
    if (rule.categories && !rule.categories.includes(ix.category)) continue;
    out.rule = rule;
    const before = results.length;
    const reason = rule.evaluate(ix, out);
    if (results.length === before)
      skipped.push({ ruleId: rule.id, title: rule.title, reason: reason || "Nothing to check on this sheet." });
  }
  out.rule = undefined;
  deriveFlatSweeps(ix, out);

  const counts: Record<Outcome, number> = { consistent: 0, questionable: 0, implausible: 0, missing: 0 };
  for (const r of results) counts[r.outcome]++;
  const benchVerified =
    counts.questionable + counts.implausible + counts.missing === 0 &&
    hazards.length === 0 &&
    results.some((r) => r.ruleId === "required-readings");
  const fromCaptures = captureFigures(ix);
  return {
    category: sheet.category,
    benchVerified,
    summary: summarise(sheet.category, benchVerified, counts, results, shortfalls, fromCaptures.length, hazards),
    counts,
    results,
    skipped,
    derived,
    shortfalls,
    fromCaptures,
    hazards,
    rulesVersion: BENCH_RULES_VERSION,
  };
}

function captureFigures(ix: SheetIndex): CaptureFigure[] {
  const out: CaptureFigure[] = [];
  for (const r of ix.items)
    if (r.origin === "capture")
      out.push({
        ref: r.ref,
        quantity: r.quantity,
        label: labelOf(r),
        display: formatReadingValue(r),
        ...(r.captureId ? { captureId: r.captureId } : {}),
      });
  for (const s of ix.sweeps)
    if (s.origin === "capture")
      out.push({
        ref: s.ref,
        quantity: "sweep",
        label: s.kind === "riaa" ? "RIAA response sweep" : "Response sweep",
        display: `${s.points.length} points, ${formatValue(s.points[0].frequencyHz, "frequency")}–${formatValue(s.points[s.points.length - 1].frequencyHz, "frequency")}`,
        ...(s.captureId ? { captureId: s.captureId } : {}),
      });
  return out;
}

function labelOf(r: Reading): string {
  return QUANTITY_INFO[r.quantity].label + (r.channel && r.channel !== "both" ? `, ${r.channel}` : "");
}

const SEVERITY: Outcome[] = ["implausible", "questionable", "missing"];

function summarise(
  category: Category,
  verified: boolean,
  counts: Record<Outcome, number>,
  results: RuleResult[],
  shortfalls: Shortfall[],
  captures: number,
  hazards: Hazard[] = [],
): string {
  const fromCaptures = captures ? ` ${captures} figure${captures > 1 ? "s" : ""} came from captures.` : "";
  const short = shortfalls.length
    ? ` ${shortfalls.length} figure${shortfalls.length > 1 ? "s fall" : " falls"} short of the rating: ${shortfalls[0].detail}`
    : "";
  if (verified)
    return `Bench-verified ${categoryNoun(category)}: every required reading is measured and all ${counts.consistent} checks are consistent.${fromCaptures}${short}`;
  const tally = SEVERITY.filter((o) => counts[o])
    .map((o) => `${counts[o]} ${o}`)
    .join(", ");
  // A reading that makes the unit unsafe to connect is said first, whatever else the sheet shows.
  if (hazards.length) return `Not bench-verified: unsafe to connect. ${hazards[0].detail} ${tally ? `(${tally})` : ""}`.trim();
  const first = SEVERITY.map((o) => results.find((r) => r.outcome === o)).find(Boolean);
  return `Not bench-verified: ${tally}. ${first ? `${first.title}: ${first.detail}` : ""}${fromCaptures}${short}`.trim();
}

export { OUTCOMES };
export type { DerivedValue, Hazard, Outcome, RuleResult, Shortfall, SkippedRule };
