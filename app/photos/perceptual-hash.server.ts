import { shrink, type Bitmap } from "./pixels.server";

// The copied-photo check's fingerprint: a 64-bit DCT hash. The picture is squeezed to 32 × 32 grey
// levels (area average), transformed with the orthonormal 2-D DCT-II, and the top-left 8 × 8 block of
// the lowest frequencies becomes the bits: the DC term (overall brightness) is left out and stays a
// 0 bit, each of the other 63 is 1 where its coefficient is above their median. Small edits (another
// size, heavier compression, a light crop, brighter) move few bits; another photo about half of them.
// Measurements and the threshold: docs/decisions/0023.

export const HASH_SIDE = 32;
/** Stored beside each hash (listing_photos.phash_scheme); 1 was the earlier library hash. */
export const PHASH_SCHEME = 2;
/** Rows and columns of the DCT the hash reads (the lowest frequencies, DC term at 0, 0). */
const BLOCK = 8;

/**
 * Two photos whose hashes differ in at most this many bits are treated as the same photo. Chosen from
 * the distances measured on the demo photos (tests/unit/photos/perceptual-hash-photos.test.ts,
 * `npx tsx scripts/photo-hash-distances.ts` for all of them; decision 0023).
 */
export const PHOTO_MATCH_MAX_DISTANCE = 10;

/** Orthonormal DCT-II basis, row k = frequency: C[k][n] = s_k · cos(π (2n + 1) k / 2N). */
function basis(n: number): Float64Array {
  const c = new Float64Array(n * n);
  for (let k = 0; k < n; k++) {
    const s = k === 0 ? Math.sqrt(1 / n) : Math.sqrt(2 / n);
    for (let i = 0; i < n; i++) c[k * n + i] = s * Math.cos((Math.PI * (2 * i + 1) * k) / (2 * n));
  }
  return c;
}

const BASES = new Map<number, Float64Array>();
function basisFor(n: number): Float64Array {
  let c = BASES.get(n);
  if (!c) BASES.set(n, (c = basis(n)));
  return c;
}

/**
 * The orthonormal 2-D DCT-II of an n × n row-major array (rows then columns), keeping the first
 * `keep` frequencies in each direction: out[u · keep + v], u the vertical and v the horizontal frequency.
 */
export function dct2d(values: ArrayLike<number>, n: number, keep = n): Float64Array {
  if (values.length !== n * n) throw new Error(`dct2d: expected ${n * n} values, got ${values.length}`);
  const c = basisFor(n);
  // Each row along x: rows[y · keep + v].
  const rows = new Float64Array(n * keep);
  for (let y = 0; y < n; y++) {
    for (let v = 0; v < keep; v++) {
      let sum = 0;
      for (let x = 0; x < n; x++) sum += c[v * n + x] * values[y * n + x];
      rows[y * keep + v] = sum;
    }
  }
  const out = new Float64Array(keep * keep);
  for (let u = 0; u < keep; u++) {
    for (let v = 0; v < keep; v++) {
      let sum = 0;
      for (let y = 0; y < n; y++) sum += c[u * n + y] * rows[y * keep + v];
      out[u * keep + v] = sum;
    }
  }
  return out;
}

/** 32 × 32 grey levels (Rec. 601 luma weights) by area average; the aspect ratio is not kept. */
export function greyThumbnail(image: Bitmap): Float64Array {
  const small = shrink(atLeastHashSide(image), HASH_SIDE, HASH_SIDE);
  const out = new Float64Array(HASH_SIDE * HASH_SIDE);
  for (let i = 0; i < out.length; i++) {
    const p = i * 4;
    out[i] = 0.299 * small.data[p] + 0.587 * small.data[p + 1] + 0.114 * small.data[p + 2];
  }
  return out;
}

/** A photo narrower or shorter than 32 px, its pixels repeated until both sides reach 32 (shrink only reduces). */
function atLeastHashSide(image: Bitmap): Bitmap {
  const fx = Math.ceil(HASH_SIDE / image.width);
  const fy = Math.ceil(HASH_SIDE / image.height);
  if (fx === 1 && fy === 1) return image;
  const width = image.width * fx;
  const height = image.height * fy;
  const data = Buffer.alloc(width * height * 4);
  for (let y = 0; y < height; y++) {
    for (let x = 0; x < width; x++) {
      const from = (Math.floor(y / fy) * image.width + Math.floor(x / fx)) * 4;
      image.data.copy(data, (y * width + x) * 4, from, from + 4);
    }
  }
  return { data, width, height };
}

/** The top-left 8 × 8 block of the grey picture's 2-D DCT, row-major (index 0 is the DC term). */
export function hashCoefficients(image: Bitmap): Float64Array {
  return dct2d(greyThumbnail(image), HASH_SIDE, BLOCK);
}

/**
 * Bits from the 8 × 8 block, first coefficient in the highest bit: the DC term's bit is always 0, each
 * other bit 1 when its coefficient is above the median of the 63 (so 31 ones); 16 hex digits.
 */
export function bitsAboveMedian(block: Float64Array): string {
  if (block.length !== 64) throw new Error("bitsAboveMedian: expected 64 coefficients");
  const median = Float64Array.from(block.subarray(1)).sort()[31];
  let bits = 0n;
  for (let i = 0; i < 64; i++) bits = (bits << 1n) | (i > 0 && block[i] > median ? 1n : 0n);
  return bits.toString(16).padStart(16, "0");
}

/** The photo's 64-bit DCT hash as 16 hex digits. */
export function dctHash(image: Bitmap): string {
  return bitsAboveMedian(hashCoefficients(image));
}

/** Bits that differ between two hashes (0 = the same picture; small = probably the same photo). */
export function hashDistance(a: string, b: string): number {
  let x = BigInt(`0x${a}`) ^ BigInt(`0x${b}`);
  let count = 0;
  for (; x; x &= x - 1n) count++; // clears the lowest set bit each time
  return count;
}
