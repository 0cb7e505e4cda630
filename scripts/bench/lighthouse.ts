// Lighthouse on one page, phone profile (its default), run a few times: the four scores' medians and,
// so a reader can see what costs the performance score, the medians of the metrics behind it and where
// the main thread's time went (long tasks, the scripts that took the most CPU, the work by kind).
import { createRequire } from "node:module";

const CHROMIUM = process.env.CHROMIUM_PATH ?? "/usr/bin/chromium";
const FLAGS = ["--no-sandbox", "--disable-gpu", "--disable-background-networking", "--disable-component-update", "--no-first-run"];
export const CATEGORIES = ["performance", "accessibility", "best-practices", "seo"] as const;

// The metrics the performance score is made of, with their weights in Lighthouse 12's scoring
// (lighthouse-core's default config: TBT 30, LCP 25, CLS 25, FCP 10, Speed Index 10).
export const METRICS = [
  { id: "first-contentful-paint", name: "FCP", weight: 10, unit: "ms" },
  { id: "largest-contentful-paint", name: "LCP", weight: 25, unit: "ms" },
  { id: "total-blocking-time", name: "TBT", weight: 30, unit: "ms" },
  { id: "speed-index", name: "Speed Index", weight: 10, unit: "ms" },
  { id: "cumulative-layout-shift", name: "CLS", weight: 25, unit: "" },
] as const;

type ChromeLauncher = {
  launch(opts: { chromePath: string; chromeFlags: string[] }): Promise<{ port: number; kill(): Promise<void> | void }>;
};

type Audit = { score?: number | null; numericValue?: number; errorMessage?: string; details?: { items?: Record<string, unknown>[] } };

/** What one run says about the main thread. */
export type ThreadCost = {
  longTasks: { url: string; ms: number }[];
  bootup: { url: string; total: number; scripting: number; parse: number }[];
  work: { group: string; ms: number }[];
};

export type MetricMedian = { name: string; weight: number; unit: string; value: number | null; score: number | null };

export type Lighthouse = {
  scores: Record<(typeof CATEGORIES)[number], number | null>;
  /** Every run's performance score, in run order: the spread shows how much the machine's load moved it. */
  performanceRuns: number[];
  metrics: MetricMedian[];
  /** Median count of main-thread tasks over 50 ms, and the run with the median performance score's detail. */
  longTaskCount: number | null;
  thread: ThreadCost | null;
  runs: number;
  errors: string[];
};

const median = (a: number[]) => (a.length ? [...a].sort((x, y) => x - y)[a.length >> 1] : null);
const short = (url: unknown) => {
  if (typeof url !== "string" || !url) return "(no script)";
  if (!/^https?:/.test(url)) return url;
  const u = new URL(url);
  return u.pathname === "/" || !u.pathname.startsWith("/assets/") ? `${u.pathname} (document)` : u.pathname.replace(/^\/assets\//, "");
};
const num = (v: unknown) => (typeof v === "number" ? Math.round(v) : 0);

function threadCost(audits: Record<string, Audit>): ThreadCost {
  const items = (id: string) => audits[id]?.details?.items ?? [];
  return {
    longTasks: items("long-tasks").map((t) => ({ url: short(t.url), ms: num(t.duration) })),
    bootup: items("bootup-time")
      .map((b) => ({ url: short(b.url), total: num(b.total), scripting: num(b.scripting), parse: num(b.scriptParseCompile) }))
      .slice(0, 5),
    work: items("mainthread-work-breakdown")
      .map((w) => ({ group: String(w.groupLabel ?? w.group), ms: num(w.duration) }))
      .slice(0, 5),
  };
}

/** Lighthouse on `url`, `runs` times in one Chromium; the medians and the median run's main-thread detail. */
export async function runLighthouse(url: string, runs = 3): Promise<Lighthouse> {
  const { default: lighthouse } = await import("lighthouse");
  const launcher = createRequire(import.meta.url)("chrome-launcher") as ChromeLauncher;
  const chrome = await launcher.launch({ chromePath: CHROMIUM, chromeFlags: ["--headless=new", ...FLAGS] });
  const per: Record<string, number[]> = Object.fromEntries(CATEGORIES.map((c) => [c, []]));
  const metricValues: Record<string, number[]> = Object.fromEntries(METRICS.map((m) => [m.id, []]));
  const metricScores: Record<string, number[]> = Object.fromEntries(METRICS.map((m) => [m.id, []]));
  const longTaskCounts: number[] = [];
  const threads: { performance: number; thread: ThreadCost }[] = [];
  const errors = new Set<string>();
  try {
    // A run whose trace fails altogether (NO_NAVSTART now and then) is run again, twice at most.
    for (let attempt = 0; per.performance.length < runs && attempt < runs + 2; attempt++) {
      const result = await lighthouse(url, { port: chrome.port, output: "json", logLevel: "silent", onlyCategories: [...CATEGORIES] });
      if (!result) continue;
      const lhr = result.lhr;
      if (lhr.runtimeError) {
        errors.add(`a run failed: ${lhr.runtimeError.code}`);
        continue;
      }
      for (const c of CATEGORIES) {
        const s = lhr.categories[c]?.score;
        if (typeof s === "number") per[c].push(Math.round(s * 100));
      }
      const audits = lhr.audits as Record<string, Audit>;
      for (const m of METRICS) {
        const a = audits[m.id];
        if (typeof a?.numericValue === "number") metricValues[m.id].push(a.numericValue);
        if (typeof a?.score === "number") metricScores[m.id].push(Math.round(a.score * 100));
      }
      const thread = threadCost(audits);
      if (!audits["long-tasks"]?.errorMessage) longTaskCounts.push(thread.longTasks.length);
      threads.push({ performance: per.performance.at(-1) ?? 0, thread });
      for (const [id, audit] of Object.entries(audits)) if (audit.errorMessage) errors.add(id);
    }
  } finally {
    await chrome.kill();
  }
  const scores = Object.fromEntries(CATEGORIES.map((c) => [c, median(per[c])])) as Lighthouse["scores"];
  const medianRun = [...threads].sort((a, b) => a.performance - b.performance)[threads.length >> 1];
  return {
    scores,
    performanceRuns: per.performance,
    metrics: METRICS.map((m) => ({
      name: m.name,
      weight: m.weight,
      unit: m.unit,
      value: median(metricValues[m.id]),
      score: median(metricScores[m.id]),
    })),
    longTaskCount: median(longTaskCounts),
    thread: medianRun?.thread ?? null,
    runs: per.performance.length,
    errors: [...errors],
  };
}

/** The lines a reader needs to see what costs the score: metrics, long tasks, the costliest scripts. */
export function describeCost(name: string, lh: Lighthouse): string[] {
  const fmt = (m: MetricMedian) =>
    m.value === null
      ? `${m.name} n/a`
      : `${m.name} ${m.unit ? Math.round(m.value) : m.value.toFixed(3)}${m.unit} (score ${m.score}, weight ${m.weight})`;
  const lines = [`Lighthouse on ${name}: performance per run ${lh.performanceRuns.join(", ")}; medians ${lh.metrics.map(fmt).join(", ")}`];
  const t = lh.thread;
  if (t) {
    const tasks = t.longTasks.map((l) => `${l.url} ${l.ms} ms`).join(", ") || "none";
    lines.push(`  main thread (median run): ${lh.longTaskCount ?? "?"} long tasks (median of runs); the median run's: ${tasks}`);
    lines.push(
      `  script CPU (bootup-time, total/scripting/parse ms): ${t.bootup.map((b) => `${b.url} ${b.total}/${b.scripting}/${b.parse}`).join(", ") || "none"}`,
    );
    lines.push(`  main-thread work by kind: ${t.work.map((w) => `${w.group} ${w.ms} ms`).join(", ")}`);
  }
  return lines;
}
