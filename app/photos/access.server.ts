import type { Transaction } from "sequelize";
import type { Listing, ListingPhoto } from "~/models/index.server";
import { ownListing } from "~/listings/access.server";
import { PhotoRefusal } from "./refusal.server";
import { mediaUrl } from "~/catalogue/media-url";
import type { PhotoView } from "./limits";

// Every photo operation starts from a listing the signed-in seller owns (the listings' one ownership
// check: someone else's listing and a missing one get the same 404).

// A sale's photos are part of its record; a removed listing is frozen for the review desk.
const CLOSED = new Set(["sold", "removed"]);

export async function ownedListing(
  listingId: unknown,
  sellerId: string,
  options: { transaction?: Transaction; lock?: boolean; forChange?: boolean } = {},
): Promise<Listing> {
  const listing = await ownListing(listingId, sellerId, options);
  if (options.forChange && CLOSED.has(listing.status)) {
    throw new PhotoRefusal("listing_closed", `This listing is ${listing.status}, so its photos can no longer change.`);
  }
  return listing;
}

export function photoView(photo: ListingPhoto): PhotoView {
  const ready = photo.status === "ready" && photo.thumbKey && photo.listingKey && photo.zoomKey;
  return {
    id: photo.id,
    position: photo.position,
    isCover: photo.isCover,
    status: photo.status,
    width: ready ? photo.width : null,
    height: ready ? photo.height : null,
    error: photo.status === "failed" ? photo.error : null,
    urls: ready ? { thumb: mediaUrl(photo.thumbKey!), listing: mediaUrl(photo.listingKey!), zoom: mediaUrl(photo.zoomKey!) } : null,
  };
}

/** Every object a photo may have in storage, including the upload still waiting for the job. */
export function photoKeys(photo: Pick<ListingPhoto, "id" | "originalKey" | "thumbKey" | "listingKey" | "zoomKey">) {
  return [incomingKey(photo.id), photo.originalKey, photo.thumbKey, photo.listingKey, photo.zoomKey].filter((k): k is string => Boolean(k));
}

/** Where an accepted upload waits for processing; never served. */
export function incomingKey(photoId: string): string {
  return `incoming/${photoId}`;
}
