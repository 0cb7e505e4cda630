import { crc32, deflateSync } from "node:zlib";

// PNGs of every colour type, bit depth and filter, plain or interlaced, written by hand for the
// decoder tests (a reference decoder reads them too). Samples come from a function, so any picture
// can be written at any depth.

export type PngSpec = {
  width: number;
  height: number;
  depth: 1 | 2 | 4 | 8 | 16;
  colour: 0 | 2 | 3 | 4 | 6;
  interlaced?: boolean;
  /** Filter per scanline (0–4); the row index picks one when a list is given. */
  filters?: number[];
  palette?: number[][];
  transparency?: Buffer;
};

const CHANNELS = { 0: 1, 2: 3, 3: 1, 4: 2, 6: 4 } as const;
const PASSES = [
  [0, 0, 8, 8],
  [4, 0, 8, 8],
  [0, 4, 4, 8],
  [2, 0, 4, 4],
  [0, 2, 2, 4],
  [1, 0, 2, 2],
  [0, 1, 1, 2],
];

function chunk(type: string, body: Buffer): Buffer {
  const head = Buffer.alloc(8);
  head.writeUInt32BE(body.length, 0);
  head.write(type, 4, "latin1");
  const crc = Buffer.alloc(4);
  crc.writeUInt32BE(crc32(Buffer.concat([head.subarray(4), body])), 0);
  return Buffer.concat([head, body, crc]);
}

function paeth(a: number, b: number, c: number): number {
  const p = a + b - c;
  const pa = Math.abs(p - a);
  const pb = Math.abs(p - b);
  const pc = Math.abs(p - c);
  return pa <= pb && pa <= pc ? a : pb <= pc ? b : c;
}

/** `sample(x, y, channel)` gives each raw sample at the image's depth. */
export function writePng(spec: PngSpec, sample: (x: number, y: number, channel: number) => number): Buffer {
  const { width, height, depth, colour, interlaced = false, filters = [0] } = spec;
  const channels = CHANNELS[colour];
  const bpp = Math.max(1, (channels * depth) >> 3);
  const passes = interlaced ? PASSES : [[0, 0, 1, 1]];
  const raw: Buffer[] = [];
  let lineNo = 0;
  for (const [x0, y0, dx, dy] of passes) {
    const w = Math.ceil((width - x0) / dx);
    const h = Math.ceil((height - y0) / dy);
    if (w <= 0 || h <= 0) continue;
    const rowBytes = Math.ceil((w * channels * depth) / 8);
    let previous = Buffer.alloc(rowBytes);
    for (let r = 0; r < h; r++, lineNo++) {
      const line = Buffer.alloc(rowBytes);
      let bit = 0;
      for (let i = 0; i < w; i++) {
        for (let c = 0; c < channels; c++, bit += depth) {
          const v = sample(x0 + i * dx, y0 + r * dy, c);
          if (depth === 16) line.writeUInt16BE(v, bit >> 3);
          else if (depth === 8) line[bit >> 3] = v;
          else line[bit >> 3] |= v << (8 - depth - (bit & 7));
        }
      }
      const filter = filters[lineNo % filters.length];
      const out = Buffer.alloc(1 + rowBytes);
      out[0] = filter;
      for (let i = 0; i < rowBytes; i++) {
        const a = i >= bpp ? line[i - bpp] : 0;
        const b = previous[i];
        const c = i >= bpp ? previous[i - bpp] : 0;
        const predicted = [0, a, b, (a + b) >> 1, paeth(a, b, c)][filter];
        out[1 + i] = (line[i] - predicted) & 0xff;
      }
      raw.push(out);
      previous = line;
    }
  }
  const ihdr = Buffer.alloc(13);
  ihdr.writeUInt32BE(width, 0);
  ihdr.writeUInt32BE(height, 4);
  ihdr[8] = depth;
  ihdr[9] = colour;
  ihdr[12] = interlaced ? 1 : 0;
  const parts = [Buffer.from([0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a]), chunk("IHDR", ihdr)];
  if (spec.palette) parts.push(chunk("PLTE", Buffer.from(spec.palette.flat())));
  if (spec.transparency) parts.push(chunk("tRNS", spec.transparency));
  parts.push(chunk("IDAT", deflateSync(Buffer.concat(raw))), chunk("IEND", Buffer.alloc(0)));
  return Buffer.concat(parts);
}
