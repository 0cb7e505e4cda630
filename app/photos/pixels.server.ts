// Pixel work done in tight loops over the RGBA buffer: jimp's general-purpose compositing and
// two-pass resize cost several times more on camera-sized photos, and the worker has no native help.

export type Bitmap = { data: Buffer; width: number; height: number };

/** True when some pixel is not fully opaque. */
export function hasTransparency(src: Bitmap): boolean {
  const d = src.data;
  for (let i = 3; i < d.length; i += 4) if (d[i] !== 255) return true;
  return false;
}

/**
 * The image over a white ground, fully opaque (JPEG has no alpha; the encoder would use black).
 * In place: a photo-sized copy is memory the worker does not have to spare.
 */
export function flattenInPlace(src: Bitmap): Bitmap {
  const d = src.data;
  for (let i = 0; i < d.length; i += 4) {
    const a = d[i + 3];
    if (a === 255) continue;
    const k = 255 - a;
    d[i] = (d[i] * a + 255 * k + 127) / 255;
    d[i + 1] = (d[i + 1] * a + 255 * k + 127) / 255;
    d[i + 2] = (d[i + 2] * a + 255 * k + 127) / 255;
    d[i + 3] = 255;
  }
  return src;
}

/**
 * Area-averaging reduction to `width` × `height` (each output pixel is the mean of the source area it
 * covers, so fine detail does not alias). Only for shrinking; alpha is taken as opaque.
 */
export function shrink(src: Bitmap, width: number, height: number): Bitmap {
  if (width > src.width || height > src.height) throw new Error("shrink only reduces");
  if (width === src.width && height === src.height) return { data: Buffer.from(src.data), width, height };
  const sx = src.width / width;
  const sy = src.height / height;
  const xSpans = spans(src.width, width, sx);
  const out = Buffer.alloc(width * height * 4);
  const row = new Float64Array(width * 3);
  const acc = new Float64Array(width * 3);
  const d = src.data;

  for (let y = 0; y < height; y++) {
    acc.fill(0);
    const top = y * sy;
    const bottom = top + sy;
    for (let ys = Math.floor(top); ys < Math.min(src.height, Math.ceil(bottom)); ys++) {
      const wy = Math.min(bottom, ys + 1) - Math.max(top, ys);
      if (wy <= 0) continue;
      reduceRow(d, ys * src.width * 4, xSpans, row);
      for (let i = 0; i < row.length; i++) acc[i] += row[i] * wy;
    }
    const norm = 1 / (sx * sy);
    let o = y * width * 4;
    for (let x = 0; x < width; x++) {
      out[o] = Math.round(acc[x * 3] * norm);
      out[o + 1] = Math.round(acc[x * 3 + 1] * norm);
      out[o + 2] = Math.round(acc[x * 3 + 2] * norm);
      out[o + 3] = 255;
      o += 4;
    }
  }
  return { data: out, width, height };
}

export type Spans = { first: Int32Array; last: Int32Array; wFirst: Float64Array; wLast: Float64Array };

// For each output column: the source columns it covers and the partial weights at either end.
export function spans(srcLen: number, outLen: number, scale: number): Spans {
  const s: Spans = {
    first: new Int32Array(outLen),
    last: new Int32Array(outLen),
    wFirst: new Float64Array(outLen),
    wLast: new Float64Array(outLen),
  };
  for (let x = 0; x < outLen; x++) {
    const left = x * scale;
    const right = Math.min(srcLen, left + scale);
    const first = Math.floor(left);
    const last = Math.min(srcLen - 1, Math.ceil(right) - 1);
    s.first[x] = first;
    s.last[x] = last;
    s.wFirst[x] = Math.min(right, first + 1) - left;
    s.wLast[x] = last > first ? right - last : 0;
  }
  return s;
}

function reduceRow(d: Buffer, offset: number, s: Spans, row: Float64Array) {
  for (let x = 0; x < s.first.length; x++) {
    const first = s.first[x];
    const last = s.last[x];
    let p = offset + first * 4;
    let wgt = s.wFirst[x];
    let r = d[p] * wgt;
    let g = d[p + 1] * wgt;
    let b = d[p + 2] * wgt;
    for (let xs = first + 1; xs < last; xs++) {
      p += 4;
      r += d[p];
      g += d[p + 1];
      b += d[p + 2];
    }
    if (last > first) {
      p = offset + last * 4;
      wgt = s.wLast[x];
      r += d[p] * wgt;
      g += d[p + 1] * wgt;
      b += d[p + 2] * wgt;
    }
    row[x * 3] = r;
    row[x * 3 + 1] = g;
    row[x * 3 + 2] = b;
  }
}

/** Width and height with the long edge at most `longEdge`; never larger than the source. */
export function fitWithin(width: number, height: number, longEdge: number): { width: number; height: number } {
  const long = Math.max(width, height);
  if (long <= longEdge) return { width, height };
  const scale = longEdge / long;
  return { width: Math.max(1, Math.round(width * scale)), height: Math.max(1, Math.round(height * scale)) };
}
