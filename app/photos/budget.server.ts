import { formatBytes } from "./limits";
import type { JpegStructure } from "./jpeg-structure.server";
import type { PngStructure } from "./png-structure.server";

// What processing a photo will cost in memory, worked out from its header before a single pixel is
// decoded, and the refusals that follow: a photo whose processing would take more than
// PHOTO_MEMORY_BUDGET, and a JPEG whose image data is far too small for the size it claims (a few
// hundred bytes "of" 7000 × 7000 pixels). The worker keeps a few such photos' worth of headroom
// under 1 GB; scripts/bench.ts measures the real peaks against these estimates.

/** Bytes one photo's processing may use on top of the worker's own. */
export const PHOTO_MEMORY_BUDGET = 640 * 1024 * 1024;

export type PhotoHeader =
  { type: "image/png"; byteSize: number; png: PngStructure } | { type: "image/jpeg"; byteSize: number; jpeg: JpegStructure };

// jpeg-js (progressive files only) keeps each 8 × 8 block as its own small array: about 620 bytes
// a block, measured, where the coefficients alone are 256.
const PROGRESSIVE_BYTES_PER_BLOCK = 620;
const HEADROOM = 16 * 1024 * 1024; // the three sizes, zlib and codec buffers

function jpegGeometry(s: JpegStructure) {
  const width = s.width ?? 0;
  const height = s.height ?? 0;
  const sampling = s.sampling?.length ? s.sampling : [{ h: 1, v: 1 }];
  const hMax = Math.max(...sampling.map((c) => c.h));
  const vMax = Math.max(...sampling.map((c) => c.v));
  const mcus = Math.ceil(width / (8 * hMax)) * Math.ceil(height / (8 * vMax));
  const blocks = mcus * sampling.reduce((n, c) => n + c.h * c.v, 0);
  return { width, height, mcus, blocks, components: sampling.length };
}

/** Peak bytes the worker needs to decode, re-encode and resize this photo. */
export function processingCost(header: PhotoHeader): number {
  if (header.type === "image/png") {
    const { width = 0, height = 0 } = header.png;
    // RGBA pixels, decoded a scanline at a time; the re-encoded original is compressed output only
    // (a few times the upload at most, when a low bit depth becomes RGB).
    return width * height * 4 + 3 * header.byteSize + HEADROOM;
  }
  const { width, height, blocks, components } = jpegGeometry(header.jpeg);
  const rgba = width * height * 4;
  const encoded = width * height * 0.75;
  if (!header.jpeg.progressive) {
    // One byte per sample per component (whole blocks), then the worst case after decoding: a turned
    // photo whose size is not whole chroma samples (or a CMYK one) goes through full-size RGBA to be
    // written again upright. An upright one needs only its planes, often scaled, and the zoom size.
    return blocks * 64 + rgba + encoded + HEADROOM;
  }
  // jpeg-js: its blocks, its per-component lines and interleaved copy, RGBA, and the copy jimp
  // makes to turn an EXIF-rotated photo upright.
  return blocks * PROGRESSIVE_BYTES_PER_BLOCK + blocks * 64 * 1.2 + width * height * components + 2 * rgba + encoded + HEADROOM;
}

export type BudgetProblem = { code: "damaged_file" | "too_large_to_process"; message: string };

/**
 * Why this photo must not be decoded, or null. `name` is how the seller knows the file
 * (e.g. “front.jpg”); messages are sentences for the seller.
 */
export function budgetProblem(header: PhotoHeader, name: string): BudgetProblem | null {
  if (header.type === "image/jpeg") {
    const { width, height, mcus } = jpegGeometry(header.jpeg);
    // Every block's DC coefficient costs at least one bit, in any coding a decoder here accepts.
    const least = Math.ceil(mcus / 8);
    if ((header.jpeg.scanBytes ?? 0) < least) {
      return {
        code: "damaged_file",
        message:
          `${name} is a JPEG photo, but it is damaged: its header says ${width} × ${height} pixels, yet it carries only ` +
          `${formatBytes(header.jpeg.scanBytes ?? 0)} of image data, too little for that many pixels. Export it again and upload the new file.`,
      };
    }
  }
  const cost = processingCost(header);
  if (cost <= PHOTO_MEMORY_BUDGET) return null;
  const width = header.type === "image/png" ? (header.png.width ?? 0) : (header.jpeg.width ?? 0);
  const height = header.type === "image/png" ? (header.png.height ?? 0) : (header.jpeg.height ?? 0);
  const fits = Math.floor(((width * height) / 1e6) * (PHOTO_MEMORY_BUDGET / cost));
  const what = header.type === "image/jpeg" && header.jpeg.progressive ? "progressive JPEG" : "photo";
  const advice =
    header.type === "image/jpeg" && header.jpeg.progressive
      ? `Save it as a standard (baseline) JPEG, or scale it down to about ${fits} megapixels, and upload it again.`
      : `Scale it down to about ${fits} megapixels and upload it again.`;
  return {
    code: "too_large_to_process",
    message: `${name} is a ${what} of ${width} × ${height} pixels that would need ${formatBytes(cost)} of memory to process; photos may use at most ${formatBytes(PHOTO_MEMORY_BUDGET)}. ${advice}`,
  };
}
