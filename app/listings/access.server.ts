import type { Transaction } from "sequelize";
import { Listing } from "~/models/index.server";
import { findOwn } from "~/auth/ownership.server";
import { ListingNotFound, ListingStateError } from "./errors.server";

// The one way listing services (and the photo API) reach a listing: by id AND owner. Anyone else's
// listing is "not found", so an id guessed or copied from a public page reveals nothing about drafts.

export async function ownListing(
  id: unknown,
  sellerId: string,
  // Lock: two saves of one listing (autosave and a button) run one after the other.
  opts: { transaction?: Transaction; lock?: boolean } = {},
): Promise<Listing> {
  const listing = await findOwn(Listing.scope("withSerial"), id, { sellerId }, opts);
  if (!listing) throw new ListingNotFound();
  return listing;
}

/** Sold and removed listings are a record; nothing on them changes from the editor. A reserved one is what a buyer is buying. */
export function assertEditable(listing: Listing): void {
  if (listing.status === "reserved")
    throw new ListingStateError("A buyer holds this unit in checkout or an open order; its listing cannot change meanwhile.", "conflict");
  if (listing.status === "sold") throw new ListingStateError("This unit is sold; its listing can no longer be changed.", "sold");
  if (listing.status === "removed")
    throw new ListingStateError(
      "A moderator removed this listing; it can no longer be changed. Write to the review desk if you disagree.",
      "removed",
    );
}

export function isPublished(listing: Pick<Listing, "status">): boolean {
  return listing.status === "live" || listing.status === "held";
}
