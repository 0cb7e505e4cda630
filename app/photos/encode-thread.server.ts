import { createRequire } from "node:module";
import path from "node:path";
import { pathToFileURL } from "node:url";
import { Worker } from "node:worker_threads";
import { encodeJpegSlice, mcuRows } from "./jpeg-encode.server";
import type { Bitmap } from "./pixels.server";

// One long-lived thread that encodes a JPEG while the job's own thread goes on: the photo job hands
// it most of the zoom size (the largest, about three quarters of the encoding) and makes and encodes
// the two smaller sizes and the rest of the zoom size meanwhile (docs/decisions/0034). The pixels are shared, not copied; the thread is started
// at the first photo, alongside its decoding, and never keeps the process alive. If it cannot start
// or fails, the work is done on the calling thread: a photo never waits on a missing thread.
// `PHOTO_THREADS=0` turns it off.

type Reply = { id: number; buffer?: ArrayBuffer; offset?: number; length?: number; error?: string; ready?: boolean };

let thread: Promise<Worker | null> | null = null;
const waiting = new Map<number, { resolve: (b: Buffer) => void; reject: (e: Error) => void }>();
let nextId = 1;

/** Starts the thread if it is not running; cheap to call for every photo. */
export function startEncoderThread(): Promise<Worker | null> {
  if (process.env.PHOTO_THREADS === "0") return Promise.resolve(null);
  thread ??= new Promise((resolve) => {
    try {
      // The worker is TypeScript like the rest: it registers tsx itself, whatever started this process.
      // tsx's ESM entry ("tsx/esm/api" as `import` resolves it), found from its package.
      const tsxPackage = createRequire(import.meta.url).resolve("tsx/package.json");
      const tsx = pathToFileURL(path.join(path.dirname(tsxPackage), "dist/esm/api/index.mjs")).href;
      const script = new URL("./encode-worker.ts", import.meta.url).href;
      const worker = new Worker(
        `import(${JSON.stringify(tsx)}).then(({ register }) => { register(); return import(${JSON.stringify(script)}); });`,
        { eval: true, execArgv: [] },
      );
      worker.on("message", (reply: Reply) => {
        if (reply.ready) {
          if (waiting.size === 0) worker.unref(); // held only while it has work
          return resolve(worker);
        }
        const job = waiting.get(reply.id);
        waiting.delete(reply.id);
        if (waiting.size === 0) worker.unref();
        if (!job) return;
        if (reply.error !== undefined || !reply.buffer) job.reject(new Error(reply.error ?? "no output"));
        else job.resolve(Buffer.from(reply.buffer, reply.offset, reply.length));
      });
      const gone = (error: Error) => {
        console.warn("[photos] encoder thread stopped:", error.message);
        thread = null; // the next photo starts another
        resolve(null);
        for (const job of waiting.values()) job.reject(error);
        waiting.clear();
      };
      worker.on("error", gone);
      worker.on("exit", (code) => gone(new Error(`exited with code ${code}`)));
    } catch (error) {
      console.warn("[photos] encoder thread could not start:", error);
      resolve(null);
    }
  });
  return thread;
}

/**
 * The 4:2:0 JPEG of `bitmap`, or of its MCU rows `rows` (`encodeJpegSlice`), encoded on the thread
 * when it runs; `bitmap.data` should sit in shared memory.
 */
export async function encodeJpegAside(
  bitmap: Bitmap,
  quality: number,
  rows: [number, number] = [0, mcuRows(bitmap.height)],
): Promise<Buffer> {
  const worker = await startEncoderThread();
  const shared = bitmap.data.buffer instanceof SharedArrayBuffer;
  const here = () => encodeJpegSlice(bitmap, quality, rows[0], rows[1]);
  if (!worker || !shared) return here();
  const id = nextId++;
  try {
    return await new Promise<Buffer>((resolve, reject) => {
      waiting.set(id, { resolve, reject });
      worker.ref();
      worker.postMessage({ id, data: bitmap.data, width: bitmap.width, height: bitmap.height, quality, rows });
    });
  } catch {
    return here();
  }
}

/** The bitmap copied into memory the thread can read too. */
export function sharedCopy(bitmap: Bitmap): Bitmap {
  const data = Buffer.from(new SharedArrayBuffer(bitmap.data.length));
  bitmap.data.copy(data);
  return { data, width: bitmap.width, height: bitmap.height };
}
