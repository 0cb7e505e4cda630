// Public market data as JSON. The same for every caller (the listing path also answers its owner with
// the editor's view, hence Vary: Cookie there), so shared caches may keep it briefly: listings change
// by the minute, not by the second.
export const PUBLIC_CACHE = "public, max-age=30, stale-while-revalidate=60";

export function publicJson(body: unknown, { varyCookie = false }: { varyCookie?: boolean } = {}): Response {
  const headers = new Headers({ "Cache-Control": PUBLIC_CACHE });
  if (varyCookie) headers.set("Vary", "Cookie");
  return Response.json(body, { headers });
}
