import { parentPort } from "node:worker_threads";
import { encodeJpeg } from "./jpeg-encode.server";

// The thread behind encode-thread.server.ts: encodes RGBA pixels it shares with the job's thread
// and hands the JPEG back without a copy.

type Request = { id: number; data: Uint8Array; width: number; height: number; quality: number };

parentPort?.on("message", ({ id, data, width, height, quality }: Request) => {
  try {
    const body = encodeJpeg({ data: Buffer.from(data.buffer, data.byteOffset, data.byteLength), width, height }, { quality });
    const buffer = body.buffer as ArrayBuffer;
    parentPort!.postMessage({ id, buffer, offset: body.byteOffset, length: body.length }, [buffer]);
  } catch (error) {
    parentPort!.postMessage({ id, error: error instanceof Error ? error.message : String(error) });
  }
});
parentPort?.postMessage({ ready: true });
