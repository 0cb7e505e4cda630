// What a file really is, from its first bytes, so a refusal can say "this is an MP3", not just "bad file".
// The WAV container and text are read here (the bench decodes both itself); anything else is named by
// `file-type`'s signature table, which is asynchronous: the upload asks it as the file arrives
// (`describeBinary`), before the synchronous checks run.
import { fileTypeFromBuffer } from "file-type";

export type Sniffed = { kind: "wav"; container: "RIFF" | "RIFX" | "RF64" } | { kind: "text" } | { kind: "other"; description: string };

const ascii = (b: Uint8Array, at: number, len: number) => String.fromCharCode(...b.subarray(at, at + len));

export const UNKNOWN_BINARY = "a binary file of a type we do not recognise";

// Words for what people most often pick by mistake; other types are named by their extension.
const DESCRIPTIONS: Record<string, string> = {
  mp3: "an MP3 audio file",
  mp2: "an MPEG audio stream",
  mp1: "an MPEG audio stream",
  flac: "a FLAC audio file",
  ogg: "an Ogg audio file",
  opus: "an Ogg Opus audio file",
  aif: "an AIFF audio file",
  m4a: "an MP4/M4A audio file",
  mp4: "an MP4 video",
  mov: "a QuickTime video",
  zip: "a ZIP archive",
  xlsx: "a spreadsheet (export it as CSV)",
  ods: "a spreadsheet (export it as CSV)",
  cfb: "an office document (a spreadsheet? export it as CSV)",
  pdf: "a PDF document",
  jpg: "a JPEG image",
  png: "a PNG image",
  gz: "a gzip archive",
};

function looksLikeText(b: Uint8Array): boolean {
  const head = b.subarray(0, 4096);
  if (head.includes(0)) return false;
  try {
    new TextDecoder("utf-8", { fatal: true }).decode(head.length < b.length ? head.subarray(0, lastCharBoundary(head)) : head);
    return true;
  } catch {
    return false;
  }
}

/** Cut before a UTF-8 sequence the 4 KB window may have split. */
function lastCharBoundary(b: Uint8Array): number {
  let i = b.length;
  while (i > 0 && (b[i - 1] & 0xc0) === 0x80) i--;
  return i > 0 && b[i - 1] >= 0xc0 ? i - 1 : b.length;
}

/** WAV, text, or something else; `description` names the something else when the caller has asked `describeBinary`. */
export function sniff(bytes: Uint8Array, description = UNKNOWN_BINARY): Sniffed {
  const tag = ascii(bytes, 0, 4);
  if ((tag === "RIFF" || tag === "RIFX" || tag === "RF64") && bytes.length >= 12) {
    const form = ascii(bytes, 8, 4);
    if (form === "WAVE") return { kind: "wav", container: tag };
    return { kind: "other", description: `a RIFF file of type "${form.trim()}", not WAVE` };
  }
  if (looksLikeText(bytes)) return { kind: "text" };
  return { kind: "other", description };
}

/** What a file that is neither WAV nor text is, in words, from file-type's signatures. */
export async function describeBinary(bytes: Uint8Array): Promise<string> {
  const found = await fileTypeFromBuffer(bytes).catch(() => undefined);
  if (!found) return UNKNOWN_BINARY;
  return DESCRIPTIONS[found.ext] ?? `${/^[aeiou]/i.test(found.ext) ? "an" : "a"} ${found.ext.toUpperCase()} file (${found.mime})`;
}
