import { inverseDct, inverseScale, reducedIdct } from "./dct";
import { ZIGZAG } from "./jpeg-tables";
import { BitReader, buildTable, JpegDataProblem, type Table } from "./jpeg-huffman.server";
import { planesToRgba } from "./jpeg-colour.server";
import type { Bitmap } from "./pixels.server";

// Decodes a sequential (baseline or extended, 8-bit, Huffman) JPEG (ITU-T T.81, Annex F) into one
// 8-bit plane per component, at full size or at 1/2, 1/4 or 1/8 straight from the coefficients
// (`scale`): memory is one byte per output sample, each block transformed as soon as it is read,
// where a general decoder keeps every coefficient of the image as a small array of its own.
// Colour conversion, resizing and turning upright are jpeg-colour.server.ts. Progressive JPEGs are
// not handled here (ProgressiveJpeg). The file has passed readJpegStructure.

export class ProgressiveJpeg extends Error {}

export type PlaneComponent = { id: number; h: number; v: number; plane: Uint8Array; stride: number; rows: number };
/** The decoded planes; `width` × `height` is the stored (not upright) size at the decoded scale. */
export type JpegPlanes = {
  width: number;
  height: number;
  /** The frame's own size, before any scaling. */
  fullWidth: number;
  fullHeight: number;
  scale: 1 | 2 | 4 | 8;
  components: PlaneComponent[];
  hMax: number;
  vMax: number;
  adobeTransform: number | null;
};

type Quant = { aan: Float32Array; plain: Float32Array };

type Component = {
  id: number;
  h: number;
  v: number;
  quant: number;
  plane: Uint8Array;
  stride: number;
  rows: number;
  pred: number;
  dc?: Table;
  ac?: Table;
};

type Frame = {
  width: number;
  height: number;
  components: Component[];
  hMax: number;
  vMax: number;
  mcusX: number;
  mcusY: number;
  /** Samples per block side in the planes: 8 / scale. */
  n: number;
};

/** Upright 8-bit RGBA at full size. */
export function decodeSequentialJpeg(jpeg: Buffer, orientation = 1): Bitmap {
  return planesToRgba(decodeJpegPlanes(jpeg), orientation);
}

export function decodeJpegPlanes(jpeg: Buffer, scale: 1 | 2 | 4 | 8 = 1): JpegPlanes {
  const quant: (Quant | undefined)[] = [];
  const dcTables: (Table | undefined)[] = [];
  const acTables: (Table | undefined)[] = [];
  let frame: Frame | null = null;
  let restartInterval = 0;
  let adobeTransform: number | null = null;
  let pos = 2;

  while (pos + 4 <= jpeg.length) {
    if (jpeg[pos] !== 0xff) throw new JpegDataProblem(`unexpected data at byte ${pos}`);
    const marker = jpeg[pos + 1];
    if (marker === 0xff) {
      pos += 1;
      continue;
    }
    if (marker === 0xd9) break;
    if (marker === 0xd8 || (marker >= 0xd0 && marker <= 0xd7)) {
      pos += 2;
      continue;
    }
    const length = jpeg.readUInt16BE(pos + 2);
    const body = jpeg.subarray(pos + 4, pos + 2 + length);
    pos += 2 + length;
    if (marker === 0xdb) readQuant(body, quant);
    else if (marker === 0xc4) readHuffman(body, dcTables, acTables);
    else if (marker === 0xdd) restartInterval = body.readUInt16BE(0);
    else if (marker === 0xee && body.toString("latin1", 0, 5) === "Adobe" && body.length >= 12) adobeTransform = body[11];
    else if (marker === 0xc2) throw new ProgressiveJpeg("a progressive JPEG");
    else if (marker === 0xc0 || marker === 0xc1) frame = readFrame(body, 8 / scale);
    else if (marker === 0xda) {
      if (!frame) throw new JpegDataProblem("its image data comes before the frame header");
      pos = decodeScan(jpeg, pos, body, frame, quant, dcTables, acTables, restartInterval);
    }
  }
  if (!frame) throw new JpegDataProblem("it has no frame header");
  const n = frame.components.length;
  if (n !== 1 && n !== 3 && n !== 4) throw new JpegDataProblem(`it has ${n} colour components`);
  return {
    width: Math.ceil(frame.width / scale),
    height: Math.ceil(frame.height / scale),
    fullWidth: frame.width,
    fullHeight: frame.height,
    scale,
    components: frame.components.map(({ id, h, v, plane, stride, rows }) => ({ id, h, v, plane, stride, rows })),
    hMax: frame.hMax,
    vMax: frame.vMax,
    adobeTransform,
  };
}

function readQuant(body: Buffer, quant: (Quant | undefined)[]) {
  for (let p = 0; p < body.length;) {
    const precision = body[p] >> 4;
    const id = body[p] & 15;
    p += 1;
    const natural = new Array<number>(64);
    for (let k = 0; k < 64; k++) natural[ZIGZAG[k]] = precision ? body.readUInt16BE(p + 2 * k) : body[p + k];
    p += precision ? 128 : 64;
    quant[id] = { aan: inverseScale(natural), plain: Float32Array.from(natural) };
  }
}

function readHuffman(body: Buffer, dc: (Table | undefined)[], ac: (Table | undefined)[]) {
  for (let p = 0; p < body.length;) {
    const kind = body[p] >> 4;
    const id = body[p] & 15;
    const counts = body.subarray(p + 1, p + 17);
    const total = counts.reduce((a, b) => a + b, 0);
    const table = buildTable(counts, body.subarray(p + 17, p + 17 + total));
    (kind === 0 ? dc : ac)[id] = table;
    p += 17 + total;
  }
}

function readFrame(body: Buffer, n: number): Frame {
  if (body[0] !== 8) throw new JpegDataProblem(`it uses ${body[0]}-bit samples; only 8-bit JPEGs can be read`);
  const height = body.readUInt16BE(1);
  const width = body.readUInt16BE(3);
  const count = body[5];
  const specs = Array.from({ length: count }, (_, i) => ({
    id: body[6 + i * 3],
    h: body[7 + i * 3] >> 4,
    v: body[7 + i * 3] & 15,
    quant: body[8 + i * 3],
  }));
  if (specs.some((c) => c.h < 1 || c.h > 4 || c.v < 1 || c.v > 4))
    throw new JpegDataProblem("its frame header names impossible sampling factors");
  const hMax = Math.max(...specs.map((c) => c.h));
  const vMax = Math.max(...specs.map((c) => c.v));
  const mcusX = Math.ceil(width / (8 * hMax));
  const mcusY = Math.ceil(height / (8 * vMax));
  // Each plane holds whole MCUs, so interleaved and single-component scans both fit.
  const components = specs.map((c): Component => {
    const stride = mcusX * c.h * n;
    const rows = mcusY * c.v * n;
    return { ...c, plane: new Uint8Array(stride * rows), stride, rows, pred: 0 };
  });
  return { width, height, components, hMax, vMax, mcusX, mcusY, n };
}

function decodeScan(
  jpeg: Buffer,
  start: number,
  header: Buffer,
  frame: Frame,
  quant: (Quant | undefined)[],
  dcTables: (Table | undefined)[],
  acTables: (Table | undefined)[],
  restartInterval: number,
): number {
  const count = header[0];
  const comps = Array.from({ length: count }, (_, i) => {
    const c = frame.components.find((x) => x.id === header[1 + i * 2]);
    if (!c) throw new JpegDataProblem("a scan names a component the frame does not have");
    c.dc = dcTables[header[2 + i * 2] >> 4];
    c.ac = acTables[header[2 + i * 2] & 15];
    if (!c.dc || !c.ac) throw new JpegDataProblem("a scan uses a Huffman table that was never given");
    if (!quant[c.quant]) throw new JpegDataProblem("a component uses a quantisation table that was never given");
    c.pred = 0;
    return c;
  });
  const reader = new BitReader(jpeg, start);
  const block = new Float32Array(64);
  const n = frame.n;
  const small = new Float32Array(n * n);
  const tmp = new Float32Array(8 * n);

  const decodeBlock = (c: Component, bx: number, by: number) => {
    const q = n === 8 ? quant[c.quant]!.aan : quant[c.quant]!.plain;
    block.fill(0);
    const size = reader.decode(c.dc!);
    c.pred += size ? reader.value(size) : 0;
    block[0] = c.pred * q[0];
    for (let k = 1; k < 64;) {
      const rs = reader.decode(c.ac!);
      const run = rs >> 4;
      const bits = rs & 15;
      if (bits === 0) {
        if (run !== 15) break; // end of block
        k += 16;
        continue;
      }
      k += run;
      if (k > 63) throw new JpegDataProblem("a block of its image data runs past 64 coefficients");
      const z = ZIGZAG[k];
      block[z] = reader.value(bits) * q[z];
      k += 1;
    }
    const out = n === 8 ? block : small;
    if (n === 8) inverseDct(block);
    else reducedIdct(block, n, small, tmp);
    let o = by * n * c.stride + bx * n;
    for (let r = 0; r < n * n; r += n, o += c.stride) {
      for (let i = 0; i < n; i++) {
        const v = out[r + i] + 128.5;
        c.plane[o + i] = v < 0 ? 0 : v > 255 ? 255 : v;
      }
    }
  };

  // One component alone: its blocks in raster order, one block per MCU (A.2.2).
  const single = comps.length === 1 ? comps[0] : null;
  const blocksX = single ? Math.ceil(Math.ceil((frame.width * single.h) / frame.hMax) / 8) : frame.mcusX;
  const blocksY = single ? Math.ceil(Math.ceil((frame.height * single.v) / frame.vMax) / 8) : frame.mcusY;
  const total = blocksX * blocksY;
  for (let mcu = 0; mcu < total; mcu++) {
    if (restartInterval && mcu > 0 && mcu % restartInterval === 0) {
      reader.restart();
      for (const c of comps) c.pred = 0;
    }
    const mx = mcu % blocksX;
    const my = (mcu / blocksX) | 0;
    if (single) decodeBlock(single, mx, my);
    else {
      for (const c of comps) {
        for (let v = 0; v < c.v; v++) for (let h = 0; h < c.h; h++) decodeBlock(c, mx * c.h + h, my * c.v + v);
      }
    }
  }
  return reader.end();
}
