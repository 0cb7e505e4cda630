import { QueryTypes } from "sequelize";
import { sequelize } from "~/db.server";
import { BenchSheet, User, Workshop } from "~/models/index.server";
import { formatEra, listingTitle } from "@shared/catalogue";
import { leadFigure, type CardFigure } from "@shared/listing-facets";
import type { Category, CosmeticGrade, ServiceState } from "@shared/catalogue";
import type { BenchSheet as Sheet } from "@shared/bench/schema";
import type { ListingSummary, PhotoRef } from "./types";
import { mediaUrl } from "./media-url";

// Turns listing rows into what list pages show. Loads what a card needs in two queries per page
// (listings with seller and sheet, then covers), however many listings there are, and only the
// columns a card shows: no description, shipping options or verdict read and parsed per card.

/** The listing columns a card is built from (see toSummaries). */
export const summaryAttributes = [
  "id",
  "sellerId",
  "workshopId",
  "category",
  "maker",
  "model",
  "yearFrom",
  "yearTo",
  "priceMinor",
  "currency",
  "offersWelcome",
  "country",
  "region",
  "town",
  "cosmeticGrade",
  "serviceState",
  "benchVerified",
  "publishedAt",
  "createdAt",
] as const;

export const summaryInclude = [
  { model: User, as: "seller", attributes: ["id", "displayName"] },
  { model: Workshop, as: "workshop", attributes: ["id", "name", "slug", "verificationStatus"] },
  // The sheet itself only on a miss of the lead figures kept below: parsing every card's sheet costs more than the page.
  { model: BenchSheet, as: "benchSheet", attributes: ["id", "updatedAt"] },
];

/** The cards' include with each whole sheet read too, for a page that shows the sheets themselves. */
export const summaryIncludeWithSheets = summaryInclude.map((i) =>
  i.as === "benchSheet" ? { ...i, attributes: [...i.attributes, "sheet"] } : i,
);

// A card's figure comes from its whole sheet, read through the sheet's schema: worth doing once per
// sheet version, not once per card per request. The cards' query reads only the sheet's id and version;
// the sheets kept figures do not cover are read in one query.
const leadFigures = new Map<string, { updatedAt: number; figure: CardFigure | null }>();

/**
 * What a card is built from: a listing model with its includes, or a plain row of the market's search
 * (card-rows.server.ts). The sheet itself only when it was read (else its id and version suffice).
 */
export interface CardSource {
  id: string;
  category: Category;
  maker: string | null;
  model: string | null;
  yearFrom: number | null;
  yearTo: number | null;
  priceMinor: number | null;
  currency: string;
  offersWelcome: boolean;
  country: string | null;
  region: string | null;
  town: string | null;
  cosmeticGrade: CosmeticGrade | null;
  serviceState: ServiceState | null;
  benchVerified: boolean;
  publishedAt: Date | null;
  createdAt: Date;
  seller?: { displayName: string } | null;
  workshop?: { name: string; verificationStatus: string } | null;
  benchSheet?: SheetRef | null;
}
type SheetRef = { id: string; updatedAt: Date; sheet?: Sheet | null };

/** Whether the sheet's own column was read (a model instance has the attribute either way). */
const sheetRead = (bench: SheetRef) => ("dataValues" in bench ? "sheet" in (bench as BenchSheet).dataValues : "sheet" in bench);

async function cardFigures(rows: readonly CardSource[]): Promise<Map<string, CardFigure | null>> {
  const out = new Map<string, CardFigure | null>();
  const missed: string[] = [];
  for (const { benchSheet: bench } of rows) {
    if (!bench) continue;
    const hit = leadFigures.get(bench.id);
    if (hit && hit.updatedAt === bench.updatedAt.getTime()) out.set(bench.id, hit.figure);
    else if (sheetRead(bench)) out.set(bench.id, keep(bench));
    else missed.push(bench.id);
  }
  if (missed.length === 0) return out;
  for (const bench of await BenchSheet.findAll({ where: { id: missed }, attributes: ["id", "updatedAt", "sheet"] })) {
    out.set(bench.id, keep(bench));
  }
  return out;
}

function keep(bench: SheetRef): CardFigure | null {
  const figure = leadFigure(bench.sheet ?? null);
  if (leadFigures.size >= 10_000) leadFigures.clear();
  leadFigures.set(bench.id, { updatedAt: bench.updatedAt.getTime(), figure });
  return figure;
}

/** The cards for `rows`, in their order; covers read in one query unless the rows came with theirs. */
export async function toSummaries(rows: readonly CardSource[], knownCovers?: Map<string, PhotoRef>): Promise<ListingSummary[]> {
  const [covers, figures] = await Promise.all([knownCovers ?? coversFor(rows.map((r) => r.id)), cardFigures(rows)]);
  return rows.map((l) => ({
    id: l.id,
    title: listingTitle(l.maker, l.model),
    maker: l.maker ?? "",
    model: l.model ?? "",
    category: l.category,
    era: formatEra(l.yearFrom, l.yearTo),
    priceMinor: l.priceMinor ?? 0,
    currency: l.currency,
    offersWelcome: l.offersWelcome,
    cosmeticGrade: l.cosmeticGrade!,
    serviceState: l.serviceState!,
    benchVerified: l.benchVerified,
    place: [l.town, l.region].filter(Boolean).join(", ") || (l.country ?? ""),
    seller: l.workshop
      ? { name: l.workshop.name, kind: "workshop", verified: l.workshop.verificationStatus === "verified" }
      : // Private sellers go by first name in lists.
        { name: (l.seller?.displayName ?? "").split(/\s+/)[0] ?? "", kind: "private", verified: false },
    cover: covers.get(l.id) ?? null,
    keyFigure: (l.benchSheet && figures.get(l.benchSheet.id)) ?? null,
    publishedAt: (l.publishedAt ?? l.createdAt).toISOString(),
  }));
}

async function coversFor(listingIds: string[]): Promise<Map<string, PhotoRef>> {
  const out = new Map<string, PhotoRef>();
  if (listingIds.length === 0) return out;
  // The marked cover, else the first ready photo.
  const rows = await sequelize.query<{ listing_id: string; thumb_key: string; listing_key: string; width: number; height: number }>(
    `SELECT DISTINCT ON (listing_id) listing_id, thumb_key, listing_key, width, height
       FROM listing_photos
      WHERE listing_id IN (:ids) AND status = 'ready'
      ORDER BY listing_id, is_cover DESC, position`,
    { replacements: { ids: listingIds }, type: QueryTypes.SELECT },
  );
  for (const r of rows) {
    out.set(r.listing_id, {
      thumbUrl: mediaUrl(r.thumb_key),
      listingUrl: mediaUrl(r.listing_key),
      width: r.width,
      height: r.height,
    });
  }
  return out;
}
