// The capture API: stream an upload to storage while reading its first bytes, refuse what the header
// already rules out, store row + job as one unit (removing the file if that fails), and report a
// capture to its owner. The file itself is read, checked and analysed by the worker's job, never here.
import { sequelize } from "~/db.server";
import { Capture } from "~/models/capture.server";
import { findOwn } from "~/auth/ownership.server";
import { sizeText } from "~/http/limited-stream.server";
import { readMultipart, splitHead, type FilePart } from "~/http/multipart.server";
import { refusal, type HttpError } from "~/http/errors.server";
import { enqueue, QUEUES } from "~/services/jobs.server";
import { deleteObjects, putObjectStream, randomKey } from "~/services/storage.server";
import {
  CAPTURE_LIMITS,
  CaptureError,
  HEADER_BYTES,
  checkHeader,
  identifyCaptureFile,
  inferKind,
  type CaptureFileKind,
} from "./captures.server";
import { readConditions } from "./capture-form.server";
import { RETRYABLE_FAILURE } from "./capture-job.server";

// Multipart framing and the condition fields around the file.
const FORM_OVERHEAD = 64 * 1024;
const limit = sizeText(CAPTURE_LIMITS.maxBytes);

const asRefusal = (e: unknown): unknown => (e instanceof CaptureError ? refusal(e.code, e.message) : e);

type Received = { key: string; fileName: string; file: CaptureFileKind; head: Uint8Array; bytes: number };

/**
 * The owner's new capture, queued for analysis; throws HttpError refusals. `listingId`, a listing of the
 * owner's the caller has checked, ties it to that draft: deleting the draft removes it.
 */
export async function submitCapture(request: Request, ownerId: string, opts: { listingId?: string } = {}): Promise<Capture> {
  const written: string[] = [];
  try {
    const { fields, files } = await readMultipart(request, {
      maxBytes: CAPTURE_LIMITS.maxBytes + FORM_OVERHEAD,
      maxFileBytes: CAPTURE_LIMITS.maxBytes,
      maxFiles: 1,
      tooLarge: (declared) =>
        refusal("file_too_large", `The upload is ${declared ? sizeText(declared) : `over ${limit}`}; captures are limited to ${limit}.`, {
          headers: { Connection: "close" },
        }),
      fileTooLarge: () =>
        refusal("file_too_large", `The file is over ${limit}; captures are limited to ${limit}.`, { headers: { Connection: "close" } }),
      tooManyFiles: () => refusal("one_file_only", "Send one capture per request, in the field `file`."),
      onFile: (part) => receive(part, written),
    });
    const received = files[0];
    if (!received || received.bytes === 0) {
      if (received) throw refusal("empty_file", "The file is empty.");
      throw refusal("no_file", "The upload has no `file` field with a capture in it.", { issues: [{ path: "file", message: "required" }] });
    }
    const read = readConditions(fields, inferKind(received.head, received.file));
    if (!read.ok) throw refusal("invalid_conditions", read.message, { issues: read.issues });
    checkHeader(received.head, received.fileName, read.conditions);
    return await sequelize.transaction(async (transaction) => {
      const capture = await Capture.create(
        {
          ownerId,
          listingId: opts.listingId ?? null,
          kind: read.conditions.kind,
          fileName: received.fileName,
          contentType: received.file === "wav" ? "audio/wav" : "text/csv",
          conditions: read.conditions,
          // What the file holds in full is the job's to say; until then, only what it is.
          format: { file: received.file },
          byteSize: received.bytes,
          storageKey: received.key,
        },
        { transaction },
      );
      // Queued in the same transaction: a worker never sees a job without its row, nor a row without a job.
      await enqueue(QUEUES.captureAnalyze, { captureId: capture.id }, { transaction });
      return capture;
    });
  } catch (error) {
    if (written.length) await deleteObjects(written).catch((e) => console.error(`[captures] could not remove ${written.join(", ")}`, e));
    throw asRefusal(error);
  }
}

/** One file part: what it is from its first bytes, then the whole of it streamed to storage. */
async function receive(part: FilePart, written: string[]): Promise<Received> {
  if (part.field !== "file") throw refusal("bad_request", `Send the capture in the field \`file\`, not \`${part.field.slice(0, 40)}\`.`);
  const fileName = (part.filename || "capture").slice(0, 255);
  try {
    const { head, all } = await splitHead(part.stream, HEADER_BYTES);
    if (head.length === 0) {
      part.stream.resume();
      return { key: "", fileName, file: "csv", head, bytes: 0 };
    }
    const file = await identifyCaptureFile(head, fileName);
    const key = randomKey("captures", file);
    written.push(key);
    const { bytes } = await putObjectStream(key, all, { contentType: file === "wav" ? "audio/wav" : "text/csv" });
    return { key, fileName, file, head, bytes };
  } catch (error) {
    throw asRefusal(error) as HttpError;
  }
}

/** The owner's capture, or null (also for someone else's or a malformed id: the API answers 404 to both). */
export function findOwnCapture(id: unknown, ownerId: string): Promise<Capture | null> {
  return findOwn(Capture, id, { ownerId });
}

/** Wait up to `seconds` for the job to finish (the answer is then immediate); null if it has not. */
export async function awaitCapture(id: string, seconds: number): Promise<Capture | null> {
  const deadline = Date.now() + seconds * 1000;
  while (Date.now() < deadline) {
    await new Promise((r) => setTimeout(r, 150));
    const c = await Capture.findByPk(id);
    if (!c || c.status === "done" || c.status === "failed") return c;
  }
  return null;
}

export function capturePath(id: string): string {
  return `/api/v1/captures/${id}`;
}

/** Six significant figures: more than any bench instrument resolves, without float noise. */
function rounded<T>(x: T): T {
  if (typeof x === "number") return (Number.isFinite(x) && x !== 0 ? Number(x.toPrecision(6)) : x) as T;
  if (Array.isArray(x)) return x.map(rounded) as T;
  if (x && typeof x === "object") return Object.fromEntries(Object.entries(x).map(([k, v]) => [k, rounded(v)])) as T;
  return x;
}

/** The public shape of a capture. */
export function presentCapture(c: Capture) {
  return {
    id: c.id,
    status: c.status,
    kind: c.kind,
    fileName: c.fileName,
    byteSize: c.byteSize,
    format: c.format,
    conditions: c.conditions,
    createdAt: c.createdAt.toISOString(),
    finishedAt: c.finishedAt?.toISOString() ?? null,
    ...(c.status === "done"
      ? { analysis: rounded(c.analysis), readings: rounded(c.readings), ...(c.sweep ? { sweep: rounded(c.sweep) } : {}) }
      : {}),
    ...(c.status === "failed" ? { error: { error: c.errorCode, message: c.errorMessage } } : {}),
    ...(isRetryable(c) ? { retry: `${capturePath(c.id)}/retry` } : {}),
  };
}

/** Failed on our side (storage, database) with its file still stored: it may be analysed again. */
export function isRetryable(c: Capture): boolean {
  return c.status === "failed" && c.errorCode === RETRYABLE_FAILURE && !!c.storageKey;
}

/**
 * Queue the owner's failed capture again, its attempts counted afresh; row and job in one transaction.
 * Null when the capture is not the owner's; throws a 409 refusal when it is not retryable.
 */
export async function retryCapture(id: unknown, ownerId: string): Promise<Capture | null> {
  const own = await findOwnCapture(id, ownerId);
  if (!own) return null;
  return sequelize.transaction(async (transaction) => {
    const c = await Capture.findByPk(own.id, { transaction, lock: transaction.LOCK.UPDATE });
    if (!c || !isRetryable(c)) {
      throw refusal(
        "conflict",
        c?.status === "failed"
          ? "This capture was refused for what its file holds; upload a corrected file instead."
          : "Only a capture whose analysis failed on our side can be tried again.",
      );
    }
    await c.update(
      { status: "queued", attempts: 0, errorCode: null, errorMessage: null, startedAt: null, finishedAt: null },
      { transaction },
    );
    await enqueue(QUEUES.captureAnalyze, { captureId: c.id }, { transaction });
    return c;
  });
}
