import { redirect } from "react-router";
import { marketFiltersToParams, parseMarketFilters } from "@shared/market-filters";
import { getUser } from "~/auth/guards.server";
import { watchStates } from "~/listings/watch.server";
import { marketPageHref } from "./market-view";
import { DEFAULT_LIMIT, searchListings } from "./search.server";
import type { MarketView } from "./ui/MarketExplorer";

// The market's first page as the server renders it (for visitors without JavaScript and for search
// engines): every filter from the URL, read leniently (a bad value is dropped and its message shown
// beside its field), the page by number. The panel takes over from here in the browser.

export async function marketPageData(request: Request): Promise<MarketView> {
  const url = new URL(request.url);
  const { filters, issues } = parseMarketFilters(url.searchParams);
  const params = marketFiltersToParams(filters).toString();
  // A plain form submit sends every field, empty ones too: answer with the canonical address, so
  // what is shared or bookmarked is the short one. A bad value stays in the address beside its message.
  if (issues.length === 0 && params !== url.searchParams.toString()) throw redirect(params ? `/market?${params}` : "/market");

  const [page, user] = await Promise.all([searchListings(filters, { page: filters.page }), getUser(request)]);
  const pageCount = Math.max(1, Math.ceil(page.total / DEFAULT_LIMIT));
  if (filters.page > pageCount) throw redirect(marketPageHref(filters, pageCount));
  // Signed in: which cards show a watch button, and in which state (never on the buyer's own units).
  const watching = user
    ? await watchStates(
        user.id,
        page.items.map((l) => l.id),
      )
    : {};
  return { first: { params, page }, pager: { page: filters.page, pageCount }, watching, signedIn: user !== null };
}
