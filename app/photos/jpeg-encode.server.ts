import { forwardDct, forwardScale } from "./dct";
import { AC_CHROMA, AC_LUMA, CHROMA_QUANT, DC_CHROMA, DC_LUMA, LUMA_QUANT, ZIGZAG, scaledQuant, type HuffmanSpec } from "./jpeg-tables";
import { ByteWriter, codeBlock, PACKED } from "./jpeg-entropy-encode.server";
import type { Bitmap } from "./pixels.server";

// Encodes a baseline JFIF JPEG (ITU-T T.81) with the example tables of Annex K scaled for the
// quality, and nothing but pixels: no EXIF, no comments. Two ways in: RGBA pixels (YCbCr with chroma
// halved both ways, 4:2:0, what cameras write; alpha ignored, flatten first), or 8-bit planes read
// through a view (start + x · dx + y · dy), which is how a decoded JPEG's own planes are written
// again upright without a colour conversion either way. The output grows in a byte buffer, so a
// large photo costs about its own size. The block loop allocates nothing (one sample block; the
// entropy coding in jpeg-entropy-encode.server.ts).

export type JpegOptions = {
  quality: number;
  /** Chroma sampling; tests use the others to exercise the decoder. */
  subsampling?: "4:2:0" | "4:2:2" | "4:4:4";
  /** MCUs between restart markers (0: none). */
  restartInterval?: number;
  grey?: boolean;
};

/** One component to encode: sample (x, y) of the upright picture is plane[start + x · dx + y · dy]. */
export type PlaneView = { plane: Uint8Array; width: number; height: number; start: number; dx: number; dy: number; h: number; v: number };

export function encodeJpeg(bitmap: Bitmap, { quality, subsampling = "4:2:0", restartInterval = 0, grey = false }: JpegOptions): Buffer {
  const [h, v] = grey ? [1, 1] : subsampling === "4:2:0" ? [2, 2] : subsampling === "4:2:2" ? [2, 1] : [1, 1];
  return encodeJpegPlanes(bitmap.width, bitmap.height, rgbaPlanes(bitmap, h, v, grey), { quality, restartInterval });
}

// Y at full size, Cb and Cr each from the mean R, G and B of the h × v pixels a sample covers
// (JFIF's equations are linear, so this is the mean of each pixel's Cb and Cr).
function rgbaPlanes({ data, width, height }: Bitmap, h: number, v: number, grey: boolean): PlaneView[] {
  const y = new Uint8Array(width * height);
  for (let i = 0, p = 0; i < y.length; i++, p += 4) y[i] = 0.299 * data[p] + 0.587 * data[p + 1] + 0.114 * data[p + 2] + 0.5;
  const luma: PlaneView = { plane: y, width, height, start: 0, dx: 1, dy: width, h, v };
  if (grey) return [{ ...luma, h: 1, v: 1 }];
  const cw = Math.ceil(width / h);
  const ch = Math.ceil(height / v);
  const cb = new Uint8Array(cw * ch);
  const cr = new Uint8Array(cw * ch);
  for (let cy = 0; cy < ch; cy++) {
    const y0 = cy * v;
    const y1 = Math.min(height, y0 + v);
    for (let cx = 0; cx < cw; cx++) {
      const x0 = cx * h;
      const x1 = Math.min(width, x0 + h);
      let r = 0;
      let g = 0;
      let b = 0;
      if (x1 - x0 === 2 && y1 - y0 === 2) {
        // 4:2:0 away from the edges, the case that counts: the four pixels read directly.
        const p = (y0 * width + x0) * 4;
        const q = p + width * 4;
        r = data[p] + data[p + 4] + data[q] + data[q + 4];
        g = data[p + 1] + data[p + 5] + data[q + 1] + data[q + 5];
        b = data[p + 2] + data[p + 6] + data[q + 2] + data[q + 6];
      } else
        for (let py = y0; py < y1; py++) {
          for (let p = (py * width + x0) * 4, end = (py * width + x1) * 4; p < end; p += 4) {
            r += data[p];
            g += data[p + 1];
            b += data[p + 2];
          }
        }
      const count = (y1 - y0) * (x1 - x0);
      cb[cy * cw + cx] = 128.5 + (-0.168736 * r - 0.331264 * g + 0.5 * b) / count;
      cr[cy * cw + cx] = 128.5 + (0.5 * r - 0.418688 * g - 0.081312 * b) / count;
    }
  }
  const chroma = (plane: Uint8Array): PlaneView => ({ plane, width: cw, height: ch, start: 0, dx: 1, dy: cw, h: 1, v: 1 });
  return [luma, chroma(cb), chroma(cr)];
}

// The 8 × 8 block at block column bx, row by, level-shifted by −128. Samples past the right and
// bottom edges repeat the last ones, so partial blocks carry no stripes into the picture.
const xs = new Int32Array(8);
function loadBlock(block: Float32Array, c: PlaneView, bx: number, by: number) {
  const d = c.plane;
  const { dx, dy } = c;
  const x0 = bx * 8;
  const y0 = by * 8;
  if (x0 + 8 <= c.width && y0 + 8 <= c.height) {
    for (let r = 0, row = c.start + x0 * dx + y0 * dy; r < 64; r += 8, row += dy) {
      for (let i = 0, p = row; i < 8; i++, p += dx) block[r + i] = d[p] - 128;
    }
    return;
  }
  for (let i = 0; i < 8; i++) xs[i] = c.start + Math.min(x0 + i, c.width - 1) * dx;
  for (let r = 0; r < 8; r++) {
    const row = Math.min(y0 + r, c.height - 1) * dy;
    for (let i = 0; i < 8; i++) block[r * 8 + i] = d[row + xs[i]] - 128;
  }
}

/** MCU rows of a 4:2:0 picture `height` pixels high: the unit `encodeJpegSlice` splits it in. */
export const mcuRows = (height: number) => Math.ceil(height / 16);

/**
 * MCU rows `from` to `to` (exclusive) of the 4:2:0 JPEG of `bitmap`, for encoding one picture on two
 * threads: each row is a restart interval (T.81 B.2.4.4), so its coding depends on no other row, and
 * the slices of 0–k and k–mcuRows(height), put end to end, are the whole file (headers in the first,
 * EOI in the last). Empty when `from` ≥ `to`.
 */
export function encodeJpegSlice(bitmap: Bitmap, quality: number, from: number, to: number): Buffer {
  if (from >= to) return Buffer.alloc(0);
  const { width, height } = bitmap;
  const y0 = from * 16;
  const y1 = Math.min(height, to * 16);
  const rows = { data: bitmap.data.subarray(y0 * width * 4, y1 * width * 4), width, height: y1 - y0 };
  const perRow = Math.ceil(width / 16);
  const part = { height, firstMcu: from * perRow, headers: from === 0, end: to >= mcuRows(height) };
  return encodeJpegPlanes(width, rows.height, rgbaPlanes(rows, 2, 2, false), { quality, restartInterval: perRow, part });
}

/** Part of a picture: its full height, the index of the part's first MCU, and which ends it has. */
type Part = { height: number; firstMcu: number; headers: boolean; end: boolean };

/**
 * `comps`: one (grey) or three (Y, Cb, Cr); `width` × `height` is the picture's size (or, with
 * `part`, the size of the rows given).
 */
export function encodeJpegPlanes(
  width: number,
  height: number,
  comps: PlaneView[],
  { quality, restartInterval = 0, part }: { quality: number; restartInterval?: number; part?: Part },
): Buffer {
  const lumaQ = scaledQuant(LUMA_QUANT, quality);
  const chromaQ = scaledQuant(CHROMA_QUANT, quality);
  const scales = [forwardScale(lumaQ), forwardScale(chromaQ)];
  const hMax = Math.max(...comps.map((c) => c.h));
  const vMax = Math.max(...comps.map((c) => c.v));
  const out = new ByteWriter(Math.ceil(width * height * (quality >= 90 ? 0.6 : 0.3)) + 2048);
  if (part?.headers !== false) writeHeaders(out, width, part?.height ?? height, comps, lumaQ, chromaQ, restartInterval);

  const block = new Float32Array(64);
  const preds = [0, 0, 0];
  // A block's worst case is under 220 bytes of codes, twice that if every byte were 0xFF.
  const mcuBytes = comps.reduce((n, c) => n + c.h * c.v, 0) * 512;
  const mcusX = Math.ceil(width / (8 * hMax));
  const mcusY = Math.ceil(height / (8 * vMax));
  let mcu = part?.firstMcu ?? 0;
  for (let my = 0; my < mcusY; my++) {
    for (let mx = 0; mx < mcusX; mx++, mcu++) {
      if (restartInterval && mcu > 0 && mcu % restartInterval === 0) {
        out.flushBits();
        out.bytes([0xff, 0xd0 + ((mcu / restartInterval - 1) & 7)]);
        preds.fill(0);
      }
      out.reserve(mcuBytes);
      for (let i = 0; i < comps.length; i++) {
        const c = comps[i];
        const t = i === 0 ? 0 : 1;
        for (let by = 0; by < c.v; by++) {
          for (let bx = 0; bx < c.h; bx++) {
            loadBlock(block, c, mx * c.h + bx, my * c.v + by);
            forwardDct(block);
            preds[i] = codeBlock(out, block, scales[t], PACKED.dc[t], PACKED.ac[t], preds[i]);
          }
        }
      }
    }
  }
  out.flushBits();
  if (part?.end !== false) out.bytes([0xff, 0xd9]);
  return Buffer.from(out.buf.buffer, out.buf.byteOffset, out.length);
}

// SOI, JFIF, quantisation tables, frame, Huffman tables, restart interval and scan header.
function writeHeaders(
  out: ByteWriter,
  width: number,
  height: number,
  comps: PlaneView[],
  lumaQ: Uint8Array,
  chromaQ: Uint8Array,
  restartInterval: number,
) {
  const grey = comps.length === 1;
  out.bytes([0xff, 0xd8, 0xff, 0xe0, 0, 16, 0x4a, 0x46, 0x49, 0x46, 0, 1, 1, 0, 0, 1, 0, 1, 0, 0]);
  for (const [id, table] of (grey ? [lumaQ] : [lumaQ, chromaQ]).entries()) {
    out.bytes([0xff, 0xdb, 0, 67, id]);
    for (let k = 0; k < 64; k++) out.byte(table[ZIGZAG[k]]);
  }
  out.bytes([0xff, 0xc0]);
  out.u16(8 + comps.length * 3);
  out.byte(8);
  out.u16(height);
  out.u16(width);
  out.byte(comps.length);
  comps.forEach((c, i) => out.bytes([i + 1, (c.h << 4) | c.v, i === 0 ? 0 : 1]));
  const specs: [number, HuffmanSpec][] = [
    [0x00, DC_LUMA],
    [0x10, AC_LUMA],
  ];
  if (!grey) specs.push([0x01, DC_CHROMA], [0x11, AC_CHROMA]);
  for (const [klass, spec] of specs) {
    out.bytes([0xff, 0xc4]);
    out.u16(2 + 1 + 16 + spec.symbols.length);
    out.byte(klass);
    out.bytes(spec.counts);
    out.bytes(spec.symbols);
  }
  if (restartInterval > 0) {
    out.bytes([0xff, 0xdd, 0, 4]);
    out.u16(restartInterval);
  }
  out.bytes([0xff, 0xda]);
  out.u16(6 + comps.length * 2);
  out.byte(comps.length);
  out.bytes([1, 0x00]);
  if (!grey) out.bytes([2, 0x11, 3, 0x11]);
  out.bytes([0, 63, 0]);
}
