import { parentPort } from "node:worker_threads";
import { encodeJpegSlice, mcuRows } from "./jpeg-encode.server";

// The thread behind encode-thread.server.ts: encodes RGBA pixels it shares with the job's thread
// (all of them, or the MCU rows asked for) and hands the JPEG back without a copy.

type Request = { id: number; data: Uint8Array; width: number; height: number; quality: number; rows?: [number, number] };

parentPort?.on("message", ({ id, data, width, height, quality, rows = [0, mcuRows(height)] }: Request) => {
  try {
    const bitmap = { data: Buffer.from(data.buffer, data.byteOffset, data.byteLength), width, height };
    const body = encodeJpegSlice(bitmap, quality, rows[0], rows[1]);
    const buffer = body.buffer as ArrayBuffer;
    parentPort!.postMessage({ id, buffer, offset: body.byteOffset, length: body.length }, [buffer]);
  } catch (error) {
    parentPort!.postMessage({ id, error: error instanceof Error ? error.message : String(error) });
  }
});
parentPort?.postMessage({ ready: true });
