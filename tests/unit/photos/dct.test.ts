import { describe, expect, it } from "vitest";
import fc from "fast-check";
import { forwardDct, forwardScale, inverseDct, inverseScale } from "~/photos/dct";

// The factored transforms against the direct sums of T.81 A.3.3, on random blocks.
const C = (k: number) => (k === 0 ? Math.SQRT1_2 : 1);
function directForward(samples: number[]): number[] {
  const out: number[] = [];
  for (let v = 0; v < 8; v++)
    for (let u = 0; u < 8; u++) {
      let s = 0;
      for (let y = 0; y < 8; y++)
        for (let x = 0; x < 8; x++)
          s += samples[y * 8 + x] * Math.cos(((2 * x + 1) * u * Math.PI) / 16) * Math.cos(((2 * y + 1) * v * Math.PI) / 16);
      out.push((C(u) * C(v) * s) / 4);
    }
  return out;
}
function directInverse(coefficients: number[]): number[] {
  const out: number[] = [];
  for (let y = 0; y < 8; y++)
    for (let x = 0; x < 8; x++) {
      let s = 0;
      for (let v = 0; v < 8; v++)
        for (let u = 0; u < 8; u++)
          s +=
            C(u) * C(v) * coefficients[v * 8 + u] * Math.cos(((2 * x + 1) * u * Math.PI) / 16) * Math.cos(((2 * y + 1) * v * Math.PI) / 16);
      out.push(s / 4);
    }
  return out;
}

const ones = Array<number>(64).fill(1);
const block = fc.array(fc.integer({ min: -128, max: 127 }), { minLength: 64, maxLength: 64 });

describe("8 × 8 DCT", () => {
  it("forward: the factored form times its scale equals the direct sums", () => {
    const scale = forwardScale(ones);
    fc.assert(
      fc.property(block, (samples) => {
        const b = Float32Array.from(samples);
        forwardDct(b);
        const want = directForward(samples);
        for (let i = 0; i < 64; i++) expect(b[i] * scale[i]).toBeCloseTo(want[i], 2);
      }),
      { numRuns: 200 },
    );
  });

  it("inverse: the factored form of pre-scaled coefficients equals the direct sums", () => {
    const scale = inverseScale(ones);
    const coefficients = fc.array(fc.integer({ min: -1024, max: 1023 }), { minLength: 64, maxLength: 64 });
    fc.assert(
      fc.property(coefficients, fc.integer({ min: 0, max: 63 }), (raw, keep) => {
        // Many real blocks have only their first few coefficients: exercise the shortcut too.
        const coef = raw.map((c, i) => (i <= keep ? c : 0));
        const b = Float32Array.from(coef, (c, i) => c * scale[i]);
        inverseDct(b);
        const want = directInverse(coef);
        for (let i = 0; i < 64; i++) expect(b[i]).toBeCloseTo(want[i], 2);
      }),
      { numRuns: 200 },
    );
  });
});
