import { describe, expect, it } from "vitest";
import fc from "fast-check";
import {
  channelsPair,
  compareRemeasurement,
  differingConditions,
  remeasurableFigures,
  REMEASURE_RULES,
  type BuyerReading,
} from "@shared/bench/remeasure";
import { BuyerReadingsSchema } from "@shared/bench/remeasure-schema";
import { QUANTITIES, CHANNELS, WEIGHTINGS, parseValue, type Conditions } from "@shared/bench";
import { exampleIntegratedAmplifierSheet } from "@shared/bench/examples";
import type { BenchSheet } from "@shared/bench/schema";
import { readingsFromForm, figureField, extraField } from "~/orders/readings-form";

// Pairing and judging a buyer's re-measurement: properties that must hold for any input (fixed seed),
// the schema the server checks with, and the form fields the buyer types into.

const SEED = 20261202;
const sheet = exampleIntegratedAmplifierSheet();
const POWER_8: Conditions = sheet.readings[3].conditions;

const maybe = <T>(arb: fc.Arbitrary<T>) => fc.option(arb, { nil: undefined });
const conditionsArb: fc.Arbitrary<Conditions> = fc
  .record({
    loadOhm: maybe(fc.constantFrom(2, 4, 6, 8, 8.02, 16)),
    frequencyHz: maybe(fc.constantFrom(20, 1000, 1005, 10_000)),
    powerW: maybe(fc.constantFrom(1, 60, 61)),
    weighting: maybe(fc.constantFrom(...WEIGHTINGS)),
    channelsDriven: maybe(fc.constantFrom<"one" | "both" | "all">("one", "both", "all")),
    atDistortion: maybe(fc.record({ ratio: fc.constantFrom(0.001, 0.01), measure: fc.constantFrom<"thd" | "thd_n">("thd", "thd_n") })),
    bandwidth: maybe(fc.constantFrom({ lowHz: 20, highHz: 20_000 }, { lowHz: 20, highHz: 80_000 })),
  })
  .map((c) => Object.fromEntries(Object.entries(c).filter(([, v]) => v !== undefined)) as Conditions);

describe("condition matching", () => {
  it("is symmetric: a pairs with b exactly when b pairs with a, naming the same conditions", () => {
    fc.assert(
      fc.property(fc.constantFrom(...QUANTITIES), conditionsArb, conditionsArb, (q, a, b) => {
        expect(differingConditions(q, a, b)).toEqual(differingConditions(q, b, a));
      }),
      { seed: SEED, numRuns: 500 },
    );
    fc.assert(
      fc.property(maybe(fc.constantFrom(...CHANNELS)), maybe(fc.constantFrom(...CHANNELS)), (a, b) => {
        expect(channelsPair(a, b)).toBe(channelsPair(b, a));
      }),
      { seed: SEED },
    );
  });

  it("pairs any conditions with themselves, and never a stated load with an unstated one", () => {
    fc.assert(
      fc.property(fc.constantFrom(...QUANTITIES), conditionsArb, (q, a) => {
        expect(differingConditions(q, a, a)).toEqual([]);
      }),
      { seed: SEED },
    );
    expect(differingConditions("output_power", { loadOhm: 8 }, {})).toEqual(["load"]);
    expect(differingConditions("output_power", { loadOhm: 8 }, { loadOhm: 4 })).toEqual(["load"]);
    // Typed numbers: 8 and 8.02 Ω are one load (1 %), 8 and 8.2 are not.
    expect(differingConditions("output_power", { loadOhm: 8 }, { loadOhm: 8.02 })).toEqual([]);
    expect(differingConditions("output_power", { loadOhm: 8 }, { loadOhm: 8.2 })).toEqual(["load"]);
  });

  it("the outcome of comparing a reading does not depend on which side is called listed, for two-sided tolerances", () => {
    // Power is two-sided against a measured figure: |difference| is the same either way round.
    fc.assert(
      fc.property(fc.double({ min: 1, max: 500, noNaN: true }), fc.double({ min: 1, max: 500, noNaN: true }), (a, b) => {
        const mk = (v: number): BenchSheet => ({
          category: "power_amplifier",
          readings: [{ quantity: "output_power", value: v, unit: "W", basis: "measured", origin: "typed", conditions: POWER_8 }],
          sweeps: [],
        });
        const r = (v: number): BuyerReading => ({ quantity: "output_power", value: v, unit: "W", conditions: POWER_8 });
        const db = Math.abs(10 * Math.log10(a / b));
        fc.pre(Math.abs(db - 0.5) > 1e-6);
        expect(compareRemeasurement(mk(a), { readings: [r(b)] }).rows[0].outcome).toBe(
          compareRemeasurement(mk(b), { readings: [r(a)] }).rows[0].outcome,
        );
      }),
      { seed: SEED, numRuns: 300 },
    );
  });
});

describe("unit invariance", () => {
  const judge = (text: string, q: BuyerReading["quantity"] = "output_power", conditions = POWER_8) => {
    const p = parseValue(text, { kind: q === "output_power" ? "power" : "voltage" });
    if (!p.ok) throw new Error(p.error);
    return compareRemeasurement(sheet, { readings: [{ quantity: q, value: p.value, unit: p.unit, channel: "left", conditions }] }).rows[0];
  };

  it("the same power typed in W, mW or dBW gives the same outcome and the same difference", () => {
    fc.assert(
      fc.property(fc.double({ min: 20, max: 200, noNaN: true }), (watts) => {
        // Away from the tolerance's edge, where the last digit typed could tip it.
        fc.pre(Math.abs(Math.abs(10 * Math.log10(watts / 66)) - 0.5) > 1e-4);
        const inW = judge(`${watts} W`);
        const inDbw = judge(`${10 * Math.log10(watts)} dBW`);
        const inMw = judge(`${watts * 1000} mW`);
        expect(inDbw.outcome).toBe(inW.outcome);
        expect(inMw.outcome).toBe(inW.outcome);
        expect(inDbw.difference!.value).toBeCloseTo(inW.difference!.value, 9);
      }),
      { seed: SEED, numRuns: 300 },
    );
  });

  it("the same output voltage typed as V rms, Vpp or dBu gives the same outcome", () => {
    const cond = sheet.readings[7].conditions; // 65 Vpp, left, into 8 Ω
    fc.assert(
      fc.property(fc.double({ min: 15, max: 30, noNaN: true }), (vrms) => {
        fc.pre(Math.abs(Math.abs(20 * Math.log10(vrms / (65 / (2 * Math.SQRT2)))) - 0.25) > 1e-4);
        const a = judge(`${vrms} V`, "output_voltage", cond);
        const b = judge(`${vrms * 2 * Math.SQRT2} Vpp`, "output_voltage", cond);
        const c = judge(`${20 * Math.log10(vrms / Math.sqrt(0.6))} dBu`, "output_voltage", cond);
        expect(b.outcome).toBe(a.outcome);
        expect(c.outcome).toBe(a.outcome);
      }),
      { seed: SEED, numRuns: 200 },
    );
  });
});

describe("judging", () => {
  it("moving a reading further from the listed figure never turns 'outside' into 'within'", () => {
    fc.assert(
      fc.property(fc.double({ min: 0.3, max: 1, noNaN: true }), fc.double({ min: 0.5, max: 1, noNaN: true }), (f, g) => {
        const r = (v: number): BuyerReading => ({ quantity: "output_power", value: v, unit: "W", channel: "left", conditions: POWER_8 });
        const near = compareRemeasurement(sheet, { readings: [r(66 * f)] }).rows[0];
        const far = compareRemeasurement(sheet, { readings: [r(66 * f * g)] }).rows[0];
        if (near.outcome === "outside") expect(far.outcome).toBe("outside");
      }),
      { seed: SEED, numRuns: 300 },
    );
  });

  it("a ref pins the pair to that figure of the sheet: the right channel's 65 W, not the left's 66 W", () => {
    const row = compareRemeasurement(sheet, {
      readings: [{ quantity: "output_power", value: 60, unit: "W", conditions: POWER_8, ref: "readings.4" }],
    }).rows[0];
    expect(row.listed?.ref).toBe("readings.4");
    expect(row.listed?.display).toBe("65 W");
  });

  it("with no channel given, a reading is set against the listing's weaker channel", () => {
    const row = compareRemeasurement(sheet, { readings: [{ quantity: "output_power", value: 60, unit: "W", conditions: POWER_8 }] })
      .rows[0];
    expect(row.listed?.display).toBe("65 W");
  });

  it("a left-channel reading pairs with the same channel's figure before the weaker other channel", () => {
    const row = compareRemeasurement(sheet, {
      readings: [{ quantity: "output_power", value: 60, unit: "W", channel: "left", conditions: POWER_8 }],
    }).rows[0];
    expect(row.listed?.ref).toBe("readings.3");
    // A figure for the left channel comes before one given for both, even a weaker one.
    const both: BenchSheet = { ...sheet, readings: [sheet.readings[3], { ...sheet.readings[3], channel: "both", value: 60 }] };
    const again = compareRemeasurement(both, {
      readings: [{ quantity: "output_power", value: 60, unit: "W", channel: "left", conditions: POWER_8 }],
    }).rows[0];
    expect(again.listed?.ref).toBe("readings.0");
  });

  it("a figure the sheet gives for both channels pairs with a one-channel reading", () => {
    const snr = sheet.readings[13]; // 98 dB(A), both channels
    const row = compareRemeasurement(sheet, {
      readings: [{ quantity: "snr", value: 97, unit: "dB", channel: "left", conditions: snr.conditions }],
    }).rows[0];
    expect(row.listed?.ref).toBe("readings.13");
    expect(row.outcome).toBe("within");
  });

  it("a channel the sheet does not have is not comparable, and says which channels it has", () => {
    const one: BenchSheet = { ...sheet, readings: [sheet.readings[3]] };
    const row = compareRemeasurement(one, {
      readings: [{ quantity: "output_power", value: 60, unit: "W", channel: "right", conditions: POWER_8 }],
    }).rows[0];
    expect(row.outcome).toBe("not_comparable");
    expect(row.reason).toMatch(/left channel only/);
  });

  it("a quantity the sheet lacks is not comparable, with the reason; counts add up", () => {
    const out = compareRemeasurement(sheet, {
      readings: [
        { quantity: "crosstalk", value: 70, unit: "dB", conditions: {} },
        { quantity: "output_power", value: 64, unit: "W", channel: "left", conditions: POWER_8 },
      ],
    });
    expect(out.rows[0].reason).toBe("The bench sheet has no channel separation.");
    expect(out.counts).toEqual({ within: 1, outside: 0, not_comparable: 1 });
    expect(out.outcome).toBe("matches");
  });

  it("every quantity has a tolerance text and a source", () => {
    for (const q of QUANTITIES) {
      expect(REMEASURE_RULES[q].toleranceText.length).toBeGreaterThan(0);
      expect(REMEASURE_RULES[q].source).toMatch(/^(Common practice: |IEC |A rating)/);
    }
  });

  it("offers the sheet's measured figures for re-measurement, not its ratings", () => {
    const refs = remeasurableFigures(sheet).map((f) => f.ref);
    expect(refs).toContain("readings.3");
    expect(refs).not.toContain("readings.0"); // rated 2 × 60 W
  });
});

describe("BuyerReadingsSchema", () => {
  const good = { quantity: "output_power", value: 64, unit: "W", channel: "left", conditions: { loadOhm: 8 }, ref: "readings.3" };
  it("accepts readings in the sheet's shape", () => {
    const r = BuyerReadingsSchema.safeParse({ readings: [good], measuredOn: "2026-12-01", equipment: "Sound-card analyser" });
    expect(r.success).toBe(true);
  });
  it("refuses a unit that does not fit, a power of zero, a bad ref, an unknown condition and no readings, with paths", () => {
    const paths = (input: unknown) => {
      const r = BuyerReadingsSchema.safeParse(input);
      return r.success ? [] : r.error.issues.map((i) => i.path.join("."));
    };
    expect(paths({ readings: [{ ...good, quantity: "thd" }] })).toEqual(["readings.0.unit"]);
    expect(paths({ readings: [{ ...good, value: 0 }] })).toEqual(["readings.0.value"]);
    expect(paths({ readings: [{ ...good, ref: "listing.1" }] })).toEqual(["readings.0.ref"]);
    expect(paths({ readings: [{ ...good, conditions: { loadOhms: 8 } }] })).toEqual(["readings.0.conditions"]);
    expect(paths({ readings: [] })).toEqual(["readings"]);
    expect(paths({ readings: Array.from({ length: 61 }, () => good) })).toEqual(["readings"]);
  });
  it("takes a signed speed error and a negative gain, as the sheet does", () => {
    const r = BuyerReadingsSchema.safeParse({
      readings: [
        { quantity: "speed_error", value: -0.002, unit: "%", conditions: {} },
        { quantity: "gain", value: -3, unit: "dB", conditions: {} },
      ],
    });
    expect(r.success).toBe(true);
  });
});

describe("readingsFromForm", () => {
  const figures = remeasurableFigures(sheet);
  const form = (fields: Record<string, string>) => (name: string) => fields[name] ?? "";
  it("reads the boxes beside the sheet's figures with the sheet's conditions, skipping blanks", () => {
    const out = readingsFromForm(form({ [figureField("readings.3")]: "64 W", [figureField("readings.9")]: "-74 dB" }), figures);
    expect(out.errors).toEqual({});
    expect(out.buyer.readings).toHaveLength(2);
    expect(out.buyer.readings[0]).toMatchObject({ quantity: "output_power", value: 64, unit: "W", channel: "left", ref: "readings.3" });
    expect(out.buyer.readings[0].conditions).toEqual(POWER_8);
    expect(out.buyer.readings[1].value).toBeCloseTo(0.0002, 6);
    expect(out.fieldOf).toEqual([figureField("readings.3"), figureField("readings.9")]);
    expect(compareRemeasurement(sheet, out.buyer).outcome).toBe("matches");
  });
  it("puts an unreadable figure's error beside its box", () => {
    const out = readingsFromForm(form({ [figureField("readings.3")]: "64 Hz", [figureField("readings.4")]: "2 × 64 W" }), figures);
    expect(Object.keys(out.errors)).toEqual([figureField("readings.3"), figureField("readings.4")]);
    expect(out.buyer.readings).toEqual([]);
  });
  it("reads a free row with its load and frequency, and asks for what is missing", () => {
    const out = readingsFromForm(
      form({
        [extraField(0, "quantity")]: "output_power",
        [extraField(0, "value")]: "90 W",
        [extraField(0, "load")]: "4R",
        [extraField(0, "frequency")]: "1 kHz",
        [extraField(0, "channel")]: "left",
        [extraField(1, "value")]: "12 W",
      }),
      figures,
    );
    expect(out.buyer.readings[0]).toMatchObject({
      quantity: "output_power",
      value: 90,
      channel: "left",
      conditions: { loadOhm: 4, frequencyHz: 1000 },
    });
    expect(out.errors).toEqual({ [extraField(1, "quantity")]: "Choose what you measured." });
  });
});
