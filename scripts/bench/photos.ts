// Memory of the photo job, for `npm run bench` (scripts/bench.ts prints the figures): the largest
// photos the upload limits allow (50 megapixels, 20 MB) and the image bombs, each processed in a
// process of its own (tests/support/photo-memory.ts) so its peak resident memory can be read.
// The goal: the worker stays under 1 GB for any upload inside the limits.
// Measured on the 2-core development machine, with jimp's decoders and jpeg-js's encoder before the
// photo codecs were our own, and after: a 49 MP 4:4:4 JPEG 1.71 GB (and failed) → 467 MB; a 49 MP
// 16-bit PNG 1.29 GB → 394 MB; a 50 MP RGBA PNG 905 MB → 384 MB; the interlaced PNG bomb 2.2 GB →
// 124 MB (refused); the JPEG claiming 7000 × 7000 1.55 GB → 110 MB (refused from its header).
import { execFileSync } from "node:child_process";
import { mkdtempSync, rmSync, writeFileSync } from "node:fs";
import { tmpdir } from "node:os";
import path from "node:path";
import { createDeflate } from "node:zlib";
import { encodeJpeg } from "../../app/photos/jpeg-encode.server";
import { interlacedPngBomb, jpegClaiming, pngWithData } from "../../tests/support/photo-files";
import { root } from "../stack";

type Figure = { label: string; value: number; unit: string; limit?: number };

let seed = 12345;
const noise = () => (seed = (seed * 1103515245 + 12345) >>> 0) >>> 27;

/** A camera-like picture: gradients, edges and sensor noise, so it compresses like a photo. */
function scene(width: number, height: number) {
  const data = Buffer.alloc(width * height * 4);
  for (let y = 0; y < height; y++) {
    for (let x = 0; x < width; x++) {
      const i = (y * width + x) * 4;
      const n = noise();
      const edge = ((x >> 9) + (y >> 9)) % 3 === 0 ? 60 : 0;
      data[i] = ((x >> 5) + n + edge) & 255;
      data[i + 1] = ((y >> 5) + n) & 255;
      data[i + 2] = (((x + y) >> 6) + n) & 255;
      data[i + 3] = 255;
    }
  }
  return { data, width, height };
}

/** A PNG of `width` × `height` at 16 bits per sample (RGB), smooth, written row by row. */
async function deepPng(width: number, height: number): Promise<Buffer> {
  const deflate = createDeflate({ level: 6 });
  const parts: Buffer[] = [];
  deflate.on("data", (p: Buffer) => parts.push(p));
  const ended = new Promise((r) => deflate.on("end", r));
  for (let y = 0; y < height; y++) {
    const row = Buffer.alloc(1 + width * 6);
    for (let x = 0; x < width; x++) {
      row.writeUInt16BE(((x >> 4) * 37) & 0xffff, 1 + x * 6);
      row.writeUInt16BE(((y >> 4) * 91) & 0xffff, 3 + x * 6);
      row.writeUInt16BE((((x + y) >> 5) * 53) & 0xffff, 5 + x * 6);
    }
    if (!deflate.write(row)) await new Promise((r) => deflate.once("drain", r));
  }
  deflate.end();
  await ended;
  return pngWithData({ width, height, depth: 16, colour: 2 }, Buffer.concat(parts));
}

type Measured = { outcome: string; baselineMb: number; peakMb: number; ms: number };

function measure(dir: string, name: string, bytes: Buffer, type: "image/jpeg" | "image/png"): Measured {
  const file = path.join(dir, name);
  writeFileSync(file, bytes);
  const out = execFileSync(path.join(root, "node_modules/.bin/tsx"), ["tests/support/photo-memory.ts", file, type], {
    cwd: root,
    encoding: "utf8",
  });
  return JSON.parse(out.trim().split("\n").at(-1)!) as Measured;
}

export async function photoFigures(): Promise<Figure[]> {
  const dir = mkdtempSync(path.join(tmpdir(), "loadline-bench-photos-"));
  try {
    const big = scene(8160, 6120);
    const figures: Figure[] = [];
    // A phone's photo, for time: the median of three runs, each in a process of its own.
    const phone = encodeJpeg(scene(4000, 3000), { quality: 88 });
    const runs = [0, 1, 2].map(() => measure(dir, "phone", phone, "image/jpeg"));
    const median = runs.map((r) => r.ms).sort((a, b) => a - b)[1];
    figures.push({
      label: `photo job, 12 MP JPEG 4:2:0 (4000 × 3000), ${(phone.length / (1 << 20)).toFixed(1)} MB: ${runs[0].outcome}; time, median of 3 (peak ${Math.max(...runs.map((r) => r.peakMb))} MB)`,
      value: median,
      unit: "ms",
    });
    const cases: [string, Buffer, "image/jpeg" | "image/png"][] = [
      ["50 MP JPEG 4:2:0 (8160 × 6120)", encodeJpeg(big, { quality: 88 }), "image/jpeg"],
      ["49 MP JPEG 4:4:4 (7000 × 7000)", encodeJpeg(scene(7000, 7000), { quality: 80, subsampling: "4:4:4" }), "image/jpeg"],
      ["49 MP 16-bit RGB PNG (7000 × 7000)", await deepPng(7000, 7000), "image/png"],
      ["interlaced 64 × 64 PNG inflating to 1 GiB", interlacedPngBomb(), "image/png"],
      ["JPEG claiming 7000 × 7000", await jpegClaiming(7000, 7000), "image/jpeg"],
    ];
    for (const [what, bytes, type] of cases) {
      const m = measure(dir, "photo", bytes, type);
      const size = bytes.length >= 1 << 20 ? `${(bytes.length / (1 << 20)).toFixed(1)} MB` : `${bytes.length} bytes`;
      figures.push({
        label: `photo job, ${what}, ${size}: ${m.outcome} in ${m.ms} ms; peak resident memory (process started at ${m.baselineMb} MB)`,
        value: m.peakMb,
        unit: "MB",
        limit: 1024,
      });
    }
    return figures;
  } finally {
    rmSync(dir, { recursive: true, force: true });
  }
}

// Runnable alone: `npx tsx scripts/bench/photos.ts`
if (import.meta.url === `file://${process.argv[1]}`) {
  for (const f of await photoFigures()) console.log(`${f.label}: ${f.value} ${f.unit}${f.limit ? ` (limit < ${f.limit} ${f.unit})` : ""}`);
}
