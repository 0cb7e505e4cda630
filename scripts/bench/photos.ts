// Time and memory of the photo job, for `npm run bench` (scripts/bench.ts prints the figures): a
// phone's 12 MP photo (under 2 s, at most 1.3 × its decode and resizes alone, under 400 MB peak), the
// largest photos the upload limits allow (50 megapixels, 20 MB; within the worker's memory budget)
// and the image bombs, each processed in a process of its own (tests/support/photo-memory.ts) so its
// peak resident memory can be read. The goal: the worker stays under 1 GB for any upload inside the
// limits. Decision 0034 has the figures before and after the lean pipeline.
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
import { PHOTO_MEMORY_BUDGET } from "../../app/photos/budget.server";
import { interlacedPngBomb, jpegClaiming, pngWithData, withExif } from "../../tests/support/photo-files";
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

type Measured = {
  outcome: string;
  baselineMb: number;
  peakMb: number;
  ms: number;
  cpuMs: number;
  phases: Record<string, number>;
  heapMb: number;
  buffersMb: number;
};

const median = (values: number[]) => [...values].sort((a, b) => a - b)[Math.floor(values.length / 2)];
const alone = (m: Measured) => (m.phases.decode ?? 0) + (m.phases.resize ?? 0);
const steps = (m: Measured) =>
  ["decode", "resize", "original", "encode", "hash"].map((p) => `${p === "resize" ? "resizes" : p} ${m.phases[p] ?? 0}`).join(", ");

/**
 * Time, the ratio to decode and resizes alone, and peak memory: each the median of three processes,
 * each a worker that has already processed a small photo (its encoder thread running, its code
 * compiled), as the photo job's worker is after its first photo.
 */
function timed(dir: string, what: string, bytes: Buffer, limits: { ms?: number; ratio?: number; peakMb?: number }): Figure[] {
  const runs = [0, 1, 2].map(() => measure(dir, "timed", bytes, "image/jpeg", true));
  const mid = runs.find((r) => r.ms === median(runs.map((x) => x.ms)))!;
  const ratio = Math.round(median(runs.map((r) => r.ms / alone(r))) * 100) / 100;
  const label = `photo job, ${what}, ${(bytes.length / (1 << 20)).toFixed(1)} MB, in a running worker: ${mid.outcome}`;
  return [
    { label: `${label}; time, median of 3 (CPU ${mid.cpuMs} ms; ms per step: ${steps(mid)})`, value: mid.ms, unit: "ms", limit: limits.ms },
    { label: `${label}; the whole over its decode and resizes alone, median of 3`, value: ratio, unit: "×", limit: limits.ratio },
    {
      label: `${label}; peak resident memory, highest of 3 (process started at ${mid.baselineMb} MB; heap at most ${Math.max(...runs.map((r) => r.heapMb))} MB, heap and buffers ${Math.max(...runs.map((r) => r.buffersMb))} MB)`,
      value: Math.max(...runs.map((r) => r.peakMb)),
      unit: "MB",
      limit: limits.peakMb,
    },
  ];
}

function measure(dir: string, name: string, bytes: Buffer, type: "image/jpeg" | "image/png", warm = false): Measured {
  const file = path.join(dir, name);
  writeFileSync(file, bytes);
  const out = execFileSync(
    path.join(root, "node_modules/.bin/tsx"),
    ["tests/support/photo-memory.ts", file, type, ...(warm ? ["--warm"] : [])],
    {
      cwd: root,
      encoding: "utf8",
    },
  );
  return JSON.parse(out.trim().split("\n").at(-1)!) as Measured;
}

export async function photoFigures(): Promise<Figure[]> {
  const dir = mkdtempSync(path.join(tmpdir(), "loadline-bench-photos-"));
  try {
    const figures: Figure[] = [];
    // A phone's photo, upright (its original stripped, not re-encoded), then the same turned by EXIF
    // (its original written again upright, so slower: no limit of its own).
    const phone = encodeJpeg(scene(4000, 3000), { quality: 88 });
    figures.push(...timed(dir, "12 MP JPEG 4:2:0 (4000 × 3000)", phone, { ms: 2000, ratio: 1.3, peakMb: 400 }));
    figures.push(...timed(dir, "12 MP JPEG 4:2:0 (4000 × 3000) with EXIF orientation 6 and GPS", withExif(phone, { orientation: 6 }), {}));
    const big = scene(8160, 6120);
    const largest = encodeJpeg(big, { quality: 88 });
    const m = measure(dir, "largest", largest, "image/jpeg");
    figures.push({
      label: `photo job, 50 MP JPEG 4:2:0 (8160 × 6120), ${(largest.length / (1 << 20)).toFixed(1)} MB: ${m.outcome} in ${m.ms} ms (CPU ${m.cpuMs} ms; ms per step: ${steps(m)}); memory over the process's start (${m.baselineMb} MB, peak ${m.peakMb} MB), against the budget of ${PHOTO_MEMORY_BUDGET / 2 ** 20} MB`,
      value: m.peakMb - m.baselineMb,
      unit: "MB",
      limit: PHOTO_MEMORY_BUDGET / 2 ** 20,
    });
    const cases: [string, Buffer, "image/jpeg" | "image/png"][] = [
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
