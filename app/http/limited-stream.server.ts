import { HttpError, refusal } from "./errors.server";

// The one size-limited stream every request body is read through: a declared Content-Length over the
// limit is refused before anything is read, and a body sent without one (chunked) stops being read
// at the first chunk past the limit. Nothing is buffered beyond the limit, and the rest of an
// oversized upload is left unread (the 413 closes the connection). Also: the text no column can hold.

export const KiB = 1024;
export const MiB = 1024 * 1024;

// The 413 closes the connection, so an upload cut off mid-stream is not read to its end.
export const CLOSE = { Connection: "close" };

export function sizeText(bytes: number): string {
  if (bytes >= MiB) return `${Number((bytes / MiB).toFixed(1))} MB`;
  if (bytes >= KiB) return `${Math.round(bytes / KiB)} KB`;
  return `${bytes} bytes`;
}

export function tooLarge(maxBytes: number, what = "The body"): (declared?: number) => HttpError {
  return (declared) =>
    refusal("too_large", `${what} ${declared ? `is ${sizeText(declared)}; it ` : ""}may be at most ${sizeText(maxBytes)}.`, {
      headers: CLOSE,
    });
}

/** The media type without parameters, lower-cased ("multipart/form-data"), or "" when there is none. */
export function mediaType(request: Request): string {
  return (request.headers.get("Content-Type") ?? "").split(";")[0].trim().toLowerCase();
}

function declaredLength(request: Request): number | null {
  const header = request.headers.get("Content-Length");
  if (header === null || !/^\s*\d+\s*$/.test(header)) return null;
  return Number(header);
}

/**
 * The body's chunks, refusing past `maxBytes`: by its Content-Length before the first read, else at
 * the first chunk that crosses the limit. Stopping early leaves the rest unread.
 */
export async function* limitedBody(
  request: Request,
  maxBytes: number,
  onTooLarge: (declared?: number) => HttpError = tooLarge(maxBytes),
): AsyncGenerator<Uint8Array> {
  const declared = declaredLength(request);
  if (declared !== null && declared > maxBytes) throw onTooLarge(declared);
  if (!request.body) return;
  if (request.bodyUsed) throw refusal("bad_request", "The body has already been read.");
  const reader = request.body.getReader();
  let total = 0;
  try {
    for (;;) {
      const { done, value } = await reader.read();
      if (done) return;
      total += value.byteLength;
      if (total > maxBytes) throw onTooLarge();
      yield value;
    }
  } finally {
    // Not cancel(): on the Node server that destroys the socket before the 413 can be sent.
    reader.releaseLock();
  }
}

/** The whole body as bytes, at most `maxBytes`. */
export async function readBytes(request: Request, maxBytes: number, onTooLarge = tooLarge(maxBytes)): Promise<Buffer> {
  const chunks: Uint8Array[] = [];
  for await (const chunk of limitedBody(request, maxBytes, onTooLarge)) chunks.push(chunk);
  return Buffer.concat(chunks);
}

export function utf8(bytes: Uint8Array, what: string): string {
  try {
    return new TextDecoder("utf-8", { fatal: true }).decode(bytes);
  } catch {
    throw refusal("bad_request", `${what} is not valid UTF-8 text.`);
  }
}

// ---- Text PostgreSQL cannot store --------------------------------------------------------------

const NUL = "\u0000";
const LONE_SURROGATE = /[\ud800-\udbff](?![\udc00-\udfff])|(?<![\ud800-\udbff])[\udc00-\udfff]/;

function unstorable(s: string): string | null {
  if (s.includes(NUL)) return "contains a NUL character (U+0000), which text cannot hold";
  if (LONE_SURROGATE.test(s)) return "holds a broken character (an unpaired surrogate)";
  return null;
}

function unstorableRefusal(path: string, problem: string): HttpError {
  const where = path ? `The field “${path}”` : "The body";
  return refusal("invalid", `${where} ${problem}; remove it and send it again.`, { issues: [{ path: path || "body", message: problem }] });
}

/** Refuses the first string (or key) anywhere in a parsed JSON value that no text column can store. */
export function assertStorableJson(value: unknown): void {
  // Iterative: a deeply nested body must not overflow the stack.
  const stack: [unknown, string][] = [[value, ""]];
  while (stack.length) {
    const [v, path] = stack.pop()!;
    if (typeof v === "string") {
      const problem = unstorable(v);
      if (problem) throw unstorableRefusal(path, problem);
    } else if (Array.isArray(v)) {
      for (let i = v.length - 1; i >= 0; i--) stack.push([v[i], path ? `${path}.${i}` : String(i)]);
    } else if (v && typeof v === "object") {
      for (const [k, child] of Object.entries(v)) {
        const problem = unstorable(k);
        if (problem) throw unstorableRefusal(path, `has a key that ${problem}`);
        stack.push([child, path ? `${path}.${k}` : k]);
      }
    }
  }
}

export function assertStorableForm(form: FormData): void {
  for (const [name, value] of form.entries()) {
    const nameProblem = unstorable(name);
    if (nameProblem) throw unstorableRefusal("", `has a field name that ${nameProblem}`);
    if (typeof value === "string") {
      const problem = unstorable(value);
      if (problem) throw unstorableRefusal(name, problem);
    }
  }
}
