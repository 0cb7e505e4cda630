// The alerts' view of the market's filters. Interim until the search foundation lands: the query
// string is kept in a stable order without paging, and nothing matches yet.

const NOT_SAVED = new Set(["page", "cursor", "sort"]);

export function canonicalAlertQuery(params: URLSearchParams): { query: string; issues: { param: string; message: string }[] } {
  const kept = [...params].filter(([k, v]) => !NOT_SAVED.has(k) && v !== "");
  kept.sort(([a], [b]) => (a < b ? -1 : a > b ? 1 : 0));
  return { query: new URLSearchParams(kept).toString(), issues: [] };
}

export function describeAlertQuery(query: string): string[] {
  const params = [...new URLSearchParams(query)];
  return params.length ? params.map(([k, v]) => `${k}: ${v}`) : ["Every unit on the market"];
}

export async function listingsMatchingQuery(_query: string, _listingIds: string[]): Promise<string[]> {
  return [];
}
