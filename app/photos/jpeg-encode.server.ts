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

// Encodes RGBA pixels as a baseline JFIF JPEG (ITU-T T.81): YCbCr with chroma halved both ways
// (4:2:0, what cameras write), the example tables of Annex K scaled for the quality, and nothing
// but pixels: no EXIF, no comments. The output grows in a byte buffer, so a large photo costs about
// its own size; alpha is ignored (flatten first).

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

export function encodeJpeg(bitmap: Bitmap, { quality, subsampling = "4:2:0", restartInterval = 0, grey = false }: JpegOptions): Buffer {
  const { width, height, data } = bitmap;
  const lumaQ = scaledQuant(LUMA_QUANT, quality);
  const chromaQ = scaledQuant(CHROMA_QUANT, quality);
  const lumaScale = forwardScale(lumaQ);
  const chromaScale = forwardScale(chromaQ);
  const [h, v] = grey ? [1, 1] : subsampling === "4:2:0" ? [2, 2] : subsampling === "4:2:2" ? [2, 1] : [1, 1];
  const out = new ByteWriter(Math.ceil(width * height * (quality >= 90 ? 0.6 : 0.3)) + 2048);

  // Headers: SOI, JFIF, tables, frame, Huffman tables, scan.
  out.bytes([0xff, 0xd8, 0xff, 0xe0, 0, 16, 0x4a, 0x46, 0x49, 0x46, 0, 1, 1, 0, 0, 1, 0, 1, 0, 0]);
  for (const [id, table] of (grey ? [lumaQ] : [lumaQ, chromaQ]).entries()) {
    out.bytes([0xff, 0xdb, 0, 67, id]);
    for (let k = 0; k < 64; k++) out.byte(table[ZIGZAG[k]]);
  }
  const comps = grey ? 1 : 3;
  out.bytes([0xff, 0xc0]);
  out.u16(8 + comps * 3);
  out.byte(8);
  out.u16(height);
  out.u16(width);
  out.byte(comps);
  out.bytes([1, (h << 4) | v, 0]);
  if (!grey) out.bytes([2, 0x11, 1, 3, 0x11, 1]);
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
  out.u16(6 + comps * 2);
  out.byte(comps);
  out.bytes([1, 0x00]);
  if (!grey) out.bytes([2, 0x11, 3, 0x11]);
  out.bytes([0, 63, 0]);

  const dcL = huffmanCodes(DC_LUMA);
  const acL = huffmanCodes(AC_LUMA);
  const dcC = huffmanCodes(DC_CHROMA);
  const acC = huffmanCodes(AC_CHROMA);
  const block = new Float32Array(64);
  const preds = [0, 0, 0];

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

  // Samples are read with edge replication, so partial blocks at the right and bottom carry no
  // stripes into the picture.
  const px = (x: number, y: number) => ((y < height ? y : height - 1) * width + (x < width ? x : width - 1)) * 4;
  const luma = (i: number) => 0.299 * data[i] + 0.587 * data[i + 1] + 0.114 * data[i + 2] - 128;
  const cb = (i: number) => -0.168736 * data[i] - 0.331264 * data[i + 1] + 0.5 * data[i + 2];
  const cr = (i: number) => 0.5 * data[i] - 0.418688 * data[i + 1] - 0.081312 * data[i + 2];

  const mcuW = 8 * h;
  const mcuH = 8 * v;
  const mcusX = Math.ceil(width / mcuW);
  const mcusY = Math.ceil(height / mcuH);
  let mcu = 0;
  for (let my = 0; my < mcusY; my++) {
    for (let mx = 0; mx < mcusX; mx++, mcu++) {
      if (restartInterval && mcu > 0 && mcu % restartInterval === 0) {
        out.flushBits();
        out.bytes([0xff, 0xd0 + ((mcu / restartInterval - 1) & 7)]);
        preds.fill(0);
      }
      const x0 = mx * mcuW;
      const y0 = my * mcuH;
      for (let by = 0; by < v; by++) {
        for (let bx = 0; bx < h; bx++) {
          for (let i = 0; i < 64; i++) block[i] = luma(px(x0 + bx * 8 + (i & 7), y0 + by * 8 + (i >> 3)));
          emit(lumaScale, dcL, acL, 0);
        }
      }
      if (grey) continue;
      // Each chroma sample is the mean of the h × v pixels it covers.
      for (const [comp, f] of [
        [1, cb],
        [2, cr],
      ] as const) {
        for (let i = 0; i < 64; i++) {
          const sx = x0 + (i & 7) * h;
          const sy = y0 + (i >> 3) * v;
          let sum = 0;
          for (let dy = 0; dy < v; dy++) for (let dx = 0; dx < h; dx++) sum += f(px(sx + dx, sy + dy));
          block[i] = sum / (h * v);
        }
        emit(chromaScale, dcC, acC, comp);
      }
    }
  }
  out.flushBits();
  out.bytes([0xff, 0xd9]);
  return Buffer.from(out.buf.buffer, out.buf.byteOffset, out.length);
}
