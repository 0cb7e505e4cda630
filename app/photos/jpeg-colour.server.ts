import { uprightLayout } from "./exif-orientation.server";
import { spans, type Bitmap, type Spans } from "./pixels.server";
import type { JpegPlanes, PlaneComponent } from "./jpeg-decode.server";

// From a JPEG's decoded planes to upright RGBA: colour conversion (JFIF's YCbCr; Adobe's transform
// flag for RGB and CMYK files), each component brought to the output size on its own — replicated
// when the output is the decoded size, area-averaged otherwise, so a photo becomes its largest
// derived size without a full-size RGBA copy ever existing — and each pixel written straight to its
// upright place.

/** `target`: the output size in the stored orientation (default: the decoded size). */
export function planesToRgba(p: JpegPlanes, orientation: number, target?: { width: number; height: number }): Bitmap {
  const tw = target?.width ?? p.width;
  const th = target?.height ?? p.height;
  const layout = uprightLayout(tw, th, orientation);
  const out = Buffer.alloc(tw * th * 4);
  const n = p.components.length;
  const ycc = n === 3 ? p.adobeTransform !== 0 : p.adobeTransform === 2;
  const same = tw === p.width && th === p.height;
  const fills = p.components.map((c) => (same ? replicate(c, p) : average(c, p, tw, th)));
  const rows = fills.map(() => new Float64Array(tw));
  const [r0, r1, r2, r3] = rows;
  const { dx } = layout;
  for (let y = 0; y < th; y++) {
    for (let i = 0; i < n; i++) fills[i](y, rows[i]);
    let o = layout.start + y * layout.dy;
    // One loop per kind, so the per-pixel work has no branches on the kind.
    if (n === 1) {
      for (let x = 0; x < tw; x++, o += dx) {
        const a = clamp(r0[x]);
        out[o] = a;
        out[o + 1] = a;
        out[o + 2] = a;
        out[o + 3] = 255;
      }
    } else if (n === 3 && ycc) {
      for (let x = 0; x < tw; x++, o += dx) {
        const a = r0[x];
        const cb = r1[x] - 128;
        const cr = r2[x] - 128;
        out[o] = clamp(a + 1.402 * cr);
        out[o + 1] = clamp(a - 0.3441363 * cb - 0.71413636 * cr);
        out[o + 2] = clamp(a + 1.772 * cb);
        out[o + 3] = 255;
      }
    } else if (n === 3) {
      for (let x = 0; x < tw; x++, o += dx) {
        out[o] = clamp(r0[x]);
        out[o + 1] = clamp(r1[x]);
        out[o + 2] = clamp(r2[x]);
        out[o + 3] = 255;
      }
    } else {
      for (let x = 0; x < tw; x++, o += dx) {
        const a = r0[x];
        let r = a;
        let g = r1[x];
        let b = r2[x];
        if (ycc) {
          r = a + 1.402 * (b - 128);
          g = a - 0.3441363 * (r1[x] - 128) - 0.71413636 * (b - 128);
          b = a + 1.772 * (r1[x] - 128);
        }
        // Adobe stores CMYK inverted (255 = no ink): the light left is what both let through.
        const k = r3[x];
        out[o] = clamp((clamp(r) * k) / 255);
        out[o + 1] = clamp((clamp(g) * k) / 255);
        out[o + 2] = clamp((clamp(b) * k) / 255);
        out[o + 3] = 255;
      }
    }
  }
  return { data: out, width: layout.width, height: layout.height };
}

const clamp = (v: number) => (v < 0 ? 0 : v > 255 ? 255 : v + 0.5);

type RowFill = (y: number, row: Float64Array) => void;

// Output at the decoded size: each sample of a subsampled component covers hMax / h pixels.
function replicate(c: PlaneComponent, p: JpegPlanes): RowFill {
  const columns = Int32Array.from({ length: p.width }, (_, x) => ((x * c.h) / p.hMax) | 0);
  return (y, row) => {
    const base = (((y * c.v) / p.vMax) | 0) * c.stride;
    for (let x = 0; x < row.length; x++) row[x] = c.plane[base + columns[x]];
  };
}

// Output at another size: each output sample is the mean of the area of the component it covers
// (whole and partial samples weighted), whatever the component's own sampling.
function average(c: PlaneComponent, p: JpegPlanes, tw: number, th: number): RowFill {
  const cw = (p.width * c.h) / p.hMax;
  const ch = (p.height * c.v) / p.vMax;
  const sx = cw / tw;
  const sy = ch / th;
  const xs = spans(Math.min(c.stride, Math.ceil(cw)), tw, sx);
  const lastRow = Math.min(c.rows, Math.ceil(ch)) - 1;
  const norm = 1 / (sx * sy);
  // Output rows go down the picture, so each source line is reduced once: the two latest are kept
  // (a line shared by two output rows, or by several when a component is enlarged).
  const cache = [new Float64Array(tw), new Float64Array(tw)];
  const cached = [-1, -1];
  const reduced = (ys: number) => {
    const slot = ys & 1;
    if (cached[slot] !== ys) {
      reduceLine(c.plane, ys * c.stride, xs, cache[slot]);
      cached[slot] = ys;
    }
    return cache[slot];
  };
  return (y, row) => {
    row.fill(0);
    const top = y * sy;
    const bottom = top + sy;
    for (let ys = Math.floor(top); ys <= Math.min(lastRow, Math.ceil(bottom) - 1); ys++) {
      const wy = (Math.min(bottom, ys + 1) - Math.max(top, ys)) * norm;
      if (wy <= 0) continue;
      const line = reduced(ys);
      for (let x = 0; x < tw; x++) row[x] += line[x] * wy;
    }
  };
}

function reduceLine(d: Uint8Array, offset: number, s: Spans, line: Float64Array) {
  for (let x = 0; x < line.length; x++) {
    const first = s.first[x];
    const last = s.last[x];
    let sum = d[offset + first] * s.wFirst[x];
    for (let xs = first + 1; xs < last; xs++) sum += d[offset + xs];
    if (last > first) sum += d[offset + last] * s.wLast[x];
    line[x] = sum;
  }
}
