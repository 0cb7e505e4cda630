import { QueryTypes } from "sequelize";
import { z } from "zod";
import { sequelize } from "~/db.server";
import { ListingPhoto } from "~/models/index.server";
import { deleteObjects } from "~/services/storage.server";
import { PHOTO_LIMITS, type PhotoListView } from "./limits";
import { idSchema, isId } from "@shared/ids";
import { readJson } from "~/http/body.server";
import { refusal } from "~/http/errors.server";
import { PhotoRefusal, photoNotFound } from "./refusal.server";
import { ownedListing, photoKeys, photoView } from "./access.server";

// The seller's view of a listing's photos, their order and cover, and deleting one.

export async function listPhotos(listingId: string, sellerId: string): Promise<PhotoListView> {
  await ownedListing(listingId, sellerId);
  const photos = await ListingPhoto.findAll({ where: { listingId }, order: [["position", "ASC"]] });
  return { photos: photos.map(photoView), maxPhotos: PHOTO_LIMITS.maxPhotos, maxBytes: PHOTO_LIMITS.maxBytes };
}

const id = idSchema("photo");
export const ArrangeInput = z
  .object({
    /** Every photo id of the listing, first to last. */
    order: z.array(id).max(PHOTO_LIMITS.maxPhotos, `lists more than ${PHOTO_LIMITS.maxPhotos} photos`).optional(),
    /** The photo shown first in the market and on the listing page. */
    coverId: id.optional(),
  })
  .strict()
  .refine((v) => v.order !== undefined || v.coverId !== undefined, {
    message: "send “order” (every photo id, first to last), “coverId”, or both",
  });
export type ArrangeInput = z.infer<typeof ArrangeInput>;

/** Parses the PATCH body, refusing with the first problem and where it is. */
export async function readArrangeInput(request: Request): Promise<ArrangeInput> {
  const body = await readJson(request, 16 * 1024);
  const parsed = ArrangeInput.safeParse(body);
  if (!parsed.success) {
    const issues = parsed.error.issues.map((i) => ({ path: i.path.join(".") || "body", message: i.message }));
    const first = parsed.error.issues[0];
    const path = first.path.join(".");
    throw refusal("invalid", path ? `${path} ${first.message}` : first.message, { issues });
  }
  return parsed.data;
}

export async function arrangePhotos(listingId: string, sellerId: string, input: ArrangeInput): Promise<PhotoListView> {
  await sequelize.transaction(async (transaction) => {
    await ownedListing(listingId, sellerId, { transaction, lock: true, forChange: true });
    const photos = await ListingPhoto.findAll({ where: { listingId }, attributes: ["id", "status"], transaction });
    const known = new Set(photos.map((p) => p.id));

    if (input.order) {
      const order = input.order.map((o) => o.toLowerCase());
      const complete = order.length === known.size && new Set(order).size === order.length && order.every((o) => known.has(o));
      if (!complete) {
        throw new PhotoRefusal(
          "bad_order",
          `The new order must name each of this listing's ${known.size} photos exactly once. ` +
            "Another window may have added or deleted one; reload and try again.",
        );
      }
      // The position constraint is deferred to commit, so positions may pass through each other here.
      await sequelize.query(
        `UPDATE listing_photos p SET position = o.ord - 1, updated_at = now()
           FROM unnest(ARRAY[:order]::uuid[]) WITH ORDINALITY AS o(id, ord)
          WHERE p.id = o.id AND p.listing_id = :listingId AND p.position <> o.ord - 1`,
        { replacements: { order, listingId }, transaction, type: QueryTypes.UPDATE },
      );
    }

    if (input.coverId) {
      const coverId = input.coverId.toLowerCase();
      const cover = photos.find((p) => p.id === coverId);
      if (!cover) throw new PhotoRefusal("bad_cover", "The cover must be one of this listing's photos.");
      if (cover.status === "failed") {
        throw new PhotoRefusal("bad_cover", "This photo could not be processed, so it cannot be the cover.");
      }
      // Two steps: the one-cover index is checked row by row.
      await ListingPhoto.update({ isCover: false }, { where: { listingId, isCover: true }, transaction });
      await ListingPhoto.update({ isCover: true }, { where: { id: coverId, listingId }, transaction });
    }
  });
  return listPhotos(listingId, sellerId);
}

/**
 * Deletes the row and every stored object. Storage is emptied before the transaction commits: if it
 * cannot be, the row stays and the seller can try again; nothing is left that no row points at.
 */
export async function deletePhoto(listingId: string, sellerId: string, photoId: string): Promise<PhotoListView> {
  await sequelize.transaction(async (transaction) => {
    await ownedListing(listingId, sellerId, { transaction, lock: true, forChange: true });
    if (!isId(photoId)) throw photoNotFound();
    const photo = await ListingPhoto.findOne({ where: { id: photoId, listingId }, transaction });
    if (!photo) throw photoNotFound();

    await photo.destroy({ transaction });
    await sequelize.query(
      `UPDATE listing_photos SET position = position - 1, updated_at = now()
        WHERE listing_id = :listingId AND position > :position`,
      { replacements: { listingId, position: photo.position }, transaction, type: QueryTypes.UPDATE },
    );
    if (photo.isCover) {
      // The next photo that is not failed takes over as cover.
      await sequelize.query(
        `UPDATE listing_photos SET is_cover = true, updated_at = now()
          WHERE id = (SELECT id FROM listing_photos WHERE listing_id = :listingId
                      ORDER BY (status = 'failed'), position LIMIT 1)`,
        { replacements: { listingId }, transaction, type: QueryTypes.UPDATE },
      );
    }
    try {
      await deleteObjects(photoKeys(photo));
    } catch (error) {
      console.error("[photos] could not delete stored objects:", error);
      throw new PhotoRefusal("storage_unavailable", "The photo could not be deleted from storage just now; try again.");
    }
  });
  return listPhotos(listingId, sellerId);
}
