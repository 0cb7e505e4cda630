import { listingsMatching } from "~/catalogue/search.server";
import { readAlertQuery } from "./filters";

// Which of some listings a stored alert query matches: the market's own search, so an alert finds
// exactly what the market shows for the same filters.

export function listingsMatchingQuery(query: string, listingIds: string[]): Promise<string[]> {
  return listingsMatching(readAlertQuery(query), listingIds);
}
