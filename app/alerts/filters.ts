import { CATEGORY_LABELS, COSMETIC_GRADE_TEXT, SERVICE_STATE_TEXT, formatPrice } from "@shared/catalogue";
import { countryName } from "@shared/countries";
import {
  defaultSort,
  formatMeasured,
  MEASURED_FILTERS,
  marketFiltersToParams,
  parseMarketFilters,
  withoutPaging,
  type FilterIssue,
  type MarketFilters,
} from "@shared/market-filters";

// A spec alert's filters: the market's own reading of its parameters, stored in the market's canonical
// spelling without position or order (an alert watches for units, it does not page or sort), and
// read back in words for the form, the list and the mails.

export function alertFilters(filters: MarketFilters): MarketFilters {
  return { ...withoutPaging(filters), sort: defaultSort(filters.q) };
}

/** The canonical query string an alert stores; bad values are dropped with the market's messages. */
export function canonicalAlertQuery(params: URLSearchParams): { query: string; issues: FilterIssue[] } {
  const { filters, issues } = parseMarketFilters(params);
  return { query: marketFiltersToParams(alertFilters(filters)).toString(), issues };
}

export function readAlertQuery(query: string): MarketFilters {
  return alertFilters(parseMarketFilters(new URLSearchParams(query)).filters);
}

const or = (words: string[]) => (words.length > 1 ? `${words.slice(0, -1).join(", ")} or ${words.at(-1)}` : (words[0] ?? ""));

/** The filters in words, one line each: "Integrated amplifiers", "Power into 8 Ω, at least 80 W", … */
export function describeAlertQuery(query: string): string[] {
  const f = readAlertQuery(query);
  const lines: string[] = [];
  if (f.category) lines.push(CATEGORY_LABELS[f.category].many);
  if (f.q) lines.push(`Matching “${f.q}”`);
  const price = (minor: number) => formatPrice(minor, f.currency);
  if (f.priceMinMinor !== null && f.priceMaxMinor !== null) lines.push(`Priced ${price(f.priceMinMinor)} to ${price(f.priceMaxMinor)}`);
  else if (f.priceMinMinor !== null) lines.push(`Priced at least ${price(f.priceMinMinor)}`);
  else if (f.priceMaxMinor !== null) lines.push(`Priced at most ${price(f.priceMaxMinor)}`);
  if (f.condition.length) lines.push(`Condition: ${or(f.condition.map((c) => COSMETIC_GRADE_TEXT[c].label))}`);
  if (f.service.length) lines.push(`Service: ${or(f.service.map((s) => SERVICE_STATE_TEXT[s].label))}`);
  if (f.mains !== null) lines.push(`Set for ${f.mains} V mains (or switchable)`);
  if (f.deliverTo) lines.push(`A courier delivers to ${countryName(f.deliverTo)}`);
  if (f.seller) lines.push(f.seller === "workshop" ? "Sold by a workshop" : "Sold privately");
  if (f.verified) lines.push("Bench-verified units only");
  for (const filter of MEASURED_FILTERS) {
    const v = f.measured[filter.key];
    if (v !== undefined) lines.push(`${filter.label} ${formatMeasured(filter, v)}`);
  }
  if (Object.keys(f.measured).length)
    lines.push(f.figures === "verified" ? "Figures from bench-verified sheets" : "Measured figures from any sheet");
  return lines.length ? lines : ["Every unit on the market"];
}
