import { crc32, deflateSync } from "node:zlib";
import { Jimp } from "jimp";

// Files for the photo tests, made in the test itself: real JPEG/PNG from jimp, EXIF written by hand,
// and the wrong things sellers pick by mistake.

/** A JPEG of `width` × `height`: left half red, right half blue (so a rotation is easy to see). */
export async function twoToneJpeg(width: number, height: number, quality = 90): Promise<Buffer> {
  const image = new Jimp({ width, height, color: 0x2040c0ff });
  image.scan(0, 0, Math.floor(width / 2), height, (_x, _y, idx) => {
    image.bitmap.data[idx] = 0xd0;
    image.bitmap.data[idx + 1] = 0x30;
    image.bitmap.data[idx + 2] = 0x20;
  });
  return image.getBuffer("image/jpeg", { quality });
}

export async function plainPng(width: number, height: number, color = 0x6a4127ff): Promise<Buffer> {
  return new Jimp({ width, height, color }).getBuffer("image/png");
}

// EXIF (CIPA DC-008 / TIFF 6.0): big-endian TIFF header, IFD0 with Orientation (0x0112) and a pointer
// to the GPS IFD (0x8825) holding latitude and longitude as degrees/minutes/seconds rationals.
export const GPS_MARK = { latitude: [51, 28, 40], longitude: [7, 1, 3] } as const;

export function exifSegment({ orientation, gps = true }: { orientation: number; gps?: boolean }): Buffer {
  const entries0 = gps ? 2 : 1;
  const ifd0Size = 2 + entries0 * 12 + 4;
  const gpsOffset = 8 + ifd0Size;
  const gpsEntries = 4;
  const gpsSize = 2 + gpsEntries * 12 + 4;
  const latOffset = gpsOffset + gpsSize;
  const lonOffset = latOffset + 24;
  const tiff = Buffer.alloc(gps ? lonOffset + 24 : 8 + ifd0Size);
  tiff.write("MM", 0, "latin1");
  tiff.writeUInt16BE(42, 2);
  tiff.writeUInt32BE(8, 4);
  let p = 8;
  tiff.writeUInt16BE(entries0, p);
  p += 2;
  const entry = (tag: number, type: number, count: number, value: (at: number) => void) => {
    tiff.writeUInt16BE(tag, p);
    tiff.writeUInt16BE(type, p + 2);
    tiff.writeUInt32BE(count, p + 4);
    value(p + 8);
    p += 12;
  };
  entry(0x0112, 3, 1, (at) => tiff.writeUInt16BE(orientation, at)); // SHORT, left-justified
  if (gps) entry(0x8825, 4, 1, (at) => tiff.writeUInt32BE(gpsOffset, at)); // LONG
  tiff.writeUInt32BE(0, p); // no next IFD
  if (gps) {
    p = gpsOffset;
    tiff.writeUInt16BE(gpsEntries, p);
    p += 2;
    entry(0x0001, 2, 2, (at) => tiff.write("N\0", at, "latin1"));
    entry(0x0002, 5, 3, (at) => tiff.writeUInt32BE(latOffset, at));
    entry(0x0003, 2, 2, (at) => tiff.write("E\0", at, "latin1"));
    entry(0x0004, 5, 3, (at) => tiff.writeUInt32BE(lonOffset, at));
    tiff.writeUInt32BE(0, p);
    const rationals = (at: number, values: readonly number[]) =>
      values.forEach((v, i) => {
        tiff.writeUInt32BE(v, at + i * 8);
        tiff.writeUInt32BE(1, at + i * 8 + 4);
      });
    rationals(latOffset, GPS_MARK.latitude);
    rationals(lonOffset, GPS_MARK.longitude);
  }
  const body = Buffer.concat([Buffer.from("Exif\0\0", "latin1"), tiff]);
  const header = Buffer.from([0xff, 0xe1, 0, 0]);
  header.writeUInt16BE(body.length + 2, 2);
  return Buffer.concat([header, body]);
}

/** The JPEG with an APP1 EXIF segment right after SOI (where cameras put it). */
export function withExif(jpeg: Buffer, options: { orientation: number; gps?: boolean }): Buffer {
  return Buffer.concat([jpeg.subarray(0, 2), exifSegment(options), jpeg.subarray(2)]);
}

function pngChunk(type: string, data: Buffer): Buffer {
  const head = Buffer.alloc(8);
  head.writeUInt32BE(data.length, 0);
  head.write(type, 4, "latin1");
  const crc = Buffer.alloc(4);
  crc.writeUInt32BE(crc32(Buffer.concat([head.subarray(4), data])), 0);
  return Buffer.concat([head, data, crc]);
}

/**
 * A complete, valid PNG of `width` × `height` at 1 bit per pixel (all black): megapixels are what
 * the limit counts, and at one bit they cost little to make (60 MP ≈ 7.5 MB raw, a few kB deflated).
 */
export function bilevelPng(width: number, height: number): Buffer {
  const ihdr = Buffer.alloc(13);
  ihdr.writeUInt32BE(width, 0);
  ihdr.writeUInt32BE(height, 4);
  ihdr[8] = 1; // bit depth
  ihdr[9] = 0; // greyscale
  const row = Math.ceil(width / 8) + 1; // filter byte + packed pixels
  const raw = Buffer.alloc(row * height); // filter 0, all pixels 0
  return Buffer.concat([
    Buffer.from([0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a]),
    pngChunk("IHDR", ihdr),
    pngChunk("IDAT", deflateSync(raw, { level: 9 })),
    pngChunk("IEND", Buffer.alloc(0)),
  ]);
}

/** A PNG with a text chunk carrying a place name, to show that metadata does not survive. */
export function withPngText(png: Buffer, keyword: string, text: string): Buffer {
  const afterIhdr = 8 + 25;
  return Buffer.concat([
    png.subarray(0, afterIhdr),
    pngChunk("tEXt", Buffer.from(`${keyword}\0${text}`, "latin1")),
    png.subarray(afterIhdr),
  ]);
}

export const textFile = () =>
  Buffer.from("Bench notes, unit 4\nRecapped the power supply; bias set to 22 mA per side.\n".repeat(20), "utf8");

export const svgWithScript = () =>
  Buffer.from(
    `<?xml version="1.0" encoding="UTF-8"?>\n<svg xmlns="http://www.w3.org/2000/svg" width="200" height="100">` +
      `<rect width="200" height="100" fill="#6a4127"/><script>fetch('/api/v1/me')</script></svg>\n`,
    "utf8",
  );

/**
 * MPEG-1 Layer III audio (ISO/IEC 11172-3): an ID3v2.4 tag header, then frames with header
 * FF FB 90 64 (128 kbit/s, 44.1 kHz, 417-byte frames) and silent payload.
 */
export function mp3Audio(frames = 8): Buffer {
  const id3 = Buffer.from([0x49, 0x44, 0x33, 4, 0, 0, 0, 0, 0, 0]);
  const frame = Buffer.alloc(417);
  frame.set([0xff, 0xfb, 0x90, 0x64]);
  return Buffer.concat([id3, ...Array.from({ length: frames }, () => frame)]);
}

/** A GIF89a of 1 × 1 pixel. */
export const gifImage = () => Buffer.from("474946383961010001008000000000ffffff21f90401000000002c00000000010001000002024401003b", "hex");

/** A real JPEG padded past the limit with a comment-free tail of zeros. */
export async function oversizeJpeg(bytes: number): Promise<Buffer> {
  const jpeg = await twoToneJpeg(64, 48);
  const out = Buffer.alloc(bytes);
  jpeg.copy(out);
  return out;
}

/** The markers of a JPEG's header segments, up to the first scan (e.g. ["E0", "DB", "C0", "C4", "DA"]). */
export function jpegHeaderMarkers(jpeg: Buffer): string[] {
  const markers: string[] = [];
  let pos = 2;
  while (pos + 4 <= jpeg.length && jpeg[pos] === 0xff) {
    const marker = jpeg[pos + 1];
    markers.push(marker.toString(16).toUpperCase());
    if (marker === 0xda) break;
    pos += 2 + jpeg.readUInt16BE(pos + 2);
  }
  return markers;
}

/** The chunk types of a PNG in order. */
export function pngChunkTypes(png: Buffer): string[] {
  const types: string[] = [];
  for (let pos = 8; pos + 8 <= png.length; pos += 12 + png.readUInt32BE(pos)) {
    types.push(png.toString("latin1", pos + 4, pos + 8));
  }
  return types;
}

/** Mean red and blue of a band across the image at `yFraction` of its height (0 = top). */
export async function bandColour(image: Buffer, yFraction: number): Promise<{ red: number; blue: number }> {
  const decoded = await Jimp.fromBuffer(image);
  const { width, height, data } = decoded.bitmap;
  const y = Math.min(height - 1, Math.floor(height * yFraction));
  let red = 0;
  let blue = 0;
  for (let x = 0; x < width; x++) {
    red += data[(y * width + x) * 4];
    blue += data[(y * width + x) * 4 + 2];
  }
  return { red: red / width, blue: blue / width };
}

/** A made-up "photo": coloured blocks placed by a seeded generator, the same picture at any size. */
export async function sceneJpeg(seed: number, width: number, height: number, quality = 90): Promise<Buffer> {
  let state = seed >>> 0 || 1;
  const next = () => {
    state ^= state << 13;
    state ^= state >>> 17;
    state ^= state << 5;
    return (state >>> 0) / 2 ** 32;
  };
  const image = new Jimp({ width, height, color: 0xf5f0e6ff });
  const d = image.bitmap.data;
  for (let n = 0; n < 12; n++) {
    const x0 = Math.floor(next() * width * 0.8);
    const y0 = Math.floor(next() * height * 0.8);
    const x1 = Math.min(width, x0 + Math.ceil(next() * width * 0.5));
    const y1 = Math.min(height, y0 + Math.ceil(next() * height * 0.5));
    const rgb = [next() * 255, next() * 255, next() * 255].map(Math.floor);
    for (let y = y0; y < y1; y++) {
      for (let x = x0; x < x1; x++) d.set(rgb, (y * width + x) * 4);
    }
  }
  return image.getBuffer("image/jpeg", { quality });
}

/**
 * A zlib stream that inflates to `n` zero bytes, made by hand rather than by deflating them: one
 * fixed-Huffman block (RFC 1951, 3.2.6) of literal zeros and copies of 258 bytes at distance 1. At
 * 13 bits per 258 bytes, a gigabyte of zeros is 6.5 MB and takes milliseconds to make.
 */
export function zerosZlib(n: number): Buffer {
  const copies = n > 258 ? Math.floor((n - 1) / 258) : 0;
  const literals = n - copies * 258;
  const out = Buffer.alloc(Math.ceil((3 + literals * 8 + copies * 13 + 7) / 8) + 8);
  out[0] = 0x78;
  out[1] = 0x01;
  let bitPos = 16;
  const bits = (value: number, count: number) => {
    for (let i = 0; i < count; i++, bitPos++) if ((value >> i) & 1) out[bitPos >> 3] |= 1 << (bitPos & 7);
  };
  const code = (value: number, count: number) => {
    for (let i = count - 1; i >= 0; i--, bitPos++) if ((value >> i) & 1) out[bitPos >> 3] |= 1 << (bitPos & 7);
  };
  bits(1, 1); // last block
  bits(1, 2); // fixed Huffman codes
  for (let i = 0; i < literals; i++) code(0x30, 8); // literal 0
  for (let i = 0; i < copies; i++) {
    code(0xc5, 8); // length 258 (code 285)
    code(0, 5); // distance 1
  }
  code(0, 7); // end of block
  const end = (bitPos + 7) >> 3;
  // Adler-32 of n zeros: A stays 1, B adds 1 per byte.
  out.writeUInt32BE((n % 65521) * 65536 + 1, end);
  return out.subarray(0, end + 4);
}

/** A PNG around image data that is already compressed (the chunks are valid; the data may lie). */
export function pngWithData(
  {
    width,
    height,
    depth,
    colour,
    interlaced = false,
  }: { width: number; height: number; depth: number; colour: number; interlaced?: boolean },
  zlibData: Buffer,
): Buffer {
  const ihdr = Buffer.alloc(13);
  ihdr.writeUInt32BE(width, 0);
  ihdr.writeUInt32BE(height, 4);
  ihdr[8] = depth;
  ihdr[9] = colour;
  ihdr[12] = interlaced ? 1 : 0;
  return Buffer.concat([
    Buffer.from([0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a]),
    pngChunk("IHDR", ihdr),
    pngChunk("IDAT", zlibData),
    pngChunk("IEND", Buffer.alloc(0)),
  ]);
}

/** An interlaced 64 × 64 RGBA PNG whose image data inflates to 1 GiB (the image needs 21 KB). */
export const interlacedPngBomb = () => pngWithData({ width: 64, height: 64, depth: 8, colour: 6, interlaced: true }, zerosZlib(2 ** 30));

/** A black 16-bit RGB PNG of `width` × `height`: rows of zeros, each with filter byte 0. */
export const blackRgb16Png = (width: number, height: number) =>
  pngWithData({ width, height, depth: 16, colour: 2 }, zerosZlib(height * (1 + width * 6)));

/** A small real JPEG whose frame header claims `width` × `height` (its data covers 16 × 16). */
export async function jpegClaiming(width: number, height: number): Promise<Buffer> {
  const jpeg = Buffer.from(await twoToneJpeg(16, 16, 50));
  const sof = jpeg.indexOf(Buffer.from([0xff, 0xc0]));
  jpeg.writeUInt16BE(height, sof + 5);
  jpeg.writeUInt16BE(width, sof + 7);
  return jpeg;
}
