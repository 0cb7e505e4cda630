import { MEASURED_FILTERS, type MarketFilters, type MarketSort, type MeasuredFilter } from "@shared/market-filters";
import { neighboursOf } from "~/listings/zones";

// The market's filters as SQL over `listings l`, with positional binds ($1 …) so the very same text
// runs from the app, from `npm run bench` and in EXPLAIN. Every condition reads a column or an index
// from the search migration; nothing here is interpolated from input except through binds.

export class Binds {
  readonly values: unknown[] = [];
  /** A placeholder for `value`, with an explicit type when PostgreSQL cannot infer it. */
  add(value: unknown, cast = ""): string {
    this.values.push(value);
    return `$${this.values.length}${cast}`;
  }
}

/** The filter dimensions a count leaves out one at a time; everything else is common to every count. */
export type Dimension = "category" | "condition" | "service" | "seller" | "verified" | `measured:${MeasuredFilter["key"]}`;

export interface Conditions {
  /** Always applied (live, text, price, mains, delivery). */
  common: string[];
  /** One condition per active dimension (a measured one without the figures gate; see dimensionSql). */
  dims: Map<Dimension, string>;
  /** What every measured figure needs to count ("" when any measured figure counts). */
  figuresGate: string;
}

/**
 * The price bounds in euro cents at the admin's rates (null where a currency has no rate), worked out once
 * per search by `euroBoundsQuery`. Without them the bounds are the conversion function in the SQL, which
 * the planner estimates as well but which runs once per row wherever the price is a filter and not the
 * index's condition (a query of the rates table each time: most of a counting scan's time).
 */
export interface EuroBounds {
  min: string | null;
  max: string | null;
}

/** The SQL that converts the price filter's bounds to euro cents, as the listings' own column is kept; null without a price filter. */
export function euroBoundsQuery(f: MarketFilters): { sql: string; bind: unknown[] } | null {
  if (f.priceMinMinor === null && f.priceMaxMinor === null) return null;
  return {
    sql: `SELECT loadline_eur_minor($1::bigint, $3::char(3))::text AS min, loadline_eur_minor($2::bigint, $3::char(3))::text AS max`,
    bind: [f.priceMinMinor, f.priceMaxMinor, f.currency],
  };
}

export function conditions(f: MarketFilters, b: Binds, euro?: EuroBounds): Conditions {
  const common = ["l.status = 'live'"];
  const dims = new Map<Dimension, string>();
  if (f.q) common.push(`l.search_doc @@ loadline_search_query(${b.add(f.q, "::text")})`);
  if (f.priceMinMinor !== null || f.priceMaxMinor !== null) {
    const cur = b.add(f.currency, "::char(3)");
    // The euro column narrows through its index; in the buyer's own currency the asked price is exact.
    if (f.priceMinMinor !== null) {
      const min = b.add(f.priceMinMinor, "::bigint");
      const eur = euro ? b.add(euro.min, "::bigint") : `loadline_eur_minor(${min}, ${cur})`;
      common.push(`l.price_eur_minor >= ${eur}`, `(l.currency <> ${cur} OR l.price_minor >= ${min})`);
    }
    if (f.priceMaxMinor !== null) {
      const max = b.add(f.priceMaxMinor, "::bigint");
      const eur = euro ? b.add(euro.max, "::bigint") : `loadline_eur_minor(${max}, ${cur})`;
      common.push(`l.price_eur_minor <= ${eur}`, `(l.currency <> ${cur} OR l.price_minor <= ${max})`);
    }
  }
  if (f.mains !== null) {
    common.push(
      `(l.mains_switchable OR l.mains_voltage_v BETWEEN ${b.add(Math.round(f.mains * 0.95), "::int")} AND ${b.add(Math.round(f.mains * 1.05), "::int")})`,
    );
  }
  if (f.deliverTo) {
    const to = b.add(f.deliverTo, "::char(2)");
    const near = b.add(neighboursOf(f.deliverTo), "::text[]");
    common.push(
      `((l.country = ${to} AND 'domestic' = ANY(l.courier_zones))` +
        ` OR (l.country = ANY(${near}) AND 'nearby' = ANY(l.courier_zones))` +
        ` OR (l.country <> ${to} AND NOT l.country = ANY(${near}) AND 'worldwide' = ANY(l.courier_zones)))`,
    );
  }
  if (f.category) dims.set("category", `l.category = ${b.add(f.category, "::text")}`);
  if (f.condition.length) dims.set("condition", `l.cosmetic_grade = ANY(${b.add(f.condition, "::text[]")})`);
  if (f.service.length) dims.set("service", `l.service_state = ANY(${b.add(f.service, "::text[]")})`);
  if (f.seller) dims.set("seller", f.seller === "workshop" ? "l.workshop_id IS NOT NULL" : "l.workshop_id IS NULL");
  if (f.verified) dims.set("verified", "l.bench_verified");
  for (const filter of MEASURED_FILTERS) {
    const value = f.measured[filter.key];
    if (value === undefined) continue;
    dims.set(`measured:${filter.key}`, `l.${filter.column} ${filter.bound === "min" ? ">=" : "<="} ${b.add(value, "::float8")}`);
  }
  return { common, dims, figuresGate: f.figures === "verified" ? "l.bench_verified" : "" };
}

/** A dimension's condition on its own, as a count flags it (a measured one with its figures gate). */
export function dimensionSql(c: Conditions, d: Dimension): string {
  const sql = c.dims.get(d)!;
  return d.startsWith("measured:") && c.figuresGate ? `${c.figuresGate} AND ${sql}` : sql;
}

/** Whether a row has a figure that counts for the filter at all (for the counts of filters not set). */
export function hasFigure(filter: MeasuredFilter, f: Pick<MarketFilters, "figures">): string {
  return `${counted(f)}l.${filter.column} IS NOT NULL`;
}

// With figures=verified a figure counts only from a bench-verified sheet. The facet columns hold measured
// readings only, so rated figures never count either way.
function counted(f: Pick<MarketFilters, "figures">): string {
  return f.figures === "verified" ? "l.bench_verified AND " : "";
}

// The figures gate goes in once however many measured filters are set: repeated, the planner multiplies
// its selectivity once per copy and expects far fewer rows than come (and picks plans for that).
export function whereOf(c: Conditions, leaveOut?: Dimension): string {
  const dims = [...c.dims].filter(([d]) => d !== leaveOut);
  const gated = c.figuresGate && dims.some(([d]) => d.startsWith("measured:")) && !dims.some(([d]) => d === "verified");
  return [...c.common, ...(gated ? [c.figuresGate] : []), ...dims.map(([, sql]) => sql)].join(" AND ");
}

/** Each sort: its key expressions (in order, the last is always the id) and direction. */
interface SortSpec {
  keys: { expr: string; cast: string }[];
  desc: boolean;
}

const PUBLISHED = { expr: "l.published_at", cast: "::timestamptz" } as const;
const ID = { expr: "l.id", cast: "::uuid" } as const;
const PRICE = { expr: "l.price_eur_minor", cast: "::bigint" } as const;

export function sortSpec(f: MarketFilters, b: Binds | null): SortSpec {
  const perWatt = f.figures === "verified" ? "CASE WHEN l.bench_verified THEN l.power_8ohm_w END" : "l.power_8ohm_w";
  const specs: Record<MarketSort, () => SortSpec> = {
    newest: () => ({ keys: [PUBLISHED, ID], desc: true }),
    price_asc: () => ({ keys: [PRICE, ID], desc: false }),
    price_desc: () => ({ keys: [PRICE, ID], desc: true }),
    // Units without the figure carry infinity and come last (the expression is indexed as it stands).
    price_per_watt: () => ({ keys: [{ expr: `loadline_per_watt(l.price_eur_minor, ${perWatt})`, cast: "::float8" }, ID], desc: false }),
    relevance: () => {
      const rank = `ts_rank(l.search_doc, loadline_search_query(${b ? b.add(f.q ?? "", "::text") : "''"}))`;
      return { keys: [{ expr: rank, cast: "::real" }, PUBLISHED, ID], desc: true };
    },
  };
  return specs[f.sort === "relevance" && !f.q ? "newest" : f.sort]();
}

/** ORDER BY for a sort. */
export function orderBy(spec: SortSpec): string {
  return spec.keys.map((k) => `${k.expr} ${spec.desc ? "DESC" : "ASC"}`).join(", ");
}

/** The row comparison that starts after the cursor's position. */
export function after(spec: SortSpec, values: string[], b: Binds): string {
  const left = spec.keys.map((k) => k.expr).join(", ");
  const right = spec.keys.map((k, i) => b.add(values[i], k.cast)).join(", ");
  return `(${left}) ${spec.desc ? "<" : ">"} (${right})`;
}

/**
 * The keys selected as exact text, so a cursor repeats them without any rounding: from their expressions,
 * or from the columns `o0, o1 …` of a subquery aliased `from` that computed them already.
 */
export function keySelect(spec: SortSpec, from?: string): string {
  return spec.keys.map((k, i) => `(${from ? `${from}.o${i}` : k.expr})::text AS k${i}`).join(", ");
}
