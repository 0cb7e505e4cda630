import { Jimp } from "jimp";
import { PHOTO_LIMITS, PHOTO_SIZES, type PhotoSize } from "./limits";
import { fitWithin, flattenInPlace, hasTransparency, shrink, type Bitmap } from "./pixels.server";
import { readJpegStructure } from "./jpeg-structure.server";
import { readPngStructure } from "./png-structure.server";
import { budgetProblem, PHOTO_MEMORY_BUDGET, type PhotoHeader } from "./budget.server";
import { decodePng, PngDataProblem } from "./png-decode.server";
import { decodeSequentialJpeg, ProgressiveJpeg } from "./jpeg-decode.server";
import { JpegDataProblem } from "./jpeg-huffman.server";
import { exifOrientation } from "./exif-orientation.server";
import { encodeJpeg } from "./jpeg-encode.server";
import { encodePng } from "./png-encode.server";
import { dctHash, hashDistance } from "./perceptual-hash.server";

// Decodes an upload that passed the checks, turns it upright, and re-encodes everything from the
// decoded pixels: no byte of the upload's metadata (EXIF, GPS, comments, text chunks) can survive,
// because only pixels are carried across.
// Memory is the point of the order here: the header is checked against the budget before anything
// is decoded; PNG and sequential JPEG are decoded by our own codecs (one RGBA copy of the image,
// bounded inflation); only progressive JPEGs go through jimp's decoder, and only when they fit.

export type RenderedImage = { body: Buffer; contentType: "image/jpeg" | "image/png"; width: number; height: number };
export type RenderedPhoto = {
  /** Full size, upright, metadata-free; JPEG stays JPEG and PNG stays PNG (lossless stays lossless). */
  original: RenderedImage;
  sizes: Record<PhotoSize, RenderedImage>;
  /** 64-bit DCT perceptual hash as 16 hex digits, from the smallest size (upright and flattened, as buyers see it). */
  phash: string;
};

const QUALITY: Record<PhotoSize | "original", number> = { thumb: 80, listing: 84, zoom: 86, original: 92 };

/** Thrown when the pixels cannot be decoded; the message is meant for the seller. */
export class UnreadableImage extends Error {}

const DAMAGED = "The photo could not be decoded";

export async function renderPhoto(input: Buffer, contentType: "image/jpeg" | "image/png"): Promise<RenderedPhoto> {
  const full = await decodeWithinBudget(input, contentType);
  const original: RenderedImage =
    contentType === "image/png"
      ? { body: await encodePng(full), contentType, width: full.width, height: full.height }
      : { body: encodeJpeg(full, { quality: QUALITY.original }), contentType, width: full.width, height: full.height };

  // The original is written; the sizes are JPEG, so transparency goes onto white in place.
  if (hasTransparency(full)) flattenInPlace(full);
  // Largest to smallest, each step shrinking the previous one.
  let source: Bitmap = full;
  const next = (size: PhotoSize): RenderedImage => {
    const target = fitWithin(source.width, source.height, PHOTO_SIZES[size]);
    source = shrink(source, target.width, target.height);
    return { body: encodeJpeg(source, { quality: QUALITY[size] }), contentType: "image/jpeg", ...target };
  };
  const zoom = next("zoom");
  const listing = next("listing");
  const thumb = next("thumb");
  return { original, sizes: { zoom, listing, thumb }, phash: dctHash(source) };
}

/** The upright RGBA pixels, or UnreadableImage, without decoding anything the budget does not allow. */
async function decodeWithinBudget(input: Buffer, contentType: "image/jpeg" | "image/png"): Promise<Bitmap> {
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

  try {
    if (header.type === "image/png") return await decodePng(input);
    try {
      return decodeSequentialJpeg(input, exifOrientation(input));
    } catch (error) {
      if (!(error instanceof ProgressiveJpeg)) throw error;
    }
    // jimp applies the EXIF orientation while decoding.
    const image = await Jimp.fromBuffer(input, {
      "image/jpeg": { maxResolutionInMP: PHOTO_LIMITS.maxMegapixels, maxMemoryUsageInMB: PHOTO_MEMORY_BUDGET / 2 ** 20 },
    });
    return image.bitmap;
  } catch (error) {
    if (error instanceof PngDataProblem || error instanceof JpegDataProblem) {
      throw new UnreadableImage(`${DAMAGED}: ${error.message}. Export the photo again and upload the new file.`);
    }
    console.warn("[photos] decode failed:", error);
    throw new UnreadableImage(`${DAMAGED}; it may be damaged. Export the photo again and upload the new file.`);
  }
}

/** Bits that differ between two hashes (0 = the same picture; small = probably the same photo). */
export const phashDistance = hashDistance;
