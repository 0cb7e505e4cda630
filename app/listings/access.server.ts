import type { Transaction } from "sequelize";
import { Listing } from "~/models/index.server";
import { ListingNotFound, ListingStateError } from "./errors.server";

// The one way listing services reach a listing: by id AND owner. Anyone else's listing is "not found",
// so an id guessed or copied from a public page reveals nothing about drafts.

const UUID = /^[0-9a-f]{8}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{12}$/i;

export async function ownListing(
  id: string,
  sellerId: string,
  opts: { transaction?: Transaction; lock?: boolean } = {},
): Promise<Listing> {
  if (!UUID.test(id)) throw new ListingNotFound();
  const listing = await Listing.scope("withSerial").findOne({
    where: { id, sellerId },
    transaction: opts.transaction,
    // Row lock: two saves of one listing (autosave and a button) run one after the other.
    ...(opts.lock && opts.transaction ? { lock: opts.transaction.LOCK.UPDATE } : {}),
  });
  if (!listing) throw new ListingNotFound();
  return listing;
}

/** Sold and removed listings are a record; nothing on them changes from the editor. */
export function assertEditable(listing: Listing): void {
  if (listing.status === "sold") throw new ListingStateError("This unit is sold; its listing can no longer be changed.", "sold");
  if (listing.status === "removed")
    throw new ListingStateError("A moderator removed this listing; it can no longer be changed. Write to the review desk if you disagree.", "removed");
}

export function isPublished(listing: Pick<Listing, "status">): boolean {
  return listing.status === "live" || listing.status === "held";
}
