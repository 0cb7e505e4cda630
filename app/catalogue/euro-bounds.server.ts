import { QueryTypes } from "sequelize";
import { sequelize } from "~/db.server";
import { currentRates } from "~/currencies/rates.server";
import type { Rates } from "@shared/currency";
import type { MarketFilters } from "@shared/market-filters";
import { euroBoundsQuery, type EuroBounds } from "./search-sql.server";

// Bounds converted by the database are kept with the rate table they were converted at (the rates a
// page's approximate prices use, re-read every RATES_CACHE_MS and at once after an admin's change in
// this process): a search that pages, refines or recounts with the same price filter then costs no
// extra round trip before its own query.
const BOUNDS_KEPT = 1_000;
const boundsKept = new WeakMap<Rates, Map<string, Promise<EuroBounds | undefined>>>();

/** The price filter's bounds in euro cents, converted once by the database; undefined without a price filter. */
export async function euroBounds(filters: MarketFilters): Promise<EuroBounds | undefined> {
  const q = euroBoundsQuery(filters);
  if (!q) return undefined;
  const rates = await currentRates();
  let kept = boundsKept.get(rates);
  if (!kept) boundsKept.set(rates, (kept = new Map<string, Promise<EuroBounds | undefined>>()));
  const key = q.bind.join("|");
  const hit = kept.get(key);
  if (hit) return hit;
  if (kept.size >= BOUNDS_KEPT) kept.clear();
  const converted = sequelize.query<EuroBounds>(q.sql, { bind: q.bind, type: QueryTypes.SELECT }).then(([row]) => row);
  kept.set(key, converted);
  converted.catch(() => kept.delete(key));
  return converted;
}
