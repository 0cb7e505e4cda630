// Deleting a draft: its row and everything hanging off it (photos, restoration log, bench sheet, every
// capture it had: on its sheet, uploaded for it, or taken off its sheet since) go in one transaction; a `draft-storage-clean` job queued in that same
// transaction then removes the stored objects (every photo size, the uploads still waiting, the
// capture files). Only a draft never published, and only by its seller: someone else's is "not found".
import { z } from "zod";
import { sequelize } from "~/db.server";
import { BenchSheet, ListingPhoto } from "~/models/index.server";
import { Capture } from "~/models/capture.server";
import { photoKeys } from "~/photos/access.server";
import { enqueue, QUEUES } from "~/services/jobs.server";
import { deleteObjects } from "~/services/storage.server";
import { ownListing } from "./access.server";
import { namedCaptureIds, releasableCaptures, removeCaptures } from "./captures.server";
import { ListingStateError } from "./errors.server";
import type { Listing } from "~/models/index.server";

/** Whether the seller may delete this listing outright (else it is withdrawn, and kept as a record). */
export function isDeletable(listing: Pick<Listing, "status" | "publishedAt">): boolean {
  return listing.status === "draft" && listing.publishedAt === null;
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
    // Its captures: those its sheet names and those uploaded for it or once on its sheet (also ones the
    // seller took off it since), unless another listing's sheet or a contest still uses them.
    const tied = await Capture.findAll({ where: { listingId: listing.id, ownerId: sellerId }, attributes: ["id"], transaction });
    const ids = [...new Set([...namedCaptureIds(sheet?.sheet), ...tied.map((c) => c.id)])];
    const captures = await releasableCaptures(ids, listing.id, sellerId, transaction);
    const keys = [...photos.flatMap(photoKeys), ...(await removeCaptures(captures, transaction))];
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
