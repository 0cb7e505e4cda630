import { describe, expect, it } from "vitest";
import { analyseCapture } from "~/bench/captures.server";
import { analyseSine, type SineCaptureConditions, type WindowName } from "@shared/bench/analysis";
import { aWeightingDb } from "@shared/bench/curves";
import { toneSamples, toneWav, type WavBits } from "../support/capture-files";

// THD of synthetic signals with known harmonic amplitudes, through the whole capture path
// (WAV written by wavefile → decoded → windowed FFT → power-summed harmonics).
// Definition: IEC 60268-3 / IEEE 1057 style THD_F = √(Σ U_n², n ≥ 2) / U_1 [from memory; docs/references.md §7].

const conditions = (extra: Partial<SineCaptureConditions> = {}): SineCaptureConditions => ({
  kind: "sine",
  scale: { kind: "volts-per-full-scale", volts: 1, basis: "peak" },
  weighting: "unweighted",
  window: "blackman-harris-7",
  ...extra,
});

function analyse(bytes: Uint8Array, c = conditions()) {
  const r = analyseCapture(bytes, "capture.wav", c, "cap-test");
  if (r.kind !== "sine") throw new Error("expected a sine analysis");
  return r.analysis;
}

// Worked example (computed; docs/references.md §8): amplitudes (1, 0.01, 0.001) → THD = √(0.01² + 0.001²) = 1.0049876 %.
const EXACT_THD = Math.hypot(0.01, 0.001);

// Quantisation noise that lands in the bins summed for each harmonic limits agreement: about −98 dB
// of noise for 16-bit at half scale, so 1e-4 of a −40 dB harmonic; far less for deeper formats.
const TOLERANCE: Record<WavBits, number> = { "8": 1, "16": 3e-4, "24": 3e-6, "32": 1e-7, "32f": 1e-6 };

describe("THD from WAV captures of every accepted format (computed worked example: 1.0049876 %)", () => {
  const formats: WavBits[] = ["16", "24", "32", "32f"];
  const rates = [44_100, 48_000, 96_000, 192_000];
  const cases: [WavBits, 1 | 2, number, number][] = [];
  let r = 0;
  for (const bits of formats)
    for (const channels of [1, 2] as const) for (const f0 of [1000, 1000.3]) cases.push([bits, channels, rates[r++ % rates.length], f0]);

  it.each(cases)("%s-bit, %d channel(s), %d Hz, f0 = %d Hz", (bits, channels, sampleRate, f0) => {
    const bytes = toneWav({ sampleRate, seconds: 0.5, f0, harmonics: [1, 0.01, 0.001], peak: 0.5, bits, channels, rightGain: 0.5 });
    const a = analyse(bytes);
    expect(a.channels).toHaveLength(channels);
    for (const ch of a.channels) {
      expect(Math.abs(ch.thd.ratio / EXACT_THD - 1)).toBeLessThan(TOLERANCE[bits]);
      expect(ch.fundamental.frequency.value).toBeCloseTo(f0, 3);
      expect(ch.harmonics[0].relativeDb.value).toBeCloseTo(-40, 2); // 0.01 → −40 dB
      expect(ch.harmonics[1].relativeDb.value).toBeCloseTo(-60, 1); // 0.001 → −60 dB
    }
  });

  it.each(rates)("24-bit stereo at %d Hz, 1 s, coherent and non-coherent", (sampleRate) => {
    for (const f0 of [1000, 1000.3]) {
      const a = analyse(toneWav({ sampleRate, seconds: 1, f0, harmonics: [1, 0.01, 0.001], peak: 0.5, bits: "24", channels: 2 }));
      for (const ch of a.channels) expect(Math.abs(ch.thd.ratio / EXACT_THD - 1)).toBeLessThan(TOLERANCE["24"]);
    }
  });
});

describe("THD_F and THD_R (IEC 60268-3:2013 worked example via an open-source library's reference data)", () => {
  it("harmonics (1, 0.1, 0.05, 0.02) give THD_F = 0.11357817 and THD_R = 0.11285260", () => {
    for (const bits of ["32f", "24"] as const) {
      const a = analyse(
        toneWav({ sampleRate: 48_000, seconds: 1, f0: 1000.3, harmonics: [1, 0.1, 0.05, 0.02], peak: 0.7, bits, channels: 1 }),
      );
      const ch = a.channels[0];
      expect(ch.thd.ratio).toBeCloseTo(0.11357817, 7);
      expect(ch.thdR.ratio).toBeCloseTo(0.1128526, 7);
    }
  });
});

describe("power-summing makes the window's choice and the cycle count immaterial (Harris, Proc. IEEE 66(1), 1978)", () => {
  // Computed (docs/references.md §8): at f0 = 1000.3 Hz, power-summing the bins around each harmonic gives the
  // exact THD with Blackman-Harris 4-term, Hann or flat-top; a single-bin read would not.
  const windows: WindowName[] = ["blackman-harris-7", "blackman-harris-4", "hann", "flat-top"];
  it.each(windows)("%s, fs = 48 kHz, N = 48000, f0 = 1000.3 Hz: THD = 1.0049876 % and level exact", (window) => {
    const x = toneSamples({ sampleRate: 48_000, seconds: 1, f0: 1000.3, harmonics: [1, 0.01, 0.001], peak: 1 });
    const a = analyseSine([x], 48_000, { scale: { kind: "volts-per-full-scale", volts: 1, basis: "peak" }, window });
    const ch = a.channels[0];
    expect(Math.abs(ch.thd.ratio / EXACT_THD - 1)).toBeLessThan(1e-7);
    expect(ch.thd.percent.value).toBeCloseTo(1.0049876, 6);
    expect(ch.thd.db.value).toBeCloseTo(-39.957, 3);
    expect(ch.fundamental.peak.value).toBeCloseTo(1, 6);
  });
});

describe("levels, watts and the trade's rules of thumb", () => {
  it("a 5 V peak-to-peak sine into 8 Ω is about 0.39 W (common practice; P = Vrms²/R)", () => {
    // Full scale stands for 5 V peak; a half-scale sine is 2.5 V peak = 5 Vpp.
    const bytes = toneWav({ sampleRate: 48_000, seconds: 0.5, f0: 1000, peak: 0.5, bits: "24", channels: 1 });
    const ch = analyse(bytes, conditions({ scale: { kind: "volts-per-full-scale", volts: 5, basis: "peak" }, loadOhm: 8 })).channels[0];
    expect(ch.fundamental.peak.value * 2).toBeCloseTo(5, 4);
    expect(ch.fundamental.rms.value).toBeCloseTo(5 / (2 * Math.SQRT2), 4);
    expect(ch.fundamental.power!.value).toBeCloseTo(0.39, 2);
    expect(ch.fundamental.power!.value).toBeCloseTo(0.390625, 4);
  });

  it("the analyser scale: 2 V rms full scale behind a 10:1 divider reads a half-scale sine as 10 V rms, 12.5 W into 8 Ω", () => {
    const bytes = toneWav({ sampleRate: 96_000, seconds: 0.5, f0: 1000, peak: 0.5, bits: "24", channels: 1 });
    const c = conditions({ scale: { kind: "analyser", fullScaleVolts: 2, basis: "rms", attenuation: 10 }, loadOhm: 8 });
    const ch = analyse(bytes, c).channels[0];
    expect(ch.fundamental.rms.value).toBeCloseTo(10, 4);
    expect(ch.fundamental.power!.value).toBeCloseTo(12.5, 3);
    expect(ch.fundamental.dBFS.value).toBeCloseTo(-6.02, 2); // half scale, 0 dBFS = full-scale sine (AES17 convention)
  });

  it("a second harmonic of 0.010 % reads −80 dB (common practice: 20·log10(1e-4))", () => {
    const bytes = toneWav({ sampleRate: 48_000, seconds: 1, f0: 1000, harmonics: [1, 1e-4], peak: 0.5, bits: "32", channels: 1 });
    const h2 = analyse(bytes).channels[0].harmonics[0];
    expect(h2.order).toBe(2);
    expect(h2.relativePercent.value).toBeCloseTo(0.01, 5);
    expect(h2.relativeDb.value).toBeCloseTo(-80, 2);
  });
});

describe("THD+N, noise, SNR, bandwidth and weighting", () => {
  const base = { sampleRate: 96_000, seconds: 1, f0: 1000, peak: 0.5, bits: "32" as const, channels: 1 as const };

  it("THD+N counts a non-harmonic tone; THD does not; SNR is the fundamental over it (definitions, IEC 60268-3 / AES17)", () => {
    const ch = analyse(toneWav({ ...base, harmonics: [1, 0.001], extra: [[5123, 1e-4]] })).channels[0];
    expect(ch.thd.ratio).toBeCloseTo(0.001, 7);
    expect(ch.thdN.ratio).toBeCloseTo(Math.hypot(0.001, 1e-4), 7);
    expect(ch.snr.value).toBeCloseTo(80, 1);
    expect(ch.noise.rms.value).toBeCloseTo((0.5 * 1e-4) / Math.SQRT2, 8);
  });

  it("AES17's 20 kHz bandwidth leaves out a 25 kHz tone; a 30 kHz bandwidth takes it in (AES17 standard low-pass filter)", () => {
    const bytes = toneWav({ ...base, extra: [[25_000, 1e-3]] });
    expect(analyse(bytes).channels[0].thdN.ratio).toBeLessThan(1e-6);
    const wide = analyse(bytes, conditions({ bandwidth: { lowHz: 20, highHz: 30_000 } })).channels[0];
    expect(wide.thdN.ratio).toBeCloseTo(1e-3, 6);
  });

  it("A-weighting in the frequency domain takes a 100 Hz hum down by A(100 Hz) = −19.1 dB (IEC 61672-1)", () => {
    const bytes = toneWav({ ...base, extra: [[100, 1e-3]] });
    const flat = analyse(bytes).channels[0];
    const weighted = analyse(bytes, conditions({ weighting: "A" })).channels[0];
    expect(flat.thdN.ratio).toBeCloseTo(1e-3, 6);
    expect(20 * Math.log10(weighted.thdN.ratio / flat.thdN.ratio)).toBeCloseTo(aWeightingDb(100), 2);
    expect(aWeightingDb(100)).toBeCloseTo(-19.1, 1);
    expect(weighted.thdN.weighting).toBe("A");
    // THD is a harmonic measure and stays unweighted.
    expect(weighted.thd.ratio).toBeCloseTo(flat.thd.ratio, 9);
  });

  it("harmonics above the bandwidth are listed but not counted in THD (common practice)", () => {
    const ch = analyse(toneWav({ ...base, f0: 8000, harmonics: [1, 0.01, 0.01] })).channels[0];
    const [h2, h3] = ch.harmonics;
    expect(h2.inBand).toBe(true);
    expect(h3.inBand).toBe(false);
    expect(h3.relativePercent.value).toBeCloseTo(1, 4);
    expect(ch.thd.ratio).toBeCloseTo(0.01, 6);
  });
});
