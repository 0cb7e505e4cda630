// What a file really is, from its first bytes, so a refusal can say "this is an MP3", not just "bad file".

export type Sniffed = { kind: "wav"; container: "RIFF" | "RIFX" | "RF64" } | { kind: "text" } | { kind: "other"; description: string };

const ascii = (b: Uint8Array, at: number, len: number) => String.fromCharCode(...b.subarray(at, at + len));

const MAGIC: [test: (b: Uint8Array) => boolean, description: string][] = [
  [(b) => ascii(b, 0, 3) === "ID3", "an MP3 audio file (ID3 tag)"],
  [(b) => b[0] === 0xff && (b[1] & 0xe0) === 0xe0, "an MP3/MPEG audio stream"],
  [(b) => ascii(b, 0, 4) === "fLaC", "a FLAC audio file"],
  [(b) => ascii(b, 0, 4) === "OggS", "an Ogg audio file"],
  [(b) => ascii(b, 0, 4) === "FORM" && ["AIFF", "AIFC"].includes(ascii(b, 8, 4)), "an AIFF audio file"],
  [(b) => ascii(b, 4, 4) === "ftyp", "an MP4/M4A file"],
  [(b) => ascii(b, 0, 4) === "PK\u0003\u0004", "a ZIP archive"],
  [(b) => ascii(b, 0, 5) === "%PDF-", "a PDF document"],
  [(b) => b[0] === 0xff && b[1] === 0xd8 && b[2] === 0xff, "a JPEG image"],
  [(b) => ascii(b, 1, 3) === "PNG", "a PNG image"],
];

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

export function sniff(bytes: Uint8Array): Sniffed {
  const tag = ascii(bytes, 0, 4);
  if ((tag === "RIFF" || tag === "RIFX" || tag === "RF64") && bytes.length >= 12) {
    const form = ascii(bytes, 8, 4);
    if (form === "WAVE") return { kind: "wav", container: tag };
    return { kind: "other", description: `a RIFF file of type "${form.trim()}", not WAVE` };
  }
  for (const [test, description] of MAGIC) if (bytes.length >= 12 && test(bytes)) return { kind: "other", description };
  if (looksLikeText(bytes)) return { kind: "text" };
  return { kind: "other", description: "a binary file of a type we do not recognise" };
}
