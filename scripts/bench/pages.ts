// The public pages under load, side by side: home, the market and a public listing page, each at 50
// connections with autocannon, against the built app on the throw-away test stack (`npm run bench`
// measures them with the scale seed's 100,000 listings added to the demo scenario).
// The load generator shares the machine's two cores with the server, so absolute figures are lower
// than a separate client would see; the market's pace against a listing page's is what is limited.
import { createRequire } from "node:module";
import os from "node:os";
import { seedScale } from "../../db/seeds/scale/write";
import { withServedApp, type Figure } from "./served-app";

type AutocannonResult = {
  requests: { average: number; total: number };
  latency: { p50: number; p97_5: number; p99: number; average: number };
  non2xx: number;
  errors: number;
  timeouts: number;
};
type Autocannon = (opts: { url: string; connections: number; duration: number }) => Promise<AutocannonResult>;
const autocannon = createRequire(import.meta.url)("autocannon") as Autocannon;

export type PageLoad = { path: string; perSecond: number; p50: number; p97_5: number; failed: number; total: number };

export async function loadPage(base: string, pagePath: string, connections = 50, seconds = 10): Promise<PageLoad> {
  await autocannon({ url: base + pagePath, connections: 10, duration: 2 }); // warm-up: JIT, pools, caches
  const r = await autocannon({ url: base + pagePath, connections, duration: seconds });
  return {
    path: pagePath,
    perSecond: r.requests.average,
    p50: r.latency.p50,
    p97_5: r.latency.p97_5,
    failed: r.non2xx + r.errors + r.timeouts,
    total: r.requests.total,
  };
}

/** Loads each public page in turn against `base`; the figures and the market-to-listing ratio. */
export async function measurePages(base: string, connections = 50, seconds = 10): Promise<Figure[]> {
  const market = await (await fetch(`${base}/market`)).text();
  const listing = /href="(\/listings\/[0-9a-f-]{36})"/.exec(market)?.[1];
  if (!listing) throw new Error("no public listing on /market");
  const figures: Figure[] = [];
  const runs: Record<string, PageLoad> = {};
  for (const [name, p] of [
    ["home", "/"],
    ["market", "/market"],
    ["a listing", listing],
  ] as const) {
    const r = (runs[name] = await loadPage(base, p, connections, seconds));
    figures.push({
      label: `GET ${name === "a listing" ? `${p} (a listing)` : `${p} (${name})`}, ${connections} connections, ${seconds} s, autocannon: p50 ${r.p50} ms, p97.5 ${r.p97_5} ms, ${r.total} requests (${r.failed} failed); requests per second`,
      value: Math.round(r.perSecond),
      unit: "req/s",
    });
  }
  // The market should be at least as fast as a listing page; 10 % is left for measurement noise.
  figures.push({
    label: "a listing page's requests per second ÷ the market's (the market at least as fast, 10 % noise allowed)",
    value: Math.round((runs["a listing"].perSecond / runs.market.perSecond) * 100) / 100,
    unit: "×",
    limit: 1.11,
  });
  figures.push({ label: "load average over the last minute (2 cores, shared)", value: Math.round(os.loadavg()[0] * 100) / 100, unit: "" });
  return figures;
}

// Runnable alone: `npx tsx scripts/bench/pages.ts [--listings N]` (own stack; N made-up listings added
// with the scale seed first), or `… pages.ts http://host:port`.
if (import.meta.url === `file://${process.argv[1]}`) {
  const url = process.argv.slice(2).find((a) => a.startsWith("http"));
  const at = process.argv.indexOf("--listings");
  const listings = at > 0 ? Number(process.argv[at + 1]) : 0;
  const figures = url
    ? await measurePages(url)
    : await withServedApp({}, async (app) => {
        if (listings > 0) {
          await seedScale({ databaseUrl: app.databaseUrl, listings, log: console.log });
          await app.restartWeb();
        }
        return measurePages(app.base);
      });
  for (const f of figures)
    console.log(`${f.label}: ${f.value} ${f.unit}${f.limit ? ` (${f.atLeast ? "at least" : "limit <"} ${f.limit} ${f.unit})` : ""}`);
  process.exit(0);
}
