// What a phone gets from each public page: the JavaScript it loads (every chunk, lazy ones included,
// gzipped as sent), its element count and HTML size, and Lighthouse's four scores (phone profile, median of 3)
// with the metrics behind the performance score and the main thread's costliest work (./lighthouse.ts).
// Headless Chromium from Debian; the limits are the budgets: 150 kB of script, 95 for every score.
import { gzipSync } from "node:zlib";
import os from "node:os";
import { chromium, type Browser } from "playwright-core";
import type { Figure } from "./served-app";
import { CATEGORIES, describeCost, runLighthouse } from "./lighthouse";

export const JS_BUDGET_KB = 150;
export const SCORE_FLOOR = 95;
const CHROMIUM = process.env.CHROMIUM_PATH ?? "/usr/bin/chromium";
const FLAGS = ["--no-sandbox", "--disable-gpu", "--disable-background-networking", "--disable-component-update", "--no-first-run"];

export type PageWeight = {
  path: string;
  scripts: { url: string; gzip: number; raw: number }[];
  totalGzip: number;
  elements: number;
  html: { raw: number; gzip: number };
};

/** The pages a buyer lands on: home, the market and a listing with plots (found through the market). */
export async function publicPages(base: string): Promise<[string, string][]> {
  const market = await (await fetch(`${base}/market`)).text();
  const listings = [...market.matchAll(/href="(\/listings\/[0-9a-f-]{36})"/g)].map((m) => m[1]);
  // The listing with the most plots is the heaviest: the one that tells whether the budget holds.
  let best: { path: string; plots: number } | null = null;
  for (const p of [...new Set(listings)]) {
    const html = await (await fetch(base + p)).text();
    const plots = (html.match(/<figure/g) ?? []).length;
    if (!best || plots > best.plots) best = { path: p, plots };
  }
  if (!best) throw new Error("no public listing on /market");
  return [
    ["home", "/"],
    ["market", "/market"],
    ["a listing with plots", best.path],
  ];
}

async function weigh(browser: Browser, base: string, pagePath: string): Promise<PageWeight> {
  const context = await browser.newContext({ viewport: { width: 390, height: 844 }, deviceScaleFactor: 2, isMobile: true, hasTouch: true });
  const page = await context.newPage();
  let html = { raw: 0, gzip: 0 };
  const bodies: Promise<{ url: string; gzip: number; raw: number } | null>[] = [];
  page.on("response", (r) => {
    if (r.request().resourceType() !== "script") return;
    bodies.push(
      r.body().then(
        (b) => ({ url: new URL(r.url()).pathname, raw: b.length, gzip: gzipSync(b).length }),
        () => null,
      ),
    );
  });
  const doc = await page.goto(base + pagePath, { waitUntil: "networkidle" });
  if (doc) {
    const b = await doc.body();
    html = { raw: b.length, gzip: gzipSync(b).length };
  }
  // Whatever loads on the way down the page (lazy chunks below the fold) counts too.
  await page.evaluate(async () => {
    for (let y = 0; y < document.body.scrollHeight; y += 600) {
      window.scrollTo(0, y);
      await new Promise((r) => setTimeout(r, 50));
    }
  });
  await page.waitForLoadState("networkidle");
  const elements = await page.evaluate(() => document.body.getElementsByTagName("*").length);
  await context.close();
  const scripts = (await Promise.all(bodies)).filter((s) => s !== null).sort((a, b) => b.gzip - a.gzip);
  return { path: pagePath, scripts, totalGzip: scripts.reduce((n, s) => n + s.gzip, 0), elements, html };
}

export async function measureWeights(base: string, pages: [string, string][]): Promise<Map<string, PageWeight>> {
  const browser = await chromium.launch({ executablePath: CHROMIUM, args: FLAGS });
  try {
    const out = new Map<string, PageWeight>();
    for (const [name, p] of pages) out.set(name, await weigh(browser, base, p));
    return out;
  } finally {
    await browser.close();
  }
}

const kb = (bytes: number) => Math.round(bytes / 102.4) / 10;

/** The figures for `npm run bench`: script weight, elements and scores per public page, with the budgets. */
export async function weightFigures(base: string, { lighthouseRuns = 3 } = {}): Promise<{ figures: Figure[]; notes: string[] }> {
  const pages = await publicPages(base);
  const weights = await measureWeights(base, pages);
  const figures: Figure[] = [];
  const notes: string[] = [];
  for (const [name, p] of pages) {
    const w = weights.get(name)!;
    const largest = w.scripts
      .slice(0, 3)
      .map((s) => `${s.url.replace(/^\/assets\//, "")} ${kb(s.gzip)} kB`)
      .join(", ");
    figures.push({
      label: `${name} (${p}): JavaScript loaded, gzipped, ${w.scripts.length} files; largest ${largest}`,
      value: kb(w.totalGzip),
      unit: "kB",
      limit: JS_BUDGET_KB,
    });
    figures.push({ label: `${name} (${p}): elements in the page`, value: w.elements, unit: "elements" });
    figures.push({ label: `${name} (${p}): HTML document, ${kb(w.html.raw)} kB raw, gzipped`, value: kb(w.html.gzip), unit: "kB" });
  }
  if (lighthouseRuns > 0) {
    for (const [name, p] of pages) {
      const lh = await runLighthouse(base + p, lighthouseRuns);
      const { scores, errors, runs } = lh;
      for (const c of CATEGORIES)
        figures.push({
          label: `${name} (${p}): Lighthouse 12 ${c}, phone, median of ${runs}`,
          value: scores[c] ?? NaN,
          unit: "",
          limit: SCORE_FLOOR,
          atLeast: true,
        });
      for (const m of lh.metrics)
        if (m.value !== null)
          figures.push({
            label: `${name} (${p}): Lighthouse ${m.name}, median of ${runs}`,
            value: m.unit ? Math.round(m.value) : Math.round(m.value * 1000) / 1000,
            unit: m.unit,
          });
      notes.push(...describeCost(name, lh));
      if (errors.length)
        notes.push(`Lighthouse on ${name}: these audits errored (their trace gatherers fail with this chromium): ${errors.join(", ")}`);
    }
  }
  figures.push({ label: "load average over the last minute (2 cores, shared)", value: Math.round(os.loadavg()[0] * 100) / 100, unit: "" });
  return { figures, notes };
}

/** "within" for a figure with a limit: under it, or for a score at least it. */
export function withinLimit(f: Figure): boolean {
  if (f.limit === undefined) return true;
  return f.atLeast ? f.value >= f.limit : f.value < f.limit;
}

// Runnable alone against a served app: `npx tsx scripts/bench/weight.ts http://127.0.0.1:3000 [--no-lighthouse]`.
if (import.meta.url === `file://${process.argv[1]}`) {
  const base = process.argv[2] ?? "http://127.0.0.1:3000";
  const { figures, notes } = await weightFigures(base, { lighthouseRuns: process.argv.includes("--no-lighthouse") ? 0 : 3 });
  for (const f of figures) {
    const limit =
      f.limit === undefined ? "" : `  (${f.atLeast ? "at least" : "limit <"} ${f.limit}${withinLimit(f) ? ", ok" : ", MISSED"})`;
    console.log(`${f.label}: ${f.value} ${f.unit}${limit}`);
  }
  for (const n of notes) console.log(n);
  process.exit(0);
}
