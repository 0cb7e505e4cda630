// Perceptual hash of a photo, for spotting the same picture reused across listings (resized,
// recompressed or lightly edited copies land within a few bits of each other).
// DCT hash: grey 32×32, 2-D DCT-II, the 8×8 lowest frequencies, each bit set when its coefficient is
// above the median of the 63 non-DC ones (the median keeps the hash balanced on any image).

const N = 32;
const K = 8;

const COS: Float64Array = (() => {
  const t = new Float64Array(K * N);
  for (let u = 0; u < K; u++) for (let x = 0; x < N; x++) t[u * N + x] = Math.cos(((2 * x + 1) * u * Math.PI) / (2 * N));
  return t;
})();

export interface RgbaBitmap {
  data: Uint8Array | Buffer;
  width: number;
  height: number;
}

/** 64-bit hash as 16 hex digits. */
export function perceptualHash(bitmap: RgbaBitmap): string {
  const grey = greyscale32(bitmap);
  // Separable DCT: rows first (keeping K frequencies), then columns.
  const rows = new Float64Array(N * K);
  for (let y = 0; y < N; y++)
    for (let u = 0; u < K; u++) {
      let s = 0;
      for (let x = 0; x < N; x++) s += grey[y * N + x] * COS[u * N + x];
      rows[y * K + u] = s;
    }
  const coeffs = new Float64Array(K * K);
  for (let v = 0; v < K; v++)
    for (let u = 0; u < K; u++) {
      let s = 0;
      for (let y = 0; y < N; y++) s += rows[y * K + u] * COS[v * N + y];
      coeffs[v * K + u] = s;
    }
  const ac = Array.from(coeffs.subarray(1)).sort((a, b) => a - b);
  const median = (ac[30] + ac[31]) / 2;
  let hex = "";
  for (let nib = 0; nib < 16; nib++) {
    let n = 0;
    for (let b = 0; b < 4; b++) n = (n << 1) | (coeffs[nib * 4 + b] > median ? 1 : 0);
    hex += n.toString(16);
  }
  return hex;
}

/** Number of differing bits between two hashes (0 = same picture, 64 = opposite). */
export function hashDistance(a: string, b: string): number {
  if (a.length !== 16 || b.length !== 16) throw new Error("perceptual hashes are 16 hex digits");
  let d = 0;
  for (let i = 0; i < 16; i++) {
    let x = parseInt(a[i], 16) ^ parseInt(b[i], 16);
    while (x) {
      d += x & 1;
      x >>= 1;
    }
  }
  return d;
}

/** Area-averaged luma (ITU-R BT.601 weights) on a 32×32 grid. */
function greyscale32({ data, width, height }: RgbaBitmap): Float64Array {
  const out = new Float64Array(N * N);
  const count = new Float64Array(N * N);
  for (let y = 0; y < height; y++) {
    const gy = Math.min(N - 1, Math.floor((y * N) / height));
    for (let x = 0; x < width; x++) {
      const gx = Math.min(N - 1, Math.floor((x * N) / width));
      const i = (y * width + x) * 4;
      out[gy * N + gx] += 0.299 * data[i] + 0.587 * data[i + 1] + 0.114 * data[i + 2];
      count[gy * N + gx]++;
    }
  }
  for (let i = 0; i < out.length; i++) out[i] /= count[i] || 1;
  return out;
}
