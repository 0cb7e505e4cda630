import type { Readable } from "node:stream";
import { pageError, refusal } from "./errors.server";
import { assertStorableForm, assertStorableJson, KiB, MiB, mediaType, readBytes, tooLarge, utf8 } from "./limited-stream.server";
import { readMultipart } from "./multipart.server";

// The body reader routes use: JSON (`readJson`), forms (`readForm`, `readPageForm` for pages) and,
// in multipart.server.ts, uploads streamed file by file. All of them read through the one limited
// stream (limited-stream.server.ts): 413 past the limit whether or not a Content-Length was sent,
// 415 for a type the route does not read, 400 for a body that does not parse, never request.formData().

/** Sizes of the bodies pages and small APIs take. */
export const BODY_LIMITS = {
  /** Sign-in, account and admin forms, the watch button. */
  form: 64 * KiB,
  /** The listing editor's steps (long notes, many parts). */
  editorForm: 256 * KiB,
  /** The bench sheet step without JavaScript: up to 300 readings as form fields. */
  benchForm: 1 * MiB,
} as const;

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
      tooManyFiles: () =>
        refusal("bad_request", maxFileBytes > 0 ? "The form carries more files than it takes." : "This form takes no files."),
      onFile: async (file) => ({ file, bytes: await collect(file.stream) }),
    });
    form = fields;
    for (const { file, bytes } of files) form.append(file.field, new File([new Uint8Array(bytes)], file.filename, { type: file.mimeType }));
  } else {
    throw refusal(
      "unsupported_media_type",
      type
        ? `A form is sent as application/x-www-form-urlencoded or multipart/form-data, not ${type}.`
        : "Send the form as application/x-www-form-urlencoded or multipart/form-data.",
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
