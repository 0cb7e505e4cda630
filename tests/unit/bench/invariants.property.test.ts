// Invariants of the rules, checked with fast-check on the demo amplifier's sheet and variations of it:
// a sheet typed in other units gets the same verdict; swapping left and right changes nothing but labels;
// a consistent amplifier sheet scaled to another power (P × k, V × √k, P = V²/R) stays consistent.
import fc from "fast-check";
import { describe, expect, it } from "vitest";
import {
  QUANTITY_INFO,
  checkBenchSheet,
  exampleIntegratedAmplifierSheet,
  parseValue,
  toUnit,
  type BenchSheet,
  type Kind,
  type Reading,
  type Verdict,
} from "@shared/bench";

const RUNS = { numRuns: 100, seed: 20261202 };

/** Spellings a bench meter or a maker's sheet uses for the same value (AC voltages; DC ones keep V/mV/µV). */
const SPELLINGS: Partial<Record<Kind, string[]>> = {
  power: ["W", "mW", "kW", "dBW", "dBm"],
  voltage: ["V", "Vrms", "Vpp", "Vpk", "mV", "dBu", "dBV"],
  ratio: ["%", "ppm", "dB", "dBc"],
  time: ["s", "ms", "µs", "ns"],
  frequency: ["Hz", "kHz"],
  resistance: ["Ω", "mΩ", "kΩ"],
  slewRate: ["V/µs", "V/ms", "V/s"],
};
const DC_SPELLINGS = ["V", "mV", "µV"];

function spellingsFor(r: Reading): string[] {
  const info = QUANTITY_INFO[r.quantity];
  if (info.dc) return DC_SPELLINGS;
  return SPELLINGS[info.kind] ?? [r.unit];
}

/** The reading as a seller would type it in `unit`, read back through the bench's own parser. */
function retype(r: Reading, unit: string): Reading {
  const kind = QUANTITY_INFO[r.quantity].kind;
  const text = `${toUnit(r.value, unit, kind)} ${unit}`;
  const parsed = parseValue(text, { kind, voltageForm: QUANTITY_INFO[r.quantity].dc ? "dc" : "rms" });
  if (!parsed.ok) throw new Error(`${text}: ${parsed.error}`);
  return { ...r, value: parsed.value, unit: parsed.unit, text };
}

/** What a verdict decides, without its wording: the mark, the counts, each rule's outcomes, the hazards. */
function decision(v: Verdict) {
  return {
    benchVerified: v.benchVerified,
    counts: v.counts,
    outcomes: v.results.map((r) => `${r.ruleId}:${r.outcome}`).sort(),
    hazards: v.hazards.map((h) => h.ruleId).sort(),
  };
}

/** The demo sheet with each measured reading's value moved by a factor: a spread of verdicts, good and bad. */
const variedSheet = fc.array(fc.double({ min: 0.4, max: 2.5, noNaN: true }), { minLength: 32, maxLength: 32 }).map((factors) => {
  const s = exampleIntegratedAmplifierSheet();
  s.readings = s.readings.map((r, i) =>
    r.basis === "measured" && QUANTITY_INFO[r.quantity].kind !== "decibel" ? { ...r, value: r.value * factors[i] } : r,
  );
  return s;
});

describe("the same sheet typed in other units gets the same verdict", () => {
  it("mW/W/dBm, Vpp/V rms/dBu, %/ppm/dB, µs/ns …", () => {
    fc.assert(
      fc.property(variedSheet, fc.array(fc.nat(), { minLength: 32, maxLength: 32 }), (sheet, picks) => {
        const retyped: BenchSheet = {
          ...sheet,
          readings: sheet.readings.map((r, i) => {
            const units = spellingsFor(r);
            return retype(r, units[picks[i] % units.length]);
          }),
        };
        expect(decision(checkBenchSheet(retyped))).toEqual(decision(checkBenchSheet(sheet)));
      }),
      RUNS,
    );
  });
});

describe("swapping left and right changes nothing but labels", () => {
  const swap = (ch: Reading["channel"]) => (ch === "left" ? "right" : ch === "right" ? "left" : ch);
  it("same mark, counts, outcomes per rule and hazards", () => {
    fc.assert(
      fc.property(variedSheet, (sheet) => {
        const swapped: BenchSheet = {
          ...sheet,
          readings: sheet.readings.map((r) => ({ ...r, channel: swap(r.channel) })),
          sweeps: sheet.sweeps.map((s) => ({ ...s, channel: swap(s.channel) })),
        };
        expect(decision(checkBenchSheet(swapped))).toEqual(decision(checkBenchSheet(sheet)));
      }),
      RUNS,
    );
  });
});

describe("a consistent amplifier sheet scaled to another power stays consistent", () => {
  // Powers × k; every output voltage, rail and slew rate × √k (P = V²/R into the same loads); the SNR, quoted
  // at the scaled power against the same noise, rises by 10·log10(k). Distortion, impedances, times unchanged.
  function scaled(k: number): BenchSheet {
    const s = exampleIntegratedAmplifierSheet();
    const rk = Math.sqrt(k);
    s.readings = s.readings.map((r) => {
      const c = { ...r.conditions };
      if (c.powerW !== undefined) c.powerW *= k;
      if (c.voltageV !== undefined) c.voltageV *= rk;
      const scale =
        r.quantity === "output_power"
          ? k
          : r.quantity === "output_voltage" || r.quantity === "rail_voltage" || r.quantity === "slew_rate"
            ? rk
            : 1;
      const value = r.quantity === "snr" ? r.value + 10 * Math.log10(k) : r.value * scale;
      return { ...r, value, conditions: c };
    });
    return s;
  }
  it("from a quarter to four times the power", () => {
    expect(checkBenchSheet(scaled(1)).benchVerified).toBe(true);
    fc.assert(
      fc.property(fc.double({ min: 0.25, max: 4, noNaN: true }), (k) => {
        const v = checkBenchSheet(scaled(k));
        expect(v.counts.questionable + v.counts.implausible + v.counts.missing).toBe(0);
        expect(v.benchVerified).toBe(true);
        expect(decision(v).outcomes).toEqual(decision(checkBenchSheet(scaled(1))).outcomes);
      }),
      RUNS,
    );
  });
});
