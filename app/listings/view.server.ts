import { Op } from "sequelize";
import { BenchSheet, Listing, ListingPhoto } from "~/models/index.server";
import type { SessionUser } from "~/auth/guards.server";
import { mediaUrl } from "~/catalogue/media-url";
import { photoView } from "~/photos/access.server";
import { listingTitle, type ListingStatus } from "@shared/catalogue";
import type { Outcome } from "@shared/bench";
import { ownListing } from "./access.server";
import { pickItem } from "./drafts.server";
import { storedSheet } from "./bench.server";
import { checklistFor } from "./publish.server";
import { restorationLog } from "./restoration.server";

// What the seller's pages and the owner's API read about listings. Owner only: the serial number and
// the postcode are in here, so nothing from this module goes to a public page.

export type SellerListingRow = {
  id: string;
  title: string;
  category: Listing["category"];
  status: ListingStatus;
  heldReason: string | null;
  benchVerified: boolean;
  priceMinor: number | null;
  currency: string;
  updatedAt: string;
  publishedAt: string | null;
  coverUrl: string | null;
  counts: Record<Outcome, number> | null;
};

export async function sellerListings(sellerId: string): Promise<SellerListingRow[]> {
  const rows = await Listing.findAll({
    where: { sellerId, status: { [Op.ne]: "removed" } },
    include: [{ model: BenchSheet, as: "benchSheet", attributes: ["verdict"] }],
    order: [["updatedAt", "DESC"]],
    limit: 500,
  });
  const covers = await ListingPhoto.findAll({
    where: { listingId: rows.map((r) => r.id), status: "ready" },
    attributes: ["listingId", "thumbKey", "isCover", "position"],
    order: [["position", "ASC"]],
  });
  const coverOf = new Map<string, string>();
  for (const p of covers) if (p.thumbKey && (p.isCover || !coverOf.has(p.listingId))) coverOf.set(p.listingId, mediaUrl(p.thumbKey));
  return rows.map((l) => {
    const verdict = l.benchSheet?.verdict;
    return {
      id: l.id,
      title: listingTitle(l.maker, l.model),
      category: l.category,
      status: l.status,
      heldReason: l.heldReason,
      benchVerified: l.benchVerified,
      priceMinor: l.priceMinor,
      currency: l.currency,
      updatedAt: l.updatedAt.toISOString(),
      publishedAt: l.publishedAt?.toISOString() ?? null,
      coverUrl: coverOf.get(l.id) ?? null,
      counts: verdict?.counts ?? null,
    };
  });
}

/** Everything the editor shows, for the listing's owner. */
export async function editorData(listingId: string, user: SessionUser) {
  const listing = await ownListing(listingId, user.id);
  const [bench, restoration, photos, checklist] = await Promise.all([
    storedSheet(listing.id),
    restorationLog(listing.id),
    ListingPhoto.findAll({ where: { listingId: listing.id }, order: [["position", "ASC"]] }),
    checklistFor(listing, user),
  ]);
  return {
    listing: {
      id: listing.id,
      status: listing.status,
      heldReason: listing.heldReason,
      reviewNote: listing.reviewNote,
      benchVerified: listing.benchVerified,
      publishedAt: listing.publishedAt?.toISOString() ?? null,
      updatedAt: listing.updatedAt.toISOString(),
      title: listingTitle(listing.maker, listing.model),
      ...pickItem(listing),
      cosmeticGrade: listing.cosmeticGrade,
      serviceState: listing.serviceState,
      conditionNote: listing.conditionNote,
    },
    sheet: bench.sheet,
    verdict: bench.verdict,
    checkedAt: bench.checkedAt?.toISOString() ?? null,
    restoration,
    photos: photos.map(photoView),
    checklist,
  };
}
export type EditorData = Awaited<ReturnType<typeof editorData>>;
