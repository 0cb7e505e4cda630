// The 8 × 8 DCT of JPEG in its fast factored form (Arai, Agui and Nakajima): about a fifth of the
// multiplications of the direct sums. The factored transforms leave each coefficient scaled by
// AAN[row] · AAN[column] (and 8 overall); the scale is folded into the quantisation tables, so
// quantising and dequantising cost nothing extra. Blocks are row-major: index = row · 8 + column.

const AAN = Float64Array.from({ length: 8 }, (_, k) => (k === 0 ? 1 : Math.cos((k * Math.PI) / 16) * Math.SQRT2));

/** Multipliers that dequantise and pre-scale a block for `inverseDct` (quant row-major). */
export function inverseScale(quant: ArrayLike<number>): Float32Array {
  return Float32Array.from({ length: 64 }, (_, i) => (quant[i] * AAN[i >> 3] * AAN[i & 7]) / 8);
}

/** Multipliers that scale and quantise the output of `forwardDct` (quant row-major). */
export function forwardScale(quant: ArrayLike<number>): Float32Array {
  return Float32Array.from({ length: 64 }, (_, i) => 1 / (quant[i] * AAN[i >> 3] * AAN[i & 7] * 8));
}

/**
 * In place: pre-scaled coefficients in, samples out (level-shifted by −128, not yet rounded).
 * Columns whose AC terms are all zero — most of them in photos — take a shortcut.
 */
export function inverseDct(b: Float32Array) {
  for (let c = 0; c < 8; c++) {
    if (b[c + 8] === 0 && b[c + 16] === 0 && b[c + 24] === 0 && b[c + 32] === 0 && b[c + 40] === 0 && b[c + 48] === 0 && b[c + 56] === 0) {
      const dc = b[c];
      for (let r = 1; r < 8; r++) b[c + r * 8] = dc;
      continue;
    }
    idct8(b, c, 8);
  }
  for (let r = 0; r < 64; r += 8) idct8(b, r, 1);
}

function idct8(b: Float32Array, o: number, s: number) {
  // Even part
  let t0 = b[o];
  let t1 = b[o + 2 * s];
  let t2 = b[o + 4 * s];
  let t3 = b[o + 6 * s];
  let t10 = t0 + t2;
  let t11 = t0 - t2;
  const t13 = t1 + t3;
  let t12 = (t1 - t3) * 1.414213562 - t13;
  t0 = t10 + t13;
  t3 = t10 - t13;
  t1 = t11 + t12;
  t2 = t11 - t12;
  // Odd part
  let t4 = b[o + s];
  let t5 = b[o + 3 * s];
  let t6 = b[o + 5 * s];
  let t7 = b[o + 7 * s];
  const z13 = t6 + t5;
  const z10 = t6 - t5;
  const z11 = t4 + t7;
  const z12 = t4 - t7;
  t7 = z11 + z13;
  t11 = (z11 - z13) * 1.414213562;
  const z5 = (z10 + z12) * 1.847759065;
  t10 = z5 - z12 * 1.0823922;
  t12 = z5 - z10 * 2.61312593;
  t6 = t12 - t7;
  t5 = t11 - t6;
  t4 = t10 - t5;
  b[o] = t0 + t7;
  b[o + 7 * s] = t0 - t7;
  b[o + s] = t1 + t6;
  b[o + 6 * s] = t1 - t6;
  b[o + 2 * s] = t2 + t5;
  b[o + 5 * s] = t2 - t5;
  b[o + 3 * s] = t3 + t4;
  b[o + 4 * s] = t3 - t4;
}

/** In place: level-shifted samples in, coefficients out (still scaled; multiply by `forwardScale`). */
export function forwardDct(b: Float32Array) {
  for (let r = 0; r < 64; r += 8) fdct8(b, r, 1);
  for (let c = 0; c < 8; c++) fdct8(b, c, 8);
}

function fdct8(b: Float32Array, o: number, s: number) {
  const d0 = b[o];
  const d1 = b[o + s];
  const d2 = b[o + 2 * s];
  const d3 = b[o + 3 * s];
  const d4 = b[o + 4 * s];
  const d5 = b[o + 5 * s];
  const d6 = b[o + 6 * s];
  const d7 = b[o + 7 * s];
  const t0 = d0 + d7;
  const t7 = d0 - d7;
  const t1 = d1 + d6;
  const t6 = d1 - d6;
  const t2 = d2 + d5;
  const t5 = d2 - d5;
  const t3 = d3 + d4;
  const t4 = d3 - d4;
  // Even part
  let t10 = t0 + t3;
  const t13 = t0 - t3;
  let t11 = t1 + t2;
  let t12 = t1 - t2;
  b[o] = t10 + t11;
  b[o + 4 * s] = t10 - t11;
  const z1 = (t12 + t13) * 0.707106781;
  b[o + 2 * s] = t13 + z1;
  b[o + 6 * s] = t13 - z1;
  // Odd part
  t10 = t4 + t5;
  t11 = t5 + t6;
  t12 = t6 + t7;
  const z5 = (t10 - t12) * 0.382683433;
  const z2 = 0.5411961 * t10 + z5;
  const z4 = 1.306562965 * t12 + z5;
  const z3 = t11 * 0.707106781;
  const z11 = t7 + z3;
  const z13 = t7 - z3;
  b[o + 5 * s] = z13 + z2;
  b[o + 3 * s] = z13 - z2;
  b[o + s] = z11 + z4;
  b[o + 7 * s] = z11 - z4;
}

// Reduced inverse transforms for decoding at 1/2, 1/4 or 1/8 scale: each output sample is the exact
// mean of the k × k samples (k = 8 / n) the full transform would give, taken straight from the
// coefficients: M[m][u] = C(u)/2 · (1/k) Σ_j cos((2(k·m + j) + 1)·u·π/16) (ITU-T T.81, A.3.3).
const REDUCE = new Map<number, Float32Array>();
function reduceMatrix(n: number): Float32Array {
  let m = REDUCE.get(n);
  if (m) return m;
  const k = 8 / n;
  m = new Float32Array(n * 8);
  for (let out = 0; out < n; out++) {
    for (let u = 0; u < 8; u++) {
      let sum = 0;
      for (let j = 0; j < k; j++) sum += Math.cos(((2 * (k * out + j) + 1) * u * Math.PI) / 16);
      m[out * 8 + u] = ((u === 0 ? Math.SQRT1_2 : 1) / 2) * (sum / k);
    }
  }
  REDUCE.set(n, m);
  return m;
}

/**
 * Dequantised coefficients (row-major, not pre-scaled) in, an n × n block of samples out (n = 4, 2
 * or 1; level-shifted by −128, not yet rounded). `tmp` holds 8 · n values.
 */
export function reducedIdct(b: Float32Array, n: number, out: Float32Array, tmp: Float32Array) {
  if (n === 1) {
    out[0] = b[0] / 8;
    return;
  }
  const m = reduceMatrix(n);
  for (let u = 0; u < 8; u++) {
    const r = u * 8;
    let any = false;
    for (let v = 0; v < 8; v++) if (b[r + v] !== 0) any = true;
    for (let x = 0; x < n; x++) {
      let sum = 0;
      if (any) for (let v = 0; v < 8; v++) sum += b[r + v] * m[x * 8 + v];
      tmp[u * n + x] = sum;
    }
  }
  for (let y = 0; y < n; y++) {
    for (let x = 0; x < n; x++) {
      let sum = 0;
      for (let u = 0; u < 8; u++) sum += m[y * 8 + u] * tmp[u * n + x];
      out[y * n + x] = sum;
    }
  }
}
