import { createInflate } from "node:zlib";
import type { Bitmap } from "./pixels.server";

// Decodes a PNG (ISO/IEC 15948) straight into 8-bit RGBA, one scanline at a time: the inflated
// image data is never held whole, and inflating stops the moment it yields more bytes than the
// header's width, height, depth and interlacing allow. A small file whose data would inflate to
// gigabytes is refused after reading one chunk past the expected size.
// The file has passed readPngStructure (chunk CRCs, a valid IHDR) before it gets here.

export class PngDataProblem extends Error {}

type Header = { width: number; height: number; depth: number; colour: number; interlaced: boolean };

const CHANNELS: Record<number, number> = { 0: 1, 2: 3, 3: 1, 4: 2, 6: 4 };

// Adam7 passes: first column, first row, column step, row step (section 8.2).
const ADAM7 = [
  [0, 0, 8, 8],
  [4, 0, 8, 8],
  [0, 4, 4, 8],
  [2, 0, 4, 4],
  [0, 2, 2, 4],
  [1, 0, 2, 2],
  [0, 1, 1, 2],
] as const;

type Pass = { x0: number; y0: number; dx: number; dy: number; width: number; rows: number; rowBytes: number };

/** The scanline passes of the image; empty passes of a small interlaced image carry no bytes at all. */
export function pngPasses({ width, height, depth, colour, interlaced }: Header): Pass[] {
  const bits = CHANNELS[colour] * depth;
  const pass = (x0: number, y0: number, dx: number, dy: number): Pass => {
    const w = Math.ceil((width - x0) / dx);
    const rows = Math.ceil((height - y0) / dy);
    return { x0, y0, dx, dy, width: Math.max(0, w), rows: Math.max(0, rows), rowBytes: Math.ceil((Math.max(0, w) * bits) / 8) };
  };
  const passes = interlaced ? ADAM7.map(([x0, y0, dx, dy]) => pass(x0, y0, dx, dy)) : [pass(0, 0, 1, 1)];
  return passes.filter((p) => p.width > 0 && p.rows > 0);
}

/** Bytes the image data inflates to: one filter byte plus the packed pixels per scanline of every pass. */
export function inflatedPngSize(header: Header): number {
  return pngPasses(header).reduce((sum, p) => sum + p.rows * (1 + p.rowBytes), 0);
}

type Chunks = { header: Header; palette: Buffer | null; transparency: Buffer | null; data: Buffer[] };

function readChunks(png: Buffer): Chunks {
  let pos = 8;
  let header: Header | null = null;
  let palette: Buffer | null = null;
  let transparency: Buffer | null = null;
  const data: Buffer[] = [];
  while (pos + 12 <= png.length) {
    const length = png.readUInt32BE(pos);
    const type = png.toString("latin1", pos + 4, pos + 8);
    const body = png.subarray(pos + 8, pos + 8 + length);
    if (type === "IHDR") {
      header = { width: body.readUInt32BE(0), height: body.readUInt32BE(4), depth: body[8], colour: body[9], interlaced: body[12] === 1 };
    } else if (type === "PLTE") palette = body;
    else if (type === "tRNS") transparency = body;
    else if (type === "IDAT") data.push(body);
    else if (type === "IEND") break;
    pos += 12 + length;
  }
  if (!header || CHANNELS[header.colour] === undefined) throw new PngDataProblem("its header is missing or unreadable");
  if (header.colour === 3 && !palette) throw new PngDataProblem("it uses a palette but has none");
  return { header, palette, transparency, data };
}

export async function decodePng(png: Buffer): Promise<Bitmap> {
  const { header, palette, transparency, data } = readChunks(png);
  const { width, height } = header;
  const expected = inflatedPngSize(header);
  const out = Buffer.alloc(width * height * 4);
  const toRgba = pixelWriter(header, palette, transparency, out);
  const bpp = Math.max(1, (CHANNELS[header.colour] * header.depth) >> 3);

  const passes = pngPasses(header);
  let passIndex = 0;
  let row = 0;
  let line = Buffer.alloc(1 + passes[0].rowBytes);
  let previous = Buffer.alloc(1 + passes[0].rowBytes);
  let filled = 0;
  let received = 0;

  const inflater = createInflate({ chunkSize: 64 * 1024 });
  inflater.end(Buffer.concat(data));
  try {
    for await (const piece of inflater as AsyncIterable<Buffer>) {
      received += piece.length;
      if (received > expected) {
        throw new PngDataProblem(`its image data unpacks to more than the ${width} × ${height} pixels its header gives`);
      }
      let at = 0;
      while (at < piece.length) {
        const pass = passes[passIndex];
        const take = Math.min(line.length - filled, piece.length - at);
        piece.copy(line, filled, at, at + take);
        filled += take;
        at += take;
        if (filled < line.length) break;
        unfilter(line, previous, bpp);
        toRgba(line, pass, row);
        [line, previous] = [previous, line];
        filled = 0;
        row += 1;
        if (row === pass.rows && passIndex + 1 < passes.length) {
          // Each pass starts afresh: its first scanline has no previous line to refer to.
          passIndex += 1;
          row = 0;
          line = Buffer.alloc(1 + passes[passIndex].rowBytes);
          previous = Buffer.alloc(1 + passes[passIndex].rowBytes);
        }
      }
    }
  } catch (error) {
    if (error instanceof PngDataProblem) throw error;
    throw new PngDataProblem(`its image data cannot be unpacked (${(error as Error).message})`);
  } finally {
    inflater.destroy();
  }
  if (received < expected) throw new PngDataProblem("its image data ends before the last row");
  return { data: out, width, height };
}

// Section 9: each scanline's first byte names the filter that was applied to the rest.
function unfilter(line: Buffer, previous: Buffer, bpp: number) {
  const type = line[0];
  const n = line.length;
  switch (type) {
    case 0:
      return;
    case 1:
      for (let i = 1 + bpp; i < n; i++) line[i] = line[i] + line[i - bpp];
      return;
    case 2:
      for (let i = 1; i < n; i++) line[i] = line[i] + previous[i];
      return;
    case 3:
      for (let i = 1; i < n; i++) line[i] = line[i] + ((i > bpp ? line[i - bpp] : 0) + previous[i]) / 2;
      return;
    case 4:
      for (let i = 1; i < n; i++) {
        const a = i > bpp ? line[i - bpp] : 0;
        const b = previous[i];
        const c = i > bpp ? previous[i - bpp] : 0;
        const p = a + b - c;
        const pa = Math.abs(p - a);
        const pb = Math.abs(p - b);
        const pc = Math.abs(p - c);
        line[i] = line[i] + (pa <= pb && pa <= pc ? a : pb <= pc ? b : c);
      }
      return;
    default:
      throw new PngDataProblem(`a scanline names an unknown filter (${type})`);
  }
}

/** Writes one unfiltered scanline of a pass into the RGBA output, whatever the colour type and depth. */
function pixelWriter(header: Header, palette: Buffer | null, transparency: Buffer | null, out: Buffer) {
  const { width, depth, colour } = header;
  const channels = CHANNELS[colour];
  const max = (1 << Math.min(depth, 8)) - 1;
  // The raw sample at index `s` of a scanline (after its filter byte), at the image's bit depth.
  const sample = (line: Buffer, s: number): number => {
    if (depth === 8) return line[1 + s];
    if (depth === 16) return line.readUInt16BE(1 + 2 * s);
    const bit = s * depth;
    return (line[1 + (bit >> 3)] >> (8 - depth - (bit & 7))) & max;
  };
  const to8 = depth === 16 ? (v: number) => (v * 255 + 32767) / 65535 : depth === 8 ? (v: number) => v : (v: number) => (v * 255) / max;
  const keyed = transparency && (colour === 0 || colour === 2) && transparency.length >= (colour === 0 ? 2 : 6) ? transparency : null;

  return (line: Buffer, pass: Pass, row: number) => {
    const y = pass.y0 + row * pass.dy;
    let o = (y * width + pass.x0) * 4;
    const step = pass.dx * 4;
    for (let x = 0; x < pass.width; x++, o += step) {
      const s = x * channels;
      let r: number, g: number, b: number;
      let a = 255;
      if (colour === 3) {
        const index = sample(line, x);
        const p = palette!;
        r = p[index * 3] ?? 0;
        g = p[index * 3 + 1] ?? 0;
        b = p[index * 3 + 2] ?? 0;
        if (transparency && index < transparency.length) a = transparency[index];
      } else if (colour === 0 || colour === 4) {
        const v = sample(line, s);
        r = g = b = to8(v);
        if (colour === 4) a = to8(sample(line, s + 1));
        else if (keyed && v === keyed.readUInt16BE(0)) a = 0;
      } else {
        const rv = sample(line, s);
        const gv = sample(line, s + 1);
        const bv = sample(line, s + 2);
        r = to8(rv);
        g = to8(gv);
        b = to8(bv);
        if (colour === 6) a = to8(sample(line, s + 3));
        else if (keyed && rv === keyed.readUInt16BE(0) && gv === keyed.readUInt16BE(2) && bv === keyed.readUInt16BE(4)) a = 0;
      }
      out[o] = r;
      out[o + 1] = g;
      out[o + 2] = b;
      out[o + 3] = a;
    }
  };
}
