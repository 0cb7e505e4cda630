// Deleting a draft: its row and everything hanging off it (photos, restoration log, bench sheet, the
// captures its sheet used) go in one transaction; a `draft-storage-clean` job queued in that same
// transaction then removes the stored objects (every photo size, the uploads still waiting, the
// capture files). Only a draft never published, and only by its seller: someone else's is "not found".
import { QueryTypes } from "sequelize";
import { z } from "zod";
import { sequelize } from "~/db.server";
import { BenchSheet, ListingPhoto } from "~/models/index.server";
import { Capture } from "~/models/capture.server";
import { isId } from "@shared/ids";
import { photoKeys } from "~/photos/access.server";
import { enqueue, QUEUES } from "~/services/jobs.server";
import { deleteObjects } from "~/services/storage.server";
import { ownListing } from "./access.server";
import { ListingStateError } from "./errors.server";
import type { Listing } from "~/models/index.server";

/** Whether the seller may delete this listing outright (else it is withdrawn, and kept as a record). */
export function isDeletable(listing: Pick<Listing, "status" | "publishedAt">): boolean {
  return listing.status === "draft" && listing.publishedAt === null;
}

/** The capture ids a sheet's readings and sweeps name. */
function captureIdsOf(sheet: BenchSheet["sheet"] | undefined): string[] {
  if (!sheet) return [];
  const ids = [...sheet.readings.map((r) => r.captureId), ...sheet.sweeps.map((s) => s.captureId)];
  return [...new Set(ids.filter((id): id is string => !!id))];
}

/** Deletes the seller's draft; returns the storage keys queued for removal. */
export async function deleteDraft(listingId: unknown, sellerId: string): Promise<{ keys: string[] }> {
  return sequelize.transaction(async (transaction) => {
    const listing = await ownListing(listingId, sellerId, { transaction, lock: true });
    if (!isDeletable(listing))
      throw new ListingStateError(
        "Only a draft that was never published can be deleted. A published listing is withdrawn instead, and kept as a record.",
        "published",
      );
    const photos = await ListingPhoto.findAll({ where: { listingId: listing.id }, transaction });
    const sheet = await BenchSheet.findOne({ where: { listingId: listing.id }, transaction });
    const named = captureIdsOf(sheet?.sheet);
    // The seller's captures on this sheet that no other listing's sheet uses.
    const elsewhere = named.length
      ? await sequelize.query<{ id: string }>(
          `SELECT DISTINCT x.id FROM bench_sheets b,
             LATERAL (SELECT r->>'captureId' AS id FROM jsonb_array_elements(b.sheet->'readings') r
                      UNION SELECT s->>'captureId' FROM jsonb_array_elements(COALESCE(b.sheet->'sweeps', '[]'::jsonb)) s) x
           WHERE b.listing_id <> $1 AND x.id = ANY($2::text[])`,
          { bind: [listing.id, named], type: QueryTypes.SELECT, transaction },
        )
      : [];
    const kept = new Set(elsewhere.map((r) => r.id));
    const ids = named.filter((id) => !kept.has(id) && isId(id));
    const captures = ids.length ? await Capture.findAll({ where: { id: ids, ownerId: sellerId }, transaction }) : [];
    const keys = [...photos.flatMap(photoKeys), ...captures.map((c) => c.storageKey).filter((k): k is string => !!k)];
    if (captures.length) await Capture.destroy({ where: { id: captures.map((c) => c.id) }, transaction });
    // Photos, the log and the sheet go with the row (ON DELETE CASCADE).
    await listing.destroy({ transaction });
    if (keys.length) await enqueue(QUEUES.draftStorageClean, { keys }, { transaction });
    return { keys };
  });
}

const CleanJob = z.object({ keys: z.array(z.string().min(1).max(1024)).max(10_000) });

/** The job: remove the deleted draft's objects (a missing one is no error, so a retry is harmless). */
export async function cleanDraftStorage(data: unknown): Promise<{ removed: number }> {
  const { keys } = CleanJob.parse(data);
  await deleteObjects(keys);
  return { removed: keys.length };
}
