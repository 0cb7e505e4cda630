import { createDeflate, crc32 } from "node:zlib";
import type { Bitmap } from "./pixels.server";
import { uprightView } from "./exif-orientation.server";

// Encodes RGBA pixels as a PNG, one filtered scanline at a time into a deflate stream: memory is the
// compressed output and two scanlines, never a filtered copy of the whole image. RGB when every
// pixel is opaque, RGBA otherwise; nothing but IHDR, IDAT and IEND. Given an EXIF orientation, the
// stored pixels are read through a turned view and written upright, with no turned copy.

const SIGNATURE = Buffer.from([0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a]);

function chunk(type: string, body: Buffer): Buffer {
  const out = Buffer.alloc(12 + body.length);
  out.writeUInt32BE(body.length, 0);
  out.write(type, 4, "latin1");
  body.copy(out, 8);
  out.writeUInt32BE(crc32(out.subarray(4, 8 + body.length)), 8 + body.length);
  return out;
}

export async function encodePng(bitmap: Bitmap, orientation = 1): Promise<Buffer> {
  const { data } = bitmap;
  const view = uprightView(bitmap.width, bitmap.height, bitmap.width, orientation);
  const { width, height } = view;
  let opaque = true;
  for (let i = 3; i < data.length && opaque; i += 4) opaque = data[i] === 255;
  const channels = opaque ? 3 : 4;
  const rowBytes = width * channels;

  const ihdr = Buffer.alloc(13);
  ihdr.writeUInt32BE(width, 0);
  ihdr.writeUInt32BE(height, 4);
  ihdr[8] = 8;
  ihdr[9] = opaque ? 2 : 6;

  const deflate = createDeflate({ level: 6, chunkSize: 1 << 20 });
  const pieces: Buffer[] = [];
  deflate.on("data", (piece: Buffer) => pieces.push(piece));
  const done = new Promise<void>((resolve, reject) => {
    deflate.on("end", resolve);
    deflate.on("error", reject);
  });

  let previous = Buffer.alloc(rowBytes);
  let current = Buffer.alloc(rowBytes);
  for (let y = 0; y < height; y++) {
    const src = view.start + y * view.dy;
    for (let x = 0, o = 0; x < width; x++) {
      const i = (src + x * view.dx) * 4;
      current[o++] = data[i];
      current[o++] = data[i + 1];
      current[o++] = data[i + 2];
      if (!opaque) current[o++] = data[i + 3];
    }
    // Paeth (filter 4) on every line: photos compress best with it, and one pass keeps it quick.
    const line = Buffer.alloc(1 + rowBytes);
    line[0] = 4;
    for (let i = 0; i < rowBytes; i++) {
      const a = i >= channels ? current[i - channels] : 0;
      const b = previous[i];
      const c = i >= channels ? previous[i - channels] : 0;
      const p = a + b - c;
      const pa = Math.abs(p - a);
      const pb = Math.abs(p - b);
      const pc = Math.abs(p - c);
      line[1 + i] = current[i] - (pa <= pb && pa <= pc ? a : pb <= pc ? b : c);
    }
    if (!deflate.write(line)) await new Promise((r) => deflate.once("drain", r));
    [previous, current] = [current, previous];
  }
  deflate.end();
  await done;

  // One IDAT, written straight into the file: no second copy of the compressed data.
  const head = Buffer.concat([SIGNATURE, chunk("IHDR", ihdr)]);
  const tail = chunk("IEND", Buffer.alloc(0));
  const size = pieces.reduce((n, p) => n + p.length, 0);
  const out = Buffer.alloc(head.length + 12 + size + tail.length);
  head.copy(out, 0);
  let at = head.length;
  out.writeUInt32BE(size, at);
  out.write("IDAT", at + 4, "latin1");
  let crc = crc32(out.subarray(at + 4, at + 8));
  at += 8;
  for (const p of pieces) {
    p.copy(out, at);
    crc = crc32(p, crc);
    at += p.length;
  }
  out.writeUInt32BE(crc, at);
  tail.copy(out, at + 4);
  return out;
}
