import { fileTypeFromBuffer } from "file-type";
import { PHOTO_LIMITS, formatBytes } from "./limits";
import { PhotoRefusal } from "./refusal.server";
import { readJpegStructure, type JpegStructure } from "./jpeg-structure.server";
import { readPngStructure } from "./png-structure.server";
import { budgetProblem, type PhotoHeader } from "./budget.server";

// The checks an upload passes before anything is stored: size, the real type read from the bytes
// (never the name or the browser's claim), the pixel count from the header, a complete file, and
// what decoding it would cost (budget.server.ts); the worker repeats the last before decoding.

export type InspectedPhoto = {
  contentType: "image/jpeg" | "image/png";
  ext: "jpg" | "png";
  width: number;
  height: number;
  byteSize: number;
};

/**
 * `partial`: `bytes` are only the first part of the upload (the web process reads a header while the
 * rest streams to storage); a structure cut short is then expected, and the job checks the whole file.
 */
export async function inspectPhoto(
  bytes: Uint8Array,
  fileName = "This file",
  options: { partial?: boolean } = {},
): Promise<InspectedPhoto> {
  const name = displayName(fileName);
  if (bytes.byteLength === 0) {
    throw new PhotoRefusal("empty_file", `${name} is empty (0 bytes); choose the photo again.`);
  }
  if (bytes.byteLength > PHOTO_LIMITS.maxBytes) {
    throw new PhotoRefusal(
      "file_too_large",
      `${name} is ${formatBytes(bytes.byteLength)}; photos may be at most ${formatBytes(PHOTO_LIMITS.maxBytes)}.`,
    );
  }

  const kind = await realKind(bytes);
  if (kind.type !== "image/jpeg" && kind.type !== "image/png") {
    const claimed = claimedExtension(fileName);
    const really = kind.description ? `is really ${kind.description}` : "is not a photo we can recognise";
    const named = claimed ? ` (named .${claimed}, but it ${really})` : ` (it ${really})`;
    throw new PhotoRefusal("unsupported_type", `${name} cannot be used${named}. Upload JPEG or PNG photos only.`);
  }

  // Of a partial upload the amount of image data is not known yet: the job checks it on the whole file.
  const jpegOf = (s: JpegStructure): JpegStructure => (options.partial ? { ...s, scanBytes: Number.POSITIVE_INFINITY } : s);
  const header: PhotoHeader =
    kind.type === "image/jpeg"
      ? { type: kind.type, byteSize: bytes.byteLength, jpeg: jpegOf(readJpegStructure(bytes)) }
      : { type: kind.type, byteSize: bytes.byteLength, png: readPngStructure(bytes) };
  const structure = header.type === "image/jpeg" ? header.jpeg : header.png;
  const { width, height } = structure;
  if (width && height && width * height > PHOTO_LIMITS.maxMegapixels * 1_000_000) {
    throw new PhotoRefusal(
      "too_many_pixels",
      `${name} is ${width} × ${height} pixels (${((width * height) / 1e6).toFixed(1)} megapixels); ` +
        `photos may have at most ${PHOTO_LIMITS.maxMegapixels} megapixels. Scale it down and upload it again.`,
    );
  }
  if (structure.problem && !(options.partial && structure.problem.code === "truncated_file")) {
    const { code, detail } = structure.problem;
    const label = kind.type === "image/jpeg" ? "JPEG" : "PNG";
    const advice =
      code === "truncated_file"
        ? "it looks cut short, perhaps by an interrupted copy or download. Upload the complete file."
        : code === "unsupported_type"
          ? `${detail}.`
          : `it is damaged: ${detail}. Export it again and upload the new file.`;
    throw new PhotoRefusal(code, `${name} is a ${label} photo, but ${advice}`);
  }
  const costly = budgetProblem(header, name);
  if (costly) throw new PhotoRefusal(costly.code, costly.message);
  return {
    contentType: kind.type,
    ext: kind.type === "image/jpeg" ? "jpg" : "png",
    width: width!,
    height: height!,
    byteSize: bytes.byteLength,
  };
}

type Kind = { type: string | null; description: string | null };

// Friendly names for what people most often pick by mistake.
const DESCRIPTIONS: Record<string, string> = {
  gif: "a GIF image",
  webp: "a WebP image",
  heic: "a HEIC photo (set the camera or phone to save JPEG, or export it as JPEG)",
  avif: "an AVIF image",
  apng: "an animated PNG",
  bmp: "a BMP image",
  tif: "a TIFF image",
  jxl: "a JPEG XL image",
  jp2: "a JPEG 2000 image",
  ico: "an icon file",
  psd: "a Photoshop document",
  cr2: "a camera raw file",
  nef: "a camera raw file",
  arw: "a camera raw file",
  dng: "a camera raw file",
  mp3: "an MP3 audio file",
  wav: "a WAV audio file",
  flac: "a FLAC audio file",
  m4a: "an AAC audio file",
  ogg: "an Ogg audio file",
  mp4: "an MP4 video",
  mov: "a QuickTime video",
  pdf: "a PDF document",
  zip: "a ZIP archive",
  gz: "a gzip archive",
  exe: "a program",
  elf: "a program",
  xml: "an XML document",
};

async function realKind(bytes: Uint8Array): Promise<Kind> {
  const svg = svgKind(bytes);
  if (svg) return svg;
  const found = await fileTypeFromBuffer(bytes);
  if (found) {
    if (found.mime === "image/jpeg" || found.mime === "image/png") return { type: found.mime, description: null };
    return { type: found.mime, description: DESCRIPTIONS[found.ext] ?? `a ${found.ext.toUpperCase()} file` };
  }
  if (looksLikeText(bytes)) return { type: "text/plain", description: "a text file" };
  return { type: null, description: null };
}

// SVG is text, so type sniffers report nothing or "XML". It is refused either way; one with script
// is named as such so the seller understands why it can never be shown.
function svgKind(bytes: Uint8Array): Kind | null {
  const head = Buffer.from(bytes.buffer, bytes.byteOffset, Math.min(bytes.byteLength, 64 * 1024))
    .toString("utf8")
    .replace(/^\uFEFF/, "");
  if (!/^\s*</.test(head) || !/<svg[\s>]/i.test(head)) return null;
  const scripted = /<script[\s>]|\son[a-z]+\s*=|javascript:/i.test(head);
  return { type: "image/svg+xml", description: scripted ? "an SVG drawing with a script in it" : "an SVG drawing" };
}

function looksLikeText(bytes: Uint8Array): boolean {
  const sample = bytes.subarray(0, 8192);
  let printable = 0;
  for (const c of sample) {
    if (c === 0) return false;
    if (c === 9 || c === 10 || c === 13 || c >= 32) printable += 1;
  }
  if (printable / sample.length < 0.95) return false;
  // Valid UTF-8 (allowing a character cut at the sample's end) rather than arbitrary high bytes.
  try {
    new TextDecoder("utf-8", { fatal: true }).decode(sample.subarray(0, lastCharBoundary(sample)));
    return true;
  } catch {
    return false;
  }
}

function lastCharBoundary(sample: Uint8Array): number {
  const end = sample.length;
  for (let i = 1; i <= 3 && end - i >= 0; i++) {
    const c = sample[end - i];
    if ((c & 0xc0) === 0xc0) return end - i; // a lead byte whose sequence may be incomplete
    if ((c & 0x80) === 0) break;
  }
  return end;
}

function displayName(fileName: string): string {
  const clean = fileName.replace(/[\u0000-\u001f\u007f]/g, "").trim();
  if (!clean || clean === "This file") return "This file";
  const short = clean.length > 80 ? `${clean.slice(0, 77)}…` : clean;
  return `“${short}”`;
}

function claimedExtension(fileName: string): string | null {
  const m = /\.([A-Za-z0-9]{1,5})$/.exec(fileName.trim());
  return m ? m[1].toLowerCase() : null;
}
