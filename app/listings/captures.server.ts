import { Op, QueryTypes, type Transaction } from "sequelize";
import type { BenchSheet } from "@shared/bench";
import { sequelize } from "~/db.server";
import { Capture } from "~/models/capture.server";
import { enqueue, QUEUES } from "~/services/jobs.server";
import { ListingInputError } from "./errors.server";
import { isId } from "@shared/ids";

// The captures a listing's bench sheet points at. A sheet names captures by id; only finished
// captures uploaded by the listing's own seller count, so a sheet cannot borrow someone else's files.

export function captureIdsOf(sheet: BenchSheet): string[] {
  const ids = new Set<string>();
  for (const r of sheet.readings) if (r.origin === "capture" && r.captureId) ids.add(r.captureId);
  for (const s of sheet.sweeps ?? []) if (s.origin === "capture" && s.captureId) ids.add(s.captureId);
  return [...ids];
}

/** Every capture id a sheet names, whatever the figure's origin: what the sheet could still point at. */
export function namedCaptureIds(sheet: BenchSheet | null | undefined): string[] {
  if (!sheet) return [];
  const ids = [...sheet.readings.map((r) => r.captureId), ...(sheet.sweeps ?? []).map((s) => s.captureId)];
  return [...new Set(ids.filter((id): id is string => !!id && isId(id)))];
}

export async function capturesForSheet(sheet: BenchSheet, sellerId: string): Promise<Map<string, Capture>> {
  const ids = captureIdsOf(sheet).filter((id) => isId(id));
  const out = new Map<string, Capture>();
  if (ids.length === 0) return out;
  const rows = await Capture.findAll({
    where: { id: { [Op.in]: ids }, ownerId: sellerId, status: "done" },
    attributes: ["id", "kind", "storageKey", "format", "conditions", "analysis", "createdAt", "updatedAt"],
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

/**
 * Of these capture ids, the seller's that nothing else keeps: no other listing's sheet names them and no
 * contest holds them. These may go with the draft or the sheet that let go of them.
 */
export async function releasableCaptures(ids: string[], listingId: string, sellerId: string, transaction: Transaction): Promise<Capture[]> {
  const own = ids.filter((id) => isId(id));
  if (!own.length) return [];
  // Locked before the other sheets are read: a save that is adding one of them to its sheet holds it
  // (settleSheetCaptures), so this reads that sheet once it is committed, or that save finds the row gone.
  const rows = await Capture.findAll({
    where: { id: own, ownerId: sellerId },
    order: [["id", "ASC"]],
    transaction,
    lock: transaction.LOCK.UPDATE,
  });
  if (!rows.length) return [];
  const kept = await sequelize.query<{ id: string }>(
    `SELECT DISTINCT x.id FROM bench_sheets b,
       LATERAL (SELECT r->>'captureId' AS id FROM jsonb_array_elements(b.sheet->'readings') r
                UNION SELECT s->>'captureId' FROM jsonb_array_elements(COALESCE(b.sheet->'sweeps', '[]'::jsonb)) s) x
     WHERE b.listing_id <> $1 AND x.id = ANY($2::text[])
     UNION SELECT unnest(capture_ids)::text FROM order_contests WHERE capture_ids && $2::uuid[]`,
    { bind: [listingId, rows.map((r) => r.id)], type: QueryTypes.SELECT, transaction },
  );
  const keep = new Set(kept.map((r) => r.id));
  return rows.filter((r) => !keep.has(r.id));
}

/** Removes capture rows in the caller's transaction; their stored files' keys, for the caller to queue in it. */
export async function removeCaptures(captures: Capture[], transaction: Transaction): Promise<string[]> {
  if (!captures.length) return [];
  await Capture.destroy({ where: { id: captures.map((c) => c.id) }, transaction });
  return captures.map((c) => c.storageKey).filter((k): k is string => !!k);
}

/**
 * A sheet being saved, in its transaction: the captures it names are tied to the listing (if not tied
 * yet), and those the stored sheet named and this one no longer does are removed with their files, unless
 * something else keeps them. A capture replaced or deleted on the sheet leaves nothing behind.
 */
export async function settleSheetCaptures(
  listingId: string,
  sellerId: string,
  before: BenchSheet | null | undefined,
  after: BenchSheet,
  transaction: Transaction,
): Promise<{ removedKeys: string[] }> {
  const named = namedCaptureIds(after);
  if (named.length) {
    // Held until commit, so a save elsewhere cannot remove a capture this sheet is taking up (see releasableCaptures).
    const held = await Capture.findAll({
      where: { id: named, ownerId: sellerId },
      attributes: ["id"],
      order: [["id", "ASC"]],
      transaction,
      lock: transaction.LOCK.KEY_SHARE,
    });
    const present = new Set(held.map((c) => c.id));
    const gone = captureIdsOf(after).filter((id) => !present.has(id));
    if (gone.length)
      throw new ListingInputError([
        { path: "readings", message: "A capture on this sheet was removed meanwhile (taken off another sheet); upload its file again." },
      ]);
    await Capture.update({ listingId }, { where: { id: named, ownerId: sellerId, listingId: null }, transaction });
  }
  const still = new Set(named);
  const dropped = namedCaptureIds(before).filter((id) => !still.has(id));
  const removable = await releasableCaptures(dropped, listingId, sellerId, transaction);
  const removedKeys = await removeCaptures(removable, transaction);
  // The same clean-up job as a deleted draft's: it exists exactly when the rows are gone.
  if (removedKeys.length) await enqueue(QUEUES.draftStorageClean, { keys: removedKeys }, { transaction });
  return { removedKeys };
}
