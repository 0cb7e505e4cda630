import { QueryTypes } from "sequelize";
import { sequelize } from "~/db.server";
import { areNeighbours } from "~/listings/zones";
import { COUNTRY_CODES } from "@shared/countries";
import { MEASURED_FILTERS, type MarketFilters } from "@shared/market-filters";

// Stand-in until the market's search (app/catalogue/search.server.ts, listingsMatching) is on main:
// the market's filters as one WHERE over the search migration's columns and functions, every value
// bound. Swap for listingsMatching when it lands, so an alert finds exactly what the market shows.

export async function listingsMatching(f: MarketFilters, listingIds: readonly string[]): Promise<string[]> {
  if (listingIds.length === 0) return [];
  const bind: unknown[] = [];
  const $ = (value: unknown, cast: string) => {
    bind.push(value);
    return `$${bind.length}${cast}`;
  };
  const where = [`l.id = ANY(${$(listingIds, "::uuid[]")})`, "l.status = 'live'"];
  if (f.q) where.push(`l.search_doc @@ loadline_search_query(${$(f.q, "::text")})`);
  for (const [bound, op] of [
    [f.priceMinMinor, ">="],
    [f.priceMaxMinor, "<="],
  ] as const) {
    if (bound === null) continue;
    const cur = $(f.currency, "::char(3)");
    const value = $(bound, "::bigint");
    where.push(`l.price_eur_minor ${op} loadline_eur_minor(${value}, ${cur})`, `(l.currency <> ${cur} OR l.price_minor ${op} ${value})`);
  }
  if (f.mains !== null)
    where.push(
      `(l.mains_switchable OR l.mains_voltage_v BETWEEN ${$(Math.round(f.mains * 0.95), "::int")} AND ${$(Math.round(f.mains * 1.05), "::int")})`,
    );
  if (f.deliverTo) {
    const to = $(f.deliverTo, "::char(2)");
    const near = $(
      COUNTRY_CODES.filter((c) => areNeighbours(f.deliverTo!, c)),
      "::text[]",
    );
    where.push(
      `((l.country = ${to} AND 'domestic' = ANY(l.courier_zones)) OR (l.country = ANY(${near}) AND 'nearby' = ANY(l.courier_zones))` +
        ` OR (l.country <> ${to} AND NOT l.country = ANY(${near}) AND 'worldwide' = ANY(l.courier_zones)))`,
    );
  }
  if (f.category) where.push(`l.category = ${$(f.category, "::text")}`);
  if (f.condition.length) where.push(`l.cosmetic_grade = ANY(${$(f.condition, "::text[]")})`);
  if (f.service.length) where.push(`l.service_state = ANY(${$(f.service, "::text[]")})`);
  if (f.seller) where.push(f.seller === "workshop" ? "l.workshop_id IS NOT NULL" : "l.workshop_id IS NULL");
  if (f.verified) where.push("l.bench_verified");
  for (const filter of MEASURED_FILTERS) {
    const value = f.measured[filter.key];
    if (value === undefined) continue;
    // With figures=verified a figure counts only from a bench-verified sheet.
    const counted = f.figures === "verified" ? "l.bench_verified AND " : "";
    where.push(`${counted}l.${filter.column} ${filter.bound === "min" ? ">=" : "<="} ${$(value, "::float8")}`);
  }
  const rows = await sequelize.query<{ id: string }>(`SELECT l.id FROM listings l WHERE ${where.join(" AND ")}`, {
    bind,
    type: QueryTypes.SELECT,
  });
  const hit = new Set(rows.map((r) => r.id));
  return listingIds.filter((id) => hit.has(id));
}
