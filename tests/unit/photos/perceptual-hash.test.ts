import { describe, expect, it } from "vitest";
import {
  bitsAboveMedian,
  dct2d,
  dctHash,
  greyThumbnail,
  hashDistance,
  HASH_SIDE,
  PHOTO_MATCH_MAX_DISTANCE,
} from "~/photos/perceptual-hash.server";
import type { Bitmap } from "~/photos/pixels.server";

// The DCT is checked against closed forms derived by hand (each derivation in its comment); the
// hash's robustness on the demo photos is in perceptual-hash-photos.test.ts.

const N = HASH_SIDE;
const s = (k: number, n = N) => (k === 0 ? Math.sqrt(1 / n) : Math.sqrt(2 / n));
const cosine = (k: number, i: number, n = N) => Math.cos((Math.PI * (2 * i + 1) * k) / (2 * n));

/** An n × n array f(y, x), row-major. */
function grid(f: (y: number, x: number) => number, n = N): Float64Array {
  return Float64Array.from({ length: n * n }, (_, i) => f(Math.floor(i / n), i % n));
}

function greyBitmap(values: ArrayLike<number>, width: number, height: number): Bitmap {
  const data = Buffer.alloc(width * height * 4);
  for (let i = 0; i < width * height; i++) {
    data.fill(Math.round(values[i]), i * 4, i * 4 + 3);
    data[i * 4 + 3] = 255;
  }
  return { data, width, height };
}

describe("the orthonormal 2-D DCT-II", () => {
  it("puts a constant picture wholly in the DC term: X(0,0) = c · N, every other term 0", () => {
    // Σ_y Σ_x c · s_0² = c · N² / N.
    const out = dct2d(
      grid(() => 7),
      N,
    );
    expect(out[0]).toBeCloseTo(7 * N, 9);
    for (let i = 1; i < out.length; i++) expect(Math.abs(out[i])).toBeLessThan(1e-9);
  });

  it("turns one basis picture into one coefficient of 1 (the basis is orthonormal), anywhere in the block", () => {
    for (const [u, v] of [
      [1, 2],
      [5, 0],
      [8, 7],
      [31, 30],
    ]) {
      const out = dct2d(
        grid((y, x) => s(u) * cosine(u, y) * s(v) * cosine(v, x)),
        N,
      );
      for (let i = 0; i < out.length; i++) expect(out[i]).toBeCloseTo(i === u * N + v ? 1 : 0, 9);
    }
  });

  it("matches the ramp's closed form: X(0,k) = 0 for even k > 0 and −s_k cos θ / (2 sin² θ), θ = πk/2N, for odd k", () => {
    // f(y, x) = x. Along y the picture is constant, so only row u = 0 is non-zero and carries a factor
    // s_0 · N = √N. Along x: Σ_{n<N} n cos((2n+1)θ) = Re e^{iθ} Σ n z^n with z = e^{2iθ}; for odd k,
    // z^N = −1 and Σ n z^n = z(1 − N z^{N−1} + (N−1) z^N)/(1−z)² = (N + (2−N) z)/(1−z)², and
    // (1−z)² = −4 sin²θ e^{2iθ}, giving −cos θ / (2 sin² θ). For even k the terms n and N−1−n pair
    // into (N−1) Σ cos((2n+1)θ) = 0. The DC term is s_0 · √N · N(N−1)/2.
    const out = dct2d(
      grid((_, x) => x),
      N,
    );
    expect(out[0]).toBeCloseTo((s(0) * Math.sqrt(N) * (N * (N - 1))) / 2, 9);
    for (let k = 1; k < N; k++) {
      const theta = (Math.PI * k) / (2 * N);
      const expected = k % 2 === 0 ? 0 : (Math.sqrt(N) * s(k) * -Math.cos(theta)) / (2 * Math.sin(theta) ** 2);
      expect(out[k]).toBeCloseTo(expected, 9);
      for (let u = 1; u < N; u++) expect(Math.abs(out[u * N + k])).toBeLessThan(1e-9);
    }
  });

  it("keeps the energy of a picture (Parseval) and, with keep < n, returns the same top-left block", () => {
    let seed = 11;
    const noise = grid(() => ((seed = (seed * 16807) % 2147483647) / 2147483647) * 255);
    const out = dct2d(noise, N);
    const energy = (xs: Float64Array) => xs.reduce((a, x) => a + x * x, 0);
    expect(energy(out) / energy(noise)).toBeCloseTo(1, 9);
    const block = dct2d(noise, N, 9);
    for (let u = 0; u < 9; u++) for (let v = 0; v < 9; v++) expect(block[u * 9 + v]).toBeCloseTo(out[u * N + v], 9);
  });

  it("refuses an array of the wrong size", () => {
    expect(() => dct2d(new Float64Array(10), 4)).toThrow(/expected 16/);
  });
});

describe("the 64-bit hash", () => {
  it("sets the bits above the median of the 63 terms after the DC term, first coefficient first, the DC bit always 0", () => {
    // The DC term (index 0) is huge and must neither set its bit nor move the median.
    const alternating = Float64Array.from({ length: 64 }, (_, i) => (i === 0 ? 1e6 : i % 2 === 0 ? 10 + i : -i));
    expect(bitsAboveMedian(alternating)).toBe("2aaaaaaaaaaaaaaa");
    // A ramp 1…63 after the DC term: the median is 32, so terms 33…63 (31 of them) are 1.
    expect(bitsAboveMedian(Float64Array.from({ length: 64 }, (_, i) => (i === 0 ? -1e6 : i)))).toBe("000000007fffffff");
  });

  it("reads the top-left 8 × 8 block of the DCT of the grey picture, row-major, with the DC term left out", () => {
    // A picture built from basis images: +20 at the wanted bits' frequencies, −20 at the others, so
    // the hash must spell the wanted bits exactly (rounding to 8-bit levels moves coefficients by
    // about 0.3). Not symmetric, so swapping rows and columns would show. 31 ones besides the DC bit.
    const wanted = 0x53a5_19f0_6c2e_b847n;
    const picture = grid((y, x) => {
      let value = 128 + 40; // the DC term: brightness only, which the hash must not read
      for (let u = 0; u < 8; u++) {
        for (let v = 0; v < 8; v++) {
          if (u === 0 && v === 0) continue;
          const bit = (wanted >> BigInt(63 - (u * 8 + v))) & 1n;
          value += (bit ? 20 : -20) * s(u) * cosine(u, y) * s(v) * cosine(v, x);
        }
      }
      return value;
    });
    expect(dctHash(greyBitmap(picture, N, N))).toBe(wanted.toString(16));
    // Darker overall (the DC term) changes nothing.
    expect(
      dctHash(
        greyBitmap(
          grid((y, x) => picture[y * N + x] - 40),
          N,
          N,
        ),
      ),
    ).toBe(wanted.toString(16));
  });

  it("weighs colour by the Rec. 601 luma weights (0.299 R + 0.587 G + 0.114 B)", () => {
    const data = Buffer.alloc(N * N * 4);
    for (let i = 0; i < N * N; i++) data.set([200, 100, 50, 255], i * 4);
    expect(greyThumbnail({ data, width: N, height: N })[0]).toBeCloseTo(0.299 * 200 + 0.587 * 100 + 0.114 * 50, 9);
  });

  it("hashes a photo smaller than 32 px on a side (a thumbnail-sized upload) as its pixels enlarged, not an error", () => {
    // 16 × 8, left half 0 and right half 255: each pixel repeated 2 × 4 times is the 32 × 32 picture.
    const small = greyBitmap(
      Array.from({ length: 16 * 8 }, (_, i) => (i % 16 < 8 ? 0 : 255)),
      16,
      8,
    );
    const large = greyBitmap(
      grid((_y, x) => (x < 16 ? 0 : 255)),
      N,
      N,
    );
    expect(Array.from(greyThumbnail(small))).toEqual(Array.from(greyThumbnail(large)));
    expect(dctHash(greyBitmap([90], 1, 1))).toMatch(/^[0-9a-f]{1,16}$/);
  });

  it("counts differing bits", () => {
    expect(hashDistance("0000000000000000", "0000000000000000")).toBe(0);
    expect(hashDistance("ffffffffffffffff", "0000000000000000")).toBe(64);
    expect(hashDistance("8000000000000001", "0000000000000000")).toBe(2);
    expect(hashDistance("00000000000000f0", "000000000000000f")).toBe(8);
  });

  it("treats 10 differing bits or fewer as the same photo (decision 0023)", () => {
    expect(PHOTO_MATCH_MAX_DISTANCE).toBe(10);
  });
});
