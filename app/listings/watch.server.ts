import { Listing } from "~/models/index.server";
import { Watch } from "~/models/watch.server";
import { isId } from "@shared/ids";
import { summaryInclude, toSummaries } from "~/catalogue/summaries.server";
import type { ListingSummary } from "~/catalogue/types";
import { canViewListing, PUBLIC_STATUSES, type Viewer } from "./visibility";

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

export interface WatchedListing {
  listingId: string;
  watchedAt: string;
  listing: ListingSummary;
}

/**
 * What a buyer watches, newest watch first. Only listings the public may see (live or sold): a unit
 * the seller withdrew or the desk holds drops out of the list while its watch row stays.
 */
export async function watchList(userId: string): Promise<WatchedListing[]> {
  const watches = await Watch.findAll({
    where: { userId },
    attributes: ["listingId", "createdAt"],
    order: [
      ["createdAt", "DESC"],
      ["id", "DESC"],
    ],
  });
  if (watches.length === 0) return [];
  const rows = await Listing.findAll({
    where: { id: watches.map((w) => w.listingId), status: [...PUBLIC_STATUSES] },
    include: summaryInclude,
  });
  const byId = new Map((await toSummaries(rows)).map((s) => [s.id, s]));
  return watches.flatMap((w) => {
    const listing = byId.get(w.listingId);
    return listing ? [{ listingId: w.listingId, watchedAt: w.createdAt.toISOString(), listing }] : [];
  });
}

/** For a page of cards: whether the buyer watches each unit, leaving out the buyer's own units. */
export async function watchStates(userId: string, listingIds: string[]): Promise<Record<string, boolean>> {
  if (listingIds.length === 0) return {};
  const [watched, own] = await Promise.all([
    Watch.findAll({ where: { userId, listingId: listingIds }, attributes: ["listingId"] }),
    Listing.findAll({ where: { id: listingIds, sellerId: userId }, attributes: ["id"] }),
  ]);
  const ownIds = new Set(own.map((l) => l.id));
  const watchedIds = new Set(watched.map((w) => w.listingId));
  return Object.fromEntries(listingIds.filter((id) => !ownIds.has(id)).map((id) => [id, watchedIds.has(id)]));
}
