// Search at scale: five representative filter combinations through `GET /api/v1/listings` on the
// served app, the server's own time (its Server-Timing header) and the wall time, against the very
// same SQL (`searchQuery`) run directly; and each query's plan, to show which indexes carry it.
import os from "node:os";
import pg from "pg";
import { countsQuery, DEFAULT_LIMIT, searchQuery } from "~/catalogue/search.server";
import { euroBoundsQuery, type EuroBounds } from "~/catalogue/search-sql.server";
import { parseMarketFilters } from "@shared/market-filters";
import { ms, pct, type Figure, type ServedApp } from "./served-app";

export const SEARCH_CASES: { name: string; params: Record<string, string> }[] = [
  { name: "words and a category", params: { q: "recapped", category: "integrated-amplifiers" } },
  {
    name: "amplifier power and THD, a price range, cheapest first",
    params: {
      category: "integrated-amplifiers",
      power8Min: "80 W",
      thdMax: "0.05 %",
      priceMin: "300",
      priceMax: "1500",
      sort: "price_asc",
    },
  },
  { name: "phono stage RIAA deviation and gain", params: { category: "phono-stages", riaaMax: "0.5 dB", gainMin: "40 dB" } },
  { name: "loudspeaker sensitivity, a courier to Germany", params: { category: "loudspeakers", sensitivityMin: "88 dB", deliverTo: "DE" } },
  {
    name: "turntable wow & flutter, bench-verified, newest first",
    params: { category: "turntables", wowFlutterMax: "0.1 %", verified: "1", sort: "newest" },
  },
];

/** The p95 budget of the server's time for one API call, and of its ratio to the bare SQL. */
const BUDGET_MS = 50;
const BUDGET_RATIO = 1.5;
const RUNS = 60;
/** Counting reads every live row: fewer runs of what counts. */
const SLOW_RUNS = 30;
const WARM_UP = 5;

/** The SQL the API runs for a query string: the page (searchQuery, at the API's page size) and the counts. */
async function sqlOf(db: pg.Client, params: URLSearchParams) {
  const { filters, issues } = parseMarketFilters(params, { strict: true });
  if (issues.length) throw new Error(`the bench's own filters do not parse: ${JSON.stringify(issues)}`);
  // The price bounds in euros, converted first as the API does (that round trip is not timed here).
  const bounds = euroBoundsQuery(filters);
  const euro = bounds ? (await db.query<EuroBounds>(bounds.sql, bounds.bind)).rows[0] : undefined;
  return { page: searchQuery(filters, { cursor: null, limit: DEFAULT_LIMIT, euro }), counts: countsQuery(filters, euro) };
}

async function explain(db: pg.Client, q: { sql: string; bind: unknown[] }): Promise<string> {
  const rows = (await db.query<{ "QUERY PLAN": string }>(`EXPLAIN (ANALYZE, BUFFERS) ${q.sql}`, q.bind)).rows;
  return rows.map((r) => r["QUERY PLAN"]).join("\n");
}

/** Index names a plan reads, in plan order. */
export function indexesInPlan(plan: string): string[] {
  const names = [...plan.matchAll(/(?:Index(?: Only)? Scan(?: Backward)? using|Bitmap Index Scan on) (\S+)/g)].map((m) => m[1]);
  return [...new Set(names)];
}

/** The search's own phases, from the API's Server-Timing (app/routes/api.v1.listings.ts). */
const PHASES = ["bounds", "page", "cards"] as const;
type ApiTimes = { server: number[]; wall: number[]; total: number; phases: Record<(typeof PHASES)[number], number[]> };

/** One API call: its server time, phases and wall time; throws on anything but a 200 with Server-Timing. */
async function callApi(url: string) {
  const t = performance.now();
  const res = await fetch(url);
  const body = (await res.json()) as { total?: number; error?: string; message?: string };
  const wall = performance.now() - t;
  if (res.status !== 200) throw new Error(`${url}: ${res.status} ${body.error ?? ""} ${body.message ?? ""}`);
  const timing = res.headers.get("Server-Timing") ?? "";
  const dur = /app;dur=([\d.]+)/.exec(timing)?.[1];
  if (dur === undefined) throw new Error(`${url}: no Server-Timing header`);
  const phase = (name: string) => Number(new RegExp(`${name};dur=([\\d.]+)`).exec(timing)?.[1] ?? NaN);
  return { server: Number(dur), wall, total: body.total ?? 0, phases: Object.fromEntries(PHASES.map((p) => [p, phase(p)])) };
}

const noApiTimes = (): ApiTimes => ({ server: [], wall: [], total: 0, phases: { bounds: [], page: [], cards: [] } });
function record(out: ApiTimes, call: Awaited<ReturnType<typeof callApi>>) {
  out.server.push(call.server);
  out.wall.push(call.wall);
  out.total = call.total;
  for (const phase of PHASES) out.phases[phase].push(call.phases[phase]);
}

/** Calls `url` `runs` times after a warm-up; `before` runs ahead of each call (and is not timed). */
async function timedApi(url: string, runs: number, before: () => Promise<unknown>): Promise<ApiTimes> {
  const out = noApiTimes();
  for (let i = 0; i < WARM_UP + runs; i++) {
    await before();
    const call = await callApi(url);
    if (i >= WARM_UP) record(out, call);
  }
  return out;
}

// The API and its bare SQL take turns, call by call: a ratio of two batches timed minutes apart
// measures the machine's load as much as the API, on a shared machine.
async function timedApiAndSql(url: string, db: pg.Client, q: { sql: string; bind: unknown[] }, runs: number) {
  const api = noApiTimes();
  const sql: number[] = [];
  for (let i = 0; i < WARM_UP + runs; i++) {
    const call = await callApi(url);
    const t = performance.now();
    await db.query(q.sql, q.bind);
    const took = performance.now() - t;
    if (i < WARM_UP) continue;
    record(api, call);
    sql.push(took);
  }
  return { api, sql };
}

async function timedSql(db: pg.Client, q: { sql: string; bind: unknown[] }, runs: number): Promise<number[]> {
  const times: number[] = [];
  for (let i = 0; i < WARM_UP + runs; i++) {
    const t = performance.now();
    await db.query(q.sql, q.bind);
    if (i >= WARM_UP) times.push(performance.now() - t);
  }
  return times;
}

const apiFigure = (what: string, api: ApiTimes): Figure => ({
  label: `${what}, ${api.server.length} calls: server p50 ${ms(pct(api.server, 50))} ms (of which ${PHASES.map((p) => `${p} ${ms(pct(api.phases[p], 50))}`).join(", ")}), wall p50 ${ms(pct(api.wall, 50))} / p95 ${ms(pct(api.wall, 95))} ms; server p95`,
  value: ms(pct(api.server, 95)),
  unit: "ms",
  limit: BUDGET_MS,
});

export async function searchFigures(app: ServedApp): Promise<{ figures: Figure[]; notes: string[] }> {
  const figures: Figure[] = [];
  // Load inflates wall time on a shared machine more than plans and buffers: say what it was.
  const load = () =>
    os
      .loadavg()
      .map((x) => x.toFixed(1))
      .join(" / ");
  const notes = [`search: load average (1 / 5 / 15 min) at the start ${load()}`];
  const db = new pg.Client({ connectionString: app.databaseUrl });
  await db.connect();
  try {
    // One thing at a time: API calls and SQL runs never overlap.
    for (const c of SEARCH_CASES) {
      const params = new URLSearchParams(c.params);
      const url = `${app.base}/api/v1/listings?${params}`;
      // The counts are kept per filter set: first as a buyer meets them when the market has moved since
      // the last search like theirs (the epoch moved before each call: the kept counts are served and
      // recounted in the background at most every 15 s), then with the market still.
      const fresh = await timedApi(url, SLOW_RUNS, () => db.query(`SELECT nextval('market_epoch')`));
      const q = await sqlOf(db, params);
      const { api: kept, sql: page } = await timedApiAndSql(url, db, q.page, RUNS);
      const counts = await timedSql(db, q.counts, SLOW_RUNS);
      const pagePlan = await explain(db, q.page);
      const countsPlan = await explain(db, q.counts);
      console.log(`\n--- search: ${c.name} (?${params})\n${q.page.sql}\n-- bind ${JSON.stringify(q.page.bind)}\n${pagePlan}`);
      console.log(`-- its counts (${q.counts.sql.length} characters of SQL):\n${countsPlan}`);

      const what = `search "${c.name}" (${kept.total.toLocaleString("en")} units): GET /api/v1/listings`;
      figures.push(apiFigure(`${what}, the market moved (kept counts served, recounted behind)`, fresh));
      figures.push(apiFigure(`${what}, counts kept`, kept));
      const [p50, c50] = [pct(page, 50), pct(counts, 50)];
      const indexes = indexesInPlan(pagePlan).join(", ") || "none, sequential scan";
      figures.push({
        label: `${what}: its page query run directly p50 ${ms(p50)} / p95 ${ms(pct(page, 95))} ms (indexes: ${indexes}); API with counts kept ÷ that, p50`,
        value: Math.round((pct(kept.server, 50) / p50) * 100) / 100,
        unit: "×",
        limit: BUDGET_RATIO,
      });
      figures.push({
        label: `${what}: its counts query run directly p50 ${ms(c50)} / p95 ${ms(pct(counts, 95))} ms (${indexesInPlan(countsPlan).join(", ") || "sequential scan"}); API with counts made afresh ÷ (page + counts), p50`,
        value: Math.round((pct(fresh.server, 50) / (p50 + c50)) * 100) / 100,
        unit: "×",
        limit: BUDGET_RATIO,
      });
    }
  } finally {
    await db.end();
  }
  notes.push(`search: load average at the end ${load()} (2 cores)`);
  return { figures, notes };
}
