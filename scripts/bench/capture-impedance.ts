// Timing of the impedance capture, for `npm run bench` (scripts/bench.ts prints the figures): a dense
// loudspeaker impedance sweep as an analyser exports it (frequency, ohms, phase; 20,000 rows, 20 Hz–
// 20 kHz at about 1 Hz resolution, what a 10 s capture analysed in 1 Hz bins gives) through the whole
// capture path: the file identified, the CSV split by papaparse, the minimum, resonance and readings.
// No FFT at its core: the budget is the capture one, 300 ms of CPU. 100,000 rows are timed too, without
// a budget, to show how it grows.
import { analyseCapture } from "../../app/bench/captures.server";
import { impedanceCsv, motional, parallelRlc, sum } from "../../tests/support/impedance-model";

type Figure = { label: string; value: number; unit: string; limit?: number };

const ms = (x: number) => Math.round(x * 10) / 10;
const median = (xs: number[]) => [...xs].sort((a, b) => a - b)[Math.floor(xs.length / 2)];

function figuresFor(rows: number, limit?: number): Figure[] {
  const m = motional(30, 45, 4);
  const freqs = Array.from({ length: rows }, (_, i) => 20 * 1000 ** (i / (rows - 1)));
  const bytes = new TextEncoder().encode(impedanceCsv(freqs, (f) => sum({ re: 6.4, im: 0 }, parallelRlc(f, 30, m.l, m.c))));
  const cpu = (): number => {
    const c = process.cpuUsage();
    const r = analyseCapture(bytes, "bench-z.csv", { kind: "impedance", ratedOhm: 8 }, "bench");
    if (r.kind !== "impedance" || r.readings.length < 2) throw new Error("the bench impedance sweep did not analyse");
    const used = process.cpuUsage(c);
    return (used.user + used.system) / 1000;
  };
  const cold = cpu();
  const runs = Array.from({ length: 7 }, cpu);
  return [
    {
      label: `impedance capture, ${freqs.length.toLocaleString("en")}-row CSV (${(bytes.length / 1048576).toFixed(1)} MB, frequency/ohms/phase), first run`,
      value: ms(cold),
      unit: "ms CPU",
    },
    { label: "impedance capture, same file, CPU time, median of 7", value: ms(median(runs)), unit: "ms", ...(limit ? { limit } : {}) },
  ];
}

export function impedanceCaptureFigures(): Figure[] {
  return [...figuresFor(20_000, 300), ...figuresFor(100_000)];
}
