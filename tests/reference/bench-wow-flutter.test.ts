import { describe, expect, it } from "vitest";
import { analyseCapture, isCaptureError } from "~/bench/captures.server";
import { analyseWowFlutter, captureConditionsSchema, flutterWeighting, flutterWeightingDb } from "@shared/bench/analysis";
import { checkBenchSheet } from "@shared/bench/verdict";
import type { BenchSheet } from "@shared/bench/schema";
import { wavFromSamples } from "../support/capture-files";
import { wowToneSamples, type WowToneSpec } from "../support/wow-tone";

const FS = 48_000;
const peak = { nominalHz: 3150, convention: "IEC-60386-peak" as const };
const read = (spec: WowToneSpec, opts: { nominalHz: number; convention: "IEC-60386-peak" | "WRMS" } = peak) =>
  analyseWowFlutter(wowToneSamples({ sampleRate: FS, ...spec }), FS, opts);

// IEC 60386:1972 + Amd 1:1988 weighting, identical to AES6-2008 Table 1 (and DIN 45507, CCIR 409): the
// tabulated response in dB re 4 Hz and its tolerance (+above/−below). Transcribed from AES6-2008 Table 1
// as reproduced in a published filter-design note; the values agree with the IEC 60386 figure (from memory).
const TABLE_1: [hz: number, db: number, plus: number, minus: number][] = [
  [0.1, -48.0, 10, 4],
  [0.2, -30.6, 10, 4],
  [0.315, -19.7, 4, 4],
  [0.4, -15.0, 4, 4],
  [0.63, -8.4, 2, 2],
  [0.8, -6.0, 2, 2],
  [1.0, -4.2, 2, 2],
  [1.6, -1.8, 2, 2],
  [2.0, -0.9, 2, 2],
  [4.0, 0.0, 0, 0],
  [6.3, -0.9, 2, 2],
  [10, -2.1, 2, 2],
  [20, -5.9, 2, 2],
  [40, -10.4, 2, 2],
  [63, -14.2, 4, 4],
  [100, -17.3, 4, 4],
  [200, -23.0, 4, 4],
];

describe("IEC 60386 / AES6-2008 wow & flutter weighting filter", () => {
  const w = flutterWeighting(2000);
  it.each(TABLE_1)("at %s Hz reads %s dB within the standard's tolerance (AES6-2008 Table 1)", (hz, db, plus, minus) => {
    const got = flutterWeightingDb(w, hz);
    expect(got).toBeLessThanOrEqual(db + plus + 1e-9);
    expect(got).toBeGreaterThanOrEqual(db - minus - 1e-9);
    // Our fit is closer than the tolerance: within 0.6 dB of every tabulated value.
    expect(Math.abs(got - db)).toBeLessThan(0.6);
  });

  it("holds at the other demodulator rates a 44.1 or 96 kHz capture gives (AES6-2008 Table 1, 4 Hz and 200 Hz)", () => {
    for (const rate of [44_100 / 22, 96_000 / 48]) {
      const r = flutterWeighting(rate);
      expect(flutterWeightingDb(r, 4)).toBeCloseTo(0, 6);
      expect(Math.abs(flutterWeightingDb(r, 200) - -23.0)).toBeLessThan(0.6);
    }
  });
});

describe("wow & flutter from a 3150 Hz test tone", () => {
  it("a pure 4 Hz FM of ±3.15 Hz reads ±0.100 % weighted peak and 0.0707 % WRMS", () => {
    // By definition the weighting is 0 dB at 4 Hz (IEC 60386), so the weighted peak of a sinusoidal FM
    // is its relative peak deviation: 3.15 / 3150 = 0.100 %; its rms is that over √2: 0.0707 %.
    // Tolerance ±1 % of reading: the two-sigma point of a sine is sin(0.95 · π/2) = 0.9969 of its peak.
    const a = read({ carrierHz: 3150, deviationHz: 3.15, rateHz: 4 });
    expect(a.weightedPeak.value).toBeGreaterThan(0.001 * 0.99);
    expect(a.weightedPeak.value).toBeLessThan(0.001 * 1.01);
    expect(a.weightedRms.value / 0.000707107).toBeGreaterThan(0.99);
    expect(a.weightedRms.value / 0.000707107).toBeLessThan(1.01);
    expect(Math.abs(a.speedError.value)).toBeLessThan(1e-6);
  });

  it("reads the same deviation through hum 20 dB and noise 40 dB below the tone", () => {
    const a = read({ carrierHz: 3150, deviationHz: 3.15, rateHz: 4, hum: 0.1, noise: 0.01 });
    expect(a.weightedPeak.value / 0.001).toBeGreaterThan(0.97);
    expect(a.weightedPeak.value / 0.001).toBeLessThan(1.03);
  });

  it("weights a 20 Hz flutter by the table's −5.9 dB (AES6-2008 Table 1, ±2 dB)", () => {
    // ±0.2 % at 20 Hz: 0.2 % · 10^(−5.9/20) = 0.1014 %; the tolerance band is 10^(±2/20).
    const a = read({ carrierHz: 3150, deviationHz: 6.3, rateHz: 20 });
    const expected = 0.002 * 10 ** (-5.9 / 20);
    expect(a.weightedPeak.value).toBeGreaterThan(expected * 10 ** (-2 / 20));
    expect(a.weightedPeak.value).toBeLessThan(expected * 10 ** (2 / 20));
    expect(a.unweightedPeak.value / 0.002).toBeCloseTo(1, 1);
  });

  it("a tone 0.5 % fast reads +0.5 % speed error; 1 % slow reads −1 %", () => {
    // Speed error = (f_measured − f_nominal) / f_nominal: 3165.75 Hz against 3150 Hz is +0.500 %.
    expect(read({ carrierHz: 3150, offset: 0.005 }).speedError.value).toBeCloseTo(0.005, 6);
    expect(read({ carrierHz: 3150, offset: -0.01 }).speedError.value).toBeCloseTo(-0.01, 6);
  });

  it("a speed that ramps by 0.2 % over 10 s drifts 0.18 % between 1 s averages, and barely registers weighted", () => {
    // Derived by hand: 1 s averages of a linear ramp centre on 0.5 s … 9.5 s, so they span 0.9 × 0.2 %.
    const a = read({ carrierHz: 3150, ramp: 0.002 });
    expect(a.drift.value).toBeCloseTo(0.0018, 5);
    expect(a.weightedPeak.value).toBeLessThan(0.00002);
  });

  it("3000 Hz for the WRMS convention: ±3 Hz at 4 Hz reads 0.0707 % WRMS", () => {
    const a = read({ carrierHz: 3000, deviationHz: 3, rateHz: 4 }, { nominalHz: 3000, convention: "WRMS" });
    expect(a.weightedRms.value / 0.000707107).toBeGreaterThan(0.99);
    expect(a.weightedRms.value / 0.000707107).toBeLessThan(1.01);
  });

  it("refuses a tone far from the stated one, and one shorter than AES6-2008's 5 s", () => {
    const refused = (f: () => unknown) => {
      try {
        f();
      } catch (e) {
        return isCaptureError(e) ? e.code : "other";
      }
      return null;
    };
    expect(refused(() => read({ carrierHz: 3800 }))).toBe("wrong_test_tone");
    expect(refused(() => read({ carrierHz: 3150, seconds: 3 }))).toBe("too_short");
  });
});

describe("a wow & flutter capture on a turntable's bench sheet", () => {
  it("gives speed error and weighted peak readings that earn the turntable its mark", () => {
    const bytes = wavFromSamples(
      [wowToneSamples({ sampleRate: FS, carrierHz: 3150, offset: 0.002, deviationHz: 1.89, rateHz: 0.5 })],
      FS,
      "16",
    );
    const conditions = captureConditionsSchema.parse({ kind: "wow_flutter", testToneHz: 3150, speedRpm: 33.333 });
    const r = analyseCapture(bytes, "tt-3150.wav", conditions, "cap-1");
    if (r.kind !== "wow_flutter") throw new Error("expected a wow & flutter analysis");
    const speed = r.readings.find((x) => x.quantity === "speed_error")!;
    const wf = r.readings.find((x) => x.quantity === "wow_flutter")!;
    expect(speed.value).toBeCloseTo(0.002, 5);
    expect(wf.conditions).toMatchObject({ weighting: "IEC-60386-peak", testToneHz: 3150, speedRpm: 33.333 });
    // ±0.06 % at 0.5 Hz (five whole cycles, so the mean speed is the offset): the table puts 0.5 Hz between −8.4 dB (0.63 Hz) and −15.0 dB (0.4 Hz).
    expect(wf.value).toBeGreaterThan(0.0006 * 10 ** (-17 / 20));
    expect(wf.value).toBeLessThan(0.0006 * 10 ** (-6.4 / 20));
    const sheet: BenchSheet = { category: "turntable", readings: r.readings, sweeps: [] };
    const verdict = checkBenchSheet(sheet);
    expect(verdict.results.find((x) => x.ruleId === "speed-error")?.outcome).toBe("consistent");
    expect(verdict.results.find((x) => x.ruleId === "wow-flutter")?.outcome).toBe("consistent");
    expect(verdict.benchVerified).toBe(true);
  });
});
