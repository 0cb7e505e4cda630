import { crc32 } from "node:zlib";

// Walks a PNG's chunks (PNG specification, ISO/IEC 15948, sections 5 and 11): IHDR first for the
// dimensions, every chunk's CRC, and IEND last, so a damaged or cut-short file is refused before
// any decoding.

export type StructureProblem = { code: "damaged_file" | "truncated_file" | "unsupported_type"; detail: string };
export type PngStructure = {
  width?: number;
  height?: number;
  /** Bits per sample, colour type and interlacing from IHDR: what decoding will cost. */
  depth?: number;
  colour?: number;
  interlaced?: boolean;
  problem?: StructureProblem;
};

const SIGNATURE = Buffer.from([0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a]);

// Allowed bit depths per colour type (table 11.1).
const DEPTHS: Record<number, number[]> = { 0: [1, 2, 4, 8, 16], 2: [8, 16], 3: [1, 2, 4, 8], 4: [8, 16], 6: [8, 16] };

export function readPngStructure(bytes: Uint8Array): PngStructure {
  const b = Buffer.from(bytes.buffer, bytes.byteOffset, bytes.byteLength);
  if (b.length < 8 || !b.subarray(0, 8).equals(SIGNATURE)) {
    return { problem: { code: "damaged_file", detail: "it does not start like a PNG" } };
  }
  const out: PngStructure = {};
  const fail = (code: StructureProblem["code"], detail: string): PngStructure => ({ ...out, problem: { code, detail } });

  let pos = 8;
  let index = 0;
  let sawData = false;
  for (;;) {
    if (pos + 8 > b.length) {
      return fail("truncated_file", "it ends before its closing IEND chunk");
    }
    const length = b.readUInt32BE(pos);
    const type = b.toString("latin1", pos + 4, pos + 8);
    if (!/^[A-Za-z]{4}$/.test(type)) return fail("damaged_file", `a chunk at byte ${pos} has no valid name`);
    if (length > 0x7fffffff) return fail("damaged_file", `the ${type} chunk has an impossible length`);
    const end = pos + 12 + length;
    if (end > b.length) {
      return fail("truncated_file", `it ends inside the ${type} chunk, before its closing IEND chunk`);
    }
    const stored = b.readUInt32BE(end - 4);
    if (crc32(b.subarray(pos + 4, end - 4)) !== stored) {
      return fail("damaged_file", `the checksum of its ${type} chunk is wrong`);
    }

    if (index === 0) {
      if (type !== "IHDR" || length !== 13) return fail("damaged_file", "its first chunk is not a valid IHDR header");
      const width = b.readUInt32BE(pos + 8);
      const height = b.readUInt32BE(pos + 12);
      const depth = b[pos + 16];
      const colour = b[pos + 17];
      out.width = width;
      out.height = height;
      out.depth = depth;
      out.colour = colour;
      out.interlaced = b[pos + 20] === 1;
      if (width === 0 || height === 0 || width > 0x7fffffff || height > 0x7fffffff) {
        return fail("damaged_file", "its header gives an impossible width or height");
      }
      if (!DEPTHS[colour]?.includes(depth)) {
        return fail("damaged_file", `its header names an impossible colour type (${colour}) and bit depth (${depth})`);
      }
      if (b[pos + 18] !== 0 || b[pos + 19] !== 0 || b[pos + 20] > 1) {
        return fail("damaged_file", "its header names an unknown compression, filter or interlace method");
      }
    } else if (type === "IDAT") {
      sawData = true;
    } else if (type === "IEND") {
      if (!sawData) return fail("damaged_file", "it has no image data");
      return out; // bytes after IEND are ignored and never stored
    }
    pos = end;
    index += 1;
  }
}
