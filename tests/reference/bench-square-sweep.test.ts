import { describe, expect, it } from "vitest";
import { analyseCapture } from "~/bench/captures.server";
import { analyseSquare, analyseSweep, RISE_TIME_BANDWIDTH_EXACT } from "@shared/bench/analysis";
import { RIAA_IEC_TABLE, RIAA_PLAYBACK_TABLE } from "../support/published-tables";
import { singlePoleSquareCsv } from "../support/capture-files";

const enc = (s: string) => new TextEncoder().encode(s);

describe("rise time and bandwidth (single pole, 10–90 %)", () => {
  it("t_r · f−3dB = ln 9 / 2π = 0.3497 (textbook single-pole derivation)", () => {
    expect(RISE_TIME_BANDWIDTH_EXACT).toBeCloseTo(0.3497, 4);
    for (const f3dB of [20e3, 100e3, 500e3]) {
      const csv = singlePoleSquareCsv({ f3dB, period: 20 / f3dB, dt: 1 / (500 * f3dB) });
      const r = analyseCapture(enc(csv), "scope.csv", { kind: "square" }, "cap");
      if (r.kind !== "square") throw new Error("expected a square-wave analysis");
      expect(r.analysis.riseTime.value * f3dB).toBeCloseTo(0.3497, 4);
    }
  });

  it("a 20 kHz bandwidth gives a 17.5 µs rise time (computed from ln9/2π)", () => {
    const csv = singlePoleSquareCsv({ f3dB: 20e3, period: 0.5e-3, dt: 40e-9 });
    const r = analyseCapture(enc(csv), "scope.csv", { kind: "square" }, "cap");
    if (r.kind !== "square") throw new Error("expected a square-wave analysis");
    expect(r.analysis.riseTime.value * 1e6).toBeCloseTo(17.5, 1);
  });

  it("a 1.75 µs rise time means about 200 kHz of bandwidth (common practice: 0.35 / t_r)", () => {
    const f3dB = RISE_TIME_BANDWIDTH_EXACT / 1.75e-6;
    const csv = singlePoleSquareCsv({ f3dB, period: 40e-6, dt: 5e-9 });
    const r = analyseCapture(enc(csv), "scope.csv", { kind: "square" }, "cap");
    if (r.kind !== "square") throw new Error("expected a square-wave analysis");
    expect(r.analysis.riseTime.value * 1e6).toBeCloseTo(1.75, 3);
    expect(r.analysis.impliedBandwidth.value / 1e3).toBeCloseTo(200, 0);
    expect(r.analysis.overshoot.value).toBeLessThan(0.01); // a single pole never overshoots
  });

  it("overshoot of an underdamped second-order step: exp(−πζ/√(1−ζ²)) = 16.3 % at ζ = 0.5 (control-theory textbook)", () => {
    const zeta = 0.5;
    const wn = 2 * Math.PI * 50e3;
    const wd = wn * Math.sqrt(1 - zeta * zeta);
    const dt = 20e-9;
    const period = 200e-6;
    const time: number[] = [];
    const volts: number[] = [];
    // Closed-form step response, restarted at each edge (the half period is long enough to settle).
    for (let i = 0; i < Math.round((2 * period) / dt); i++) {
      const t = i * dt;
      const half = Math.floor(t / (period / 2));
      const since = t - half * (period / 2);
      const step = 1 - Math.exp(-zeta * wn * since) * (Math.cos(wd * since) + (zeta / Math.sqrt(1 - zeta * zeta)) * Math.sin(wd * since));
      time.push(t);
      volts.push(half % 2 === 0 ? step : 1 - step);
    }
    const a = analyseSquare(Float64Array.from(time), Float64Array.from(volts));
    const expected = 100 * Math.exp((-Math.PI * zeta) / Math.sqrt(1 - zeta * zeta));
    expect(expected).toBeCloseTo(16.3, 1);
    expect(a.overshoot.value).toBeCloseTo(expected, 1);
  });
});

describe("sweeps: deviation from flat and from the RIAA playback curve (IEC 60098)", () => {
  // Sweeps typed from IEC 60098's playback table (tests/support/published-tables.ts), rounded to 0.01 dB.
  const tf = Float64Array.from(RIAA_PLAYBACK_TABLE, ([hz]) => hz);
  const tableDb = (o = 0, tilt = (_f: number) => 0) => Float64Array.from(RIAA_PLAYBACK_TABLE, ([hz, db]) => o + db + tilt(hz));

  it("a phono stage typed from the RIAA table deviates by no more than the table's rounding", () => {
    const a = analyseSweep(tf, tableDb(35), { reference: "riaa" });
    expect(Math.abs(a.worstDeviation.deviation.value)).toBeLessThanOrEqual(0.005 + 1e-9);
    expect(a.levelAt1kHz.value).toBeCloseTo(35, 9);
    expect(a.minus3dB.low).toBeNull();
  });

  it("a stage whose treble is 0.5 dB hot from 10 kHz: worst deviation +0.5 dB, found in the treble", () => {
    const a = analyseSweep(
      tf,
      tableDb(0, (x) => (x >= 10_000 ? 0.5 : 0)),
      { reference: "riaa" },
    );
    expect(Math.abs(a.worstDeviation.deviation.value - 0.5)).toBeLessThanOrEqual(0.005 + 1e-9);
    expect(a.worstDeviation.frequency.value).toBeGreaterThanOrEqual(10_000);
    expect(a.conditions.band).toEqual({ lowHz: 20, highHz: 20_000 });
  });

  it("the IEC variant: a stage with the 7950 µs pole fits the IEC target, not the plain one (IEC 60098 amendment)", () => {
    const f = Float64Array.from(RIAA_IEC_TABLE, ([hz]) => hz);
    const levels = Float64Array.from(RIAA_IEC_TABLE, ([, db]) => db);
    expect(Math.abs(analyseSweep(f, levels, { reference: "riaa", iecPole: true }).worstDeviation.deviation.value)).toBeLessThanOrEqual(
      0.01,
    );
    // Against the plain curve it reads 3 dB low at 20 Hz (16.26 − 19.27 dB; the pole's corner is 20.02 Hz).
    expect(analyseSweep(f, levels, { reference: "riaa" }).worstDeviation.deviation.value).toBeCloseTo(-3.0, 1);
  });

  it("−3 dB points of a flat response with single-pole corners at 15 Hz and 60 kHz (computed)", () => {
    // A dense sweep so linear interpolation between points does not blur the corners.
    const f: number[] = [];
    for (let x = 5; x <= 200_000; x *= 1.01) f.push(x);
    const level = f.map((x) => 20 * Math.log10(1 / Math.sqrt((1 + (15 / x) ** 2) * (1 + (x / 60_000) ** 2))));
    // Levels in volts: the same response as a voltage ratio.
    const volts = level.map((db) => 2 * 10 ** (db / 20));
    for (const [lv, unit] of [
      [level, "dB"],
      [volts, "V"],
    ] as const) {
      const a = analyseSweep(Float64Array.from(f), Float64Array.from(lv), { levelUnit: unit });
      // Each pole also shades the other corner slightly; −3.01 dB sits at 15.0 Hz and 60 kHz only to ~0.1 %.
      expect(a.minus3dB.low!.value).toBeCloseTo(15, 0);
      expect(a.minus3dB.high!.value / 1000).toBeCloseTo(60, 0);
    }
  });
});
