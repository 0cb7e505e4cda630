import { describe, expect, it } from "vitest";
import { analyseCapture, isCaptureError } from "~/bench/captures.server";
import { captureConditionsSchema, type CaptureConditionsInput } from "@shared/bench/analysis";
import { prng, wavFromSamples } from "../support/capture-files";

// Channel separation, intermodulation and output impedance from synthesised WAV captures of known
// answer, through the whole capture path (24-bit WAV → decode → windowed FFT → tone zones). Each
// expected value is derived by hand beside its test, never by the code under test.

const TAU = 2 * Math.PI;

function run(channels: Float64Array[], fs: number, conditions: CaptureConditionsInput) {
  return analyseCapture(wavFromSamples(channels, fs, "24"), "capture.wav", captureConditionsSchema.parse(conditions), "cap-ref");
}

function make(fs: number, seconds: number, f: (t: number, i: number) => number): Float64Array {
  const n = Math.round(fs * seconds);
  const x = new Float64Array(n);
  for (let i = 0; i < n; i++) x[i] = f(i / fs, i);
  return x;
}

function imd(channels: Float64Array[], fs: number, method: "smpte" | "dfd") {
  const r = run(channels, fs, { kind: "imd", method });
  if (r.kind !== "imd") throw new Error("expected an imd analysis");
  return r;
}

describe("SMPTE intermodulation (SMPTE RP120; IEC 60268-3 modulation distortion: d_m = √(d_m2² + d_m3²), pairs summed, re U(f2))", () => {
  // 60 Hz at 0.4 and 7 kHz at 0.1 of full scale: the method's 4:1.
  const A1 = 0.4;
  const A2 = 0.1;

  it.each([0.01, 0.001])("a 7 kHz tone amplitude-modulated %f deep at 60 Hz reads d_m = that depth", (m) => {
    // A2·(1 + m·cos ω1t)·sin ω2t = A2·sin ω2t + (A2·m/2)·[sin(ω2+ω1)t + sin(ω2−ω1)t]:
    // each first sideband is A2·m/2, the pair sums to A2·m, so d_m2 = m and d_m3 = 0 → d_m = m.
    const x = make(48_000, 2, (t) => A1 * Math.sin(TAU * 60 * t) + A2 * (1 + m * Math.cos(TAU * 60 * t)) * Math.sin(TAU * 7000 * t));
    const r = imd([x], 48_000, "smpte");
    const ch = r.analysis.channels[0];
    expect(ch.imd.ratio / m).toBeCloseTo(1, 3);
    expect(ch.amplitudeRatio).toBeCloseTo(4, 3);
    expect(r.readings).toHaveLength(1);
    expect(r.readings[0]).toMatchObject({ quantity: "imd", unit: "%", origin: "capture", basis: "measured" });
    expect(r.readings[0].value / m).toBeCloseTo(1, 3);
  });

  it("second- and third-order sidebands combine as rms of the orders: 0.3 % and 0.4 % → 0.5 %", () => {
    // AM at 60 Hz depth 0.003 and at 120 Hz depth 0.004: d_m2 = 0.003, d_m3 = 0.004, d_m = √(0.003² + 0.004²) = 0.005.
    const x = make(48_000, 2, (t) => {
      const env = 1 + 0.003 * Math.cos(TAU * 60 * t) + 0.004 * Math.cos(TAU * 120 * t);
      return A1 * Math.sin(TAU * 60 * t) + A2 * env * Math.sin(TAU * 7000 * t);
    });
    const ch = imd([x], 48_000, "smpte").analysis.channels[0];
    expect(ch.second).toBeCloseTo(0.003, 6);
    expect(ch.third).toBeCloseTo(0.004, 6);
    expect(ch.imd.ratio).toBeCloseTo(0.005, 6);
  });

  it("a second-order nonlinearity y = x + a·x² reads d_m2 = 2·a·A1 (1 % for a = 0.0125, A1 = 0.4)", () => {
    // a·(2·A1 sin ω1t · A2 sin ω2t) = a·A1·A2·[cos(ω2−ω1)t − cos(ω2+ω1)t]: each sideband a·A1·A2,
    // the pair 2·a·A1·A2, over U(f2) = A2 (x² adds nothing at f2): d_m2 = 2·0.0125·0.4 = 0.01.
    const x = make(48_000, 2, (t) => {
      const v = A1 * Math.sin(TAU * 60 * t) + A2 * Math.sin(TAU * 7000 * t);
      return v + 0.0125 * v * v;
    });
    const ch = imd([x], 48_000, "smpte").analysis.channels[0];
    expect(ch.second).toBeCloseTo(0.01, 5);
    expect(ch.third).toBeLessThan(1e-5);
    expect(ch.imd.percent.value).toBeCloseTo(1, 3);
  });

  it("a clean two-tone reads no intermodulation (below 0.001 %) on both channels of a stereo file", () => {
    const x = make(48_000, 1, (t) => A1 * Math.sin(TAU * 60 * t) + A2 * Math.sin(TAU * 7000 * t));
    const r = imd([x, x], 48_000, "smpte");
    expect(r.analysis.channels.map((c) => c.channel)).toEqual(["left", "right"]);
    for (const ch of r.analysis.channels) expect(ch.imd.ratio).toBeLessThan(1e-5);
  });

  it("without the 7 kHz tone the capture is refused", () => {
    const x = make(48_000, 1, (t) => A1 * Math.sin(TAU * 60 * t));
    expect(() => imd([x], 48_000, "smpte")).toThrow(/high tone/);
  });
});

describe("Difference-frequency distortion (IEC 60268-3: d_2 = U(f2−f1)/(2·U(f2)), d_3 = (U(2f1−f2) + U(2f2−f1))/(2·U(f2)))", () => {
  const A = 0.4; // each of 19 and 20 kHz, equal amplitudes as the method asks

  it("a second-order nonlinearity y = x + a·x² reads d_2 = a·A/2 (1 % for a = 0.05, A = 0.4)", () => {
    // a·2·A² sin ω1t sin ω2t = a·A²·[cos(ω2−ω1)t − cos(ω2+ω1)t]: U(1 kHz) = a·A², and
    // d_2 = a·A² / (2·A) = a·A/2 = 0.05·0.4/2 = 0.01.
    const x = make(96_000, 1, (t) => {
      const v = A * Math.sin(TAU * 19_000 * t) + A * Math.sin(TAU * 20_000 * t);
      return v + 0.05 * v * v;
    });
    const r = imd([x], 96_000, "dfd");
    const ch = r.analysis.channels[0];
    expect(ch.second).toBeCloseTo(0.01, 6);
    expect(ch.amplitudeRatio).toBeCloseTo(1, 4);
    expect(r.readings[0].value).toBeCloseTo(0.01, 6);
    expect(r.readings[0].note).toMatch(/difference-frequency/);
  });

  it("a third-order nonlinearity y = x + b·x³ reads d_3 = (3/4)·b·A² / (1 + (9/4)·b·A²) and no d_2", () => {
    // (sin α + sin β)³ holds (3/4) at 2β−α and at 2α−β, and (3/4 + 3/2) = 9/4 at each tone, so
    // U(18k) = U(21k) = (3/4)·b·A³ and U(f2) = A + (9/4)·b·A³. With b = 0.05, A = 0.4 (b·A² = 0.008):
    // d_3 = 2·(3/4)·0.008·A / (2·A·(1 + 9/4·0.008)) = 0.006 / 1.018 = 0.0058939.
    const x = make(96_000, 1, (t) => {
      const v = A * Math.sin(TAU * 19_000 * t) + A * Math.sin(TAU * 20_000 * t);
      return v + 0.05 * v * v * v;
    });
    const ch = imd([x], 96_000, "dfd").analysis.channels[0];
    expect(ch.third).toBeCloseTo(0.0058939, 6);
    expect(ch.second).toBeLessThan(1e-6);
  });

  it("a 44.1 kHz capture holds the 21 kHz product; 20 + 21 kHz tones would put d_3 at 22 kHz, past its 22.05 kHz limit", () => {
    const x = make(44_100, 1, (t) => A * Math.sin(TAU * 19_000 * t) + A * Math.sin(TAU * 20_000 * t));
    expect(imd([x], 44_100, "dfd").analysis.channels[0].imd.ratio).toBeLessThan(1e-5);
    const c = captureConditionsSchema.parse({ kind: "imd", method: "dfd", lowToneHz: 20_000, highToneHz: 21_000 });
    expect(() => analyseCapture(wavFromSamples([x], 44_100, "24"), "c.wav", c, "cap-ref")).toThrow(/higher rate/);
  });
});

function separation(channels: Float64Array[], fs: number) {
  const r = run(channels, fs, { kind: "separation" });
  if (r.kind !== "separation") throw new Error("expected a separation analysis");
  return r;
}

describe("Channel separation (IEC 60268-3 crosstalk: 20·log10 of driven over undriven level at the test tone)", () => {
  const noise = (seed: number, rms: number) => {
    const r = prng(seed);
    return () => (r() - 0.5) * rms * Math.sqrt(12);
  };

  it("a leak of 1/1000 of the driven 1 kHz tone reads 60.0 dB on the undriven side", () => {
    // 20·log10(1000) = 60 dB exactly; a 1e-6 noise floor is 60 dB below the leak.
    const n = noise(3, 1e-6);
    const left = make(48_000, 1, (t) => 0.5 * Math.sin(TAU * 1000 * t));
    const right = make(48_000, 1, (t) => 0.0005 * Math.sin(TAU * 1000 * t + 1) + n());
    const r = separation([left, right], 48_000);
    expect(r.analysis.driven).toBe("left");
    expect(r.readings).toHaveLength(1);
    expect(r.readings[0]).toMatchObject({ quantity: "crosstalk", unit: "dB", channel: "right", origin: "capture" });
    expect(r.readings[0].value).toBeCloseTo(60, 1);
    expect(r.readings[0].conditions.frequencyHz).toBeCloseTo(1000, 2);
  });

  it("a stepped capture (100 Hz, 1 kHz, 10 kHz, 1 s each) gives one reading per step, right side driven", () => {
    // Leaks 1e-4, 10^(−70/20) and 10^(−50/20) of the driven tone: 80, 70 and 50 dB.
    const n = noise(5, 1e-7);
    const steps: [number, number][] = [
      [100, 1e-4],
      [1000, 10 ** (-70 / 20)],
      [10_000, 10 ** (-50 / 20)],
    ];
    const driven = make(48_000, 3, (t) => 0.5 * Math.sin(TAU * steps[Math.min(2, Math.floor(t))][0] * t));
    const leak = make(48_000, 3, (t) => {
      const [f, k] = steps[Math.min(2, Math.floor(t))];
      return 0.5 * k * Math.sin(TAU * f * t + 0.5) + n();
    });
    const r = separation([leak, driven], 48_000);
    expect(r.analysis.driven).toBe("right");
    expect(r.readings.map((x) => Math.round(x.conditions.frequencyHz ?? 0))).toEqual([100, 1000, 10_000]);
    expect(r.readings.map((x) => x.value)).toEqual([80, 70, 50]);
    for (const x of r.readings) expect(x.channel).toBe("left");
  });

  it("a harmonic of the test tone (3 % second harmonic) is not read as a test tone of its own", () => {
    const n = noise(7, 1e-6);
    const left = make(48_000, 1, (t) => 0.5 * Math.sin(TAU * 1000 * t) + 0.015 * Math.sin(TAU * 2000 * t));
    const right = make(48_000, 1, (t) => 0.005 * Math.sin(TAU * 1000 * t) + n());
    const r = separation([left, right], 48_000);
    expect(r.readings).toHaveLength(1);
    expect(r.readings[0].value).toBeCloseTo(40, 1);
  });

  it("a leak hidden in the noise reads as a floor, flagged, not as a figure better than the noise allows", () => {
    const n = noise(9, 1e-5);
    const left = make(48_000, 1, (t) => 0.5 * Math.sin(TAU * 1000 * t));
    const right = make(48_000, 1, () => n());
    const r = separation([left, right], 48_000);
    expect(r.analysis.points[0].belowNoise).toBe(true);
    expect(r.readings[0].note).toMatch(/at least/);
  });

  it("a leak 4 dB over the undriven side's noise is flagged; 15 dB over it reads its own value (within 10 dB: common practice)", () => {
    // White noise of rms 1e-5 spread over 24 kHz; the 1 kHz zone (33 bins of 0.73 Hz) holds
    // 1e-10 · 33/32768 = 1.0e-13 of it. A leak of rms 5e-7 holds 2.5e-13 (4 dB over), one of rms 1.778e-6
    // 3.16e-12 (15 dB over): separation 20·log10(0.35355/1.778e-6) = 106.0 dB.
    const left = make(48_000, 1, (t) => 0.5 * Math.sin(TAU * 1000 * t));
    for (const [leakRms, flagged] of [
      [5e-7, true],
      [1.778e-6, false],
    ] as const) {
      const n = noise(11, 1e-5);
      const right = make(48_000, 1, (t) => leakRms * Math.SQRT2 * Math.sin(TAU * 1000 * t) + n());
      const p = separation([left, right], 48_000).analysis.points[0];
      expect(p.belowNoise).toBe(flagged);
      // The noise in the zone (1/30 of the leak's power) adds to or takes from it by up to about 1 dB.
      if (!flagged) expect(Math.abs(p.separation.value - 106.0)).toBeLessThan(1);
    }
  });

  it("a mono file is refused: separation needs both sides", () => {
    const x = make(48_000, 1, (t) => 0.5 * Math.sin(TAU * 1000 * t));
    try {
      separation([x], 48_000);
      throw new Error("accepted");
    } catch (e) {
      expect(isCaptureError(e) && e.code).toBe("kind_mismatch");
    }
  });
});

function zout(channels: Float64Array[], fs: number, loadOhm: number, nominalLoadOhm?: number) {
  const r = run(channels, fs, { kind: "output_impedance", loadOhm, ...(nominalLoadOhm ? { nominalLoadOhm } : {}) });
  if (r.kind !== "output_impedance") throw new Error("expected an output-impedance analysis");
  return r;
}

describe("Output impedance and damping factor (Thévenin divider: Z_out = R·(V_open/V_loaded − 1); DF = R_nominal/Z_out)", () => {
  it("0.05 Ω behind an 8 Ω load reads 0.05 Ω and a damping factor of 160", () => {
    // V_loaded = V_open·8/(8 + 0.05). The damping-factor example 8 Ω / 0.05 Ω = 160 (audio glossaries).
    const loaded = 8 / 8.05;
    const x = make(48_000, 2, (t) => 0.5 * (t < 1 ? 1 : loaded) * Math.sin(TAU * 1000 * t));
    const r = zout([x], 48_000, 8, 8);
    expect(r.analysis.channels[0].outputImpedance.value).toBeCloseTo(0.05, 4);
    const [z, df] = r.readings;
    expect(z).toMatchObject({ quantity: "output_impedance", unit: "mΩ", origin: "capture" });
    expect(z.value).toBeCloseTo(0.05, 4);
    expect(df).toMatchObject({ quantity: "damping_factor", unit: "", conditions: { loadOhm: 8 } });
    expect(df.value).toBeCloseTo(160, 0);
  });

  it("loaded first, a pause to switch, then open: the order does not matter (0.2 Ω into 4 Ω, DF 40 into 8 Ω)", () => {
    // V_loaded = V_open·4/4.2; Z_out = 4·(4.2/4 − 1) = 0.2 Ω; DF = 8/0.2 = 40.
    const x = make(48_000, 2.2, (t) => (t < 1 ? 4 / 4.2 : t < 1.2 ? 0 : 1) * 0.6 * Math.sin(TAU * 400 * t));
    const r = zout([x, x], 48_000, 4, 8);
    expect(r.analysis.channels).toHaveLength(2);
    for (const ch of r.analysis.channels) {
      expect(ch.outputImpedance.value).toBeCloseTo(0.2, 4);
      expect(ch.dampingFactor).toBeCloseTo(40, 1);
    }
  });

  it("a line output of 600 Ω into 10 kΩ reads 600 Ω and no damping factor", () => {
    // V_loaded = V_open·10000/10600 → Z_out = 10000·(10600/10000 − 1) = 600 Ω.
    const x = make(48_000, 1, (t) => (t < 0.5 ? 1 : 10_000 / 10_600) * 0.5 * Math.sin(TAU * 1000 * t));
    const r = zout([x], 48_000, 10_000);
    expect(r.readings).toHaveLength(1);
    expect(r.readings[0].value).toBeCloseTo(600, 1);
  });

  it("a tone at one steady level is refused: there is no loaded reading to compare", () => {
    const n = prng(4);
    const x = make(48_000, 1, (t) => 0.5 * Math.sin(TAU * 1000 * t) + (n() - 0.5) * 1e-5);
    expect(() => zout([x], 48_000, 8, 8)).toThrow(/one steady level/);
  });
});
