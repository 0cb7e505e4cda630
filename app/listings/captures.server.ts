import { Op } from "sequelize";
import type { BenchSheet } from "@shared/bench";
import { Capture } from "~/models/capture.server";
import { isId } from "@shared/ids";

// The captures a listing's bench sheet points at. A sheet names captures by id; only finished
// captures uploaded by the listing's own seller count, so a sheet cannot borrow someone else's files.

export function captureIdsOf(sheet: BenchSheet): string[] {
  const ids = new Set<string>();
  for (const r of sheet.readings) if (r.origin === "capture" && r.captureId) ids.add(r.captureId);
  for (const s of sheet.sweeps ?? []) if (s.origin === "capture" && s.captureId) ids.add(s.captureId);
  return [...ids];
}

export async function capturesForSheet(sheet: BenchSheet, sellerId: string): Promise<Map<string, Capture>> {
  const ids = captureIdsOf(sheet).filter((id) => isId(id));
  const out = new Map<string, Capture>();
  if (ids.length === 0) return out;
  const rows = await Capture.findAll({
    where: { id: { [Op.in]: ids }, ownerId: sellerId, status: "done" },
    attributes: ["id", "kind", "storageKey", "format", "conditions", "analysis", "createdAt"],
  });
  for (const c of rows) out.set(c.id, c);
  return out;
}

const KIND_WORDS = {
  sine: "sine capture",
  square: "square-wave capture",
  sweep: "sweep capture",
  impedance: "impedance sweep",
  separation: "one-side-driven stereo capture",
  imd: "two-tone capture",
  output_impedance: "open-and-loaded capture",
  wow_flutter: "wow & flutter test-tone capture",
} as const;

/** "from a sine capture (WAV, 48 kHz, 24-bit)" — how the figure was obtained, without the file's name. */
export function captureNote(capture: Capture | undefined): string {
  if (!capture) return "from a capture";
  const f = capture.format;
  const bits: string[] = [];
  if (f?.file === "wav") {
    bits.push("WAV");
    if ("sampleRate" in f)
      bits.push(`${Number((f.sampleRate / 1000).toFixed(1))} kHz`, `${f.bitDepth}-bit${f.encoding === "float" ? " float" : ""}`);
  } else if (f?.file === "csv") {
    bits.push("CSV");
    if ("rows" in f) bits.push(`${f.rows} rows`);
  }
  return `from a ${KIND_WORDS[capture.kind]}${bits.length ? ` (${bits.join(", ")})` : ""}`;
}
