import { BenchSheet, Listing, ListingPhoto, User } from "~/models/index.server";
import { mediaUrl } from "~/catalogue/media-url";
import { deskNotFound } from "./not-found.server";
import { systemClock, type Clock } from "~/orders/clock.server";
import { isId } from "@shared/ids";
import { CATEGORY_LABELS, listingTitle } from "@shared/catalogue";
import { formatPrice } from "@shared/money";
import { auditTrail } from "./audit.server";
import { CLAIM_MINUTES, claimForViewer } from "./claims.server";
import { openFlags } from "./flags.server";
import { flagView, type FlagView } from "./flag-view.server";
import { listingActions } from "./listing-actions.server";

// /desk/listings/:id for moderators: the listing as the desk needs it (the hold's reason and the bench
// figures behind it, open flags, photos), who holds the item, what may be done to it, and its trail.

export interface DeskVerdictLine {
  title: string;
  outcome: string;
  detail: string;
  figures: string[];
}

export async function deskListingPage(moderator: { id: string; displayName: string }, listingId: string, clock: Clock = systemClock) {
  if (!isId(listingId)) deskNotFound("listing");
  const listing = await Listing.findByPk(listingId, {
    include: [{ model: User, as: "seller", attributes: ["id", "displayName", "email", "status"] }],
  });
  if (!listing) deskNotFound("listing");
  const subject = { type: "listing" as const, id: listing.id };
  const [claim, sheet, photos, flags, trail] = await Promise.all([
    claimForViewer(subject, moderator, clock),
    BenchSheet.findOne({ where: { listingId: listing.id }, attributes: ["verdict", "checkedAt"] }),
    ListingPhoto.findAll({ where: { listingId: listing.id, status: "ready" }, order: [["position", "ASC"]], limit: 12 }),
    openFlags(listing.id),
    auditTrail(subject),
  ]);
  const verdict = sheet?.verdict ?? null;
  const flagViews: FlagView[] = [];
  for (const f of flags) flagViews.push(await flagView(f));
  return {
    listing: {
      id: listing.id,
      title: listingTitle(listing.maker, listing.model),
      category: CATEGORY_LABELS[listing.category]?.one ?? listing.category,
      status: listing.status,
      heldReason: listing.heldReason,
      reviewNote: listing.reviewNote ?? null,
      price: listing.priceMinor === null ? null : formatPrice(listing.priceMinor, listing.currency),
      place: [listing.town, listing.country].filter(Boolean).join(", "),
      publishedAt: listing.publishedAt?.toISOString() ?? null,
      updatedAt: listing.updatedAt.toISOString(),
      seller: listing.seller
        ? { id: listing.seller.id, name: listing.seller.displayName, email: listing.seller.email, status: listing.seller.status }
        : null,
    },
    verdict: verdict
      ? {
          summary: verdict.summary,
          benchVerified: verdict.benchVerified,
          counts: verdict.counts,
          checkedAt: sheet?.checkedAt?.toISOString() ?? null,
          // The figures behind a hold: the rules that did not come out consistent, worst first.
          lines: verdict.results
            .filter((r) => r.outcome !== "consistent")
            .sort((a, b) => rank(a.outcome) - rank(b.outcome))
            .map((r): DeskVerdictLine => ({
              title: r.title,
              outcome: r.outcome,
              detail: r.detail,
              figures: r.compared.map((c) => `${c.label}: ${c.display}`),
            })),
        }
      : null,
    photos: photos.filter((p) => p.thumbKey).map((p) => ({ id: p.id, url: mediaUrl(p.listingKey ?? p.thumbKey!) })),
    flags: flagViews,
    actions: listingActions(listing.status, flagViews.length > 0),
    claim: claim.mine ? { mine: true as const } : { mine: false as const, by: claim.by, until: claim.until.toISOString() },
    claimMinutes: CLAIM_MINUTES,
    trail,
  };
}
export type DeskListingPage = Awaited<ReturnType<typeof deskListingPage>>;

function rank(outcome: string): number {
  return ["implausible", "questionable", "missing"].indexOf(outcome) + 1 || 9;
}
