import { describe, expect, it } from "vitest";
import { riaaPlaybackDb } from "@shared/bench/curves";
import { dbDomain, decimateMinMax, referenceLevel, responseSeries, thinEvenly } from "~/listings/plot-math";
import type { Sweep } from "@shared/bench";

describe("thinning a square-wave trace for the plot", () => {
  it("keeps every bucket's extremes, so a one-sample overshoot spike survives", () => {
    const n = 10_000;
    const t = Float64Array.from({ length: n }, (_, i) => i * 1e-8);
    const v = Float64Array.from({ length: n }, (_, i) => (Math.floor(i / 2500) % 2 ? 1 : -1));
    v[2501] = 1.3; // overshoot right after the first rising edge
    const out = decimateMinMax(t, v, 100);
    expect(out.length).toBeLessThanOrEqual(200);
    expect(Math.max(...out.map((p) => p.y))).toBe(1.3);
    expect(Math.min(...out.map((p) => p.y))).toBe(-1);
    // Time order is kept (the line must not double back).
    expect(out.every((p, i) => i === 0 || p.x > out[i - 1].x)).toBe(true);
  });
  it("passes short traces through untouched", () => {
    expect(decimateMinMax([0, 1, 2], [5, 6, 7], 100)).toEqual([
      { x: 0, y: 5 },
      { x: 1, y: 6 },
      { x: 2, y: 7 },
    ]);
  });
  it("thins evenly and keeps both ends", () => {
    const xs = Array.from({ length: 1000 }, (_, i) => i);
    const out = thinEvenly(xs, 10);
    expect(out).toHaveLength(10);
    expect(out[0]).toBe(0);
    expect(out[9]).toBe(999);
  });
});

const sweep = (kind: "flat" | "riaa", points: [number, number][]): Sweep => ({
  kind,
  origin: "typed",
  conditions: {},
  points: points.map(([frequencyHz, levelDb]) => ({ frequencyHz, levelDb })),
});

describe("frequency response for the plot", () => {
  it("is shown relative to its level at 1 kHz, interpolated in log frequency (common practice)", () => {
    const s = sweep("flat", [
      [100, -12.5],
      [500, -12],
      [2000, -12],
      [20_000, -15],
    ]);
    expect(referenceLevel(s.points)).toEqual({ levelDb: -12, atHz: 1000 });
    expect(responseSeries(s).points.map((p) => p.level)).toEqual([-0.5, 0, 0, -3]);
  });
  it("falls back to the point nearest 1 kHz when the sweep does not reach it", () => {
    expect(
      referenceLevel(
        sweep("flat", [
          [2000, 3],
          [5000, 2],
          [9000, 1],
        ]).points,
      ),
    ).toEqual({ levelDb: 3, atHz: 2000 });
  });
  it("an RIAA sweep that follows the playback curve deviates by 0 dB; the curve is +19.3 dB at 20 Hz and −19.6 dB at 20 kHz (IEC 60098)", () => {
    const fs = [20, 100, 1000, 10_000, 20_000];
    const s = sweep(
      "riaa",
      fs.map((f) => [f, 36 + riaaPlaybackDb(f)]),
    );
    const out = responseSeries(s);
    expect(out.riaa?.variant).toBe("riaa");
    for (const p of out.points) expect(Math.abs(p.deviation!)).toBeLessThan(0.002);
    expect(out.points[0].target).toBeCloseTo(19.27, 1);
    expect(out.points[4].target).toBeCloseTo(-19.62, 1);
  });
  it("an RIAA sweep 1 dB shy at 20 kHz shows that as its worst deviation", () => {
    const fs = [20, 100, 1000, 10_000, 20_000];
    const s = sweep(
      "riaa",
      fs.map((f) => [f, riaaPlaybackDb(f) - (f === 20_000 ? 1 : 0)]),
    );
    const out = responseSeries(s);
    expect(out.riaa?.worstDb).toBeCloseTo(-1, 2);
    expect(out.riaa?.atHz).toBe(20_000);
  });
});

describe("dB axis ranges", () => {
  it("hold the data on whole steps with at least the minimum span", () => {
    const [lo, hi] = dbDomain([-3.01, 0.2], 1, 6);
    expect(lo).toBeLessThanOrEqual(-3.01);
    expect(hi).toBeGreaterThanOrEqual(0.2);
    expect(hi - lo).toBeGreaterThanOrEqual(6);
    expect(Number.isInteger(lo) && Number.isInteger(hi)).toBe(true);
    const [a, b] = dbDomain([-86, -57.7, -141.6], 20, 40);
    expect([a, b]).toEqual([-160, -40]);
  });
});
