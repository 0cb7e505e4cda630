import { Listing } from "~/models/index.server";
import { Watch } from "~/models/watch.server";
import { isId } from "@shared/ids";
import { canViewListing, type Viewer } from "./visibility";

// Watching a listing. The form says which state it wants ("watch" or "unwatch"), so sending it twice
// changes nothing the second time; the unique (user, listing) pair makes that hold under races too.

export type WatchOutcome = { ok: true; watching: boolean } | { ok: false; status: 404 | 409; reason: string };

export async function isWatching(userId: string, listingId: string): Promise<boolean> {
  return (await Watch.count({ where: { userId, listingId } })) > 0;
}

export async function setWatch(viewer: Viewer, listingId: string, watch: boolean): Promise<WatchOutcome> {
  const listing = isId(listingId) ? await Listing.findByPk(listingId, { attributes: ["id", "status", "sellerId"] }) : null;
  if (!listing || !canViewListing(listing.status, listing.sellerId, viewer)) {
    return { ok: false, status: 404, reason: "There is no listing here." };
  }
  if (!watch) {
    await Watch.destroy({ where: { userId: viewer.id, listingId } });
    return { ok: true, watching: false };
  }
  if (listing.sellerId === viewer.id) return { ok: false, status: 409, reason: "This is your own listing." };
  if (listing.status !== "live") return { ok: false, status: 409, reason: "Only units for sale can be watched." };
  await Watch.bulkCreate([{ userId: viewer.id, listingId }], { ignoreDuplicates: true });
  return { ok: true, watching: true };
}
