import { forwardDct, forwardScale } from "./dct";
import {
  AC_CHROMA,
  AC_LUMA,
  CHROMA_QUANT,
  DC_CHROMA,
  DC_LUMA,
  LUMA_QUANT,
  ZIGZAG,
  huffmanCodes,
  scaledQuant,
  type HuffmanSpec,
} from "./jpeg-tables";
import type { Bitmap } from "./pixels.server";

// Encodes a baseline JFIF JPEG (ITU-T T.81) with the example tables of Annex K scaled for the
// quality, and nothing but pixels: no EXIF, no comments. Two ways in: RGBA pixels (YCbCr with chroma
// halved both ways, 4:2:0, what cameras write; alpha ignored, flatten first), or 8-bit planes read
// through a view (start + x · dx + y · dy), which is how a decoded JPEG's own planes are written
// again upright without a colour conversion either way. The output grows in a byte buffer, so a
// large photo costs about its own size.

export type JpegOptions = {
  quality: number;
  /** Chroma sampling; tests use the others to exercise the decoder. */
  subsampling?: "4:2:0" | "4:2:2" | "4:4:4";
  /** MCUs between restart markers (0: none). */
  restartInterval?: number;
  grey?: boolean;
};

class ByteWriter {
  buf: Uint8Array;
  length = 0;
  private acc = 0;
  private bits = 0;
  constructor(capacity: number) {
    this.buf = new Uint8Array(Math.max(1024, capacity));
  }
  private room(n: number) {
    if (this.length + n <= this.buf.length) return;
    const next = new Uint8Array(Math.max(this.buf.length * 2, this.length + n));
    next.set(this.buf.subarray(0, this.length));
    this.buf = next;
  }
  byte(v: number) {
    this.room(1);
    this.buf[this.length++] = v;
  }
  u16(v: number) {
    this.byte(v >> 8);
    this.byte(v & 0xff);
  }
  bytes(a: ArrayLike<number>) {
    for (let i = 0; i < a.length; i++) this.byte(a[i]);
  }
  /** Entropy-coded bits, most significant first, with 0xFF stuffed by 0x00. */
  put(value: number, count: number) {
    this.acc = (this.acc << count) | (value & ((1 << count) - 1));
    this.bits += count;
    while (this.bits >= 8) {
      this.bits -= 8;
      const b = (this.acc >> this.bits) & 0xff;
      this.byte(b);
      if (b === 0xff) this.byte(0);
    }
    this.acc &= (1 << this.bits) - 1;
  }
  /** Pads the last byte with 1-bits (F.1.2.3). */
  flushBits() {
    if (this.bits > 0) this.put(0x7f, 8 - this.bits);
  }
}

type Coder = { code: Uint16Array; length: Uint8Array };

const bitSize = (v: number) => (v === 0 ? 0 : 32 - Math.clz32(v < 0 ? -v : v));

/** One component to encode: sample (x, y) of the upright picture is plane[start + x · dx + y · dy]. */
export type PlaneView = { plane: Uint8Array; width: number; height: number; start: number; dx: number; dy: number; h: number; v: number };

export function encodeJpeg(bitmap: Bitmap, { quality, subsampling = "4:2:0", restartInterval = 0, grey = false }: JpegOptions): Buffer {
  const [h, v] = grey ? [1, 1] : subsampling === "4:2:0" ? [2, 2] : subsampling === "4:2:2" ? [2, 1] : [1, 1];
  return encodeJpegPlanes(bitmap.width, bitmap.height, rgbaPlanes(bitmap, h, v, grey), { quality, restartInterval });
}

// Y at full size, Cb and Cr each the mean of the h × v pixels a sample covers (JFIF's equations).
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
    const y1 = Math.min(height, cy * v + v);
    for (let cx = 0; cx < cw; cx++) {
      const x1 = Math.min(width, cx * h + h);
      let sb = 0;
      let sr = 0;
      let count = 0;
      for (let py = cy * v; py < y1; py++) {
        for (let px = cx * h; px < x1; px++) {
          const p = (py * width + px) * 4;
          const r = data[p];
          const g = data[p + 1];
          const b = data[p + 2];
          sb += -0.168736 * r - 0.331264 * g + 0.5 * b;
          sr += 0.5 * r - 0.418688 * g - 0.081312 * b;
          count++;
        }
      }
      cb[cy * cw + cx] = 128.5 + sb / count;
      cr[cy * cw + cx] = 128.5 + sr / count;
    }
  }
  const chroma = (plane: Uint8Array): PlaneView => ({ plane, width: cw, height: ch, start: 0, dx: 1, dy: cw, h: 1, v: 1 });
  return [luma, chroma(cb), chroma(cr)];
}

/** `comps`: one (grey) or three (Y, Cb, Cr); `width` × `height` is the picture's size. */
export function encodeJpegPlanes(
  width: number,
  height: number,
  comps: PlaneView[],
  { quality, restartInterval = 0 }: { quality: number; restartInterval?: number },
): Buffer {
  const grey = comps.length === 1;
  const lumaQ = scaledQuant(LUMA_QUANT, quality);
  const chromaQ = scaledQuant(CHROMA_QUANT, quality);
  const scales = [forwardScale(lumaQ), forwardScale(chromaQ)];
  const hMax = Math.max(...comps.map((c) => c.h));
  const vMax = Math.max(...comps.map((c) => c.v));
  const out = new ByteWriter(Math.ceil(width * height * (quality >= 90 ? 0.6 : 0.3)) + 2048);

  // Headers: SOI, JFIF, tables, frame, Huffman tables, scan.
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

  const coders = [
    [huffmanCodes(DC_LUMA), huffmanCodes(AC_LUMA)],
    [huffmanCodes(DC_CHROMA), huffmanCodes(AC_CHROMA)],
  ];
  const block = new Float32Array(64);
  const preds = [0, 0, 0];
  const xs = new Int32Array(8);

  const emit = (scale: Float32Array, dc: Coder, ac: Coder, comp: number) => {
    forwardDct(block);
    const diff = Math.round(block[0] * scale[0]) - preds[comp];
    preds[comp] += diff;
    const size = bitSize(diff);
    out.put(dc.code[size], dc.length[size]);
    if (size) out.put(diff < 0 ? diff - 1 : diff, size);
    let run = 0;
    for (let k = 1; k < 64; k++) {
      const z = ZIGZAG[k];
      const raw = Math.round(block[z] * scale[z]);
      const c = raw > 1023 ? 1023 : raw < -1023 ? -1023 : raw; // the tables code up to 10 bits
      if (c === 0) {
        run += 1;
        continue;
      }
      while (run > 15) {
        out.put(ac.code[0xf0], ac.length[0xf0]);
        run -= 16;
      }
      const s = bitSize(c);
      const symbol = (run << 4) | s;
      out.put(ac.code[symbol], ac.length[symbol]);
      out.put(c < 0 ? c - 1 : c, s);
      run = 0;
    }
    if (run > 0) out.put(ac.code[0], ac.length[0]);
  };

  // Samples past the right and bottom edges repeat the last ones, so partial blocks carry no
  // stripes into the picture.
  const load = (c: PlaneView, bx: number, by: number) => {
    const x0 = bx * 8;
    const y0 = by * 8;
    for (let i = 0; i < 8; i++) xs[i] = c.start + Math.min(x0 + i, c.width - 1) * c.dx;
    const d = c.plane;
    for (let r = 0; r < 8; r++) {
      const row = Math.min(y0 + r, c.height - 1) * c.dy;
      const o = r * 8;
      for (let i = 0; i < 8; i++) block[o + i] = d[row + xs[i]] - 128;
    }
  };

  const mcusX = Math.ceil(width / (8 * hMax));
  const mcusY = Math.ceil(height / (8 * vMax));
  let mcu = 0;
  for (let my = 0; my < mcusY; my++) {
    for (let mx = 0; mx < mcusX; mx++, mcu++) {
      if (restartInterval && mcu > 0 && mcu % restartInterval === 0) {
        out.flushBits();
        out.bytes([0xff, 0xd0 + ((mcu / restartInterval - 1) & 7)]);
        preds.fill(0);
      }
      for (let i = 0; i < comps.length; i++) {
        const c = comps[i];
        const t = i === 0 ? 0 : 1;
        for (let by = 0; by < c.v; by++) {
          for (let bx = 0; bx < c.h; bx++) {
            load(c, mx * c.h + bx, my * c.v + by);
            emit(scales[t], coders[t][0], coders[t][1], i);
          }
        }
      }
    }
  }
  out.flushBits();
  out.bytes([0xff, 0xd9]);
  return Buffer.from(out.buf.buffer, out.buf.byteOffset, out.length);
}
