import { CaptureError, checkHeader, HEADER_BYTES as CAPTURE_HEADER_BYTES, identifyCaptureFile } from "~/bench/captures.server";
import { readConditions } from "~/bench/capture-form.server";
import { splitHead, type FilePart } from "~/http/multipart.server";
import { putObjectStream, randomKey } from "~/services/storage.server";
import type { ContestCaptureUpload } from "./contest-captures.server";
import { CAPTURE_FIELD_PREFIX } from "./contest-words";
import type { FieldErrors } from "./readings-form";

// The contest form's capture: the file (field `capture`) is refused unless its first bytes are a WAV,
// then streamed to storage; its stated conditions (`capture.volts`, `capture.loadOhm` …, a sine
// recording) are read with the bench's own form reader and checked against the file's header.

const isObject = (v: unknown): v is object => typeof v === "object" && v !== null;

type Received = { key: string; fileName: string; head: Uint8Array; bytes: number };
export type CaptureFile = { capture: Received } | { captureError: string };

/** The capture (field `capture`): a WAV by its first bytes, then streamed to storage for the analysis job. */
export async function receiveCapture(part: FilePart, written: string[]): Promise<CaptureFile | null> {
  if (!part.filename) {
    part.stream.resume();
    return null;
  }
  const fileName = part.filename.slice(0, 255);
  const { head, all } = await splitHead(part.stream, CAPTURE_HEADER_BYTES);
  try {
    if ((await identifyCaptureFile(head, fileName)) !== "wav")
      throw new CaptureError("unsupported_format", "A capture sent with a contest is a WAV file.");
  } catch (e) {
    part.stream.resume();
    if (e instanceof CaptureError) return { captureError: e.message };
    throw e;
  }
  const key = randomKey("captures", "wav");
  written.push(key);
  const { bytes } = await putObjectStream(key, all, { contentType: "audio/wav" });
  return { capture: { key, fileName, head, bytes } };
}

/** The capture's stated conditions (fields `capture.*`, a sine recording), checked with its header. */
export function captureFrom(form: FormData, files: readonly unknown[], errors: FieldErrors): ContestCaptureUpload[] {
  const problems = files.flatMap((f) => (isObject(f) && "captureError" in f ? [(f as { captureError: string }).captureError] : []));
  if (problems.length) errors.capture = problems.join(" ");
  const received = files.flatMap((f) => (isObject(f) && "capture" in f ? [(f as { capture: Received }).capture] : []));
  if (!received.length) return [];
  const fields = new FormData();
  for (const [k, v] of form.entries()) if (k.startsWith(CAPTURE_FIELD_PREFIX)) fields.set(k.slice(CAPTURE_FIELD_PREFIX.length), v);
  fields.set("kind", "sine");
  if (!fields.get("scale")) fields.set("scale", "volts-per-full-scale");
  const read = readConditions(fields, "sine");
  if (!read.ok) {
    for (const issue of read.issues) errors[`${CAPTURE_FIELD_PREFIX}${issue.path.split(".").pop() ?? ""}`] ??= issue.message;
    errors.capture ??= read.message;
    return [];
  }
  const out: ContestCaptureUpload[] = [];
  for (const c of received) {
    if (c.bytes === 0) {
      errors.capture ??= "The capture file is empty.";
      continue;
    }
    try {
      checkHeader(c.head, c.fileName, read.conditions);
      out.push({ key: c.key, fileName: c.fileName, byteSize: c.bytes, conditions: read.conditions });
    } catch (e) {
      if (!(e instanceof CaptureError)) throw e;
      errors.capture ??= e.message;
    }
  }
  return out;
}
