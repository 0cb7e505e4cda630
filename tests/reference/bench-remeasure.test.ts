// The buyer's re-measurement against the listing's bench sheet, checked with hand-worked figures.
// Each check names where its numbers and its tolerance come from ("common practice" where that is all
// there is; the tolerance table and its reasons are in docs/remeasurement.md).
import { describe, expect, it } from "vitest";
import { compareRemeasurement, type BuyerReading, type RemeasureRow } from "@shared/bench/remeasure";
import { parseValue } from "@shared/bench/units";
import { exampleIntegratedAmplifierSheet } from "@shared/bench/examples";
import type { BenchSheet, Conditions } from "@shared/bench/schema";

const sheet = exampleIntegratedAmplifierSheet();
// readings.3: left channel, 66 W into 8 Ω, 1 kHz, 0.1 % THD, both channels driven (invented demo sheet).
const POWER_8: Conditions = sheet.readings[3].conditions;

function typed(quantity: BuyerReading["quantity"], text: string, conditions: Conditions, rest: Partial<BuyerReading> = {}): BuyerReading {
  const p = parseValue(text);
  if (!p.ok) throw new Error(p.error);
  return { quantity, value: p.value, unit: p.unit, text, conditions, ...rest };
}

function one(s: BenchSheet, r: BuyerReading): RemeasureRow {
  const out = compareRemeasurement(s, { readings: [r] });
  expect(out.rows).toHaveLength(1);
  return out.rows[0];
}

describe("output power (tolerance ±0.5 dB: common practice, mains and dummy-load spread)", () => {
  it("30 % less than the sheet is −1.55 dB and outside: 10·log10(0.7) = −1.549 dB (dB definition, as dBW = 10·log10 P/1 W)", () => {
    const row = one(sheet, typed("output_power", "46.2 W", POWER_8, { channel: "left" }));
    expect(row.listed?.display).toBe("66 W");
    expect(row.difference?.value).toBeCloseTo(-1.549, 3);
    expect(row.difference?.display).toBe("−1.55 dB (−30 %)");
    expect(row.outcome).toBe("outside");
    expect(row.direction).toBe("worse");
  });

  it("62 W against 66 W is −0.27 dB, within: 10·log10(62/66) = −0.2715 dB [computed]", () => {
    const row = one(sheet, typed("output_power", "62 W", POWER_8, { channel: "left" }));
    expect(row.difference?.value).toBeCloseTo(-0.2715, 4);
    expect(row.outcome).toBe("within");
  });

  it("the same 66 W typed as 18.1954 dBW reads the same: 10·log10(66) = 18.1954 dBW (dBW = 10·log10 P/1 W)", () => {
    const row = one(sheet, typed("output_power", "18.1954 dBW", POWER_8, { channel: "left" }));
    expect(row.measured.value).toBeCloseTo(66, 2);
    expect(row.outcome).toBe("within");
    expect(Math.abs(row.difference!.value)).toBeLessThan(0.001);
  });

  it("a reading into 4 Ω never pairs with the sheet's 8 Ω figure: a power claim states its load (16 CFR 432.2)", () => {
    // The demo sheet has 4 Ω figures too, at 98 W: pair with those, not the 8 Ω ones.
    const row = one(sheet, typed("output_power", "96 W", { ...POWER_8, loadOhm: 4 }, { channel: "left" }));
    expect(row.listed?.display).toBe("98 W");
    const lone = one(sheet, typed("output_power", "60 W", { ...POWER_8, loadOhm: 6 }, { channel: "left" }));
    expect(lone.outcome).toBe("not_comparable");
    expect(lone.reason).toMatch(/^The load differs/);
  });

  it("a different distortion limit keeps them apart: 16 CFR 432.2 states power at a rated maximum THD", () => {
    const row = one(
      sheet,
      typed("output_power", "70 W", { ...POWER_8, atDistortion: { ratio: 0.01, measure: "thd" } }, { channel: "left" }),
    );
    expect(row.outcome).toBe("not_comparable");
    expect(row.reason).toMatch(/distortion limit/);
  });
});

describe("a rated figure is a limit: only the worse side counts (common practice)", () => {
  const ratedOnly: BenchSheet = { ...sheet, readings: sheet.readings.filter((r) => r.basis === "rated") };
  // readings.0 of the demo: rated 60 W into 8 Ω, 20 Hz–20 kHz, 0.1 % THD, both channels driven.
  const RATED_8 = sheet.readings[0].conditions;
  it("66 W against a 60 W rating is better and within, though +0.41 dB", () => {
    const row = one(ratedOnly, typed("output_power", "66 W", RATED_8));
    expect(row.listed?.basis).toBe("rated");
    expect(row.outcome).toBe("within");
    expect(row.direction).toBe("better");
  });
  it("80 W (+1.25 dB) is still within: 10·log10(80/60) = 1.249 dB [computed]", () => {
    const row = one(ratedOnly, typed("output_power", "80 W", RATED_8));
    expect(row.difference?.value).toBeCloseTo(1.249, 3);
    expect(row.outcome).toBe("within");
  });
  it("50 W is −0.79 dB against the rating, outside: 10·log10(50/60) = −0.792 dB [computed]", () => {
    const row = one(ratedOnly, typed("output_power", "50 W", RATED_8));
    expect(row.difference?.value).toBeCloseTo(-0.792, 3);
    expect(row.outcome).toBe("outside");
  });
});

describe("distortion (a factor of 2: common practice, analyser and mains spread)", () => {
  // readings.9: left THD 0.012 % at 60 W into 8 Ω, 1 kHz (from a capture).
  const AT = { powerW: 60, loadOhm: 8, frequencyHz: 1000 };
  it("0.020 % against 0.012 % is ×1.7, within", () => {
    const row = one(sheet, typed("thd", "0.02 %", AT, { channel: "left" }));
    expect(row.difference?.display).toBe("×1.7");
    expect(row.outcome).toBe("within");
  });
  it("0.030 % is ×2.5, outside", () => {
    expect(one(sheet, typed("thd", "0.03 %", AT, { channel: "left" })).outcome).toBe("outside");
  });
  it("−74 dB is 0.020 % (20·log10(0.0002) = −73.98 dB, the ratio-in-dB convention), so the same outcome as 0.02 %", () => {
    const p = parseValue("-73.98 dB", { kind: "ratio" });
    expect(p.ok && p.value).toBeCloseTo(0.0002, 6);
    expect(one(sheet, typed("thd", "0.02 %", AT, { channel: "left" })).outcome).toBe("within");
  });
  it("THD is not THD+N: a THD+N reading pairs only with the sheet's THD+N (0.018 %), in the same bandwidth (AES17: 20 kHz)", () => {
    const band = { lowHz: 20, highHz: 20_000 };
    const row = one(sheet, typed("thd_n", "0.03 %", { ...AT, bandwidth: band }, { channel: "left" }));
    expect(row.listed?.display).toBe("0.018 %");
    expect(row.outcome).toBe("within");
    const wide = one(sheet, typed("thd_n", "0.03 %", { ...AT, bandwidth: { lowHz: 20, highHz: 80_000 } }, { channel: "left" }));
    expect(wide.outcome).toBe("not_comparable");
    expect(wide.reason).toMatch(/^The measurement bandwidth differs/);
  });
});

describe("noise: weighting must match (IEC 61672-1: A-weighting is −19.1 dB at 100 Hz, so weighted and unweighted readings differ)", () => {
  it("an unweighted SNR never pairs with the sheet's A-weighted one", () => {
    const snr = sheet.readings[13];
    expect(snr.conditions.weighting).toBe("A");
    const row = one(sheet, typed("snr", "90 dB", { ...snr.conditions, weighting: "unweighted" }));
    expect(row.outcome).toBe("not_comparable");
    expect(row.reason).toMatch(/weighting/);
  });
  it("an A-weighted SNR 2.5 dB lower is within ±3 dB (common practice: hum and analyser floor)", () => {
    const snr = sheet.readings[13];
    const row = one(sheet, typed("snr", "95.5 dB", snr.conditions));
    expect(row.difference?.display).toBe("−2.5 dB");
    expect(row.outcome).toBe("within");
  });
});

describe("turntables", () => {
  const tt: BenchSheet = {
    category: "turntable",
    readings: [
      {
        quantity: "speed_error",
        value: 0.0005,
        unit: "%",
        basis: "measured",
        origin: "typed",
        conditions: { speedRpm: 33.33, testToneHz: 3150 },
      },
      {
        quantity: "wow_flutter",
        value: 0.0008,
        unit: "%",
        basis: "measured",
        origin: "typed",
        conditions: { speedRpm: 33.33, testToneHz: 3150, weighting: "IEC-60386-peak" },
      },
    ],
    sweeps: [],
  };
  it("a 3150 Hz tone read at 3159.45 Hz is +0.30 % fast ((f − f₀)/f₀; tone per IEC 60386); +0.25 points from +0.05 %: within ±0.3", () => {
    const err = (3159.45 - 3150) / 3150;
    expect(err).toBeCloseTo(0.003, 9);
    const row = one(tt, { quantity: "speed_error", value: err, unit: "%", conditions: { speedRpm: 33.33, testToneHz: 3150 } });
    expect(row.difference?.display).toBe("+0.25 percentage points");
    expect(row.outcome).toBe("within");
  });
  it("+0.4 % is 0.35 points off: outside ±0.3 (common practice: test-record accuracy)", () => {
    const row = one(tt, typed("speed_error", "+0.4 %", { speedRpm: 33.33, testToneHz: 3150 }));
    expect(row.outcome).toBe("outside");
  });
  it("WRMS never pairs with a weighted-peak reading (AES6 / IEC 60386 peak vs the WRMS convention; WRMS reads lower, from memory)", () => {
    const row = one(tt, typed("wow_flutter", "0.05 %", { speedRpm: 33.33, testToneHz: 3150, weighting: "WRMS" }));
    expect(row.outcome).toBe("not_comparable");
  });
  it("0.11 % weighted peak against 0.08 % is ×1.38, within a factor of 1.5 (common practice)", () => {
    const row = one(tt, typed("wow_flutter", "0.11 %", { speedRpm: 33.33, testToneHz: 3150, weighting: "IEC-60386-peak" }));
    expect(row.difference?.display).toBe("×1.4");
    expect(row.outcome).toBe("within");
  });
  it("a figure at 45 rpm does not pair with one at 33⅓", () => {
    expect(one(tt, typed("speed_error", "0.1 %", { speedRpm: 45, testToneHz: 3150 })).outcome).toBe("not_comparable");
  });
});

describe("loudspeakers", () => {
  const spk: BenchSheet = {
    category: "loudspeaker",
    readings: [
      { quantity: "nominal_impedance", value: 8, unit: "Ω", basis: "rated", origin: "typed", conditions: {} },
      // 6.4 Ω is the lowest an 8 Ω speaker may dip to: 80 % of rated (IEC 60268-5, as quoted secondarily).
      { quantity: "impedance_minimum", value: 6.4, unit: "Ω", basis: "measured", origin: "typed", conditions: {} },
      { quantity: "sensitivity", value: 88, unit: "dB/2.83 V/1 m", basis: "measured", origin: "typed", conditions: { distanceM: 1 } },
    ],
    sweeps: [],
  };
  it("5.9 Ω against 6.4 Ω is −7.8 %, within ±10 % (common practice: meter and lead spread)", () => {
    const row = one(spk, typed("impedance_minimum", "5.9 Ω", {}));
    expect(row.difference?.value).toBeCloseTo(-0.078125, 6);
    expect(row.outcome).toBe("within");
  });
  it("5.6 Ω is −12.5 %, outside", () => {
    expect(one(spk, typed("impedance_minimum", "5.6 Ω", {})).outcome).toBe("outside");
  });
  it("sensitivity: 89.4 dB against 88 dB is within ±1.4 dB, 89.5 dB outside (IEC 61672-1:2013 Table 3: class 1 ±0.7 dB at 1 kHz, two meters)", () => {
    expect(one(spk, typed("sensitivity", "89.4 dB/2.83V", { distanceM: 1 })).outcome).toBe("within");
    expect(one(spk, typed("sensitivity", "89.5 dB/2.83V", { distanceM: 1 })).outcome).toBe("outside");
  });
  it("a rated impedance is not re-measured: not comparable, with the reason", () => {
    const row = one(spk, typed("nominal_impedance", "8 Ω", {}));
    expect(row.outcome).toBe("not_comparable");
    expect(row.reason).toMatch(/rating/);
  });
});

describe("RIAA deviation read off the sheet's sweep", () => {
  // The playback curve re 1 kHz, IEC 60098 time constants 3180/318/75 µs, docs/references.md §1 table [computed, rounded to 0.01 dB].
  const F = [20, 50, 100, 500, 1000, 2000, 5000, 10_000, 20_000];
  const DB = [19.27, 16.95, 13.09, 2.65, 0, -2.59, -8.21, -13.73, -19.62];
  const phono: BenchSheet = {
    category: "phono_stage",
    readings: [],
    sweeps: [
      {
        kind: "riaa",
        variant: "riaa",
        origin: "typed",
        conditions: {},
        // +0.30 dB at 20 Hz on top of the published curve: the sheet's worst deviation is 0.30 dB.
        points: F.map((f, i) => ({ frequencyHz: f, levelDb: DB[i] + (f === 20 ? 0.3 : 0) })),
      },
    ],
  };
  const RANGE = { frequencyRange: { lowHz: 20, highHz: 20_000 } };
  it("the sheet lists ±0.30 dB over 20 Hz–20 kHz; ±0.6 dB is 0.3 dB more, within ±0.5 dB (common practice)", () => {
    const row = one(phono, typed("riaa_deviation", "±0.6 dB", RANGE));
    expect(row.listed?.ref).toBe("sweeps.0");
    expect(row.listed?.value).toBeCloseTo(0.3, 2);
    expect(row.outcome).toBe("within");
  });
  it("±0.9 dB is 0.6 dB more: outside", () => {
    expect(one(phono, typed("riaa_deviation", "±0.9 dB", RANGE)).outcome).toBe("outside");
  });
});

describe("overall outcome", () => {
  it("one pair outside makes the whole 'differs'; all within 'matches'; none comparable 'nothing to compare'", () => {
    const ok = typed("output_power", "64 W", POWER_8, { channel: "left" });
    const bad = typed("output_power", "46 W", POWER_8, { channel: "left" });
    const off = typed("output_power", "64 W", { loadOhm: 6 }, { channel: "left" });
    expect(compareRemeasurement(sheet, { readings: [ok] }).outcome).toBe("matches");
    expect(compareRemeasurement(sheet, { readings: [ok, bad, off] }).outcome).toBe("differs");
    expect(compareRemeasurement(sheet, { readings: [off] }).outcome).toBe("nothing_to_compare");
    expect(compareRemeasurement(null, { readings: [ok] }).outcome).toBe("nothing_to_compare");
  });
});
