import { randomUUID } from "node:crypto";
import { buffer } from "node:stream/consumers";
import type { FilePart } from "~/http/multipart.server";
import { deletePrivateObject, putPrivateObject } from "~/services/private-storage.server";

// The document a workshop application carries: a PDF, JPEG or PNG (told by its first bytes, not its
// name), at most DOCUMENT_MAX_BYTES, stored in the private bucket under a random key.

export const DOCUMENT_MAX_BYTES = 8 * 1024 * 1024;
export const DOCUMENT_PREFIX = "workshop-documents/";

export const DOCUMENT_TYPES = {
  "application/pdf": { ext: "pdf", label: "PDF" },
  "image/jpeg": { ext: "jpg", label: "JPEG" },
  "image/png": { ext: "png", label: "PNG" },
} as const;
export type DocumentType = keyof typeof DOCUMENT_TYPES;

/** What the first bytes say the file is, or null for anything we do not take. */
export function documentTypeOf(head: Uint8Array): DocumentType | null {
  const starts = (...bytes: number[]) => bytes.every((b, i) => head[i] === b);
  if (starts(0x25, 0x50, 0x44, 0x46, 0x2d)) return "application/pdf"; // "%PDF-"
  if (starts(0xff, 0xd8, 0xff)) return "image/jpeg";
  if (starts(0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a)) return "image/png";
  return null;
}

export type ReceivedDocument = { key: string; type: DocumentType; name: string; bytes: number } | { error: string } | null;

/**
 * One uploaded document, read whole (the multipart reader stops it past DOCUMENT_MAX_BYTES), checked and
 * stored. Keys written are pushed to `written` so the caller can delete them if the application fails.
 */
export async function receiveDocument(part: FilePart, written: string[]): Promise<ReceivedDocument> {
  if (!part.filename) {
    part.stream.resume(); // the empty part a file input sends when nothing was chosen
    return null;
  }
  const body = await buffer(part.stream);
  if (body.length === 0) return { error: "The file is empty." };
  const type = documentTypeOf(body);
  if (!type) return { error: "Send the document as a PDF, JPEG or PNG file." };
  const now = new Date();
  const key = `${DOCUMENT_PREFIX}${now.getUTCFullYear()}/${String(now.getUTCMonth() + 1).padStart(2, "0")}/${randomUUID()}.${DOCUMENT_TYPES[type].ext}`;
  written.push(key);
  await putPrivateObject(key, body, type);
  return { key, type, name: cleanFileName(part.filename), bytes: body.length };
}

/** The name as the applicant's computer gave it, kept only for the desk to read: printable, at most 120 characters. */
export function cleanFileName(name: string): string {
  const base = name.split(/[\\/]/).pop() ?? "";
  const printable = base
    .normalize("NFC")
    .replace(/[\u0000-\u001f\u007f-\u009f\u202a-\u202e\u2066-\u2069]/g, "")
    .trim();
  return printable.slice(0, 120) || "document";
}

export async function deleteDocuments(keys: string[]): Promise<void> {
  for (const key of keys) await deletePrivateObject(key).catch((e) => console.error(`[workshops] could not remove ${key}:`, e));
  keys.length = 0;
}
