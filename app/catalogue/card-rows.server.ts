import type { Category, CosmeticGrade, ServiceState } from "@shared/catalogue";
import { mediaUrl } from "./media-url";
import { toSummaries, type CardSource } from "./summaries.server";
import type { ListingSummary, PhotoRef } from "./types";

// What a market card needs, joined onto the search's page of listing ids in the same statement (see
// searchQuery): one round trip per page instead of three, and plain rows rather than model instances,
// which cost more to build than the query takes at this size. `p` is the page, `l` its listings.

/** The columns a card is built from, as named in CardRow. */
export const CARD_COLUMNS = [
  "l.category",
  "l.maker",
  "l.model",
  "l.year_from",
  "l.year_to",
  "l.price_minor",
  "l.currency",
  "l.offers_welcome",
  "l.country",
  "l.region",
  "l.town",
  "l.cosmetic_grade",
  "l.service_state",
  "l.bench_verified",
  "l.published_at",
  "l.created_at",
  "u.display_name AS seller_name",
  "w.name AS workshop_name",
  "w.verification_status AS workshop_status",
  "s.id AS sheet_id",
  "s.updated_at AS sheet_updated_at",
  "c.thumb_key",
  "c.listing_key",
  "c.width AS cover_width",
  "c.height AS cover_height",
].join(", ");

/** The seller, workshop, sheet (one per listing) and cover: the marked one, else the first ready photo. */
export const CARD_JOINS = `JOIN listings l ON l.id = p.id
  LEFT JOIN users u ON u.id = l.seller_id
  LEFT JOIN workshops w ON w.id = l.workshop_id
  LEFT JOIN bench_sheets s ON s.listing_id = l.id
  LEFT JOIN LATERAL (
    SELECT ph.thumb_key, ph.listing_key, ph.width, ph.height FROM listing_photos ph
     WHERE ph.listing_id = l.id AND ph.status = 'ready' ORDER BY ph.is_cover DESC, ph.position LIMIT 1
  ) c ON true`;

export interface CardRow {
  id: string;
  category: Category;
  maker: string | null;
  model: string | null;
  year_from: number | null;
  year_to: number | null;
  price_minor: number | null;
  currency: string;
  offers_welcome: boolean;
  country: string | null;
  region: string | null;
  town: string | null;
  cosmetic_grade: CosmeticGrade | null;
  service_state: ServiceState | null;
  bench_verified: boolean;
  published_at: Date | null;
  created_at: Date;
  seller_name: string | null;
  workshop_name: string | null;
  workshop_status: string | null;
  sheet_id: string | null;
  sheet_updated_at: Date | null;
  thumb_key: string | null;
  listing_key: string | null;
  cover_width: number | null;
  cover_height: number | null;
}

/** The cards for the search's rows, in their order. */
export function summariesFromRows(rows: readonly CardRow[]): Promise<ListingSummary[]> {
  const covers = new Map<string, PhotoRef>();
  const sources = rows.map((r): CardSource => {
    if (r.thumb_key && r.listing_key && r.cover_width && r.cover_height)
      covers.set(r.id, {
        thumbUrl: mediaUrl(r.thumb_key),
        listingUrl: mediaUrl(r.listing_key),
        width: r.cover_width,
        height: r.cover_height,
      });
    return {
      id: r.id,
      category: r.category,
      maker: r.maker,
      model: r.model,
      yearFrom: r.year_from,
      yearTo: r.year_to,
      priceMinor: r.price_minor,
      currency: r.currency,
      offersWelcome: r.offers_welcome,
      country: r.country,
      region: r.region,
      town: r.town,
      cosmeticGrade: r.cosmetic_grade,
      serviceState: r.service_state,
      benchVerified: r.bench_verified,
      publishedAt: r.published_at,
      createdAt: r.created_at,
      seller: r.seller_name === null ? null : { displayName: r.seller_name },
      workshop: r.workshop_name === null ? null : { name: r.workshop_name, verificationStatus: r.workshop_status ?? "" },
      benchSheet: r.sheet_id && r.sheet_updated_at ? { id: r.sheet_id, updatedAt: r.sheet_updated_at } : null,
    };
  });
  return toSummaries(sources, covers);
}
