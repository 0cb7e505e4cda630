// The capture API: accept an upload (refuse what cannot be measured before anything is stored),
// store file + row + job as one unit, and report a capture to its owner.
import { sequelize } from "~/db.server";
import { Capture } from "~/models/capture.server";
import { enqueue, QUEUES } from "~/services/jobs.server";
import { deleteObject, putObject, randomKey } from "~/services/storage.server";
import { CAPTURE_LIMITS, CaptureError, checkSize, identifyCapture, inferKind, preflightCapture, type CaptureFormat } from "./captures.server";
import { readConditions, type ConditionsIssue } from "./capture-form.server";

export type ApiError = { error: string; message: string; issues?: ConditionsIssue[]; details?: Record<string, unknown> };
type Refusal = { status: number; body: ApiError };

const refuse = (status: number, error: string, message: string, extra: Partial<ApiError> = {}): Refusal => ({
  status,
  body: { error, message, ...extra },
});

const fromCaptureError = (e: CaptureError): Refusal => ({ status: e.status, body: e.toJSON() });

// Multipart framing around the file; anything beyond this over the limit cannot hold a valid capture.
const FORM_OVERHEAD = 64 * 1024;
const UUID = /^[0-9a-f]{8}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{12}$/i;

export type SubmitResult = { ok: true; capture: Capture } | { ok: false; refusal: Refusal };

export async function submitCapture(request: Request, ownerId: string): Promise<SubmitResult> {
  const length = Number(request.headers.get("Content-Length") ?? "0");
  if (length > CAPTURE_LIMITS.maxBytes + FORM_OVERHEAD) {
    const limit = (CAPTURE_LIMITS.maxBytes / 1048576).toFixed(1);
    const e = new CaptureError("FILE_TOO_LARGE", `The upload is ${(length / 1048576).toFixed(1)} MB; captures are limited to ${limit} MB.`);
    return { ok: false, refusal: fromCaptureError(e) };
  }
  let form: FormData;
  try {
    form = await request.formData();
  } catch {
    return { ok: false, refusal: refuse(400, "BAD_REQUEST", "Send the capture as multipart/form-data with a `file` field.") };
  }
  const file = form.get("file");
  if (!(file instanceof File)) {
    return { ok: false, refusal: refuse(400, "FILE_MISSING", "The upload has no `file` field with a capture in it.", { issues: [{ path: "file", message: "required" }] }) };
  }
  const fileName = (file.name || "capture").slice(0, 255);
  try {
    checkSize(file.size);
    const bytes = new Uint8Array(await file.arrayBuffer());
    const kindOfFile = identifyCapture(bytes, fileName);
    const read = readConditions(form, inferKind(bytes, kindOfFile));
    if (!read.ok) return { ok: false, refusal: refuse(400, "INVALID_CONDITIONS", read.message, { issues: read.issues }) };
    const format = preflightCapture(bytes, fileName, read.conditions);
    const capture = await store(bytes, {
      ownerId,
      kind: read.conditions.kind,
      fileName,
      contentType: kindOfFile === "wav" ? "audio/wav" : "text/csv",
      conditions: read.conditions,
      format,
    });
    return { ok: true, capture };
  } catch (e) {
    if (e instanceof CaptureError) return { ok: false, refusal: fromCaptureError(e) };
    throw e;
  }
}

/** File, row and job together: if the row or the job cannot be written, the file goes too. */
async function store(
  bytes: Uint8Array,
  meta: Pick<Capture, "ownerId" | "kind" | "fileName" | "contentType" | "conditions"> & { format: CaptureFormat },
): Promise<Capture> {
  const key = randomKey("captures", meta.contentType === "audio/wav" ? "wav" : "csv");
  await putObject(key, bytes, { contentType: meta.contentType, contentLength: bytes.length });
  try {
    return await sequelize.transaction(async (transaction) => {
      const capture = await Capture.create(
        { ...meta, byteSize: bytes.length, storageKey: key },
        { transaction },
      );
      // The job is written in the same transaction, so a worker never sees a job without its row.
      await enqueue(QUEUES.captureAnalyze, { captureId: capture.id }, {
        db: {
          executeSql: async (text: string, values: unknown[]) => {
            // pg reads undefined as NULL; Sequelize's bind wants it said.
            const bind = values.map((v) => (v === undefined ? null : v));
            const [rows] = await sequelize.query(text, { bind, transaction });
            return { rows };
          },
        },
      });
      return capture;
    });
  } catch (error) {
    await deleteObject(key).catch((e) => console.error(`[captures] could not remove ${key} after a failed save`, e));
    throw error;
  }
}

/** The owner's capture, or null (also for someone else's or a malformed id: the API answers 404 to both). */
export async function findOwnCapture(id: string, ownerId: string): Promise<Capture | null> {
  if (!UUID.test(id)) return null;
  return Capture.findOne({ where: { id, ownerId } });
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
  };
}
