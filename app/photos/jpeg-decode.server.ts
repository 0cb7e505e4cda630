import { inverseDct, inverseScale } from "./dct";
import { ZIGZAG } from "./jpeg-tables";
import { uprightLayout } from "./exif-orientation.server";
import { BitReader, buildTable, JpegDataProblem, type Table } from "./jpeg-huffman.server";
import type { Bitmap } from "./pixels.server";

// Decodes a sequential (baseline or extended, 8-bit, Huffman) JPEG into upright 8-bit RGBA
// (ITU-T T.81, Annex F). Memory is one byte per sample per component plus the RGBA output: each
// block is transformed as soon as it is read, where a general decoder keeps every coefficient of the
// image as a small array of its own. Progressive JPEGs are not handled here (ProgressiveJpeg).
// The file has passed readJpegStructure (markers, frame header, scans followed to the end).

export class ProgressiveJpeg extends Error {}

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

type Frame = { width: number; height: number; components: Component[]; hMax: number; vMax: number; mcusX: number; mcusY: number };

export function decodeSequentialJpeg(jpeg: Buffer, orientation = 1): Bitmap {
  const quant: (Float32Array | undefined)[] = [];
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
    else if (marker === 0xc0 || marker === 0xc1) frame = readFrame(body);
    else if (marker === 0xda) {
      if (!frame) throw new JpegDataProblem("its image data comes before the frame header");
      pos = decodeScan(jpeg, pos, body, frame, quant, dcTables, acTables, restartInterval);
    }
  }
  if (!frame) throw new JpegDataProblem("it has no frame header");
  return toRgba(frame, adobeTransform, orientation);
}

function readQuant(body: Buffer, quant: (Float32Array | undefined)[]) {
  for (let p = 0; p < body.length;) {
    const precision = body[p] >> 4;
    const id = body[p] & 15;
    p += 1;
    const natural = new Array<number>(64);
    for (let k = 0; k < 64; k++) natural[ZIGZAG[k]] = precision ? body.readUInt16BE(p + 2 * k) : body[p + k];
    p += precision ? 128 : 64;
    quant[id] = inverseScale(natural);
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

function readFrame(body: Buffer): Frame {
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
    const stride = mcusX * c.h * 8;
    const rows = mcusY * c.v * 8;
    return { ...c, plane: new Uint8Array(stride * rows), stride, rows, pred: 0 };
  });
  return { width, height, components, hMax, vMax, mcusX, mcusY };
}

function decodeScan(
  jpeg: Buffer,
  start: number,
  header: Buffer,
  frame: Frame,
  quant: (Float32Array | undefined)[],
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

  const decodeBlock = (c: Component, bx: number, by: number) => {
    const q = quant[c.quant]!;
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
    inverseDct(block);
    let o = by * 8 * c.stride + bx * 8;
    for (let r = 0; r < 64; r += 8, o += c.stride) {
      for (let i = 0; i < 8; i++) {
        const v = block[r + i] + 128.5;
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

// Colour conversion (JFIF; Adobe's transform flag for RGB and CMYK files), chroma replicated to
// full size, each pixel written straight to its upright place.
function toRgba(frame: Frame, adobeTransform: number | null, orientation: number): Bitmap {
  const { width, height, components, hMax, vMax } = frame;
  const layout = uprightLayout(width, height, orientation);
  const out = Buffer.alloc(width * height * 4);
  const n = components.length;
  if (n !== 1 && n !== 3 && n !== 4) throw new JpegDataProblem(`it has ${n} colour components`);
  const columns = components.map((c) => Int32Array.from({ length: width }, (_, x) => ((x * c.h) / hMax) | 0));
  const ycc = n === 3 ? adobeTransform !== 0 : adobeTransform === 2;
  const [c0, c1, c2, c3] = components;
  for (let y = 0; y < height; y++) {
    const rows = components.map((c) => (((y * c.v) / vMax) | 0) * c.stride);
    let o = layout.start + y * layout.dy;
    for (let x = 0; x < width; x++, o += layout.dx) {
      const a = c0.plane[rows[0] + columns[0][x]];
      let r = a;
      let g = a;
      let b = a;
      if (n > 1) {
        const p = c1.plane[rows[1] + columns[1][x]];
        const q = c2.plane[rows[2] + columns[2][x]];
        if (ycc) {
          r = a + 1.402 * (q - 128);
          g = a - 0.3441363 * (p - 128) - 0.71413636 * (q - 128);
          b = a + 1.772 * (p - 128);
        } else {
          g = p;
          b = q;
        }
        if (n === 4) {
          // Adobe stores CMYK inverted (255 = no ink): the light left is what both let through.
          const k = c3.plane[rows[3] + columns[3][x]];
          r = (clamp(r) * k) / 255;
          g = (clamp(g) * k) / 255;
          b = (clamp(b) * k) / 255;
        }
      }
      out[o] = clamp(r);
      out[o + 1] = clamp(g);
      out[o + 2] = clamp(b);
      out[o + 3] = 255;
    }
  }
  return { data: out, width: layout.width, height: layout.height };
}

const clamp = (v: number) => (v < 0 ? 0 : v > 255 ? 255 : v + 0.5);
