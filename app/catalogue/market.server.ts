import { Op, QueryTypes } from "sequelize";
import { sequelize } from "~/db.server";
import { Listing, Workshop } from "~/models/index.server";
import { CATEGORIES, type Category } from "@shared/catalogue";
import { DEFAULT_FILTERS, parseMarketFilters, type FilterCounts, type FilterIssue, type MarketFilters } from "@shared/market-filters";
import { filterCounts, searchListings } from "./search.server";
import { summaryAttributes, summaryInclude, toSummaries } from "./summaries.server";
import type { ListingSummary } from "./types";

export const MARKET_PAGE_SIZE = 24;

/** The market's URL, read leniently: a bad value is dropped and its message kept for the field it belongs to. */
export interface MarketSearch {
  filters: MarketFilters;
  issues: FilterIssue[];
}

export function parseMarketSearch(url: URL): MarketSearch {
  return parseMarketFilters(url.searchParams, { strict: false });
}

export interface MarketPage {
  items: ListingSummary[];
  total: number;
  page: number;
  pageCount: number;
  pageSize: number;
  category: Category | null;
  /** Units per category, the other filters as set. */
  counts: CategoryCount[];
  filters: MarketFilters;
  issues: FilterIssue[];
  filterCounts: FilterCounts;
}

export interface CategoryCount {
  category: Category;
  live: number;
}

/** The market page: the first page of the search (by page number, for visitors without JavaScript and for crawlers). */
export async function marketPage({ filters, issues }: MarketSearch, pageSize = MARKET_PAGE_SIZE): Promise<MarketPage> {
  let result = await searchListings(filters, { page: filters.page, limit: pageSize });
  const pageCount = Math.max(1, Math.ceil(result.total / pageSize));
  const page = Math.min(filters.page, pageCount);
  // A page number past the end (an old link) shows the last page.
  if (page !== filters.page) result = await searchListings(filters, { page, limit: pageSize });
  const filterCounts = result.counts;
  const counts = CATEGORIES.map((category) => ({ category, live: filterCounts.category[category] }));
  return {
    items: result.items,
    total: result.total,
    page,
    pageCount,
    pageSize,
    category: filters.category,
    counts,
    filters,
    issues,
    filterCounts,
  };
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

/**
 * The home page: the latest bench-verified units, the categories and a few honest totals. The totals are
 * the market's own counts with no filter set, kept until a live listing changes: counting every live
 * row on each visit made home the slowest public page at 100,000 listings.
 */
export async function homeData(limit = 6): Promise<HomeData> {
  const [rows, marketCounts, verifiedWorkshops] = await Promise.all([
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
    filterCounts(DEFAULT_FILTERS),
    Workshop.count({ where: { verificationStatus: "verified", verifiedAt: { [Op.ne]: null } } }),
  ]);
  const counts = CATEGORIES.map((category) => ({ category, live: marketCounts.category[category] }));
  const live = counts.reduce((n, c) => n + c.live, 0);
  return { recentVerified: await toSummaries(rows), counts, totals: { live, benchVerified: marketCounts.verified, verifiedWorkshops } };
}
