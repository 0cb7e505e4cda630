// Small builders for bench-sheet tests.
import { checkBenchSheet, type BenchSheet, type Category, type Conditions, type Reading, type Sweep, type Verdict } from "@shared/bench";
import { riaaPlaybackDb } from "@shared/bench/curves";

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

/** A phono stage's response sweep (1/6-octave, 20 Hz–20 kHz) following RIAA playback, with optional errors added. */
export function riaaSweep(o: { offsetDb?: number; tiltDb?: (f: number) => number; iec?: boolean }): Sweep {
  const points: Sweep["points"] = [];
  for (let i = 0; i <= 60; i++) {
    const f = Math.round(20 * 2 ** (i / 6) * 100) / 100;
    if (f > 20000) break;
    points.push({ frequencyHz: f, levelDb: (o.offsetDb ?? 0) + riaaPlaybackDb(f, { iecPole: o.iec }) + (o.tiltDb?.(f) ?? 0) });
  }
  if (!points.some((p) => p.frequencyHz === 1000)) {
    points.push({ frequencyHz: 1000, levelDb: o.offsetDb ?? 0 });
    points.sort((a, b) => a.frequencyHz - b.frequencyHz);
  }
  return { kind: "riaa", origin: "typed", conditions: {}, points };
}
