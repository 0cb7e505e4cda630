import { describe, expect, it } from "vitest";
import { reducedIdct } from "~/photos/dct";
import { decodeJpegPlanes, decodeSequentialJpeg } from "~/photos/jpeg-decode.server";
import { planesToRgba } from "~/photos/jpeg-colour.server";
import { shrink } from "~/photos/pixels.server";
import { sceneJpeg } from "../../support/photo-files";

// Decoding at 1/2, 1/4 and 1/8 straight from the coefficients, and the zoom size made from the
// planes without a full-size RGBA copy, against the full decode followed by a box resize.

/** The 8 × 8 inverse DCT by its defining sums (ITU-T T.81, A.3.3), level shift left out. */
function directIdct(coef: number[]): number[] {
  const c = (u: number) => (u === 0 ? Math.SQRT1_2 : 1);
  const out: number[] = [];
  for (let y = 0; y < 8; y++)
    for (let x = 0; x < 8; x++) {
      let sum = 0;
      for (let v = 0; v < 8; v++)
        for (let u = 0; u < 8; u++)
          sum += c(u) * c(v) * coef[v * 8 + u] * Math.cos(((2 * x + 1) * u * Math.PI) / 16) * Math.cos(((2 * y + 1) * v * Math.PI) / 16);
      out.push(sum / 4);
    }
  return out;
}

let seed = 99;
const random = () => ((seed = (seed * 1103515245 + 12345) >>> 0) / 2 ** 32) * 2 - 1;

/** Mean of each k × k square of a `width`-wide plane. */
function boxMean(plane: ArrayLike<number>, width: number, height: number, stride: number, k: number) {
  const w = Math.floor(width / k);
  const h = Math.floor(height / k);
  const out = new Float64Array(w * h);
  for (let y = 0; y < h; y++)
    for (let x = 0; x < w; x++) {
      let sum = 0;
      for (let j = 0; j < k; j++) for (let i = 0; i < k; i++) sum += plane[(y * k + j) * stride + x * k + i];
      out[y * w + x] = sum / (k * k);
    }
  return { out, w, h };
}

describe("the reduced inverse DCT", () => {
  it.each([4, 2, 1])("gives the exact mean of each square of the full transform (%i samples a side)", (n) => {
    for (let trial = 0; trial < 20; trial++) {
      const coef = Array.from({ length: 64 }, (_, i) => Math.round(random() * (i === 0 ? 800 : 200 / (1 + (i >> 3) + (i & 7)))));
      const full = directIdct(coef);
      const want = boxMean(full, 8, 8, 8, 8 / n).out;
      const got = new Float32Array(n * n);
      reducedIdct(Float32Array.from(coef), n, got, new Float32Array(8 * n));
      for (let i = 0; i < n * n; i++) expect(got[i]).toBeCloseTo(want[i], 2);
    }
  });
});

describe("decoding a JPEG at a smaller scale", { timeout: 60_000 }, () => {
  it.each([2, 4, 8] as const)("1/%i matches the full decode averaged over each square, within one level", async (k) => {
    const jpeg = await sceneJpeg(5, 320, 240, 90);
    const full = decodeJpegPlanes(jpeg);
    const small = decodeJpegPlanes(jpeg, k);
    expect([small.width, small.height]).toEqual([320 / k, 240 / k]);
    for (const [i, c] of full.components.entries()) {
      const cw = (320 * c.h) / full.hMax;
      const ch = (240 * c.v) / full.vMax;
      const want = boxMean(c.plane, cw, ch, c.stride, k);
      const s = small.components[i];
      let worst = 0;
      // Both sides are rounded to whole levels (and clamped), so up to one level apart.
      for (let y = 0; y < want.h; y++)
        for (let x = 0; x < want.w; x++) worst = Math.max(worst, Math.abs(s.plane[y * s.stride + x] - want.out[y * want.w + x]));
      expect(worst, `component ${i}`).toBeLessThanOrEqual(1);
    }
  });

  it("makes the zoom size from the planes as the full RGBA decode shrunk would, within a few levels at a few pixels", async () => {
    const jpeg = await sceneJpeg(6, 400, 300, 90);
    const planes = decodeJpegPlanes(jpeg);
    const reference = shrink(decodeSequentialJpeg(jpeg), 240, 180);
    const zoom = planesToRgba(planes, 1, { width: 240, height: 180 });
    expect([zoom.width, zoom.height]).toEqual([240, 180]);
    let total = 0;
    let worst = 0;
    for (let i = 0; i < zoom.data.length; i++) {
      const d = Math.abs(zoom.data[i] - reference.data[i]);
      total += d;
      worst = Math.max(worst, d);
    }
    // Averaging YCbCr then converting differs from converting then averaging only by rounding and
    // by clamping at the ends of the range: a few levels at a few saturated pixels (0.02 on average
    // and 6 at most, measured).
    expect(total / zoom.data.length).toBeLessThan(0.1);
    expect(worst).toBeLessThanOrEqual(8);
  });
});
