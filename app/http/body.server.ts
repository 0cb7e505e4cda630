import busboy from "busboy";
import type { Readable } from "node:stream";
import { HttpError, pageError, refusal } from "./errors.server";

// Every request body is read here, through one size-limited stream: a declared Content-Length over the
// limit is refused before anything is read, and a body sent without one (chunked) stops being read at
// the first chunk past the limit. Nothing is buffered beyond the limit, and the rest of an oversized
// upload is left unread (the 413 closes the connection). Multipart is parsed as a stream (busboy) with
// per-file limits; files are kept in memory only where a route allows small ones, else each goes to
// the route's own handler (captures and photos stream theirs to object storage).

export const KiB = 1024;
export const MiB = 1024 * 1024;

/** Sizes of the bodies pages and small APIs take. */
export const BODY_LIMITS = {
  /** Sign-in, account and admin forms, the watch button. */
  form: 64 * KiB,
  /** The listing editor's steps (long notes, many parts). */
  editorForm: 256 * KiB,
  /** The bench sheet step without JavaScript: up to 300 readings as form fields. */
  benchForm: 1 * MiB,
} as const;

// The 413 closes the connection, so an upload cut off mid-stream is not read to its end.
const CLOSE = { Connection: "close" };

export function sizeText(bytes: number): string {
  if (bytes >= MiB) return `${Number((bytes / MiB).toFixed(1))} MB`;
  if (bytes >= KiB) return `${Math.round(bytes / KiB)} KB`;
  return `${bytes} bytes`;
}

export function tooLarge(maxBytes: number, what = "The body"): (declared?: number) => HttpError {
  return (declared) =>
    refusal("too_large", `${what} ${declared ? `is ${sizeText(declared)}; it ` : ""}may be at most ${sizeText(maxBytes)}.`, { headers: CLOSE });
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

function utf8(bytes: Uint8Array, what: string): string {
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
function assertStorableJson(value: unknown): void {
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

function assertStorableForm(form: FormData): void {
  for (const [name, value] of form.entries()) {
    const nameProblem = unstorable(name);
    if (nameProblem) throw unstorableRefusal("", `has a field name that ${nameProblem}`);
    if (typeof value === "string") {
      const problem = unstorable(value);
      if (problem) throw unstorableRefusal(name, problem);
    }
  }
}

// ---- JSON ------------------------------------------------------------------------------------

const isJson = (type: string) => type === "application/json" || /^application\/[\w.-]+\+json$/.test(type);

/** A JSON body of at most `maxBytes`: 415 for another type, 400 for JSON that does not parse, 413 past the limit. */
export async function readJson(request: Request, maxBytes: number, what = "The body"): Promise<unknown> {
  if (!isJson(mediaType(request))) throw refusal("unsupported_media_type", `Send ${what.toLowerCase()} as application/json.`);
  const text = utf8(await readBytes(request, maxBytes, tooLarge(maxBytes, what)), what);
  if (text.trim() === "") throw refusal("invalid_json", `${what} is empty; send JSON.`);
  let value: unknown;
  try {
    value = JSON.parse(text);
  } catch (e) {
    throw refusal("invalid_json", `${what} is not valid JSON: ${(e as Error).message}`);
  }
  assertStorableJson(value);
  return value;
}

// ---- Forms -----------------------------------------------------------------------------------

export type FormOptions = {
  maxBytes?: number;
  /** Files in a multipart form are kept in memory up to this size each; 0 refuses files. */
  maxFileBytes?: number;
  maxFiles?: number;
};

/**
 * A form, urlencoded or multipart, as FormData. 415 for any other type, 400 for a broken multipart
 * body, 413 past the limit, 400 naming the field for text no column can hold.
 */
export async function readForm(request: Request, options: FormOptions = {}): Promise<FormData> {
  const maxBytes = options.maxBytes ?? BODY_LIMITS.form;
  const type = mediaType(request);
  let form: FormData;
  if (type === "application/x-www-form-urlencoded") {
    const text = utf8(await readBytes(request, maxBytes, tooLarge(maxBytes, "The form")), "The form");
    form = new FormData();
    for (const [k, v] of new URLSearchParams(text)) form.append(k, v);
  } else if (type === "multipart/form-data") {
    const maxFileBytes = options.maxFileBytes ?? 0;
    const { fields, files } = await readMultipart(request, {
      maxBytes,
      maxFileBytes: Math.max(maxFileBytes, 1),
      maxFiles: maxFileBytes > 0 ? (options.maxFiles ?? 1) : 0,
      tooLarge: tooLarge(maxBytes, "The form"),
      tooManyFiles: () => refusal("bad_request", maxFileBytes > 0 ? "The form carries more files than it takes." : "This form takes no files."),
      onFile: async (file) => ({ file, bytes: await collect(file.stream) }),
    });
    form = fields;
    for (const { file, bytes } of files) form.append(file.field, new File([new Uint8Array(bytes)], file.filename, { type: file.mimeType }));
  } else {
    throw refusal(
      "unsupported_media_type",
      type ? `A form is sent as application/x-www-form-urlencoded or multipart/form-data, not ${type}.` : "Send the form as application/x-www-form-urlencoded or multipart/form-data.",
    );
  }
  assertStorableForm(form);
  return form;
}

/** `readForm` for page actions: a refusal becomes the error page (400, 413, 415) rather than JSON. */
export async function readPageForm(request: Request, options: FormOptions = {}): Promise<FormData> {
  try {
    return await readForm(request, options);
  } catch (error) {
    pageError(error);
  }
}

/**
 * A copy of `request` whose body is `form` again, urlencoded, for code that reads the form itself
 * (remix-auth's FormStrategy) after the form was read and checked here.
 */
export function formRequest(request: Request, form: FormData): Request {
  const headers = new Headers(request.headers);
  headers.delete("Content-Length");
  headers.set("Content-Type", "application/x-www-form-urlencoded;charset=UTF-8");
  const body = new URLSearchParams();
  for (const [k, v] of form.entries()) if (typeof v === "string") body.append(k, v);
  return new Request(request.url, { method: request.method, headers, body, signal: request.signal });
}

async function collect(stream: Readable): Promise<Buffer> {
  const chunks: Buffer[] = [];
  for await (const chunk of stream) chunks.push(chunk as Buffer);
  return Buffer.concat(chunks);
}

// ---- Multipart as a stream -------------------------------------------------------------------

export type FilePart = { field: string; filename: string; mimeType: string; stream: Readable };

export interface MultipartOptions<T> {
  /** The whole body. */
  maxBytes: number;
  /** Each file. */
  maxFileBytes: number;
  maxFiles: number;
  maxFields?: number;
  maxFieldBytes?: number;
  tooLarge?: (declared?: number) => HttpError;
  fileTooLarge?: (file: FilePart) => HttpError;
  tooManyFiles?: () => HttpError;
  /** Consumes one file's stream (and cleans up after itself if it fails). */
  onFile: (file: FilePart) => Promise<T>;
}

/**
 * Parses a multipart body as it arrives. Fields are collected (with limits); each file is handed to
 * `onFile` as it starts. The first refusal stops the reading: the active file stream is destroyed
 * with it, every handler is waited for, and the refusal is thrown. Handlers that finished before a
 * later refusal may have stored something: the caller undoes that.
 */
export async function readMultipart<T>(request: Request, options: MultipartOptions<T>): Promise<{ fields: FormData; files: T[] }> {
  const maxFields = options.maxFields ?? 200;
  const maxFieldBytes = options.maxFieldBytes ?? 64 * KiB;
  const onTooLarge = options.tooLarge ?? tooLarge(options.maxBytes);
  const fileTooLarge = options.fileTooLarge ?? ((f: FilePart) => refusal("file_too_large", `The file “${f.filename}” is larger than ${sizeText(options.maxFileBytes)}.`, { headers: CLOSE }));
  const tooManyFiles = options.tooManyFiles ?? (() => refusal("bad_request", `Send at most ${options.maxFiles} file${options.maxFiles === 1 ? "" : "s"}.`));
  if (mediaType(request) !== "multipart/form-data") throw refusal("unsupported_media_type", "Send the upload as multipart/form-data.");

  let parser: busboy.Busboy;
  try {
    parser = busboy({
      headers: { "content-type": request.headers.get("Content-Type") ?? "" },
      defParamCharset: "utf8",
      limits: {
        fileSize: options.maxFileBytes,
        files: options.maxFiles,
        fields: maxFields,
        fieldSize: maxFieldBytes,
        parts: options.maxFiles + maxFields,
        headerPairs: 20,
      },
    });
  } catch (e) {
    throw refusal("bad_request", `The multipart body cannot be read: ${(e as Error).message}.`);
  }

  const fields = new FormData();
  const handled: Promise<T>[] = [];
  let failed = false;
  let failure: unknown;
  let stop = () => {};
  const stopped = new Promise<void>((resolve) => (stop = resolve));
  const fail = (e: unknown) => {
    if (failed) return;
    failed = true;
    failure = e;
    stop();
  };
  const broken = (e: unknown) => (e instanceof HttpError ? e : refusal("bad_request", `The multipart body is broken: ${(e as Error).message}.`));

  parser.on("field", (name, value, info) => {
    if (info.nameTruncated || info.valueTruncated) fail(refusal("too_large", `The field “${name.slice(0, 100)}” is longer than ${sizeText(maxFieldBytes)}.`, { headers: CLOSE }));
    else fields.append(name, value);
  });
  parser.on("file", (field, stream, info) => {
    if (failed) {
      stream.resume();
      return;
    }
    const part: FilePart = { field, filename: info.filename ?? "", mimeType: info.mimeType, stream };
    stream.once("limit", () => {
      const e = fileTooLarge(part);
      fail(e);
      stream.destroy(e);
    });
    const result = options.onFile(part);
    result.catch((e) => {
      fail(e);
      stream.resume();
    });
    handled.push(result);
  });
  parser.on("filesLimit", () => fail(tooManyFiles()));
  parser.on("fieldsLimit", () => fail(refusal("too_large", `A form may carry at most ${maxFields} fields.`, { headers: CLOSE })));
  parser.on("partsLimit", () => fail(refusal("too_large", `A form may carry at most ${options.maxFiles + maxFields} parts.`, { headers: CLOSE })));
  const finished = new Promise<void>((resolve, reject) => {
    parser.once("close", resolve);
    parser.once("error", (e) => reject(broken(e)));
  });
  finished.catch(() => {});

  try {
    for await (const chunk of limitedBody(request, options.maxBytes, onTooLarge)) {
      if (failed) break;
      // A handler that stopped reading its file holds busboy's buffer: a refusal must end the wait too.
      if (!parser.write(chunk)) await Promise.race([new Promise((r) => parser.once("drain", r)), finished, stopped]);
      if (failed) break;
    }
    if (!failed) {
      parser.end();
      await Promise.race([finished, stopped]);
    }
  } catch (e) {
    fail(broken(e));
  }
  if (failed) parser.destroy(failure instanceof Error ? failure : undefined);
  const settled = await Promise.allSettled(handled);
  if (failed) throw failure;
  assertStorableForm(fields);
  return { fields, files: settled.map((s) => (s as PromiseFulfilledResult<T>).value) };
}

/** The first `want` bytes of a stream (fewer if it ends), and an iterator over everything, from the start. */
export async function splitHead(stream: Readable, want: number): Promise<{ head: Buffer; all: AsyncIterable<Uint8Array> }> {
  const it = stream[Symbol.asyncIterator]() as AsyncIterator<Buffer>;
  const first: Buffer[] = [];
  let got = 0;
  let ended = false;
  while (got < want) {
    const next = await it.next();
    if (next.done) {
      ended = true;
      break;
    }
    first.push(next.value);
    got += next.value.length;
  }
  const all = (async function* () {
    yield* first;
    if (ended) return;
    for (let next = await it.next(); !next.done; next = await it.next()) yield next.value;
  })();
  return { head: Buffer.concat(first).subarray(0, want), all };
}
