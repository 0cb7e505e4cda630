// Search at scale: five representative filter combinations through `GET /api/v1/listings` on the
// served app, the server's own time (its Server-Timing header) and the wall time, against the very
// same SQL (`searchQuery`) run directly; and each query's plan, to show which indexes carry it.
import pg from "pg";
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
const WARM_UP = 5;

type SqlOf = (params: URLSearchParams) => Promise<{ sql: string; bind: unknown[] }>;
interface SearchModules {
  parseMarketFilters(params: URLSearchParams, opts: { strict: boolean }): { filters: unknown; issues: unknown[] };
  searchQuery(
    filters: unknown,
    opts: { cursor: null; limit: number },
  ): Promise<{ sql: string; bind: unknown[] }> | { sql: string; bind: unknown[] };
}

/** The SQL the API runs for a query string, from the search module's own `searchQuery`; null until it exists. */
async function sqlOfParams(): Promise<SqlOf | null> {
  // Named through variables until the search module lands on this branch.
  const paths = ["../../shared/market-filters", "../../app/catalogue/search.server"];
  let mods: SearchModules;
  try {
    const [filters, search] = await Promise.all(paths.map((p) => import(p) as Promise<Partial<SearchModules>>));
    if (!filters.parseMarketFilters || !search.searchQuery) return null;
    mods = { parseMarketFilters: filters.parseMarketFilters, searchQuery: search.searchQuery };
  } catch {
    return null;
  }
  return async (params) => {
    const { filters, issues } = mods.parseMarketFilters(params, { strict: true });
    if (issues.length) throw new Error(`the bench's own filters do not parse: ${JSON.stringify(issues)}`);
    return await mods.searchQuery(filters, { cursor: null, limit: 24 });
  };
}

/** Index names a plan reads, in plan order. */
export function indexesInPlan(plan: string): string[] {
  const names = [...plan.matchAll(/(?:Index(?: Only)? Scan(?: Backward)? using|Bitmap Index Scan on) (\S+)/g)].map((m) => m[1]);
  return [...new Set(names)];
}

async function timedApi(url: string): Promise<{ server: number[]; wall: number[]; total: number }> {
  const server: number[] = [];
  const wall: number[] = [];
  let total = 0;
  for (let i = 0; i < WARM_UP + RUNS; i++) {
    const t = performance.now();
    const res = await fetch(url);
    const body = (await res.json()) as { total?: number; error?: string; message?: string };
    const took = performance.now() - t;
    if (res.status !== 200) throw new Error(`${url}: ${res.status} ${body.error ?? ""} ${body.message ?? ""}`);
    const dur = /app;dur=([\d.]+)/.exec(res.headers.get("Server-Timing") ?? "")?.[1];
    if (dur === undefined) throw new Error(`${url}: no Server-Timing header`);
    if (i < WARM_UP) continue;
    server.push(Number(dur));
    wall.push(took);
    total = body.total ?? 0;
  }
  return { server, wall, total };
}

async function timedSql(db: pg.Client, sql: string, bind: unknown[]): Promise<number[]> {
  const times: number[] = [];
  for (let i = 0; i < WARM_UP + RUNS; i++) {
    const t = performance.now();
    await db.query(sql, bind);
    if (i >= WARM_UP) times.push(performance.now() - t);
  }
  return times;
}

export async function searchFigures(app: ServedApp): Promise<{ figures: Figure[]; notes: string[] }> {
  const figures: Figure[] = [];
  const notes: string[] = [];
  const probe = await fetch(`${app.base}/api/v1/listings`);
  if (probe.status === 404) return { figures, notes: ["search figures skipped: GET /api/v1/listings is not on this branch yet"] };
  const sqlOf = await sqlOfParams();
  if (!sqlOf) notes.push("search SQL figures skipped: searchQuery (app/catalogue/search.server.ts) is not on this branch yet");
  const db = new pg.Client({ connectionString: app.databaseUrl });
  await db.connect();
  try {
    // The one server at a time: API calls and SQL runs alternate by case, never overlap.
    for (const c of SEARCH_CASES) {
      const params = new URLSearchParams(c.params);
      const api = await timedApi(`${app.base}/api/v1/listings?${params}`);
      const what = `search "${c.name}" (${api.total.toLocaleString("en")} units)`;
      const [s50, s95, w50, w95] = [pct(api.server, 50), pct(api.server, 95), pct(api.wall, 50), pct(api.wall, 95)];
      figures.push({
        label: `${what}: GET /api/v1/listings, ${RUNS} calls, server p50 ${ms(s50)} ms, wall p50 ${ms(w50)} / p95 ${ms(w95)} ms; server p95`,
        value: ms(s95),
        unit: "ms",
        limit: BUDGET_MS,
      });
      if (!sqlOf) continue;
      const { sql, bind } = await sqlOf(params);
      const direct = await timedSql(db, sql, bind);
      const plan = (await db.query<{ "QUERY PLAN": string }>(`EXPLAIN (ANALYZE, BUFFERS) ${sql}`, bind)).rows
        .map((r) => r["QUERY PLAN"])
        .join("\n");
      const indexes = indexesInPlan(plan);
      console.log(`\n--- search: ${c.name} (?${params})\n${sql}\n-- bind ${JSON.stringify(bind)}\n${plan}`);

      const [q50, q95] = [pct(direct, 50), pct(direct, 95)];
      figures.push({
        label: `${what}: the same SQL run directly p50 ${ms(q50)} / p95 ${ms(q95)} ms (indexes: ${indexes.join(", ") || "none, sequential scan"}); API server p95 ÷ SQL p95 ${ms(s95 / q95)} ×, p50 ÷ p50`,
        value: Math.round((s50 / q50) * 100) / 100,
        unit: "×",
        limit: BUDGET_RATIO,
      });
    }
  } finally {
    await db.end();
  }
  return { figures, notes };
}
