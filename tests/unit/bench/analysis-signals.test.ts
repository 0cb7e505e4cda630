// Capture analysis on signals whose answer is known by hand: high harmonics, one-sided and short
// clipping, a tone away from where the seller said, a tone barely above the noise, noise density,
// resolution flags, and what a capture hands the bench sheet.
import { describe, expect, it } from "vitest";
import {
  analyseSine,
  analyseSquare,
  computeWindow,
  findClippedRun,
  sineToReadings,
  storedAnalysisSchema,
  type CaptureScale,
  type SineCaptureConditions,
} from "@shared/bench/analysis";
import { checkBenchSheet, parseValue, toUnit } from "@shared/bench";
import { toneSamples } from "../../support/capture-files";

const FS = 48_000;
const SCALE: CaptureScale = { kind: "volts-per-full-scale", volts: 1, basis: "peak" };
const sine = (x: Float64Array, c: Partial<Parameters<typeof analyseSine>[2]> = {}) => analyseSine([x], FS, { scale: SCALE, ...c });
const codeOf = (f: () => unknown) => {
  try {
    f();
  } catch (e) {
    return (e as { code?: string }).code;
  }
  return "no error";
};

describe("THD counts harmonics 2 to 10 (IEC 60268-3 THD_F, harmonics within the bandwidth)", () => {
  it("energy only at harmonics 6–10, 0.1 % each, gives THD = √5 × 0.1 % = 0.2236 %", () => {
    // f0 = 1 kHz, so the 10th harmonic (10 kHz) is inside the 20 kHz bandwidth.
    const x = toneSamples({ sampleRate: FS, seconds: 1, f0: 1000, peak: 0.5, harmonics: [1, 0, 0, 0, 0, 1e-3, 1e-3, 1e-3, 1e-3, 1e-3] });
    const ch = sine(x).channels[0];
    expect(ch.thd.ratio).toBeCloseTo(Math.sqrt(5) * 1e-3, 6);
    expect(ch.harmonics.map((h) => h.order)).toEqual([2, 3, 4, 5, 6, 7, 8, 9, 10]);
    expect(ch.harmonics[8].relativePercent.value).toBeCloseTo(0.1, 4);
  });
});

describe("clipping: a run of 4 samples at full scale, on either side, is the analyser's overload", () => {
  const at = (values: number[]) => Float64Array.from([0.1, 0.2, ...values, 0.2, 0.1]);
  const top = 32767 / 32768; // largest 16-bit code as a fraction of full scale
  it("finds a run of 4 on the negative side only", () => {
    expect(findClippedRun(at([-1, -1, -1, -1]), top)).toEqual({ index: 2, length: 4 });
  });
  it("finds a run of 4 on the positive side, and reports the whole run's length", () => {
    expect(findClippedRun(at([top, top, top, top, top, top]), top)).toEqual({ index: 2, length: 6 });
  });
  it("a negative run is measured to its end", () => {
    expect(findClippedRun(at([-1, -1, -1, -1, -1]), top)?.length).toBe(5);
  });
  it("runs of 2 and 3 samples are a peak touching full scale, not clipping", () => {
    expect(findClippedRun(at([-1, -1]), top)).toBeNull();
    expect(findClippedRun(at([top, top, top]), top)).toBeNull();
    expect(findClippedRun(at([-1, -1, -1, 0.5, -1, -1, -1]), top)).toBeNull();
  });
  it("a sine whose negative half is flattened at −1 for several samples is caught", () => {
    const x = toneSamples({ sampleRate: FS, seconds: 0.01, f0: 1000, peak: 1.2 }).map((v) => Math.max(-1, Math.min(0.99, v)));
    expect(findClippedRun(x, 1)).not.toBeNull();
  });
});

describe("the fundamental is sought within ±10 % of the stated frequency", () => {
  const tone = (f0: number) => toneSamples({ sampleRate: FS, seconds: 1, f0, peak: 0.5 });
  it.each([800, 1200])("a %d Hz tone is not taken for a stated 1 kHz", (f0) => {
    expect(codeOf(() => sine(tone(f0), { fundamentalHz: 1000 }))).toBe("no_fundamental");
  });
  it.each([920, 1080])("a %d Hz tone is found for a stated 1 kHz", (f0) => {
    expect(sine(tone(f0), { fundamentalHz: 1000 }).channels[0].fundamental.frequency.value).toBeCloseTo(f0, 1);
  });
});

describe("a fundamental must stand 30 dB clear of the noise in the same bins", () => {
  // White noise of rms σ over 0–24 kHz puts σ²/32768 in each of the 65536-point FFT's bins; the
  // fundamental's zone is 33 bins, so the noise there is σ²·33/32768. A tone of peak A holds A²/2.
  const sigma = 0.01;
  const zoneNoise = (sigma * sigma * 33) / 32768;
  const peakFor = (clearDb: number) => Math.sqrt(2 * zoneNoise * 10 ** (clearDb / 10));
  const x = (clearDb: number) => toneSamples({ sampleRate: FS, seconds: 1, f0: 1000, peak: peakFor(clearDb), noiseRms: sigma });
  it("20 dB clear is refused: no fundamental", () => {
    expect(codeOf(() => sine(x(20), { fundamentalHz: 1000 }))).toBe("no_fundamental");
  });
  it("40 dB clear is analysed", () => {
    expect(sine(x(40), { fundamentalHz: 1000 }).channels[0].fundamental.frequency.value).toBeCloseTo(1000, 0);
  });
});

describe("noise density is the band's noise over the square root of its width (V/√Hz)", () => {
  it("white noise of rms σ over 0–24 kHz has density σ/√24000 whatever the measurement bandwidth", () => {
    const sigma = 1e-3;
    const x = toneSamples({ sampleRate: FS, seconds: 2, f0: 1000, peak: 0.5, noiseRms: sigma });
    for (const bw of [
      { lowHz: 20, highHz: 20_000 },
      { lowHz: 400, highHz: 10_000 },
    ]) {
      const ch = sine(x, { bandwidth: bw }).channels[0];
      const width = bw.highHz - bw.lowHz;
      // Noise in the band: σ·√(width/24000); density σ/√24000 = 6.455e-6 V/√Hz for 1 V full scale.
      expect(ch.noise.rms.value / (sigma * Math.sqrt(width / 24_000))).toBeCloseTo(1, 1);
      expect(ch.noise.density.value / (sigma / Math.sqrt(24_000))).toBeCloseTo(1, 1);
      expect(ch.noise.density.unit).toBe("V/√Hz");
    }
  });
});

describe("resolution: what a capture is too short or too coarse to show", () => {
  it("a 5 Hz resolution needs 0.2 s; a 0.15 s capture is refused as too short", () => {
    const x = toneSamples({ sampleRate: FS, seconds: 0.15, f0: 1000, peak: 0.5 });
    expect(codeOf(() => sine(x, { resolutionHz: 5 }))).toBe("too_short");
  });
  it("a rise spread over fewer than 4 samples is flagged: the true edge may be faster", () => {
    // Every rising edge a linear ramp over k + 1 sample intervals: 10–90 % takes 0.8·(k + 1) of them.
    const step = (k: number) => {
      const v = Array.from({ length: 400 }, (_, i) => (i % 100 < 50 ? 0 : Math.min(1, ((i % 100) - 49) / (k + 1))));
      return analyseSquare(
        Float64Array.from(v, (_, i) => i * 1e-6),
        Float64Array.from(v),
      );
    };
    expect(step(3).riseTime.value).toBeCloseTo(3.2e-6, 12);
    expect(step(3).resolutionLimited).toBe(true); // 3.2 intervals
    expect(step(5).resolutionLimited).toBe(false); // 4.8 intervals
  });
});

describe("what a sine capture hands the bench sheet", () => {
  const conditions: SineCaptureConditions = {
    kind: "sine",
    scale: { kind: "volts-per-full-scale", volts: 40, basis: "peak" },
    loadOhm: 8,
    weighting: "A",
    window: "blackman-harris-7",
    channelsDriven: "both",
  };
  // Peak 0.5 of a 40 V full scale is 20 V peak, 14.14 V rms: 20²/(2·8) = 25 W into 8 Ω.
  const x = toneSamples({ sampleRate: FS, seconds: 1, f0: 1000, peak: 0.5, harmonics: [1, 1e-3] });
  const a = analyseSine([x], FS, { scale: conditions.scale, loadOhms: 8, weighting: "A" });
  const readings = sineToReadings(a, conditions, "cap-1");
  const power = readings.find((r) => r.quantity === "output_power")!;

  it("power is the rms voltage squared over the load: 25 W", () => {
    expect(power.value).toBeCloseTo(25, 3);
  });
  it("the power keeps the distortion it was taken at (THD+N of the same capture)", () => {
    const thdN = readings.find((r) => r.quantity === "thd_n")!;
    expect(power.conditions.atDistortion).toEqual({ ratio: thdN.value, measure: "thd_n" });
  });
  it("distortion and noise are referred to the power, and carry the capture's weighting", () => {
    const thdN = readings.find((r) => r.quantity === "thd_n")!;
    expect(thdN.conditions.powerW).toBeCloseTo(25, 3);
    expect(thdN.conditions.weighting).toBe("A");
  });
  it("the capture's power and voltage agree with each other on the sheet", () => {
    const v = checkBenchSheet({ category: "power_amplifier", readings, sweeps: [] });
    expect(v.results.filter((r) => r.ruleId === "power-voltage-load").map((r) => r.outcome)).toEqual(["consistent"]);
  });
  it("an rms full scale is √2 times its peak: 10 V rms full scale, half scale, is 5 V rms", () => {
    const rms = analyseSine([toneSamples({ sampleRate: FS, seconds: 1, f0: 1000, peak: 0.5 })], FS, {
      scale: { kind: "volts-per-full-scale", volts: 10, basis: "rms" },
    });
    expect(rms.channels[0].fundamental.rms.value).toBeCloseTo(5, 4);
  });
  it("a stored analysis with a malformed channel is not read back as today's shape", () => {
    const bad = { ...a, channels: [...a.channels, { channel: "right" }] };
    expect(storedAnalysisSchema.safeParse(JSON.parse(JSON.stringify(a))).success).toBe(true);
    expect(storedAnalysisSchema.safeParse(bad).success).toBe(false);
  });
});

describe("levels and windows by their definitions (docs/references.md §7, §8)", () => {
  it("dBm is 10·log10(P / 1 mW): 30 dBm is 1 W, 20 dBm is 100 mW", () => {
    expect(parseValue("30 dBm")).toMatchObject({ ok: true, value: 1 });
    expect((parseValue("20 dBm") as { value: number }).value).toBeCloseTo(0.1, 12);
    expect(toUnit(1, "dBm", "power")).toBeCloseTo(30, 12);
    expect((parseValue("10 dBW") as { value: number }).value).toBeCloseTo(10, 12);
  });
  it("the 4-term Blackman-Harris window in its periodic form: 1 at the centre, a0 − a1 + a2 − a3 = 0.00006 at the ends", () => {
    // Harris, Proc. IEEE 66(1), 1978: a = 0.35875, 0.48829, 0.14128, 0.01168.
    const w = computeWindow("blackman-harris-4", 8);
    expect(w[4]).toBeCloseTo(1, 12);
    expect(w[0]).toBeCloseTo(0.00006, 12);
    // A periodic cosine sum averages exactly a0 over its period (its coherent gain).
    expect(w.reduce((s, v) => s + v, 0) / 8).toBeCloseTo(0.35875, 12);
  });
});
