import { Op, QueryTypes, type WhereOptions } from "sequelize";
import { z } from "zod";
import { sequelize } from "~/db.server";
import { Listing, Workshop } from "~/models/index.server";
import { CATEGORIES, categoryFromSlug, type Category } from "@shared/catalogue";
import { summaryAttributes, summaryInclude, toSummaries } from "./summaries.server";
import type { ListingSummary } from "./types";

export const MARKET_PAGE_SIZE = 24;

/** The market's URL parameters: `?category=turntables&page=2`. Unknown values fall back, never error. */
export const MarketSearchSchema = z.object({
  category: z
    .string()
    .optional()
    .transform((s) => categoryFromSlug(s)),
  page: z.coerce.number().int().min(1).max(10_000).catch(1).default(1),
});
export type MarketSearch = z.infer<typeof MarketSearchSchema>;

export function parseMarketSearch(url: URL): MarketSearch {
  return MarketSearchSchema.parse({
    category: url.searchParams.get("category") ?? undefined,
    page: url.searchParams.get("page") ?? undefined,
  });
}

export interface MarketPage {
  items: ListingSummary[];
  total: number;
  page: number;
  pageCount: number;
  pageSize: number;
  category: Category | null;
  counts: CategoryCount[];
}

export interface CategoryCount {
  category: Category;
  live: number;
}

/** Live listings, newest first, optionally in one category. Only `live` is ever shown in the market. */
export async function marketPage(search: MarketSearch, pageSize = MARKET_PAGE_SIZE): Promise<MarketPage> {
  const where: WhereOptions = { status: "live", ...(search.category ? { category: search.category } : {}) };
  // The category counts give the total too: one query fewer per page.
  const counts = await liveCountsByCategory();
  const total = counts.reduce((n, c) => (!search.category || c.category === search.category ? n + c.live : n), 0);
  const pageCount = Math.max(1, Math.ceil(total / pageSize));
  const page = Math.min(search.page, pageCount);
  const rows = await Listing.findAll({
    where,
    attributes: [...summaryAttributes],
    include: summaryInclude,
    order: [
      ["publishedAt", "DESC"],
      ["id", "DESC"],
    ],
    limit: pageSize,
    offset: (page - 1) * pageSize,
  });
  return { items: await toSummaries(rows), total, page, pageCount, pageSize, category: search.category, counts };
}

/** How many live listings each category has (every category, zero included), in catalogue order. */
export async function liveCountsByCategory(): Promise<CategoryCount[]> {
  const rows = await sequelize.query<{ category: Category; live: string }>(
    "SELECT category, count(*) AS live FROM listings WHERE status = 'live' GROUP BY category",
    { type: QueryTypes.SELECT },
  );
  const by = new Map(rows.map((r) => [r.category, Number(r.live)]));
  return CATEGORIES.map((category) => ({ category, live: by.get(category) ?? 0 }));
}

export interface HomeData {
  recentVerified: ListingSummary[];
  counts: CategoryCount[];
  totals: { live: number; benchVerified: number; verifiedWorkshops: number };
}

/** The home page: the latest bench-verified units, the categories and a few honest totals. */
export async function homeData(limit = 6): Promise<HomeData> {
  const [rows, counts, benchVerified, verifiedWorkshops] = await Promise.all([
    Listing.findAll({
      where: { status: "live", benchVerified: true },
      attributes: [...summaryAttributes],
      include: summaryInclude,
      order: [
        ["publishedAt", "DESC"],
        ["id", "DESC"],
      ],
      limit,
    }),
    liveCountsByCategory(),
    Listing.count({ where: { status: "live", benchVerified: true } }),
    Workshop.count({ where: { verificationStatus: "verified", verifiedAt: { [Op.ne]: null } } }),
  ]);
  const live = counts.reduce((n, c) => n + c.live, 0);
  return { recentVerified: await toSummaries(rows), counts, totals: { live, benchVerified, verifiedWorkshops } };
}
