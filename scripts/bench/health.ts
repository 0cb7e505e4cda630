// Health checks under load, for `npm run bench` (scripts/bench.ts prints the figures): requests per
// second and latency percentiles at 20 connections against a running app (`npm start`, or
// BENCH_URL). The load comes from this process on the same machine, so absolute figures are lower
// than a separate client would see; the comparison between the endpoints is what they are for.
import http from "node:http";

type Figure = { label: string; value: number; unit: string; limit?: number };

export type LoadResult = { requests: number; perSecond: number; p50: number; p95: number; failures: number };

/** `connections` loops each sending GET `url` back to back on a kept-alive socket for `seconds`. */
export async function load(url: string, { connections = 20, seconds = 5 } = {}): Promise<LoadResult> {
  const agent = new http.Agent({ keepAlive: true, maxSockets: connections });
  const latencies: number[] = [];
  let failures = 0;
  const deadline = performance.now() + seconds * 1000;
  const once = () =>
    new Promise<number>((resolve) => {
      const req = http.get(url, { agent }, (res) => {
        res.resume();
        res.on("end", () => resolve(res.statusCode ?? 0));
      });
      req.on("error", () => resolve(0));
    });
  const started = performance.now();
  await Promise.all(
    Array.from({ length: connections }, async () => {
      while (performance.now() < deadline) {
        const t = performance.now();
        const status = await once();
        latencies.push(performance.now() - t);
        if (status !== 200) failures += 1;
      }
    }),
  );
  const elapsed = (performance.now() - started) / 1000;
  agent.destroy();
  latencies.sort((a, b) => a - b);
  const at = (q: number) => latencies[Math.min(latencies.length - 1, Math.floor(q * latencies.length))] ?? NaN;
  return { requests: latencies.length, perSecond: latencies.length / elapsed, p50: at(0.5), p95: at(0.95), failures };
}

export async function healthFigures(baseUrl: string): Promise<Figure[]> {
  const figures: Figure[] = [];
  for (const [name, path, limit] of [
    ["liveness", "/healthz/live", 50],
    ["readiness", "/healthz/ready", 100],
  ] as const) {
    await load(`${baseUrl}${path}`, { seconds: 1 }); // warm-up: connections, JIT, the first checks
    const r = await load(`${baseUrl}${path}`);
    const what = `GET ${path} (${name}), 20 connections, 5 s`;
    figures.push(
      {
        label: `${what}: requests per second (${r.requests} requests, ${r.failures} not 200)`,
        value: Math.round(r.perSecond),
        unit: "req/s",
      },
      { label: `${what}: median latency (p95 ${round(r.p95)} ms)`, value: round(r.p50), unit: "ms", limit },
    );
  }
  return figures;
}

const round = (x: number) => Math.round(x * 10) / 10;

// Runnable alone: `npx tsx scripts/bench/health.ts [base URL]`
if (import.meta.url === `file://${process.argv[1]}`) {
  const base = process.argv[2] ?? process.env.BENCH_URL ?? "http://127.0.0.1:3000";
  for (const f of await healthFigures(base))
    console.log(`${f.label}: ${f.value} ${f.unit}${f.limit ? ` (limit < ${f.limit} ${f.unit})` : ""}`);
}
