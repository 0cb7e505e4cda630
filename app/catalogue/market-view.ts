import { COSMETIC_GRADE_TEXT, SERVICE_STATE_TEXT, formatPrice, type Category } from "@shared/catalogue";
import {
  DEFAULT_FILTERS,
  MEASURED_FILTERS,
  defaultSort,
  formatMeasured,
  marketFiltersToParams,
  measuredFiltersFor,
  withoutPaging,
  type MarketFilters,
  type MarketSort,
  type MeasuredFilter,
} from "@shared/market-filters";

// How the market's filters read on the page: addresses, the sorts on offer, and the applied filters as
// removable chips. Isomorphic and free of React, so the panel and its tests share one wording.

/** The market page for these filters (a new search always starts at the top). */
export function marketHref(f: MarketFilters): string {
  const params = marketFiltersToParams(withoutPaging(f)).toString();
  return params ? `/market?${params}` : "/market";
}

/** The page-numbered address the pager links to without JavaScript. */
export function marketPageHref(f: MarketFilters, page: number): string {
  const params = marketFiltersToParams({ ...f, cursor: null, page }).toString();
  return params ? `/market?${params}` : "/market";
}

/** The filters moved to another category: figures that category does not have are dropped, not kept hidden. */
export function inCategory(f: MarketFilters, category: Category | null): MarketFilters {
  const offered = new Set(measuredFiltersFor(category).map((m) => m.key));
  const measured = Object.fromEntries(Object.entries(f.measured).filter(([key]) => offered.has(key as MeasuredFilter["key"])));
  const next: MarketFilters = { ...withoutPaging(f), category, measured };
  if (!sortOptions(next).some((o) => o.value === next.sort)) next.sort = defaultSort(next.q);
  return next;
}

/** Whether the category's units have a measured power into 8 Ω (and so a price per watt). */
export function hasPower(category: Category | null): boolean {
  return measuredFiltersFor(category).some((m) => m.key === "power8");
}

export function sortOptions(f: Pick<MarketFilters, "q" | "category">): { value: MarketSort; label: string }[] {
  return [
    ...(f.q ? [{ value: "relevance" as const, label: "Best match" }] : []),
    { value: "newest", label: "Newest first" },
    { value: "price_asc", label: "Price, low to high" },
    { value: "price_desc", label: "Price, high to low" },
    ...(hasPower(f.category) ? [{ value: "price_per_watt" as const, label: "Price per measured watt into 8 Ω" }] : []),
  ];
}

/** A measured filter as a chip: its label without the words of the bound, the bound as a sign ("THD ≤ 0.05 %"). */
export function measuredChip(m: MeasuredFilter, value: number): string {
  const plusMinus = m.label.endsWith("±");
  const name = m.label.replace(/, at (least|most)( ±)?$/, "");
  return `${name} ${m.bound === "min" ? "≥" : "≤"} ${plusMinus ? "±" : ""}${formatMeasured(m, value)}`;
}

export interface AppliedFilter {
  /** Stable key for React and tests: the parameter, and the value for repeatable ones. */
  id: string;
  /** What the chip shows. */
  label: string;
  /** The same filters without this one. */
  without: MarketFilters;
}

/**
 * Every filter the buyer set, in panel order; the category is not among them (the category links show it).
 * `countryName` names the "Delivers to" country: the market's loader names the countries (the browser
 * builds no Intl object for them); without it the chip shows the code.
 */
export function appliedFilters(f: MarketFilters, countryName: (code: string) => string = (code) => code): AppliedFilter[] {
  const out: AppliedFilter[] = [];
  const add = (id: string, label: string, without: Partial<MarketFilters>) =>
    out.push({ id, label, without: { ...withoutPaging(f), ...without } });
  if (f.q) add("q", `“${f.q}”`, { q: null, sort: f.sort === "relevance" ? "newest" : f.sort });
  if (f.priceMinMinor !== null) add("priceMin", `From ${formatPrice(f.priceMinMinor, f.currency)}`, { priceMinMinor: null });
  if (f.priceMaxMinor !== null) add("priceMax", `Up to ${formatPrice(f.priceMaxMinor, f.currency)}`, { priceMaxMinor: null });
  for (const g of f.condition) add(`condition:${g}`, COSMETIC_GRADE_TEXT[g].label, { condition: f.condition.filter((x) => x !== g) });
  for (const s of f.service) add(`service:${s}`, SERVICE_STATE_TEXT[s].label, { service: f.service.filter((x) => x !== s) });
  if (f.mains !== null) add("mains", `Set for ${f.mains} V`, { mains: null });
  if (f.deliverTo) add("deliverTo", `Delivers to ${countryName(f.deliverTo)}`, { deliverTo: null });
  if (f.seller) add("seller", f.seller === "workshop" ? "Workshops" : "Private sellers", { seller: null });
  if (f.verified) add("verified", "Bench-verified only", { verified: false });
  if (f.figures === "measured") add("figures", "Unverified measured figures count", { figures: "verified" });
  for (const m of MEASURED_FILTERS) {
    const value = f.measured[m.key];
    if (value === undefined) continue;
    const measured = { ...f.measured };
    delete measured[m.key];
    add(m.param, measuredChip(m, value), { measured });
  }
  return out;
}

/** Clear all: every applied filter off; the category, the display currency and the sort are kept. */
export function clearedFilters(f: MarketFilters): MarketFilters {
  return { ...DEFAULT_FILTERS, measured: {}, category: f.category, currency: f.currency, sort: f.sort === "relevance" ? "newest" : f.sort };
}
