import { Jimp } from "jimp";
import { PHOTO_LIMITS, PHOTO_SIZES, type PhotoSize } from "./limits";
import { fitWithin, flattenInPlace, hasTransparency, shrink, type Bitmap } from "./pixels.server";
import { readJpegStructure, type JpegStructure } from "./jpeg-structure.server";
import { readPngStructure } from "./png-structure.server";
import { budgetProblem, PHOTO_MEMORY_BUDGET, type PhotoHeader } from "./budget.server";
import { decodePng, PngDataProblem } from "./png-decode.server";
import { decodeJpegPlanes, ProgressiveJpeg, type JpegPlanes } from "./jpeg-decode.server";
import { planesToRgba } from "./jpeg-colour.server";
import { JpegDataProblem } from "./jpeg-huffman.server";
import { exifOrientation, pngOrientation, uprightLayout, uprightView } from "./exif-orientation.server";
import { encodeJpeg, encodeJpegPlanes, encodeJpegSlice, mcuRows } from "./jpeg-encode.server";
import { encodePng } from "./png-encode.server";
import { stripJpegMetadata, stripPngMetadata } from "./strip.server";
import { encodeJpegAside, sharedCopy, startEncoderThread } from "./encode-thread.server";
import { dctHash, hashDistance } from "./perceptual-hash.server";

// An upload that passed the checks becomes an upright, metadata-free original, three upright JPEG
// sizes and a perceptual hash (docs/decisions/0034).
// - The original is the upload's own image data with every metadata segment or chunk left out
//   (strip.server.ts), not re-encoded, when it is already upright; a turned one (EXIF or eXIf
//   orientation 2–8) is written again upright — a JPEG from its decoded planes, without colour
//   conversion — so the stored original always shows as the sizes do, with no metadata at all.
// - The sizes never carry a byte of the upload's metadata: only pixels are carried across.
// - Memory: the header is checked against the budget before anything is decoded. A sequential JPEG
//   is decoded to planes, at 1/2, 1/4 or 1/8 scale when the zoom size allows and the original need
//   not be re-encoded, and its planes become the zoom size in one pass: no full-size RGBA copy.
//   PNG is decoded by our own codec (one RGBA copy, bounded inflation); only progressive JPEGs go
//   through jimp's decoder, and only when they fit.

export type RenderedImage = { body: Buffer; contentType: "image/jpeg" | "image/png"; width: number; height: number };
export type RenderedPhoto = {
  /** Full size, upright, metadata-free; JPEG stays JPEG and PNG stays PNG (lossless stays lossless). */
  original: RenderedImage;
  sizes: Record<PhotoSize, RenderedImage>;
  /** 64-bit DCT perceptual hash as 16 hex digits, from the smallest size (upright and flattened, as buyers see it). */
  phash: string;
};

/** Where the time goes, for the bench: decode, resize (the three sizes), original, encode, hash. */
export type PhaseTimer = (phase: "decode" | "resize" | "original" | "encode" | "hash", ms: number) => void;

const QUALITY: Record<PhotoSize | "original", number> = { thumb: 80, listing: 84, zoom: 86, original: 92 };

/** Thrown when the pixels cannot be decoded; the message is meant for the seller. */
export class UnreadableImage extends Error {}

const DAMAGED = "The photo could not be decoded";

export async function renderPhoto(input: Buffer, contentType: "image/jpeg" | "image/png", timer?: PhaseTimer): Promise<RenderedPhoto> {
  const time = phases(timer);
  const header = checkedHeader(input, contentType);
  void startEncoderThread(); // starts (once per process) while this photo decodes
  const decoded = await time("decode", () => decodeWithinBudget(input, header));
  // The original first: a transparent PNG's sizes are flattened onto white in place.
  const originalBody = await time("original", () => decoded.original());
  const original: RenderedImage = { body: originalBody, contentType, width: decoded.width, height: decoded.height };
  const zoom = await time("resize", () => sharedCopy(decoded.zoom()));
  decoded.release(); // the full-size pixels or planes are garbage from here

  // The zoom size is encoded in two slices of MCU rows: the top on the encoder thread while this one
  // makes and encodes the other sizes, then the bottom here: three quarters to one quarter, as the
  // listing size, thumbnail and their shrinking take this thread about half as long as the zoom
  // size's encoding (measured with npx tsx scripts/bench/photos.ts).
  const rows = mcuRows(zoom.height);
  const split = Math.ceil((rows * 3) / 4);
  const zoomTop = encodeJpegAside(zoom, QUALITY.zoom, [0, split]);
  const listingSize = fitWithin(zoom.width, zoom.height, PHOTO_SIZES.listing);
  const listing = await time("resize", () => shrink(zoom, listingSize.width, listingSize.height));
  const thumbSize = fitWithin(listing.width, listing.height, PHOTO_SIZES.thumb);
  const thumb = await time("resize", () => shrink(listing, thumbSize.width, thumbSize.height));
  const jpeg = (body: Buffer, bitmap: Bitmap): RenderedImage => ({
    body,
    contentType: "image/jpeg",
    width: bitmap.width,
    height: bitmap.height,
  });
  const listingOut = await time("encode", () => jpeg(encodeJpeg(listing, { quality: QUALITY.listing }), listing));
  const thumbOut = await time("encode", () => jpeg(encodeJpeg(thumb, { quality: QUALITY.thumb }), thumb));
  const phash = await time("hash", () => dctHash(thumb));
  const zoomBottom = await time("encode", () => encodeJpegSlice(zoom, QUALITY.zoom, split, rows));
  // Only the part of the thread's encoding not already overlapped counts as time of its own.
  const zoomOut = await time("encode", async () => jpeg(Buffer.concat([await zoomTop, zoomBottom]), zoom));
  return { original, sizes: { zoom: zoomOut, listing: listingOut, thumb: thumbOut }, phash };
}

function phases(timer?: PhaseTimer) {
  return async <T>(phase: Parameters<PhaseTimer>[0], work: () => T | Promise<T>): Promise<T> => {
    const started = performance.now();
    const out = await work();
    timer?.(phase, performance.now() - started);
    return out;
  };
}

function checkedHeader(input: Buffer, contentType: "image/jpeg" | "image/png"): PhotoHeader {
  const header: PhotoHeader =
    contentType === "image/png"
      ? { type: contentType, byteSize: input.length, png: readPngStructure(input) }
      : { type: contentType, byteSize: input.length, jpeg: readJpegStructure(input) };
  const structure = header.type === "image/png" ? header.png : header.jpeg;
  if (structure.problem?.detail.startsWith("it does not start like")) {
    throw new UnreadableImage("The file changed type between upload and processing; upload it again.");
  }
  if (structure.problem)
    throw new UnreadableImage(`${DAMAGED}: ${structure.problem.detail}. Export the photo again and upload the new file.`);
  const { width = 0, height = 0 } = structure;
  if (width * height > PHOTO_LIMITS.maxMegapixels * 1_000_000) {
    throw new UnreadableImage(
      `The photo has ${width} × ${height} pixels, more than the ${PHOTO_LIMITS.maxMegapixels} megapixels a photo may have.`,
    );
  }
  const costly = budgetProblem(header, "This file");
  if (costly) throw new UnreadableImage(costly.message);
  return header;
}

/** What was decoded: the upright size, and the two things made from it, the original first, each once. */
type Decoded = { width: number; height: number; original: () => Buffer | Promise<Buffer>; zoom: () => Bitmap; release: () => void };

async function decodeWithinBudget(input: Buffer, header: PhotoHeader): Promise<Decoded> {
  try {
    if (header.type === "image/png") return await decodedPng(input);
    try {
      return decodedJpeg(input, header.jpeg);
    } catch (error) {
      if (!(error instanceof ProgressiveJpeg)) throw error;
    }
    // jimp applies the EXIF orientation while decoding.
    const image = await Jimp.fromBuffer(input, {
      "image/jpeg": { maxResolutionInMP: PHOTO_LIMITS.maxMegapixels, maxMemoryUsageInMB: PHOTO_MEMORY_BUDGET / 2 ** 20 },
    });
    let full: Bitmap | null = image.bitmap;
    const upright = exifOrientation(input) === 1;
    return {
      width: full.width,
      height: full.height,
      zoom: () => zoomOf(full!),
      original: () => (upright ? stripJpegMetadata(input) : encodeJpeg(full!, { quality: QUALITY.original })),
      release: () => (full = null),
    };
  } catch (error) {
    if (error instanceof PngDataProblem || error instanceof JpegDataProblem) {
      throw new UnreadableImage(`${DAMAGED}: ${error.message}. Export the photo again and upload the new file.`);
    }
    console.warn("[photos] decode failed:", error);
    throw new UnreadableImage(`${DAMAGED}; it may be damaged. Export the photo again and upload the new file.`);
  }
}

function zoomOf(full: Bitmap): Bitmap {
  const size = fitWithin(full.width, full.height, PHOTO_SIZES.zoom);
  return shrink(full, size.width, size.height);
}

function decodedJpeg(input: Buffer, structure: JpegStructure): Decoded {
  const orientation = exifOrientation(input);
  const [w, h] = [structure.width!, structure.height!];
  const target = fitWithin(w, h, PHOTO_SIZES.zoom); // in the stored orientation
  // An upright upload's original is stripped, not re-encoded: only the zoom size's detail is needed.
  const scale =
    orientation !== 1 ? 1 : (([8, 4, 2] as const).find((k) => Math.ceil(w / k) >= target.width && Math.ceil(h / k) >= target.height) ?? 1);
  let planes: JpegPlanes | null = decodeJpegPlanes(input, scale);
  const swap = orientation >= 5 && orientation <= 8;
  return {
    width: swap ? h : w,
    height: swap ? w : h,
    zoom: () => planesToRgba(planes!, orientation, target),
    original: () => (orientation === 1 ? stripJpegMetadata(input) : uprightJpeg(planes!, orientation)),
    release: () => (planes = null),
  };
}

// A turned JPEG written again upright from its own planes (each read through a turned view), with
// its own sampling turned too. Through RGBA instead: CMYK and RGB files, and sizes that are not whole
// chroma samples (an odd width at 4:2:0), where a turned chroma grid would sit half a sample off.
function uprightJpeg(p: JpegPlanes, orientation: number): Buffer {
  const n = p.components.length;
  const ycc = n === 3 && p.adobeTransform !== 0;
  const whole = p.width % p.hMax === 0 && p.height % p.vMax === 0;
  if (n !== 1 && (!ycc || !whole)) return encodeJpeg(planesToRgba(p, orientation), { quality: QUALITY.original });
  const swap = orientation >= 5;
  const views = p.components.map((c) => {
    const cw = Math.ceil((p.width * c.h) / p.hMax);
    const ch = Math.ceil((p.height * c.v) / p.vMax);
    const view = uprightView(cw, ch, c.stride, orientation);
    return { plane: c.plane, ...view, h: swap ? c.v : c.h, v: swap ? c.h : c.v };
  });
  return encodeJpegPlanes(swap ? p.height : p.width, swap ? p.width : p.height, views, { quality: QUALITY.original });
}

async function decodedPng(input: Buffer): Promise<Decoded> {
  const orientation = pngOrientation(input);
  let full: Bitmap | null = await decodePng(input);
  const swap = orientation >= 5 && orientation <= 8;
  return {
    width: swap ? full.height : full.width,
    height: swap ? full.width : full.height,
    original: () => (orientation === 1 ? stripPngMetadata(input) : encodePng(full!, orientation)),
    zoom: () => {
      // The original is written; the sizes are JPEG, so transparency goes onto white in place.
      if (hasTransparency(full!)) flattenInPlace(full!);
      return turned(zoomOf(full!), orientation);
    },
    release: () => (full = null),
  };
}

/** A (small) bitmap in the stored orientation turned upright. */
function turned(src: Bitmap, orientation: number): Bitmap {
  if (orientation === 1) return src;
  const layout = uprightLayout(src.width, src.height, orientation);
  const out = Buffer.alloc(src.data.length);
  for (let y = 0, i = 0; y < src.height; y++) {
    let o = layout.start + y * layout.dy;
    for (let x = 0; x < src.width; x++, i += 4, o += layout.dx) src.data.copy(out, o, i, i + 4);
  }
  return { data: out, width: layout.width, height: layout.height };
}

/** Bits that differ between two hashes (0 = the same picture; small = probably the same photo). */
export const phashDistance = hashDistance;
