import { describe, expect, it } from "vitest";
import { analyseCapture } from "~/bench/captures.server";
import { captureConditionsSchema, type CaptureConditionsInput } from "@shared/bench/analysis";
import { wavFromSamples } from "../support/capture-files";

// Levels in volts and watts from the two-tone, separation and output-impedance captures, and how the
// output-impedance reading tells its two levels apart. Synthesised 24-bit WAVs of known answer; every
// expected value is derived by hand beside its test.

const TAU = 2 * Math.PI;
const FS = 48_000;
/** A full-scale sample stands for 40 V peak at the unit's output. */
const SCALE = { kind: "volts-per-full-scale", volts: 40, basis: "peak" } as const;

function run(channels: Float64Array[], conditions: CaptureConditionsInput) {
  return analyseCapture(wavFromSamples(channels, FS, "24"), "capture.wav", captureConditionsSchema.parse(conditions), "cap-levels");
}

function make(seconds: number, f: (t: number) => number): Float64Array {
  const x = new Float64Array(Math.round(FS * seconds));
  for (let i = 0; i < x.length; i++) x[i] = f(i / FS);
  return x;
}

describe("the level a two-tone test is stated at: the rms of a sine with the same peak as the two tones together", () => {
  it("60 Hz at 16 V peak plus 7 kHz at 4 V peak (SMPTE 4:1) is 20 V peak: 14.14 V rms, 25 W into 8 Ω", () => {
    // The two tones' peaks coincide now and then, so the composite's peak is the sum of their
    // amplitudes: (0.4 + 0.1) × 40 V = 20 V; a sine of that peak has 20/√2 = 14.142 V rms, and
    // 14.142² / 8 Ω = 25.0 W. (Adding the tones as rms, √(0.4² + 0.1²) × 40 V, would give 16.5 V.)
    const x = make(2, (t) => 0.4 * Math.sin(TAU * 60 * t) + 0.1 * Math.sin(TAU * 7000 * t));
    const r = run([x], { kind: "imd", method: "smpte", scale: SCALE, loadOhm: 8 });
    if (r.kind !== "imd") throw new Error("expected an imd analysis");
    const ch = r.analysis.channels[0];
    expect(ch.equivalentSineRms!.value).toBeCloseTo(14.142, 2);
    expect(ch.power!.value).toBeCloseTo(25, 1);
    expect(r.readings[0].conditions).toMatchObject({ powerW: 25, loadOhm: 8 });
  });
});

describe("the driven level of a separation capture (rms volts)", () => {
  it("a 1 kHz tone at half full scale is 20 V peak, 14.14 V rms, 25 W into 8 Ω", () => {
    // 0.5 × 40 V = 20 V peak; 20/√2 = 14.142 V rms; 14.142² / 8 Ω = 25.0 W.
    const left = make(1, (t) => 0.5 * Math.sin(TAU * 1000 * t));
    const right = make(1, (t) => 0.0005 * Math.sin(TAU * 1000 * t + 1));
    const r = run([left, right], { kind: "separation", scale: SCALE, loadOhm: 8 });
    if (r.kind !== "separation") throw new Error("expected a separation analysis");
    expect(r.analysis.points[0].drivenRms!.value).toBeCloseTo(14.142, 2);
    expect(r.readings[0].conditions).toMatchObject({ powerW: 25, loadOhm: 8 });
  });

  it("without a load the level is stated as the rms voltage", () => {
    const left = make(1, (t) => 0.5 * Math.sin(TAU * 1000 * t));
    const right = make(1, (t) => 0.0005 * Math.sin(TAU * 1000 * t + 1));
    const r = run([left, right], { kind: "separation", scale: SCALE });
    expect(r.readings[0].conditions.voltageV).toBeCloseTo(14.14, 2);
  });

  it("a stepped capture states no level: each tone fills only its own step of the window", () => {
    // 100 Hz, then 1 kHz, then 10 kHz, 1 s each at 0.5 of full scale (14.14 V rms): read over the whole
    // 3 s window, each tone's level is diluted by the steps it is absent from and weighted by where its
    // step falls under the window, so it says nothing of the 14.14 V it was played at; none is stated.
    const steps = [100, 1000, 10_000];
    const driven = make(3, (t) => 0.5 * Math.sin(TAU * steps[Math.min(2, Math.floor(t))] * t));
    const leak = make(3, (t) => 0.0005 * Math.sin(TAU * steps[Math.min(2, Math.floor(t))] * t + 0.5));
    const r = run([driven, leak], { kind: "separation", scale: SCALE, loadOhm: 8 });
    expect(r.readings).toHaveLength(3);
    for (const x of r.readings) {
      expect(x.conditions.powerW).toBeUndefined();
      expect(x.conditions.voltageV).toBeUndefined();
    }
  });
});

function zout(x: Float64Array, conditions: Omit<Extract<CaptureConditionsInput, { kind: "output_impedance" }>, "kind">) {
  const r = run([x], { kind: "output_impedance", ...conditions });
  if (r.kind !== "output_impedance") throw new Error("expected an output-impedance analysis");
  return r;
}

describe("output impedance: the two levels (Thévenin divider, Z_out = R·(V_open/V_loaded − 1))", () => {
  it("states both levels in rms volts: 20 V peak open is 14.14 V rms, into 8 Ω of a 0.05 Ω source 14.05 V", () => {
    // 0.5 × 40 V = 20 V peak, 14.142 V rms open; loaded 14.142 × 8/8.05 = 14.054 V.
    const x = make(2, (t) => 0.5 * (t < 1 ? 1 : 8 / 8.05) * Math.sin(TAU * 1000 * t));
    const ch = zout(x, { loadOhm: 8, scale: SCALE }).analysis.channels[0];
    expect(ch.openRms!.value).toBeCloseTo(14.142, 2);
    expect(ch.loadedRms!.value).toBeCloseTo(14.054, 2);
  });

  it("no block counted as open or loaded holds the switch between them", () => {
    // Blocks are 50 ms (2400 samples at 48 kHz; 8 cycles of 1 kHz is shorter). The load goes on at
    // 1.02 s, inside the block 1.00–1.05 s, which therefore holds both levels: it and every block
    // beside it must be left out ("between"), so no open block ends after 1.02 s and no loaded block
    // starts before it.
    const x = make(2, (t) => 0.5 * (t < 1.02 ? 1 : 4 / 4.2) * Math.sin(TAU * 1000 * t));
    const ch = zout(x, { loadOhm: 4 }).analysis.channels[0];
    const at = (part: string) => ch.levels.filter((l) => l.part === part).map((l) => Math.round(l.t * 1000));
    expect(Math.max(...at("open")) + 50).toBeLessThanOrEqual(1020);
    expect(Math.min(...at("loaded"))).toBeGreaterThanOrEqual(1020);
    expect(at("between")).toContain(1000);
    // 4·(4.2/4 − 1) = 0.2 Ω.
    expect(ch.outputImpedance.value).toBeCloseTo(0.2, 4);
  });

  it("a muting relay that leaves the tone 40 dB down while the load is switched is a pause, not a third level", () => {
    // Loaded (4 Ω behind 0.2 Ω) for 1 s, 0.5 s at 1 % of the open level while switching, open for 1 s:
    // still Z_out = 4·(4.2/4 − 1) = 0.2 Ω, read from the two levels either side of the pause.
    const x = make(2.5, (t) => (t < 1 ? 4 / 4.2 : t < 1.5 ? 0.01 : 1) * 0.6 * Math.sin(TAU * 400 * t));
    const r = zout(x, { loadOhm: 4, nominalLoadOhm: 8 });
    const ch = r.analysis.channels[0];
    expect(ch.outputImpedance.value).toBeCloseTo(0.2, 4);
    // DF = 8/0.2 = 40, quoted into the nominal 8 Ω, not the 4 Ω the level was read into.
    expect(ch.dampingFactor).toBeCloseTo(40, 1);
    const df = r.readings.find((x) => x.quantity === "damping_factor")!;
    expect(df.value).toBeCloseTo(40, 1);
    expect(df.conditions.loadOhm).toBe(8);
  });
});
