import type { ListingSummary } from "~/catalogue/types";
import {
  CATEGORIES,
  CATEGORY_LABELS,
  COSMETIC_GRADES,
  SERVICE_STATES,
  categoryFromSlug,
  type Category,
  type CosmeticGrade,
  type ServiceState,
} from "./catalogue";
import { CURRENCY_CODES, isCurrency, parsePrice, priceInputValue, type Currency } from "./listing-input";
import { isOneOf } from "./one-of";
import { textProblem } from "./text-rules";
import { MEASURED_FILTERS, MEASURED_FILTER_BY_PARAM, measuredParam, parseMeasured, type MeasuredFilterKey } from "./measured-filters";

// The market's whole state as URL parameters: the page's URL, the API's query string and a stored spec
// alert all use this one reading and this one canonical spelling. Isomorphic (the filter panel runs it too).

export * from "./measured-filters";

export const SELLER_KINDS = ["workshop", "private"] as const;
export type SellerKind = (typeof SELLER_KINDS)[number];

/** "verified": a figure counts only from a bench-verified sheet; "measured": also measured figures on sheets not verified. Rated figures never count. */
export const FIGURE_SOURCES = ["verified", "measured"] as const;
export type FigureSource = (typeof FIGURE_SOURCES)[number];

export const MARKET_SORTS = ["newest", "price_asc", "price_desc", "price_per_watt", "relevance"] as const;
export type MarketSort = (typeof MARKET_SORTS)[number];

export const MAX_QUERY_LENGTH = 200;
export const MAX_PAGE = 10_000;

export interface MarketFilters {
  /** Words to search for (trimmed, spaces collapsed), or null. */
  q: string | null;
  category: Category | null;
  /** Bounds in minor units of `currency`. */
  priceMinMinor: number | null;
  priceMaxMinor: number | null;
  /** The buyer's display currency; price bounds are in it. */
  currency: Currency;
  /** Cosmetic grades (any of), in catalogue order; empty = all. */
  condition: CosmeticGrade[];
  /** Service states (any of), in catalogue order; empty = all. */
  service: ServiceState[];
  /** Mains volts the unit must be set for (±5 %); switchable units match any. */
  mains: number | null;
  /** ISO country a courier option (parcel or freight) must reach. */
  deliverTo: string | null;
  seller: SellerKind | null;
  /** Only bench-verified units. */
  verified: boolean;
  figures: FigureSource;
  /** Measured-figure bounds in each filter's column units (see MEASURED_FILTERS). */
  measured: Partial<Record<MeasuredFilterKey, number>>;
  /** Defaults to relevance when there is a `q`, newest otherwise. */
  sort: MarketSort;
  /** The API's opaque position after the last page read. */
  cursor: string | null;
  /** The HTML page's number (from 1). */
  page: number;
}

export const DEFAULT_FILTERS: MarketFilters = {
  q: null,
  category: null,
  priceMinMinor: null,
  priceMaxMinor: null,
  currency: "EUR",
  condition: [],
  service: [],
  mains: null,
  deliverTo: null,
  seller: null,
  verified: false,
  figures: "verified",
  measured: {},
  sort: "newest",
  cursor: null,
  page: 1,
};

export function defaultSort(q: string | null): MarketSort {
  return q ? "relevance" : "newest";
}

export interface FilterIssue {
  param: string;
  message: string;
}

/** Units each choice would leave, the other filters as they are (the chosen value of the same kind left out). */
export interface FilterCounts {
  category: Record<Category, number>;
  condition: Record<CosmeticGrade, number>;
  service: Record<ServiceState, number>;
  seller: Record<SellerKind, number>;
  /** With `verified=1` added. */
  verified: number;
  /** Per measured filter: the units left with its value as set; when it is not set, the units that have the figure at all. */
  measured: Record<MeasuredFilterKey, number>;
}

/** GET /api/v1/listings: one page, the number of units matching, the next page's cursor (null at the end) and the counts. */
export interface ListingsPage {
  items: ListingSummary[];
  total: number;
  nextCursor: string | null;
  counts: FilterCounts;
}

type Params = URLSearchParams | Record<string, string | string[] | undefined>;

const SINGLE = [
  "q",
  "category",
  "priceMin",
  "priceMax",
  "currency",
  "mains",
  "deliverTo",
  "seller",
  "verified",
  "figures",
  "sort",
  "cursor",
  "page",
];
const REPEATABLE = ["condition", "service"];
const CURSOR_PATTERN = /^[A-Za-z0-9_-]{1,512}$/;

function entries(params: Params): [string, string][] {
  if (params instanceof URLSearchParams) return [...params.entries()];
  return Object.entries(params).flatMap(([k, v]) =>
    v === undefined ? [] : Array.isArray(v) ? v.map((x): [string, string] => [k, x]) : [[k, v]],
  );
}

/**
 * Reads market parameters. Strict (the API): every bad, unknown or repeated parameter is an issue.
 * Lenient (the page): a bad value is dropped (with its issue, for the message beside its field) and
 * unknown parameters are ignored. The filters returned are always usable.
 */
export function parseMarketFilters(
  params: Params,
  { strict = false }: { strict?: boolean } = {},
): { filters: MarketFilters; issues: FilterIssue[] } {
  const issues: FilterIssue[] = [];
  const issue = (param: string, message: string) => issues.push({ param, message });
  const all = new Map<string, string[]>();
  for (const [k, v] of entries(params)) all.set(k, [...(all.get(k) ?? []), v]);

  const one = (name: string): string | null => {
    const values = all.get(name);
    if (!values?.length) return null;
    if (values.length > 1 && strict) issue(name, `Give ${name} once.`);
    const v = values[0].trim();
    return v === "" ? null : v;
  };
  if (strict) {
    for (const name of all.keys()) {
      if (!SINGLE.includes(name) && !REPEATABLE.includes(name) && !MEASURED_FILTER_BY_PARAM.has(name))
        issue(name, `Unknown parameter "${name}".`);
    }
  }
  const f: MarketFilters = { ...DEFAULT_FILTERS, measured: {}, condition: [], service: [] };

  const q = one("q")?.normalize("NFC").replace(/\s+/g, " ");
  if (q) {
    const problem = textProblem(q, "name", "The search");
    if (problem) issue("q", problem);
    else if (q.length > MAX_QUERY_LENGTH) issue("q", `Search for at most ${MAX_QUERY_LENGTH} characters.`);
    else if (!/[\p{L}\p{N}]/u.test(q)) issue("q", "Type a word or a model number to search for.");
    else f.q = q;
  }

  const slug = one("category");
  if (slug) {
    const category = categoryFromSlug(slug);
    if (category) f.category = category;
    else issue("category", `Unknown category "${slug}"; one of ${CATEGORIES.map((c) => CATEGORY_LABELS[c].slug).join(", ")}.`);
  }

  const currency = one("currency")?.toUpperCase();
  if (currency) {
    if (isCurrency(currency)) f.currency = currency;
    else issue("currency", `Unknown currency "${currency}"; one of ${CURRENCY_CODES.join(", ")}.`);
  }
  for (const [param, key] of [
    ["priceMin", "priceMinMinor"],
    ["priceMax", "priceMaxMinor"],
  ] as const) {
    const text = one(param);
    if (!text) continue;
    const price = parsePrice(text, f.currency, { allowZero: true });
    if (price.ok) f[key] = price.value;
    else issue(param, price.message);
  }
  if (f.priceMinMinor !== null && f.priceMaxMinor !== null && f.priceMinMinor > f.priceMaxMinor) {
    issue("priceMax", "The highest price is below the lowest.");
    f.priceMaxMinor = null;
  }

  f.condition = manyOf("condition", COSMETIC_GRADES);
  f.service = manyOf("service", SERVICE_STATES);
  function manyOf<const T extends string>(param: string, list: readonly T[]): T[] {
    const picked = new Set<T>();
    for (const v of (all.get(param) ?? [])
      .flatMap((x) => x.split(","))
      .map((x) => x.trim())
      .filter(Boolean)) {
      if (isOneOf(list, v)) picked.add(v);
      else issue(param, `Unknown ${param} "${v}"; one of ${list.join(", ")}.`);
    }
    return list.filter((x) => picked.has(x));
  }

  const mains = one("mains");
  if (mains) {
    const m = /^(\d{2,3})\s*V?$/i.exec(mains);
    const volts = m ? Number(m[1]) : NaN;
    if (volts >= 90 && volts <= 260) f.mains = volts;
    else issue("mains", "Give the mains voltage in volts, e.g. 230 or 120.");
  }

  const deliverTo = one("deliverTo")?.toUpperCase();
  if (deliverTo) {
    if (/^[A-Z]{2}$/.test(deliverTo)) f.deliverTo = deliverTo;
    else issue("deliverTo", "Give a two-letter country code, e.g. DE.");
  }

  const seller = one("seller");
  if (seller) {
    if (isOneOf(SELLER_KINDS, seller)) f.seller = seller;
    else issue("seller", 'Seller is "workshop" or "private".');
  }

  const verified = one("verified");
  if (verified) {
    if (verified === "1" || verified === "true") f.verified = true;
    else if (verified !== "0" && verified !== "false") issue("verified", "Use verified=1 for bench-verified units only.");
  }

  const figures = one("figures");
  if (figures) {
    if (isOneOf(FIGURE_SOURCES, figures)) f.figures = figures;
    else issue("figures", 'Figures are "verified" (bench-verified sheets only) or "measured" (any measured figure).');
  }

  for (const filter of MEASURED_FILTERS) {
    const text = one(filter.param);
    if (!text) continue;
    const read = parseMeasured(filter, text);
    if (read.ok) f.measured[filter.key] = read.value;
    else issue(filter.param, read.message);
  }
  if (f.measured.gainMin !== undefined && f.measured.gainMax !== undefined && f.measured.gainMin > f.measured.gainMax) {
    issue("gainMax", "The highest gain is below the lowest.");
    delete f.measured.gainMax;
  }

  f.sort = defaultSort(f.q);
  const sort = one("sort");
  if (sort) {
    if (!isOneOf(MARKET_SORTS, sort)) issue("sort", `Unknown sort "${sort}"; one of ${MARKET_SORTS.join(", ")}.`);
    else if (sort === "relevance" && !f.q) issue("sort", "Sorting by relevance needs words to search for (q).");
    else f.sort = sort;
  }

  const cursor = one("cursor");
  if (cursor) {
    if (CURSOR_PATTERN.test(cursor)) f.cursor = cursor;
    else issue("cursor", "This cursor is not one Loadline gave out; start from the first page.");
  }

  const page = one("page");
  if (page) {
    const n = /^\d{1,6}$/.test(page) ? Number(page) : NaN;
    if (n >= 1 && n <= MAX_PAGE) f.page = n;
    else issue("page", `Pages are numbered 1 to ${MAX_PAGE}.`);
  }

  return { filters: f, issues };
}

/** The canonical parameters: defaults left out, always in the same order, so equal filters give equal URLs. */
export function marketFiltersToParams(f: MarketFilters): URLSearchParams {
  const p = new URLSearchParams();
  if (f.q) p.set("q", f.q);
  if (f.category) p.set("category", CATEGORY_LABELS[f.category].slug);
  if (f.priceMinMinor !== null) p.set("priceMin", priceInputValue(f.priceMinMinor, f.currency));
  if (f.priceMaxMinor !== null) p.set("priceMax", priceInputValue(f.priceMaxMinor, f.currency));
  // The currency only says what the price bounds are in: without a bound it changes nothing, so it is left out.
  if (f.currency !== DEFAULT_FILTERS.currency && (f.priceMinMinor !== null || f.priceMaxMinor !== null)) p.set("currency", f.currency);
  for (const c of COSMETIC_GRADES.filter((g) => f.condition.includes(g))) p.append("condition", c);
  for (const s of SERVICE_STATES.filter((g) => f.service.includes(g))) p.append("service", s);
  if (f.mains !== null) p.set("mains", String(f.mains));
  if (f.deliverTo) p.set("deliverTo", f.deliverTo);
  if (f.seller) p.set("seller", f.seller);
  if (f.verified) p.set("verified", "1");
  if (f.figures !== DEFAULT_FILTERS.figures) p.set("figures", f.figures);
  for (const filter of MEASURED_FILTERS) {
    const v = f.measured[filter.key];
    if (v !== undefined) p.set(filter.param, measuredParam(filter, v));
  }
  if (f.sort !== defaultSort(f.q)) p.set("sort", f.sort);
  if (f.cursor) p.set("cursor", f.cursor);
  if (f.page > 1) p.set("page", String(f.page));
  return p;
}

/** The same filters without a position (a new search starts at the top; a spec alert stores no page). */
export function withoutPaging(f: MarketFilters): MarketFilters {
  return { ...f, cursor: null, page: 1 };
}
