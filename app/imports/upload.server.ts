import type { Readable } from "node:stream";
import { refusal } from "~/http/errors.server";
import { CLOSE, KiB } from "~/http/limited-stream.server";
import { readMultipart } from "~/http/multipart.server";
import { MAX_IMPORT_BYTES } from "./check-csv";

// The uploaded CSV, read into memory within its limit (a few megabytes at most) and decoded as UTF-8.
// It is never stored: the checked rows are what the import keeps (docs/decisions/0032).

const MB = (MAX_IMPORT_BYTES / 1024 / 1024).toFixed(0);

async function collect(stream: Readable): Promise<Buffer> {
  const chunks: Buffer[] = [];
  for await (const c of stream) chunks.push(c as Buffer);
  return Buffer.concat(chunks);
}

/** The `file` field of a multipart form: its name and text, or a refusal in words a workshop can act on. */
export async function readCsvUpload(request: Request): Promise<{ fileName: string; text: string }> {
  const { files } = await readMultipart(request, {
    maxBytes: MAX_IMPORT_BYTES + 64 * KiB,
    maxFileBytes: MAX_IMPORT_BYTES,
    maxFiles: 1,
    tooLarge: () => refusal("too_large", `The file is larger than ${MB} MB; split it into smaller files.`, { headers: CLOSE }),
    fileTooLarge: (f) => refusal("too_large", `“${f.filename}” is larger than ${MB} MB; split it into smaller files.`, { headers: CLOSE }),
    tooManyFiles: () => refusal("one_file_only", "Send one CSV file at a time."),
    onFile: async (f) => ({ field: f.field, fileName: f.filename, bytes: await collect(f.stream) }),
  });
  const file = files.find((f) => f.field === "file");
  if (!file || file.bytes.length === 0) throw refusal("no_file", "Choose a CSV file to import.");
  const bytes = file.bytes;
  // A workbook (zip) or an old binary spreadsheet, not text: say what to do rather than list garbled rows.
  if ((bytes[0] === 0x50 && bytes[1] === 0x4b) || (bytes[0] === 0xd0 && bytes[1] === 0xcf))
    throw refusal("unsupported_type", "This is a spreadsheet workbook, not CSV; save it as “CSV UTF-8” and send that file.");
  let text: string;
  try {
    text = new TextDecoder("utf-8", { fatal: true }).decode(bytes);
  } catch {
    throw refusal("unsupported_type", "The file is not UTF-8 text; save it from your spreadsheet as “CSV UTF-8”.");
  }
  if (text.includes("\u0000")) throw refusal("unsupported_type", "The file is not text; send a CSV file.");
  return { fileName: file.fileName || "import.csv", text };
}
