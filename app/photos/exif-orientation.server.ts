// The EXIF orientation of a JPEG (CIPA DC-008: tag 0x0112 in IFD0 of the APP1 "Exif" segment) or
// of a PNG (its eXIf chunk: the same TIFF structure without the "Exif\0\0" prefix, PNG third
// edition, 11.3.6.1), 1–8, or 1 when absent or unreadable. Nothing else of the EXIF block is read.

export function exifOrientation(jpeg: Buffer): number {
  let pos = 2;
  while (pos + 4 <= jpeg.length && jpeg[pos] === 0xff) {
    const marker = jpeg[pos + 1];
    if (marker === 0xda || marker === 0xd9) break; // image data: no EXIF after this point
    const length = jpeg.readUInt16BE(pos + 2);
    if (marker === 0xe1 && jpeg.toString("latin1", pos + 4, pos + 10) === "Exif\0\0") {
      return orientationIn(jpeg.subarray(pos + 10, pos + 2 + length));
    }
    pos += 2 + length;
  }
  return 1;
}

/** The orientation of a PNG's first eXIf chunk; chunks were checked by readPngStructure. */
export function pngOrientation(png: Buffer): number {
  for (let pos = 8; pos + 12 <= png.length;) {
    const length = png.readUInt32BE(pos);
    const type = png.toString("latin1", pos + 4, pos + 8);
    if (type === "IEND") break;
    if (type === "eXIf") return orientationIn(png.subarray(pos + 8, pos + 8 + length));
    pos += 12 + length;
  }
  return 1;
}

function orientationIn(tiff: Buffer): number {
  if (tiff.length < 8) return 1;
  const little = tiff.toString("latin1", 0, 2) === "II";
  const u16 = (at: number) => (little ? tiff.readUInt16LE(at) : tiff.readUInt16BE(at));
  const u32 = (at: number) => (little ? tiff.readUInt32LE(at) : tiff.readUInt32BE(at));
  if (!little && tiff.toString("latin1", 0, 2) !== "MM") return 1;
  const ifd = u32(4);
  if (ifd + 2 > tiff.length) return 1;
  const entries = u16(ifd);
  for (let i = 0; i < entries; i++) {
    const at = ifd + 2 + i * 12;
    if (at + 12 > tiff.length) return 1;
    if (u16(at) === 0x0112) {
      const value = u16(at + 8); // a SHORT sits left-justified in the value field
      return value >= 1 && value <= 8 ? value : 1;
    }
  }
  return 1;
}

/**
 * Where decoded pixel (x, y) of a `width` × `height` image lands in the upright image, as an RGBA
 * byte index `start + x · dx + y · dy`, and the upright size.
 */
export function uprightLayout(width: number, height: number, orientation: number) {
  const swap = orientation >= 5;
  const W = swap ? height : width;
  const H = swap ? width : height;
  const at = (x: number, y: number) => (y * W + x) * 4;
  // For each orientation: where the stored origin goes, and the step for one stored column and row.
  const layouts: Record<number, [number, number, number]> = {
    1: [at(0, 0), 4, W * 4],
    2: [at(W - 1, 0), -4, W * 4],
    3: [at(W - 1, H - 1), -4, -W * 4],
    4: [at(0, H - 1), 4, -W * 4],
    5: [at(0, 0), W * 4, 4],
    6: [at(W - 1, 0), W * 4, -4],
    7: [at(W - 1, H - 1), -W * 4, -4],
    8: [at(0, H - 1), -W * 4, 4],
  };
  const [start, dx, dy] = layouts[orientation] ?? layouts[1];
  return { width: W, height: H, start, dx, dy };
}

/**
 * The upright picture read from a stored plane of `width` × `height` samples, `stride` apart: sample
 * (X, Y) of the upright picture is at start + X · dx + Y · dy, in samples.
 */
export function uprightView(width: number, height: number, stride: number, orientation: number) {
  const right = width - 1;
  const bottom = (height - 1) * stride;
  const views: Record<number, [number, number, number]> = {
    1: [0, 1, stride],
    2: [right, -1, stride],
    3: [bottom + right, -1, -stride],
    4: [bottom, 1, -stride],
    5: [0, stride, 1],
    6: [bottom, -stride, 1],
    7: [bottom + right, -stride, -1],
    8: [right, stride, -1],
  };
  const [start, dx, dy] = views[orientation] ?? views[1];
  const swap = orientation >= 5 && orientation <= 8;
  return { width: swap ? height : width, height: swap ? width : height, start, dx, dy };
}
