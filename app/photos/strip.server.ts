// Metadata stripped without touching the picture: the upload's own image data, byte for byte, with
// every segment or chunk that could carry anything else left out. What is kept is a whitelist, so a
// kind of metadata we have never heard of is dropped too.
// JPEG (ITU-T T.81, Annex B): SOI, the quantisation and Huffman tables, the restart interval, the
// frame header, each scan header with its entropy-coded data, EOI. Dropped: APP0–APP15 (JFIF, EXIF
// with GPS, XMP, ICC, maker notes, MPF and its appended images), COM, and anything after EOI. One
// thing of APP14 matters to the picture — Adobe's colour-transform flag, which says whether three
// components are YCbCr or RGB — so when the upload has one, a fresh APP14 of our own carries only it.
// PNG (ISO/IEC 15948): IHDR, PLTE, tRNS, IDAT, IEND; every text, time, EXIF and other chunk dropped.

const KEPT_JPEG = new Set([0xdb, 0xc4, 0xdd, 0xc0, 0xc1, 0xc2, 0xda]);

/** The JPEG without metadata; the file has passed readJpegStructure. */
export function stripJpegMetadata(jpeg: Buffer): Buffer {
  const parts: Buffer[] = [Buffer.from([0xff, 0xd8])];
  let adobe: number | null = null;
  let pos = 2;
  while (pos + 1 < jpeg.length) {
    while (jpeg[pos] === 0xff && jpeg[pos + 1] === 0xff) pos += 1; // fill bytes
    const marker = jpeg[pos + 1];
    if (marker === 0xd9) break;
    if (marker >= 0xd0 && marker <= 0xd7) {
      pos += 2;
      continue;
    }
    const end = pos + 2 + jpeg.readUInt16BE(pos + 2);
    if (marker === 0xee && jpeg.toString("latin1", pos + 4, pos + 9) === "Adobe" && end - pos >= 16) adobe = jpeg[pos + 15];
    if (!KEPT_JPEG.has(marker)) {
      pos = end;
      continue;
    }
    if (marker !== 0xda) {
      parts.push(jpeg.subarray(pos, end));
      pos = end;
      continue;
    }
    // A scan: its header and entropy-coded data run to the next marker other than RSTn (or a stuffed 0xFF00).
    let p = end;
    for (;;) {
      p = jpeg.indexOf(0xff, p);
      if (p < 0 || p + 1 >= jpeg.length) {
        p = jpeg.length;
        break;
      }
      const next = jpeg[p + 1];
      if (next === 0x00 || (next >= 0xd0 && next <= 0xd7)) p += 2;
      else break;
    }
    parts.push(jpeg.subarray(pos, p));
    pos = p;
  }
  if (adobe !== null) {
    // "Adobe", version 100, flags 0 and 0, the transform (the segment of Adobe's DCTDecode notes).
    parts.splice(1, 0, Buffer.from([0xff, 0xee, 0, 14, 0x41, 0x64, 0x6f, 0x62, 0x65, 0, 100, 0, 0, 0, 0, adobe]));
  }
  parts.push(Buffer.from([0xff, 0xd9]));
  return Buffer.concat(parts);
}

const KEPT_PNG = new Set(["IHDR", "PLTE", "tRNS", "IDAT", "IEND"]);

/** The PNG without metadata; the file has passed readPngStructure (so every CRC is right). */
export function stripPngMetadata(png: Buffer): Buffer {
  const parts: Buffer[] = [png.subarray(0, 8)];
  for (let pos = 8; pos + 12 <= png.length;) {
    const length = png.readUInt32BE(pos);
    const type = png.toString("latin1", pos + 4, pos + 8);
    const end = pos + 12 + length;
    if (KEPT_PNG.has(type)) parts.push(png.subarray(pos, end));
    if (type === "IEND") break;
    pos = end;
  }
  return Buffer.concat(parts);
}
