// Whether an e-mail address has an account must not show in how long the anonymous forms take, for
// `npm run bench` (scripts/bench.ts prints the figures). Against a running app (`npm start`, or
// BENCH_URL): "forgot password" for a demo account's address and for unknown ones, and sign-up with
// a taken address and with fresh ones, alternating, medians of `runs` each. The fresh sign-ups
// create unconfirmed accounts named timing-bench-…@example.test in that app's database.
import { randomBytes } from "node:crypto";
import os from "node:os";

type Figure = { label: string; value: number; unit: string; limit?: number };

// A demo account the seed creates (README lists them).
const KNOWN = "buyer@loadline.test";
const LIMIT_MS = 20;

async function postForm(url: string, fields: Record<string, string>): Promise<number> {
  const started = performance.now();
  const res = await fetch(url, {
    method: "POST",
    body: new URLSearchParams(fields),
    headers: { "Content-Type": "application/x-www-form-urlencoded" },
    redirect: "manual",
  });
  await res.arrayBuffer();
  if (res.status !== 200) throw new Error(`POST ${url} answered ${res.status}`);
  return performance.now() - started;
}

const median = (xs: number[]) => {
  const s = [...xs].sort((a, b) => a - b);
  return s.length % 2 ? s[s.length >> 1] : (s[s.length / 2 - 1] + s[s.length / 2]) / 2;
};
const round = (x: number) => Math.round(x * 10) / 10;

/**
 * Times two kinds of request in turn (ABAB…, after a warm-up of each). Besides both medians, the
 * median of the paired differences: a neighbour's load drifting during the run shifts both of a
 * pair alike, so it cancels there, where it would not between the two medians.
 */
async function alternate(runs: number, a: () => Promise<number>, b: () => Promise<number>) {
  for (let i = 0; i < 3; i++) {
    await a();
    await b();
  }
  const ta: number[] = [];
  const tb: number[] = [];
  for (let i = 0; i < runs; i++) {
    if (i % 2) {
      tb.push(await b());
      ta.push(await a());
    } else {
      ta.push(await a());
      tb.push(await b());
    }
  }
  return { a: median(ta), b: median(tb), paired: median(ta.map((t, i) => t - tb[i])) };
}

export async function accountTimingFigures(baseUrl: string, runs = 20): Promise<Figure[]> {
  const run = randomBytes(4).toString("hex");
  let n = 0;
  const unknown = () => `timing-bench-${run}-${n++}@example.test`;

  const forgot = await alternate(
    runs,
    () => postForm(`${baseUrl}/forgot-password`, { email: KNOWN }),
    () => postForm(`${baseUrl}/forgot-password`, { email: unknown() }),
  );
  const password = "timing-bench-password";
  const signUp = await alternate(
    runs,
    () => postForm(`${baseUrl}/sign-up`, { displayName: "Timing bench", email: KNOWN, password }),
    () => postForm(`${baseUrl}/sign-up`, { displayName: "Timing bench", email: unknown(), password }),
  );

  const pair = (what: string, m: { a: number; b: number; paired: number }, known: string, other: string): Figure[] => [
    { label: `${what}: medians of ${runs}, ${known} / ${other}`, value: round(m.a), unit: `ms / ${round(m.b)} ms` },
    { label: `${what}: median of the ${runs} paired differences, ${known} − ${other}`, value: round(m.paired), unit: "ms" },
    { label: `${what}: its size`, value: round(Math.abs(m.paired)), unit: "ms", limit: LIMIT_MS },
  ];
  return [
    ...pair("POST /forgot-password", forgot, "address with an account", "without"),
    ...pair("POST /sign-up", signUp, "taken address", "fresh address"),
    { label: "load average over the last minute (timings above are wall time)", value: round(os.loadavg()[0]), unit: "" },
  ];
}

// Runnable alone: `npx tsx scripts/bench/account-timing.ts [base URL]`
if (import.meta.url === `file://${process.argv[1]}`) {
  const base = process.argv[2] ?? process.env.BENCH_URL ?? "http://127.0.0.1:3000";
  for (const f of await accountTimingFigures(base)) {
    console.log(`${f.label}: ${f.value} ${f.unit}${f.limit ? ` (limit < ${f.limit} ${f.unit})` : ""}`);
  }
}
