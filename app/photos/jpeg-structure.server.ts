// Walks a JPEG's marker segments (ITU-T T.81, Annex B) without decoding any pixels: finds the frame
// header for the dimensions and follows every scan to the end-of-image marker, so a file cut short
// in transfer is caught before a job spends time on it.

export type StructureProblem = { code: "damaged_file" | "truncated_file" | "unsupported_type"; detail: string };
export type JpegStructure = {
  width?: number;
  height?: number;
  /** Progressive frames need every coefficient kept until the last scan. */
  progressive?: boolean;
  /** Sampling factors per component, from the frame header. */
  sampling?: { h: number; v: number }[];
  /** Bytes of entropy-coded data over all scans. */
  scanBytes?: number;
  problem?: StructureProblem;
};

const SOI = 0xd8;
const EOI = 0xd9;
const SOS = 0xda;

// Frame headers: C0–CF except DHT (C4), JPG (C8) and DAC (CC).
const isFrameMarker = (m: number) => m >= 0xc0 && m <= 0xcf && m !== 0xc4 && m !== 0xc8 && m !== 0xcc;
// The decoder behind jimp reads baseline, extended sequential and progressive Huffman frames only.
const READABLE_FRAMES = new Set([0xc0, 0xc1, 0xc2]);
const CODINGS: Record<number, string> = {
  0xc3: "lossless coding",
  0xc5: "hierarchical coding",
  0xc6: "hierarchical coding",
  0xc7: "hierarchical coding",
  0xc9: "arithmetic coding",
  0xca: "arithmetic coding",
  0xcb: "arithmetic coding",
  0xcd: "hierarchical arithmetic coding",
  0xce: "hierarchical arithmetic coding",
  0xcf: "hierarchical arithmetic coding",
};

const cut = (detail: string): JpegStructure => ({ problem: { code: "truncated_file", detail } });

export function readJpegStructure(bytes: Uint8Array): JpegStructure {
  const b = Buffer.from(bytes.buffer, bytes.byteOffset, bytes.byteLength);
  if (b.length < 4 || b[0] !== 0xff || b[1] !== SOI) {
    return { problem: { code: "damaged_file", detail: "it does not start like a JPEG" } };
  }
  const out: JpegStructure = {};
  let pos = 2;
  let scans = 0;
  const fail = (problem: StructureProblem): JpegStructure => ({ ...out, problem });

  for (;;) {
    if (pos >= b.length) return { ...out, ...cut("it ends before the end-of-image marker") };
    if (b[pos] !== 0xff) return fail({ code: "damaged_file", detail: `unexpected data at byte ${pos}` });
    while (pos < b.length && b[pos] === 0xff) pos += 1; // fill bytes may pad any marker
    if (pos >= b.length) return { ...out, ...cut("it ends inside a marker") };
    const marker = b[pos];
    pos += 1;

    if (marker === EOI) {
      if (out.width === undefined) return fail({ code: "damaged_file", detail: "it has no frame header" });
      if (scans === 0) return fail({ code: "damaged_file", detail: "it has no image data" });
      return out; // anything after EOI (some cameras append data) is ignored and never stored
    }
    if (marker === SOI || marker === 0x00) return fail({ code: "damaged_file", detail: `stray marker at byte ${pos - 1}` });
    if ((marker >= 0xd0 && marker <= 0xd7) || marker === 0x01) continue; // stand-alone markers

    if (pos + 2 > b.length) return { ...out, ...cut("it ends inside a segment header") };
    const length = b.readUInt16BE(pos);
    if (length < 2) return fail({ code: "damaged_file", detail: `a segment at byte ${pos} has an impossible length` });
    if (pos + length > b.length) return { ...out, ...cut("it ends inside a segment") };

    if (isFrameMarker(marker)) {
      if (length < 8) return fail({ code: "damaged_file", detail: "the frame header is too short" });
      out.height = b.readUInt16BE(pos + 3);
      out.width = b.readUInt16BE(pos + 5);
      const precision = b[pos + 2];
      const components = b[pos + 7];
      out.progressive = marker === 0xc2;
      out.sampling = Array.from({ length: components }, (_, i) => ({ h: b[pos + 9 + i * 3] >> 4, v: b[pos + 9 + i * 3] & 15 }));
      if (!READABLE_FRAMES.has(marker)) {
        return fail({
          code: "unsupported_type",
          detail: `it uses ${CODINGS[marker] ?? "a rare coding"}, which we cannot read; export it again as a standard JPEG`,
        });
      }
      if (out.width === 0 || out.height === 0) {
        return fail({ code: "damaged_file", detail: "its frame header gives no width or height" });
      }
      if (![1, 3, 4].includes(components)) {
        return fail({ code: "damaged_file", detail: `its frame header names ${components} colour components` });
      }
      if (precision !== 8) {
        return fail({
          code: "unsupported_type",
          detail: `it has ${precision}-bit samples, which we cannot read; export it again as a standard 8-bit JPEG`,
        });
      }
      if (length < 8 + components * 3 || out.sampling.some((s) => s.h < 1 || s.h > 4 || s.v < 1 || s.v > 4)) {
        return fail({ code: "damaged_file", detail: "its frame header names impossible sampling factors" });
      }
    }

    pos += length;
    if (marker !== SOS) continue;

    if (out.width === undefined) return fail({ code: "damaged_file", detail: "image data comes before the frame header" });
    scans += 1;
    const scanStart = pos;
    // Entropy-coded data: 0xFF is followed by 0x00 (a stuffed byte) or a restart marker inside a scan;
    // any other marker ends the scan.
    for (;;) {
      const ff = b.indexOf(0xff, pos);
      if (ff < 0 || ff + 1 >= b.length) return { ...out, ...cut("it ends in the middle of the image data") };
      const next = b[ff + 1];
      if (next === 0x00 || (next >= 0xd0 && next <= 0xd7) || next === 0xff) {
        pos = ff + (next === 0xff ? 1 : 2);
        continue;
      }
      pos = ff;
      break;
    }
    out.scanBytes = (out.scanBytes ?? 0) + (pos - scanStart);
  }
}
