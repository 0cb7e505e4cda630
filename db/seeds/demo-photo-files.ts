import { mkdir, readFile, writeFile } from "node:fs/promises";
import os from "node:os";
import { Worker } from "node:worker_threads";
import path from "node:path";
import { fileURLToPath } from "node:url";
import { Jimp } from "jimp";
import type { Category } from "@shared/catalogue";
import { shrink } from "~/photos/pixels.server";
import { dctHash } from "~/photos/perceptual-hash.server";
import { drawUnit } from "./demo-photos";

// The demo's photo files: drawn once, encoded as the photo pipeline would store them, and kept in a
// git-ignored cache so a fresh test database seeds in seconds. Bump GENERATION when the drawing changes.

const GENERATION = 8;
const here = path.dirname(fileURLToPath(import.meta.url));
const CACHE = path.resolve(here, "../../.local/cache/demo-photos", `g${GENERATION}`);

/** The pipeline's thumbnail long edge; listing and zoom are not enlarged past the drawing (1024 × 768). */
const THUMB = { width: 400, height: 300 };

export interface DemoPhotoFiles {
  /** 1024 × 768 JPEG, stored as original, zoom and listing size (the pipeline never enlarges). */
  full: Buffer;
  thumb: Buffer;
  width: number;
  height: number;
  phash: string;
}

export interface PhotoJob {
  category: Category;
  key: string;
  view: number;
}

/**
 * The files for many photos, drawn on up to two worker threads (drawing and JPEG encoding are pure
 * CPU); falls back to this thread where workers cannot start.
 */
export async function drawDemoPhotos(jobs: PhotoJob[]): Promise<DemoPhotoFiles[]> {
  const out: DemoPhotoFiles[] = new Array(jobs.length);
  const todo: number[] = [];
  for (const [i, job] of jobs.entries()) {
    const hit = await cached(job.key, job.view);
    if (hit) out[i] = hit;
    else todo.push(i);
  }
  const threads = Math.min(2, os.availableParallelism(), todo.length);
  if (threads < 2) {
    for (const i of todo) out[i] = await demoPhotoFiles(jobs[i].category, jobs[i].key, jobs[i].view);
    return out;
  }
  // The worker is TypeScript: register tsx's loader in the new thread before importing it.
  const entry = new URL("./demo-photo-worker.ts", import.meta.url).href;
  const boot = `import("tsx/esm/api").then(({ register }) => { register(); return import(${JSON.stringify(entry)}); })`;
  const workers = Array.from({ length: threads }, () => new Worker(boot, { eval: true }));
  try {
    await Promise.all(
      workers.map(async (worker) => {
        while (todo.length) {
          const i = todo.shift()!;
          out[i] = await new Promise<DemoPhotoFiles>((resolve, reject) => {
            const onMessage = (msg: { id: number; files?: DemoPhotoFiles; error?: string }) => {
              if (msg.id !== i) return;
              worker.off("message", onMessage);
              worker.off("error", reject);
              if (msg.error) reject(new Error(msg.error));
              else resolve({ ...msg.files!, full: Buffer.from(msg.files!.full), thumb: Buffer.from(msg.files!.thumb) });
            };
            worker.on("message", onMessage);
            worker.once("error", reject);
            worker.postMessage({ id: i, ...jobs[i] });
          });
        }
      }),
    );
  } finally {
    await Promise.all(workers.map((w) => w.terminate()));
  }
  return out;
}

async function cached(key: string, view: number): Promise<DemoPhotoFiles | null> {
  const base = path.join(CACHE, `${key}-${view}`);
  try {
    const [full, thumb, meta] = await Promise.all([
      readFile(`${base}.full.jpg`),
      readFile(`${base}.thumb.jpg`),
      readFile(`${base}.json`, "utf8"),
    ]);
    return { full, thumb, ...(JSON.parse(meta) as { width: number; height: number; phash: string }) };
  } catch {
    return null; // not drawn yet
  }
}

export async function demoPhotoFiles(category: Category, key: string, view: number): Promise<DemoPhotoFiles> {
  const hit = await cached(key, view);
  if (hit) return hit;
  const base = path.join(CACHE, `${key}-${view}`);
  const cv = drawUnit(category, key, view);
  const bitmap = { data: Buffer.from(cv.data.buffer, cv.data.byteOffset, cv.data.byteLength), width: cv.width, height: cv.height };
  const small = shrink(bitmap, THUMB.width, THUMB.height);
  const [full, thumb] = await Promise.all([encodeJpeg(bitmap, 84), encodeJpeg(small, 80)]);
  const phash = pipelineHash(small);
  const out = { full, thumb, width: cv.width, height: cv.height, phash };
  await mkdir(CACHE, { recursive: true });
  await Promise.all([
    writeFile(`${base}.full.jpg`, full),
    writeFile(`${base}.thumb.jpg`, thumb),
    writeFile(`${base}.json`, JSON.stringify({ width: out.width, height: out.height, phash })),
  ]);
  return out;
}

type Bitmap = { data: Buffer; width: number; height: number };

type Encoder = (bitmap: Bitmap, opts: { quality: number }) => Buffer | Promise<Buffer>;
let jpegEncoder: Encoder | undefined;

/** jimp's JPEG codec called on the bitmap directly (its image export composites pixel by pixel first). */
async function encodeJpeg(bitmap: Bitmap, quality: number): Promise<Buffer> {
  if (!jpegEncoder) {
    const probe = new Jimp({ width: 1, height: 1 });
    const format = probe.formats.find((f) => f.mime === "image/jpeg");
    if (!format?.encode) throw new Error("jimp has no JPEG encoder");
    jpegEncoder = format.encode as unknown as Encoder;
  }
  return Buffer.from(await jpegEncoder({ data: bitmap.data, width: bitmap.width, height: bitmap.height }, { quality }));
}

/** The same hash the photo pipeline stores (app/photos/render.server.ts): the DCT hash of the smallest size. */
function pipelineHash(smallest: Bitmap): string {
  return dctHash(smallest);
}
