import { describe, expect, it } from "vitest";
import { fitWithin, flattenInPlace, shrink } from "~/photos/pixels.server";

const bitmap = (width: number, height: number, pixels: number[][]) => ({
  width,
  height,
  data: Buffer.from(pixels.flatMap(([r, g, b, a = 255]) => [r, g, b, a])),
});

describe("pixel helpers", () => {
  it("shrinks by averaging the area each output pixel covers", () => {
    // 4 × 2 to 2 × 1: each output pixel is the mean of a 2 × 2 block.
    const src = bitmap(4, 2, [
      [0, 0, 0],
      [100, 0, 0],
      [0, 40, 0],
      [0, 80, 0],
      [200, 0, 0],
      [100, 0, 0],
      [0, 0, 0],
      [0, 0, 120],
    ]);
    expect([...shrink(src, 2, 1).data]).toEqual([100, 0, 0, 255, 0, 30, 30, 255]);
  });

  it("weights partly covered source pixels (3 → 2 columns)", () => {
    // Output 0 covers source 0 fully and half of 1: (90·1 + 30·0.5) / 1.5 = 70.
    const src = bitmap(3, 1, [
      [90, 90, 90],
      [30, 30, 30],
      [0, 0, 0],
    ]);
    expect([...shrink(src, 2, 1).data]).toEqual([70, 70, 70, 255, 10, 10, 10, 255]);
  });

  it("keeps the long edge within bounds and never enlarges", () => {
    expect(fitWithin(4000, 3000, 1200)).toEqual({ width: 1200, height: 900 });
    expect(fitWithin(3000, 4000, 400)).toEqual({ width: 300, height: 400 });
    expect(fitWithin(800, 600, 2400)).toEqual({ width: 800, height: 600 });
    expect(fitWithin(20000, 10, 400)).toEqual({ width: 400, height: 1 });
  });

  it("puts transparent pixels on white", () => {
    const src = bitmap(2, 1, [
      [0, 0, 0, 0],
      [0, 0, 0, 128],
    ]);
    expect([...flattenInPlace(src).data]).toEqual([255, 255, 255, 255, 127, 127, 127, 255]);
    expect([...src.data]).toEqual([255, 255, 255, 255, 127, 127, 127, 255]); // no copy
  });
});
