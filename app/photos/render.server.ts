import { Jimp } from "jimp";
import { PHOTO_LIMITS, PHOTO_SIZES, type PhotoSize } from "./limits";
import { fitWithin, flattenOnWhite, hasTransparency, shrink, type Bitmap } from "./pixels.server";

// Decodes an upload that passed the checks, turns it upright, and re-encodes everything from the
// decoded pixels: no byte of the upload's metadata (EXIF, GPS, comments, text chunks) can survive,
// because only pixels are carried across.

export type RenderedImage = { body: Buffer; contentType: "image/jpeg" | "image/png"; width: number; height: number };
export type RenderedPhoto = {
  /** Full size, upright, metadata-free; JPEG stays JPEG and PNG stays PNG (lossless stays lossless). */
  original: RenderedImage;
  sizes: Record<PhotoSize, RenderedImage>;
  /** 64-bit DCT perceptual hash as 16 hex digits. */
  phash: string;
};

const QUALITY: Record<PhotoSize | "original", number> = { thumb: 80, listing: 84, zoom: 86, original: 92 };

/** Thrown when the pixels cannot be decoded; the message is meant for the seller. */
export class UnreadableImage extends Error {}

type Image = Awaited<ReturnType<typeof Jimp.fromBuffer>>;

export async function renderPhoto(input: Buffer, contentType: "image/jpeg" | "image/png"): Promise<RenderedPhoto> {
  let image: Image;
  try {
    // jimp applies the EXIF orientation while decoding a JPEG.
    image = await Jimp.fromBuffer(input, {
      "image/jpeg": { maxResolutionInMP: PHOTO_LIMITS.maxMegapixels, maxMemoryUsageInMB: 1024 },
    });
  } catch (error) {
    console.warn("[photos] decode failed:", error);
    throw new UnreadableImage("The image data could not be decoded; it may be damaged. Export the photo again and upload the new file.");
  }
  if (image.mime !== contentType) {
    throw new UnreadableImage("The file changed type between upload and processing; upload it again.");
  }
  const encode = encoders(image);
  const full: Bitmap = image.bitmap;

  const original: RenderedImage =
    contentType === "image/png"
      ? { body: await encode.png(full), contentType, width: full.width, height: full.height }
      : { body: await encode.jpeg(full, QUALITY.original), contentType, width: full.width, height: full.height };

  // Largest to smallest, each step shrinking the previous one.
  let source = hasTransparency(full) ? flattenOnWhite(full) : full;
  const next = async (size: PhotoSize): Promise<RenderedImage> => {
    const target = fitWithin(source.width, source.height, PHOTO_SIZES[size]);
    source = shrink(source, target.width, target.height);
    return { body: await encode.jpeg(source, QUALITY[size]), contentType: "image/jpeg", ...target };
  };
  const zoom = await next("zoom");
  const listing = await next("listing");
  const thumb = await next("thumb");
  return { original, sizes: { zoom, listing, thumb }, phash: perceptualHash(source) };
}

// jimp's DCT hash squeezes the picture to 32 × 32 first; doing that step here with the area average
// (from the smallest size: upright and flattened, as buyers see it) saves its slower resampling.
function perceptualHash(smallest: Bitmap): string {
  const side = Math.min(32, smallest.width, smallest.height);
  const squeezed = shrink(smallest, side, side);
  // jimp types the instance fromBitmap makes as any.
  return bitsToHex((Jimp.fromBitmap(squeezed) as { pHash(): string }).pHash());
}

// The codecs jimp registered, called on a bitmap directly: jimp's own JPEG export first composites
// the image onto a background pixel by pixel, which costs as much as the encode itself.
function encoders(image: Image) {
  const find = (mime: string) => {
    const format = image.formats.find((f) => f.mime === mime);
    if (!format?.encode) throw new Error(`jimp has no ${mime} encoder`);
    return format.encode as (bitmap: Bitmap, options?: Record<string, unknown>) => Buffer | Promise<Buffer>;
  };
  const jpeg = find("image/jpeg");
  const png = find("image/png");
  // Only pixels go in: the JPEG codec hands the decoded EXIF block and comments back on the bitmap
  // object and would write them out again.
  const bare = ({ data, width, height }: Bitmap): Bitmap => ({ data, width, height });
  return {
    jpeg: async (bitmap: Bitmap, quality: number) => Buffer.from(await jpeg(bare(bitmap), { quality })),
    png: async (bitmap: Bitmap) => Buffer.from(await png(bare(bitmap))),
  };
}

function bitsToHex(bits: string): string {
  if (!/^[01]{64}$/.test(bits)) throw new Error(`unexpected perceptual hash: ${bits}`);
  return BigInt(`0b${bits}`).toString(16).padStart(16, "0");
}

/** Bits that differ between two hashes (0 = the same picture; small = probably the same photo). */
export function phashDistance(a: string, b: string): number {
  let x = BigInt(`0x${a}`) ^ BigInt(`0x${b}`);
  let count = 0;
  while (x) {
    count += Number(x & 1n);
    x >>= 1n;
  }
  return count;
}
