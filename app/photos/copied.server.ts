import { QueryTypes, type Transaction } from "sequelize";
import { sequelize } from "~/db.server";
import { raiseFlag } from "~/desk/flags.server";
import { Listing } from "~/models/index.server";
import { PHASH_SCHEME, PHOTO_MATCH_MAX_DISTANCE } from "./perceptual-hash.server";

// The copied-photo check: a listing's photo whose hash is within the match distance of a photo on
// ANOTHER seller's listing that buyers have seen holds the listing for the review desk and raises a
// `copied_photo` flag with both photos. A seller reusing their own photos is nobody's concern; a
// pair a moderator has dismissed does not hold the listing again.

/** The flag's reason code and the words the seller sees on the held listing. */
export const COPIED_PHOTO_REASON = "photo_match";
export const COPIED_PHOTO_HELD_REASON =
  "Photo check: a photo matches one on another seller's listing. A moderator compares the two before the unit goes on the market.";

export type PhotoMatch = { photoId: string; matchesPhotoId: string; matchesListingId: string; distance: number };

/** Listings the public has seen: a copy can only be taken from one of these. */
const SEEN_STATUSES = ["live", "reserved", "sold", "withdrawn"];

/**
 * This listing's ready photos (or only `photoIds`) that match a photo on another seller's seen
 * listing, closest first; each photo with its closest match only.
 */
export async function copiedPhotoMatches(
  listingId: string,
  sellerId: string,
  opts: { photoIds?: string[]; transaction?: Transaction } = {},
): Promise<PhotoMatch[]> {
  // bit_count over the XOR of the two hashes read as 64-bit strings: the Hamming distance.
  const rows = await sequelize.query<PhotoMatch>(
    `SELECT DISTINCT ON (p.id) p.id AS "photoId", q.id AS "matchesPhotoId", q.listing_id AS "matchesListingId",
            bit_count(('x' || p.phash)::bit(64) # ('x' || q.phash)::bit(64))::int AS distance
       FROM listing_photos p
       JOIN listing_photos q ON q.listing_id <> p.listing_id AND q.status = 'ready' AND q.phash IS NOT NULL
                            AND q.phash_scheme = :scheme
       JOIN listings other ON other.id = q.listing_id
      WHERE p.listing_id = :listingId AND p.status = 'ready' AND p.phash IS NOT NULL AND p.phash_scheme = :scheme
        ${opts.photoIds ? "AND p.id IN (:photoIds)" : ""}
        AND other.seller_id <> :sellerId AND other.status IN (:seen)
        AND bit_count(('x' || p.phash)::bit(64) # ('x' || q.phash)::bit(64)) <= :max
      ORDER BY p.id, distance, q.created_at, q.id`,
    {
      replacements: {
        listingId,
        sellerId,
        photoIds: opts.photoIds ?? [],
        seen: SEEN_STATUSES,
        max: PHOTO_MATCH_MAX_DISTANCE,
        scheme: PHASH_SCHEME,
      },
      type: QueryTypes.SELECT,
      transaction: opts.transaction,
    },
  );
  return rows.sort((a, b) => a.distance - b.distance);
}

/**
 * Runs the check inside the caller's transaction (publishing, or a photo added to a live listing):
 * raises one flag per matching pair that has none open, and returns the matches that hold the
 * listing (all but pairs a moderator dismissed).
 */
export async function flagCopiedPhotos(
  listingId: string,
  sellerId: string,
  transaction: Transaction,
  photoIds?: string[],
): Promise<PhotoMatch[]> {
  const matches = await copiedPhotoMatches(listingId, sellerId, { photoIds, transaction });
  if (!matches.length) return [];
  const earlier = await sequelize.query<{ photoId: string; matchesPhotoId: string; open: boolean; dismissed: boolean }>(
    `SELECT details->>'photoId' AS "photoId", details->>'matchesPhotoId' AS "matchesPhotoId",
            bool_or(resolved_at IS NULL) AS open, bool_or(resolution = 'dismissed') AS dismissed
       FROM desk_flags WHERE kind = 'copied_photo' AND listing_id = :listingId
      GROUP BY 1, 2`,
    { replacements: { listingId }, type: QueryTypes.SELECT, transaction },
  );
  const pair = (m: { photoId: string; matchesPhotoId: string }) => `${m.photoId}:${m.matchesPhotoId}`;
  const seen = new Map(earlier.map((e) => [pair(e), e]));
  const holding: PhotoMatch[] = [];
  for (const m of matches) {
    const before = seen.get(pair(m));
    if (before?.dismissed && !before.open) continue;
    holding.push(m);
    if (before?.open) continue;
    await raiseFlag(
      {
        kind: "copied_photo",
        listingId,
        reason: COPIED_PHOTO_REASON,
        details: { photoId: m.photoId, matchesPhotoId: m.matchesPhotoId, distance: m.distance },
      },
      transaction,
    );
  }
  return holding;
}

/**
 * A photo that became ready on a live listing (added after publishing): a match takes the listing
 * off the market to the desk. Safe to run twice: an open flag is not raised again.
 */
export async function holdLiveListingIfCopied(listingId: string, photoId: string): Promise<boolean> {
  return sequelize.transaction(async (transaction) => {
    const listing = await Listing.findByPk(listingId, { transaction, lock: transaction.LOCK.UPDATE });
    if (!listing || listing.status !== "live") return false;
    const holding = await flagCopiedPhotos(listing.id, listing.sellerId, transaction, [photoId]);
    if (!holding.length) return false;
    await listing.update({ status: "held", heldReason: COPIED_PHOTO_HELD_REASON }, { transaction });
    return true;
  });
}
