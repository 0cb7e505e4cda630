import { Op, QueryTypes } from "sequelize";
import { sequelize } from "~/db.server";
import { Listing, Review, User, Workshop } from "~/models/index.server";
import { summaryAttributes, summaryInclude, toSummaries } from "~/catalogue/summaries.server";
import type { ListingSummary } from "~/catalogue/types";
import { placeText } from "~/listings/sections.server";
import { isId } from "@shared/ids";
import { reviewView, type ReviewView } from "./reviews.server";
import { monthText } from "@shared/dates";

// A seller's public standing, for /sellers/:id and /workshops/:slug: the rating (average and count of
// reviews a moderator has not hidden), the latest reviews, completed sales, the share of the listings
// they put in the market that carry the bench-verified mark, and their live listings.

export const RECENT_REVIEWS = 10;
export const LIVE_LISTINGS_SHOWN = 24;
/** Statuses of a listing that has been in the market (a draft or a held one never was). */
const MARKET_STATUSES = ["live", "reserved", "sold"] as const;

export interface Rating {
  average: number | null;
  count: number;
}

export interface PublicReview extends Omit<ReviewView, "hidden"> {
  /** The buyer as others see them: first name and an initial. */
  by: string;
  unit: string;
}

export interface Standing {
  rating: Rating;
  reviews: PublicReview[];
  completedSales: number;
  verified: { listings: number; benchVerified: number };
  live: ListingSummary[];
}

export interface SellerProfile extends Standing {
  seller: { id: string; name: string; memberSince: string };
  workshop: { name: string; slug: string; place: string | null; about: string | null; verified: boolean } | null;
}

/** "Perrin Gadsby" → "Perrin G.": enough to tell reviews apart, not enough to find the buyer. */
export function shortName(displayName: string | null | undefined): string {
  const parts = (displayName ?? "").trim().split(/\s+/).filter(Boolean);
  if (parts.length === 0) return "A buyer";
  return parts.length === 1 ? parts[0] : `${parts[0]} ${parts[parts.length - 1][0].toUpperCase()}.`;
}

export async function ratingOf(sellerId: string): Promise<Rating> {
  const [row] = await sequelize.query<{ average: string | null; count: number }>(
    `SELECT avg(rating)::text AS average, count(*)::int AS count FROM reviews WHERE seller_id = :sellerId AND hidden_at IS NULL`,
    { replacements: { sellerId }, type: QueryTypes.SELECT },
  );
  return { average: row?.average ? Math.round(Number(row.average) * 10) / 10 : null, count: row?.count ?? 0 };
}

export async function standingOf(sellerId: string): Promise<Standing> {
  const [rating, recent, [sales], [share], live] = await Promise.all([
    ratingOf(sellerId),
    Review.findAll({
      where: { sellerId, hiddenAt: null },
      include: [{ model: User, as: "buyer", attributes: ["id", "displayName"] }],
      order: [
        ["createdAt", "DESC"],
        ["id", "DESC"],
      ],
      limit: RECENT_REVIEWS,
    }),
    sequelize.query<{ n: number }>(`SELECT count(*)::int AS n FROM orders WHERE seller_id = :sellerId AND released_at IS NOT NULL`, {
      replacements: { sellerId },
      type: QueryTypes.SELECT,
    }),
    sequelize.query<{ listings: number; verified: number }>(
      `SELECT count(*)::int AS listings, count(*) FILTER (WHERE bench_verified)::int AS verified
         FROM listings WHERE seller_id = :sellerId AND status IN (:statuses)`,
      { replacements: { sellerId, statuses: MARKET_STATUSES }, type: QueryTypes.SELECT },
    ),
    Listing.findAll({
      where: { sellerId, status: "live" },
      attributes: [...summaryAttributes],
      include: summaryInclude,
      order: [
        ["publishedAt", "DESC"],
        ["id", "DESC"],
      ],
      limit: LIVE_LISTINGS_SHOWN,
    }),
  ]);
  const units = await unitTitles(recent.map((r) => r.orderId));
  return {
    rating,
    reviews: recent.map((r) => {
      const { hidden: _hidden, ...view } = reviewView(r);
      return { ...view, by: shortName(r.buyer?.displayName), unit: units.get(r.orderId) ?? "a unit" };
    }),
    completedSales: sales?.n ?? 0,
    verified: { listings: share?.listings ?? 0, benchVerified: share?.verified ?? 0 },
    live: await toSummaries(live),
  };
}

async function unitTitles(orderIds: string[]): Promise<Map<string, string>> {
  if (orderIds.length === 0) return new Map();
  const rows = await sequelize.query<{ id: string; maker: string | null; model: string | null }>(
    `SELECT o.id, l.maker, l.model FROM orders o JOIN listings l ON l.id = o.listing_id WHERE o.id IN (:orderIds)`,
    { replacements: { orderIds }, type: QueryTypes.SELECT },
  );
  return new Map(rows.map((r) => [r.id, [r.maker, r.model].filter(Boolean).join(" ") || "a unit"]));
}

/** Where a seller's public page is: their workshop's page when they have one that is not refused. */
export function sellerHref(sellerId: string, workshop: Pick<Workshop, "slug" | "verificationStatus"> | null | undefined): string {
  return workshop && workshop.verificationStatus !== "rejected" ? `/workshops/${workshop.slug}` : `/sellers/${sellerId}`;
}

/**
 * A seller's page: an active account that has put something in the market (a buyer-only account has no
 * public page; a suspended one's listings have left it). Null answers the same 404 for all of these.
 */
export async function sellerProfile(id: string): Promise<SellerProfile | { redirect: string } | null> {
  if (!isId(id)) return null;
  const user = await User.findByPk(id, { attributes: ["id", "displayName", "status", "createdAt"] });
  if (!user || user.status !== "active") return null;
  const workshop = await Workshop.findOne({ where: { ownerId: user.id, verificationStatus: { [Op.ne]: "rejected" } } });
  if (workshop) return { redirect: `/workshops/${workshop.slug}` };
  const inMarket = await Listing.count({ where: { sellerId: user.id, status: [...MARKET_STATUSES] } });
  if (inMarket === 0) return null;
  return {
    seller: { id: user.id, name: user.displayName, memberSince: monthText(user.createdAt) },
    workshop: null,
    ...(await standingOf(user.id)),
  };
}

export async function workshopProfile(slug: string): Promise<SellerProfile | null> {
  if (!/^[a-z0-9-]{1,80}$/i.test(slug)) return null;
  const workshop = await Workshop.findOne({ where: { slug } });
  if (!workshop || workshop.verificationStatus === "rejected") return null;
  const owner = await User.findByPk(workshop.ownerId, { attributes: ["id", "displayName", "status", "createdAt"] });
  if (!owner || owner.status !== "active") return null;
  return {
    seller: { id: owner.id, name: owner.displayName, memberSince: monthText(workshop.createdAt) },
    workshop: {
      name: workshop.name,
      slug: workshop.slug,
      place: placeText(workshop.town, workshop.region, workshop.country),
      about: workshop.about,
      verified: workshop.verificationStatus === "verified" && workshop.verifiedAt !== null,
    },
    ...(await standingOf(owner.id)),
  };
}
