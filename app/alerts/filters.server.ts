import { readAlertQuery } from "./filters";
import { listingsMatching } from "./match-sql.server";

// Which of some listings a stored alert query matches, read with the market's own filter parser.

export function listingsMatchingQuery(query: string, listingIds: string[]): Promise<string[]> {
  return listingsMatching(readAlertQuery(query), listingIds);
}
