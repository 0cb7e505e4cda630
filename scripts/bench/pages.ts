// The public pages under load, side by side: home, the market and a public listing page, each at 50
// connections with autocannon, against the built app on the throw-away test stack (demo scenario).
// The load generator shares the machine's two cores with the server, so absolute figures are lower
// than a separate client would see; the market's pace against a listing page's is what is limited.
import { spawn, type ChildProcess } from "node:child_process";
import fs from "node:fs";
import { createRequire } from "node:module";
import os from "node:os";
import path from "node:path";
import { bin, bringUp, finished, launch, profile, root, stopChild, waitForHttp } from "../stack";

export type Figure = { label: string; value: number; unit: string; limit?: number; atLeast?: boolean };

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

/** Builds the app, serves it on the throw-away test stack and measures the public pages. */
export async function pageFigures(): Promise<{ figures: Figure[]; notes: string[] }> {
  const p = profile("test");
  fs.rmSync(p.dir, { recursive: true, force: true });
  const stack = await bringUp(p, { log: () => {} });
  const children: ChildProcess[] = [];
  try {
    const env = { ...stack.env };
    if ((await finished(launch(bin("react-router"), ["build"], { ...env, NODE_ENV: "production" }, true))) !== 0)
      throw new Error("react-router build failed");
    const web = spawn(process.execPath, ["--import", "tsx", path.join(root, "scripts/serve.ts")], {
      cwd: root,
      env: { ...process.env, ...env, NODE_ENV: "production", HOST: "127.0.0.1" },
      stdio: ["ignore", "ignore", "inherit"],
    });
    children.push(web);
    const base = `http://127.0.0.1:${env.PORT}`;
    await waitForHttp(`${base}/healthz`, 90_000, web);
    const load = await measurePages(base);
    // What a phone gets from the same pages: script weight, elements, Lighthouse (scripts/bench/weight.ts).
    const weight = await (await import("./weight")).weightFigures(base);
    return { figures: [...load, ...weight.figures], notes: weight.notes };
  } finally {
    for (const c of children) await stopChild(c);
    await stack.stop();
  }
}

// Runnable alone: `npx tsx scripts/bench/pages.ts` (own stack), or `… pages.ts http://host:port`.
if (import.meta.url === `file://${process.argv[1]}`) {
  const figures = process.argv[2] ? await measurePages(process.argv[2]) : (await pageFigures()).figures;
  for (const f of figures)
    console.log(`${f.label}: ${f.value} ${f.unit}${f.limit ? ` (${f.atLeast ? "at least" : "limit <"} ${f.limit} ${f.unit})` : ""}`);
  process.exit(0);
}
