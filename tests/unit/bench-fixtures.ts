// Small builders for bench-sheet tests.
import { checkBenchSheet, type BenchSheet, type Category, type Conditions, type Reading, type Sweep, type Verdict } from "@shared/bench";
import { RIAA_IEC_TABLE, RIAA_PLAYBACK_TABLE, sweepFromTable } from "../support/published-tables";

type Extra = Partial<Omit<Reading, "quantity" | "value" | "unit" | "conditions">>;

export function measured(
  quantity: Reading["quantity"],
  value: number,
  unit: string,
  conditions: Conditions = {},
  extra: Extra = {},
): Reading {
  return { quantity, value, unit, basis: "measured", origin: "typed", conditions, ...extra };
}

export function rated(quantity: Reading["quantity"], value: number, unit: string, conditions: Conditions = {}, extra: Extra = {}): Reading {
  return { quantity, value, unit, basis: "rated", origin: "typed", conditions, ...extra };
}

export function sheet(category: Category, readings: Reading[], more: Partial<BenchSheet> = {}): BenchSheet {
  return { category, readings, sweeps: [], ...more };
}

export function resultsFor(v: Verdict, ruleId: string) {
  return v.results.filter((r) => r.ruleId === ruleId);
}

/** Outcomes of one rule on a sheet, in order. */
export function outcomes(s: BenchSheet, ruleId: string) {
  return resultsFor(checkBenchSheet(s), ruleId).map((r) => r.outcome);
}

export const full8 = {
  loadOhm: 8,
  frequencyHz: 1000,
  atDistortion: { ratio: 0.001, measure: "thd" as const },
  channelsDriven: "both" as const,
};
export const full4 = { ...full8, loadOhm: 4 };

/**
 * A phono stage's response sweep typed from the published RIAA playback table (IEC 60098, rounded to
 * 0.01 dB as printed; with the IEC 7950 µs pole when `iec`), shifted by the stage's gain and bent by
 * `tiltDb`: never built with the curve the rule judges it by.
 */
export function riaaSweep(o: { offsetDb?: number; tiltDb?: (f: number) => number; iec?: boolean }): Sweep {
  const points = sweepFromTable(o.iec ? RIAA_IEC_TABLE : RIAA_PLAYBACK_TABLE, o);
  return { kind: "riaa", origin: "typed", conditions: {}, points };
}
