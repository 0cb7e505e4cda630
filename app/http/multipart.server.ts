import busboy from "busboy";
import type { Readable } from "node:stream";
import { HttpError, refusal } from "./errors.server";
import { assertStorableForm, CLOSE, KiB, limitedBody, mediaType, sizeText, tooLarge } from "./limited-stream.server";

// Multipart bodies parsed as they arrive (busboy), through the one limited stream, with a limit per
// file. Each file goes to the route's handler as it starts: captures and photos stream theirs on to
// object storage; page forms keep small ones in memory.

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
  const fileTooLarge =
    options.fileTooLarge ??
    ((f: FilePart) =>
      refusal("file_too_large", `The file “${f.filename}” is larger than ${sizeText(options.maxFileBytes)}.`, { headers: CLOSE }));
  const tooManyFiles =
    options.tooManyFiles ?? (() => refusal("bad_request", `Send at most ${options.maxFiles} file${options.maxFiles === 1 ? "" : "s"}.`));
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
  const broken = (e: unknown) =>
    e instanceof HttpError ? e : refusal("bad_request", `The multipart body is broken: ${(e as Error).message}.`);

  parser.on("field", (name, value, info) => {
    if (info.nameTruncated || info.valueTruncated)
      fail(refusal("too_large", `The field “${name.slice(0, 100)}” is longer than ${sizeText(maxFieldBytes)}.`, { headers: CLOSE }));
    else fields.append(name, value);
  });
  parser.on("file", (field, stream, info) => {
    // The handler sees a destroyed stream's error through its own reading; this keeps it from being unheard.
    stream.on("error", () => {});
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
  parser.on("partsLimit", () =>
    fail(refusal("too_large", `A form may carry at most ${options.maxFiles + maxFields} parts.`, { headers: CLOSE })),
  );
  // Every error event is listened to (busboy may emit more than one, e.g. a bad header, then the
  // destroy): an unheard one would take the whole process down.
  const finished = new Promise<void>((resolve, reject) => {
    parser.once("close", resolve);
    parser.on("error", (e) => reject(broken(e)));
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
  // Every handler has finished (and cleaned up after itself) before the answer goes out.
  await Promise.allSettled(handled);
  if (failed) throw failure;
  assertStorableForm(fields);
  return { fields, files: await Promise.all(handled) };
}

/**
 * The first `want` bytes of a stream (fewer if it ends), whether that was all of it, and an iterator
 * over everything, from the start.
 */
export async function splitHead(
  stream: Readable,
  want: number,
): Promise<{ head: Buffer; complete: boolean; all: AsyncIterable<Uint8Array> }> {
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
  const joined = Buffer.concat(first);
  return { head: joined.subarray(0, want), complete: ended && joined.length <= want, all };
}
