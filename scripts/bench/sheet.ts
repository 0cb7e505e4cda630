// Timing of the bench-sheet check, for `npm run bench` (scripts/bench.ts prints the figures).
import { checkBenchSheet } from "../../shared/bench/verdict";
import { checkBenchSheetJson } from "../../shared/bench/api";
import {
  doctoredIntegratedAmplifierSheet,
  exampleIntegratedAmplifierRequest,
  exampleIntegratedAmplifierSheet,
} from "../../shared/bench/examples";

type Figure = { label: string; value: number; unit: string; limit?: number };

/** Mean wall-clock and CPU µs per call over `runs` calls, after a warm-up so the JIT has settled. */
function meanMicros(fn: () => unknown, runs: number): { wall: number; cpu: number } {
  for (let i = 0; i < Math.min(500, runs); i++) fn();
  const c0 = process.cpuUsage();
  const t0 = performance.now();
  for (let i = 0; i < runs; i++) fn();
  const wall = ((performance.now() - t0) * 1000) / runs;
  const c = process.cpuUsage(c0);
  return { wall, cpu: (c.user + c.system) / runs };
}

export async function benchSheetCheck(runs = 5000): Promise<Figure[]> {
  const good = exampleIntegratedAmplifierSheet();
  const bad = doctoredIntegratedAmplifierSheet();
  const body = JSON.stringify(exampleIntegratedAmplifierRequest());
  let sink = 0;
  const check = meanMicros(() => (sink += checkBenchSheet(good).counts.consistent), runs);
  const doctored = meanMicros(() => (sink += checkBenchSheet(bad).counts.implausible), runs);
  const api = meanMicros(() => (sink += checkBenchSheetJson(body).status), Math.ceil(runs / 5));
  if (sink < 0) console.log(sink); // keeps the work observable
  return [
    {
      label: `checkBenchSheet, example integrated amplifier (${good.readings.length} readings), mean of ${runs}`,
      value: round(check.wall),
      unit: "µs",
      limit: 1000,
    },
    { label: "  same, CPU time per sheet (steadier on a busy machine)", value: round(check.cpu), unit: "µs", limit: 1000 },
    { label: `checkBenchSheet, doctored sheet, mean of ${runs}`, value: round(doctored.wall), unit: "µs", limit: 1000 },
    {
      label: `JSON parse + schema + check (API body, ${body.length} bytes), mean of ${Math.ceil(runs / 5)}`,
      value: round(api.wall),
      unit: "µs",
    },
  ];
}

function round(x: number): number {
  return Math.round(x * 10) / 10;
}

// Runnable alone: `npx tsx scripts/bench/sheet.ts`
if (import.meta.url === `file://${process.argv[1]}`) {
  for (const f of await benchSheetCheck()) console.log(`${f.label}: ${f.value} ${f.unit}${f.limit ? ` (limit ${f.limit} ${f.unit})` : ""}`);
}
