import { QueryTypes } from "sequelize";
import { sequelize } from "~/db.server";
import { refusal } from "~/http/errors.server";
import { euroBounds } from "./euro-bounds.server";
import { UUID_PATTERN } from "@shared/ids";
import { CATEGORIES, COSMETIC_GRADES, SERVICE_STATES } from "@shared/catalogue";
import {
  MEASURED_FILTERS,
  SELLER_KINDS,
  defaultSort,
  marketFiltersToParams,
  withoutPaging,
  type FilterCounts,
  type ListingsPage,
  type MarketFilters,
} from "@shared/market-filters";
import {
  Binds,
  after,
  conditions,
  dimensionSql,
  hasFigure,
  keySelect,
  orderBy,
  sortSpec,
  whereOf,
  type Dimension,
  type EuroBounds,
} from "./search-sql.server";
import { CARD_COLUMNS, CARD_JOINS, summariesFromRows, type CardRow } from "./card-rows.server";

// The market's search: live listings matching the filters, in the chosen order, a page at a time.
// The API pages by cursor (the sort keys of the last row, exact, so pages never skip or repeat a unit
// however many listings share a price or a time); the HTML page by number. Counts say how many units
// each choice in the panel would leave.

export const DEFAULT_LIMIT = 24;
export const MAX_LIMIT = 100;

export interface SearchOptions {
  /** From the previous page's `nextCursor`. */
  cursor?: string | null;
  limit?: number;
  /** The HTML page's number (from 1); ignored with a cursor. */
  page?: number;
  /** The price bounds in euros, from `euroBounds` (else the SQL converts them). */
  euro?: EuroBounds;
}

/** Where a search's time went, in ms: the API sends it as Server-Timing and `npm run bench` reads it. */
export interface SearchTimings {
  /** Converting the price bounds (0 when kept or without a price filter). */
  bounds: number;
  /** The page's query (with the kept counts, fetched beside it). */
  page: number;
  /** Building the cards from the rows. */
  cards: number;
}

/**
 * The SQL of one page: the matching listings' ids with their sort keys, and in the same statement what a
 * card shows (seller, workshop, sheet version, cover photo), as `npm run bench` runs it too. One round
 * trip and plain rows: the cards are built from them without model instances.
 */
export function searchQuery(filters: MarketFilters, opts: SearchOptions = {}): { sql: string; bind: unknown[] } {
  const b = new Binds();
  const spec = sortSpec(filters, b);
  const where = [whereOf(conditions(filters, b, opts.euro))];
  const cursor = opts.cursor ?? null;
  if (cursor)
    where.push(
      after(
        spec,
        decodeCursor(
          cursor,
          filters.sort,
          spec.keys.map((k) => k.cast),
        ),
        b,
      ),
    );
  const limit = clampLimit(opts.limit);
  const offset = !cursor && opts.page && opts.page > 1 ? ` OFFSET ${b.add((opts.page - 1) * limit, "::int")}` : "";
  // One row more than the page shows: it says whether there is a next page. Each key is computed once
  // per candidate row (a rank is the costly one), then outside the page as exact text for the cursor and
  // as it is for putting the joined rows back in order.
  const ordered = spec.keys.map((k, i) => `${k.expr} AS o${i}`).join(", ");
  const page = `SELECT l.id, ${ordered} FROM listings l WHERE ${where.join(" AND ")} ORDER BY ${orderBy(spec)} LIMIT ${b.add(limit + 1, "::int")}${offset}`;
  const reorder = spec.keys.map((_, i) => `p.o${i} ${spec.desc ? "DESC" : "ASC"}`).join(", ");
  const sql = `SELECT p.id, ${keySelect(spec, "p")}, ${CARD_COLUMNS} FROM (${page}) p ${CARD_JOINS} ORDER BY ${reorder}`;
  return { sql, bind: b.values };
}

/** One page of live listings for the filters, with the total and the counts (kept between pages; see cachedCounts). */
export async function searchListings(filters: MarketFilters, opts: SearchOptions = {}, timings?: SearchTimings): Promise<ListingsPage> {
  let t = performance.now();
  const lap = (phase: keyof SearchTimings) => {
    const now = performance.now();
    if (timings) timings[phase] = now - t;
    t = now;
  };
  const euro = await euroBounds(filters);
  lap("bounds");
  const { sql, bind } = searchQuery(filters, { ...opts, euro });
  const limit = clampLimit(opts.limit);
  const [rows, counted] = await Promise.all([
    sequelize.query<CardRow & Record<string, string>>(sql, { bind, type: QueryTypes.SELECT }),
    cachedCounts(filters),
  ]);
  lap("page");
  const page = rows.slice(0, limit);
  const last = page.at(-1);
  const nextCursor = rows.length > limit && last ? encodeCursor(filters.sort, keysOf(last)) : null;
  const items = await summariesFromRows(page);
  lap("cards");
  return { items, total: counted.total, nextCursor, counts: counted.counts };
}

/** Of `listingIds`, those live and matching the filters (a spec alert's check of newly published units). */
export async function listingsMatching(filters: MarketFilters, listingIds: readonly string[]): Promise<string[]> {
  if (listingIds.length === 0) return [];
  const b = new Binds();
  const where = whereOf(conditions(filters, b));
  const rows = await sequelize.query<{ id: string }>(
    `SELECT l.id FROM listings l WHERE l.id = ANY(${b.add(listingIds, "::uuid[]")}) AND ${where}`,
    {
      bind: b.values,
      type: QueryTypes.SELECT,
    },
  );
  const hit = new Set(rows.map((r) => r.id));
  return listingIds.filter((id) => hit.has(id));
}

/** How many units each choice would leave, the other filters as set. */
export async function filterCounts(filters: MarketFilters): Promise<FilterCounts> {
  return (await cachedCounts(filters)).counts;
}

// Counting reads every live row the common filters leave (a parallel scan, tens of milliseconds at scale),
// so counts are kept per filter set. When a live listing changes (the market_epoch sequence moves; see its
// migration) or a minute has passed, the kept counts are stale: they are still served, and recounted in the
// background at most once per RECOUNT_EVERY_MS for that filter set. Only a filter set never counted waits.
const COUNTS_TTL_MS = 60_000;
const RECOUNT_EVERY_MS = 15_000;
const COUNTS_KEPT = 500;
type Counted = { total: number; counts: FilterCounts };
interface KeptCounts {
  filters: MarketFilters;
  /** The epoch and time the value was counted at. */
  epoch: string;
  at: number;
  value: Promise<Counted>;
  /** When the last recount started, and the recount in flight. */
  recountedAt: number;
  recount: Promise<void> | null;
}
const countsKept = new Map<string, KeptCounts>();

// The epoch is read at most once a second per process: a count a second late is no harm, and a query
// per call is (5 ms and a pool connection under load).
const EPOCH_READ_EVERY_MS = 1_000;
let epochRead: { at: number; value: Promise<string> } | null = null;

function marketEpoch(): Promise<string> {
  if (epochRead && Date.now() - epochRead.at < EPOCH_READ_EVERY_MS) return epochRead.value;
  const value = sequelize
    .query<{ epoch: string }>(`SELECT last_value || ':' || is_called AS epoch FROM market_epoch`, { type: QueryTypes.SELECT })
    .then(([row]) => row?.epoch ?? "");
  const read = { at: Date.now(), value };
  epochRead = read;
  value.catch(() => {
    if (epochRead === read) epochRead = null;
  });
  return value;
}

const isFresh = (kept: KeptCounts, epoch: string) => kept.epoch === epoch && Date.now() - kept.at < COUNTS_TTL_MS;

async function cachedCounts(filters: MarketFilters): Promise<Counted> {
  const key = marketFiltersToParams({ ...withoutPaging(filters), sort: defaultSort(filters.q) }).toString();
  const epoch = await marketEpoch();
  const kept = countsKept.get(key);
  if (!kept) {
    const value = countsAndTotal(filters);
    if (countsKept.size >= COUNTS_KEPT) countsKept.delete(countsKept.keys().next().value!);
    const now = Date.now();
    countsKept.set(key, { filters, epoch, at: now, value, recountedAt: now, recount: null });
    value.catch(() => countsKept.delete(key));
    return value;
  }
  if (!isFresh(kept, epoch) && !kept.recount && Date.now() - kept.recountedAt >= RECOUNT_EVERY_MS) void recount(kept, epoch);
  return kept.value;
}

/** Counts `kept` again for `epoch`; the old counts stay in use until the new ones are in (or if counting fails). */
function recount(kept: KeptCounts, epoch: string): Promise<void> {
  kept.recountedAt = Date.now();
  const at = kept.recountedAt;
  kept.recount = countsAndTotal(kept.filters)
    .then((counted) => {
      Object.assign(kept, { epoch, at, value: Promise.resolve(counted) });
    })
    .catch(() => undefined)
    .finally(() => {
      kept.recount = null;
    });
  return kept.recount;
}

/** For tests: waits for the background recounts in flight (none starts here). */
export async function settleCounts(): Promise<void> {
  await Promise.all([...countsKept.values()].flatMap((kept) => (kept.recount ? [kept.recount] : [])));
}

// One pass over the rows the common filters leave: each active dimension becomes a boolean column, and
// each count is the rows where every other dimension holds.
/** The SQL behind `filterCounts` (one row: "total" and one column per count), for `npm run bench` too. */
export function countsQuery(filters: MarketFilters, euro?: EuroBounds): { sql: string; bind: unknown[] } {
  const b = new Binds();
  const c = conditions(filters, b, euro);
  const dims = [...c.dims.keys()];
  const flag = (d: Dimension) => `d${dims.indexOf(d)}`;
  const others = (leaveOut?: Dimension) => dims.filter((d) => d !== leaveOut).map(flag);
  const holds = (...parts: string[]) => (parts.length ? parts.join(" AND ") : "true");
  const inner = [
    "l.category",
    "l.cosmetic_grade",
    "l.service_state",
    "l.workshop_id IS NOT NULL AS by_workshop",
    "l.bench_verified",
    ...dims.map((d) => `(${dimensionSql(c, d)}) AS ${flag(d)}`),
    ...MEASURED_FILTERS.map((m, i) => `(${hasFigure(m, filters)}) AS h${i}`),
  ];
  const lit = (s: string) => `'${s}'`; // catalogue codes only, never input
  const counts: [string, string][] = [
    ["total", holds(...others())],
    ...CATEGORIES.map((v): [string, string] => [`category.${v}`, holds(...others("category"), `category = ${lit(v)}`)]),
    ...COSMETIC_GRADES.map((v): [string, string] => [`condition.${v}`, holds(...others("condition"), `cosmetic_grade = ${lit(v)}`)]),
    ...SERVICE_STATES.map((v): [string, string] => [`service.${v}`, holds(...others("service"), `service_state = ${lit(v)}`)]),
    ...SELLER_KINDS.map((v): [string, string] => [
      `seller.${v}`,
      holds(...others("seller"), v === "workshop" ? "by_workshop" : "NOT by_workshop"),
    ]),
    ["verified", holds(...others("verified"), "bench_verified")],
    ...MEASURED_FILTERS.map((m, i): [string, string] => [
      `measured.${m.key}`,
      c.dims.has(`measured:${m.key}`) ? holds(...others()) : holds(...others(), `h${i}`),
    ]),
  ];
  const sql =
    `SELECT ${counts.map(([name, cond]) => `count(*) FILTER (WHERE ${cond}) AS "${name}"`).join(", ")}` +
    ` FROM (SELECT ${inner.join(", ")} FROM listings l WHERE ${c.common.join(" AND ")}) x`;
  return { sql, bind: b.values };
}

async function countsAndTotal(filters: MarketFilters): Promise<Counted> {
  const { sql, bind } = countsQuery(filters, await euroBounds(filters));
  const [row] = await sequelize.query<Record<string, string>>(sql, { bind, type: QueryTypes.SELECT });
  const n = (name: string) => Number(row?.[name] ?? 0);
  const pick = <T extends string>(prefix: string, list: readonly T[]) =>
    Object.fromEntries(list.map((v) => [v, n(`${prefix}.${v}`)])) as Record<T, number>;
  return {
    total: n("total"),
    counts: {
      category: pick("category", CATEGORIES),
      condition: pick("condition", COSMETIC_GRADES),
      service: pick("service", SERVICE_STATES),
      seller: pick("seller", SELLER_KINDS),
      verified: n("verified"),
      measured: pick(
        "measured",
        MEASURED_FILTERS.map((m) => m.key),
      ),
    },
  };
}

function clampLimit(limit: number | undefined): number {
  return Math.min(MAX_LIMIT, Math.max(1, Math.floor(limit ?? DEFAULT_LIMIT)));
}

function keysOf(row: Record<string, string>): string[] {
  const keys: string[] = [];
  for (let i = 0; `k${i}` in row; i++) keys.push(row[`k${i}`]);
  return keys;
}

// A cursor is the sort's name and the last row's keys, as text, in base64url: opaque to callers, exact for us.
function encodeCursor(sort: string, keys: string[]): string {
  return Buffer.from(JSON.stringify([sort, ...keys])).toString("base64url");
}

function decodeCursor(cursor: string, sort: string, casts: string[]): string[] {
  let parsed: unknown;
  try {
    parsed = JSON.parse(Buffer.from(cursor, "base64url").toString("utf8"));
  } catch {
    parsed = null;
  }
  const keys = Array.isArray(parsed) && parsed[0] === sort ? parsed.slice(1) : [];
  const ok = keys.length === casts.length && keys.every((k, i) => typeof k === "string" && KEY_SHAPES[casts[i]]?.(k) === true);
  if (!ok) {
    throw refusal("invalid", "This cursor does not belong to this search; start again from the first page.", {
      issues: [{ path: "cursor", message: "Use the nextCursor of a page of this same search and sort." }],
    });
  }
  return keys as string[];
}

// What each kind of sort key looks like as PostgreSQL writes it, and within what it can read back:
// nothing else is ever bound from a cursor, so a made-up one is a 400 and never a database error.
const number = (max: number) => (k: string) =>
  /^-?Infinity$/.test(k) || (/^-?\d+(\.\d+)?(e[+-]?\d{1,3})?$/.test(k) && Math.abs(Number(k)) < max);
const KEY_SHAPES: Record<string, (k: string) => boolean> = {
  "::timestamptz": (k) => {
    const m = /^(\d{4}-\d\d-\d\d) (\d\d:\d\d:\d\d)(\.\d{1,6})?\+00$/.exec(k);
    const at = m ? new Date(`${m[1]}T${m[2]}Z`) : null;
    return !!at && !Number.isNaN(at.getTime()) && at.toISOString().startsWith(`${m![1]}T${m![2]}`);
  },
  "::bigint": (k) => /^-?\d{1,18}$/.test(k),
  "::float8": number(1e308),
  "::real": number(3e38),
  "::uuid": (k) => UUID_PATTERN.test(k),
};
