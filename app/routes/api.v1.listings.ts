import type { Route } from "./+types/api.v1.listings";
import { apiRoute } from "~/http/api-route.server";
import { refusal } from "~/http/errors.server";
import { publicJson } from "~/catalogue/public-json.server";
import { searchListings, DEFAULT_LIMIT, MAX_LIMIT, type SearchTimings } from "~/catalogue/search.server";
import { parseMarketFilters } from "@shared/market-filters";

// GET /api/v1/listings: the market's search for anyone (docs/api.md, "Listings"). Every parameter is
// checked; a bad one is a 400 naming it. `limit` sets the page size; the rest are the market's filters.
const route = apiRoute<Route.LoaderArgs>({
  GET: async ({ request }) => {
    const params = new URL(request.url).searchParams;
    const limitText = params.getAll("limit");
    params.delete("limit");
    const { filters, issues } = parseMarketFilters(params, { strict: true });
    const limit = limitText.length ? Number(limitText[0]) : DEFAULT_LIMIT;
    if (limitText.length > 1 || !/^\d{1,3}$/.test(limitText[0] ?? "1") || limit < 1 || limit > MAX_LIMIT) {
      issues.push({ param: "limit", message: `Give limit once, a whole number from 1 to ${MAX_LIMIT}.` });
    }
    if (params.has("page"))
      issues.push({ param: "page", message: "The API pages with cursor (each page's nextCursor), not page numbers." });
    if (issues.length) {
      throw refusal("invalid", `Check ${issues.map((i) => i.param).join(", ")}.`, {
        issues: issues.map((i) => ({ path: i.param, message: i.message })),
      });
    }
    const timings: SearchTimings = { bounds: 0, page: 0, cards: 0 };
    const response = publicJson(await searchListings(filters, { cursor: filters.cursor, limit }, timings));
    // Beside the edge's own app;dur: where the search's time went.
    for (const [name, ms] of Object.entries(timings) as [string, number][])
      response.headers.append("Server-Timing", `${name};dur=${ms.toFixed(1)}`);
    return response;
  },
});
export const loader = route.loader;
export const action = route.action;
