import fc from "fast-check";
import { describe, expect, it } from "vitest";
import {
  gridPath,
  hzDomain,
  hzTick,
  levelAtHz,
  linePath,
  linearScale,
  linearTicks,
  logGrid,
  logScale,
  logTicks,
  niceDomain,
  round125,
} from "~/components/plots/scale";

describe("log-frequency axis", () => {
  const s = logScale([20, 20_000]);
  it("gives each decade the same width", () => {
    expect(s(20)).toBe(0);
    expect(s(20_000)).toBe(1);
    expect(s(200)).toBeCloseTo(1 / 3, 12);
    expect(s(2000)).toBeCloseTo(2 / 3, 12);
  });
  it("puts an octave at the same width anywhere along it", () => {
    fc.assert(
      fc.property(fc.double({ min: 20, max: 10_000, noNaN: true }), (f) => {
        expect(s(2 * f) - s(f)).toBeCloseTo(Math.log10(2) / 3, 9);
      }),
    );
  });
  it("ticks at 1, 2 and 5 × 10ⁿ, decades and ends labelled on a phone, the rest minor", () => {
    const ticks = logTicks([20, 20_000]);
    expect(ticks.map((t) => t.value)).toEqual([20, 50, 100, 200, 500, 1000, 2000, 5000, 10_000, 20_000]);
    expect(ticks.map((t) => t.label)).toEqual(["20", "50", "100", "200", "500", "1k", "2k", "5k", "10k", "20k"]);
    expect(ticks.filter((t) => !t.minor).map((t) => t.label)).toEqual(["20", "100", "1k", "10k", "20k"]);
  });
  it("leaves a decade unlabelled on a phone when it would crowd the end's label", () => {
    // 100 kHz sits 0.30 of a decade from 200 kHz: 7 % of a 10 Hz–200 kHz axis, too close for two labels.
    const ticks = logTicks([10, 200_000]);
    expect(ticks.filter((t) => !t.minor).map((t) => t.label)).toEqual(["10", "100", "1k", "10k", "200k"]);
  });
  it("ticks land inside the axis for any 1-2-5 domain", () => {
    fc.assert(
      fc.property(
        fc.integer({ min: 0, max: 2 }),
        fc.integer({ min: 0, max: 2 }),
        fc.integer({ min: 0, max: 3 }),
        fc.integer({ min: 1, max: 4 }),
        (a, b, p, span) => {
          const lo = [1, 2, 5][a] * 10 ** p;
          const hi = [1, 2, 5][b] * 10 ** (p + span);
          const ticks = logTicks([lo, hi]);
          const scale = logScale([lo, hi]);
          expect(ticks[0].value).toBe(lo);
          expect(ticks[ticks.length - 1].value).toBe(hi);
          for (const t of ticks) {
            expect(scale(t.value)).toBeGreaterThanOrEqual(-1e-12);
            expect(scale(t.value)).toBeLessThanOrEqual(1 + 1e-12);
          }
          expect(ticks.every((t, i) => i === 0 || t.value > ticks[i - 1].value)).toBe(true);
        },
      ),
    );
  });
  it("draws graph paper at 1…9 × 10ⁿ", () => {
    const grid = logGrid([20, 20_000]);
    expect(grid.slice(0, 9)).toEqual([20, 30, 40, 50, 60, 70, 80, 90, 100]);
    expect(grid).toHaveLength(8 + 9 + 9 + 2);
    expect(grid.at(-1)).toBe(20_000);
  });
  it("widens a sweep's span to 1-2-5 values", () => {
    expect(hzDomain([22, 1000, 19_500])).toEqual([20, 20_000]);
    expect(hzDomain([10, 100_000])).toEqual([10, 100_000]);
    expect(hzDomain([15, 40_000])).toEqual([10, 50_000]);
    expect(hzDomain([])).toEqual([20, 20_000]);
    expect(round125(0.7)).toBe(0.5);
    expect(round125(0.7, true)).toBe(1);
  });
  it("labels frequencies the trade's way", () => {
    expect([20, 1000, 1500, 20_000, 1_000_000].map(hzTick)).toEqual(["20", "1k", "1.5k", "20k", "1M"]);
  });
});

describe("linear axes", () => {
  it("ticks on whole steps with a true minus sign", () => {
    expect(linearTicks([-3, 3], 1).map((t) => t.label)).toEqual(["−3", "−2", "−1", "0", "1", "2", "3"]);
    expect(linearTicks([-1, 1], 0.5).map((t) => t.value)).toEqual([-1, -0.5, 0, 0.5, 1]);
  });
  it("fits a range around the values, on whole steps, at least the span asked for", () => {
    fc.assert(
      fc.property(
        fc.array(
          fc.integer({ min: -20_000, max: 20_000 }).map((v) => v / 100),
          { minLength: 1, maxLength: 50 },
        ) /* dB to 0.01 */,
        fc.integer({ min: 1, max: 40 }),
        (values, minSpan) => {
          const { domain, step } = niceDomain(values, minSpan);
          expect(domain[0]).toBeLessThanOrEqual(Math.min(...values));
          expect(domain[1]).toBeGreaterThanOrEqual(Math.max(...values));
          expect(domain[1] - domain[0]).toBeGreaterThanOrEqual(minSpan - 1e-9);
          expect(Math.abs(domain[0] / step - Math.round(domain[0] / step))).toBeLessThan(1e-6);
        },
      ),
    );
  });
});

describe("paths", () => {
  const sx = linearScale([0, 10]);
  const sy = linearScale([0, 10]);
  it("runs y downwards: a higher level sits nearer the top", () => {
    expect(
      linePath(
        [
          { x: 0, y: 0 },
          { x: 5, y: 10 },
          { x: 10, y: 2.5 },
        ],
        sx,
        sy,
      ),
    ).toBe("M0 1000L500 0L1000 750");
  });
  it("breaks the line at a point it cannot place instead of joining across the gap", () => {
    const d = linePath(
      [
        { x: 1, y: 1 },
        { x: 2, y: NaN },
        { x: 3, y: 3 },
        { x: 4, y: 4 },
      ],
      sx,
      sy,
    );
    expect(d).toBe("M100 900M300 700L400 600");
  });
  it("draws grid lines across the whole plot, none outside it", () => {
    expect(gridPath([0.5, 1.5], [0.25])).toBe("M500 0V1000M0 750H1000");
  });
  it("reads a level between measured points in log frequency", () => {
    const pts = [
      { hz: 100, db: 0 },
      { hz: 1000, db: 10 },
    ];
    expect(levelAtHz(pts, 10 ** 2.5)).toBeCloseTo(5, 9);
    expect(levelAtHz(pts, 1000)).toBe(10);
    expect(levelAtHz(pts, 50)).toBeUndefined();
    expect(levelAtHz(pts, 2000)).toBeUndefined();
  });
});
