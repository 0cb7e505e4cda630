// `npm run bench`: timing figures with their limits; exits non-zero when a limit is missed.
// Capture analysis: a 10 s stereo 96 kHz 24-bit WAV, from its bytes to readings, against a bare
// fft.js transform of the same samples (both channels, the same FFT size). Runs alternate and the
// median of several is taken. The limits apply to CPU time, which other processes on a shared
// machine do not inflate the way they inflate wall time; both are printed, with the load average.
import os from "node:os";
import wavefile from "wavefile";
import { analyseCapture } from "../app/bench/captures.server";
import { decodeWavData, readWavFormat } from "../app/bench/wav.server";
import { bareFft, nextPowerOfTwo } from "../shared/bench/analysis";

// `npm run bench -- --only search` (or several parts, comma-separated) measures only those parts; the
// scale seed runs whenever search or pages is among them. Without --only everything runs.
const SECTIONS = ["capture", "sheet", "photos", "edge", "weight", "search", "pages", "account", "import"] as const;
type SectionName = (typeof SECTIONS)[number];
const onlyAt = process.argv.indexOf("--only");
const only = onlyAt > 0 ? (process.argv[onlyAt + 1] ?? "").split(",").filter(Boolean) : null;
const unknown = only?.filter((name) => !(SECTIONS as readonly string[]).includes(name)) ?? [];
if (only && (only.length === 0 || unknown.length)) {
  console.error(`--only: one or more of ${SECTIONS.join(", ")}, comma-separated (not ${unknown.join(", ") || "nothing"})`);
  process.exit(2);
}
const runs = (name: SectionName) => !only || only.includes(name);

// A limit is a ceiling (the value must stay under it), or with atLeast a floor (Lighthouse scores).
type Figure = { label: string; value: number; unit: string; limit?: number; atLeast?: boolean };
const { WaveFile } = wavefile as unknown as {
  WaveFile: new () => { fromScratch(c: number, r: number, b: string, s: ArrayLike<number>[]): void; toBuffer(): Uint8Array };
};

function captureWav(seconds: number, sampleRate: number): Uint8Array {
  const n = seconds * sampleRate;
  const left = new Int32Array(n);
  const right = new Int32Array(n);
  let seed = 12345;
  const noise = () => ((seed = (seed * 1103515245 + 12345) >>> 0) / 2 ** 32 - 0.5) * 2e-6;
  for (let i = 0; i < n; i++) {
    const ph = (2 * Math.PI * 997 * i) / sampleRate;
    const v = 0.5 * Math.sin(ph) + 5e-5 * Math.sin(2 * ph) + 2e-5 * Math.sin(3 * ph);
    left[i] = Math.round((v + noise()) * 8388607);
    right[i] = Math.round((0.98 * v + noise()) * 8388607);
  }
  const w = new WaveFile();
  w.fromScratch(2, sampleRate, "24", [left, right]);
  return w.toBuffer();
}

const median = (a: number[]) => [...a].sort((x, y) => x - y)[a.length >> 1];
const ms = (x: number) => Math.round(x * 10) / 10;

async function captureFigures(): Promise<Figure[]> {
  const bytes = captureWav(10, 96_000);
  const conditions = {
    kind: "sine" as const,
    scale: { kind: "analyser" as const, fullScaleVolts: 2, basis: "rms" as const, attenuation: 10 },
    loadOhm: 8,
    weighting: "A" as const,
    window: "blackman-harris-7" as const,
  };
  const { format, data } = readWavFormat(bytes);
  const channels = decodeWavData(format, data).samples;

  // [wall ms, CPU ms] of one call.
  const timed = (fn: () => void): [number, number] => {
    const c = process.cpuUsage();
    const t = performance.now();
    fn();
    const wall = performance.now() - t;
    const cpu = process.cpuUsage(c);
    return [wall, (cpu.user + cpu.system) / 1000];
  };
  const analyse = () =>
    timed(() => {
      const r = analyseCapture(bytes, "bench.wav", conditions, "bench");
      if (r.kind !== "sine" || r.readings.length === 0) throw new Error("the bench capture did not analyse");
    });
  const bare = () =>
    timed(() => {
      for (const ch of channels) bareFft(ch);
    });

  const [coldWall, coldCpu] = analyse();
  bare();
  analyse();
  const runs = 9;
  const a: [number, number][] = [];
  const f: [number, number][] = [];
  for (let i = 0; i < runs; i++) {
    a.push(analyse());
    f.push(bare());
  }
  const aWall = median(a.map((x) => x[0]));
  const aCpu = median(a.map((x) => x[1]));
  const fWall = median(f.map((x) => x[0]));
  const fCpu = median(f.map((x) => x[1]));
  const size = nextPowerOfTwo(channels[0].length);
  const file = `10 s stereo 96 kHz 24-bit WAV (${(bytes.length / 1048576).toFixed(1)} MB)`;
  return [
    {
      label: `capture analysis, ${file}, first run (FFT tables, window, A-weighting built), wall / CPU ${ms(coldWall)} / ${ms(coldCpu)} ms`,
      value: ms(coldCpu),
      unit: "ms CPU",
    },
    {
      label: `capture analysis, same file, wall time, median of ${runs} (min ${ms(Math.min(...a.map((x) => x[0])))} ms)`,
      value: ms(aWall),
      unit: "ms",
    },
    { label: `capture analysis, same file, CPU time, median of ${runs}`, value: ms(aCpu), unit: "ms", limit: 300 },
    {
      label: `bare fft.js real FFT of both channels (2 × ${size} points), wall / CPU median of ${runs}`,
      value: ms(fCpu),
      unit: `ms CPU (wall ${ms(fWall)} ms)`,
    },
    { label: "capture analysis ÷ bare FFT, CPU-time medians", value: Math.round((aCpu / fCpu) * 100) / 100, unit: "×", limit: 2 },
    { label: "capture analysis ÷ bare FFT, wall-time medians", value: Math.round((aWall / fWall) * 100) / 100, unit: "×" },
    { label: "load average over the last minute (2 cores)", value: Math.round(os.loadavg()[0] * 100) / 100, unit: "" },
  ];
}

async function sheetFigures(): Promise<{ figures: Figure[]; note?: string }> {
  try {
    const mod = await import("./bench/sheet");
    return { figures: await mod.benchSheetCheck() };
  } catch (e) {
    return { figures: [], note: `bench-sheet check timing not available (scripts/bench/sheet.ts: ${(e as Error).message})` };
  }
}

type Section = { figures: Figure[]; notes: string[]; failed?: boolean };

// One served app for every server figure: the edge first (it measures a fresh web process) and the
// page weights, then the scale seed's listings are added and the search API and the public pages'
// pace are measured at that size.
async function serverFigures(): Promise<Section> {
  if (process.argv.includes("--no-server")) return { figures: [], notes: ["server figures left out (--no-server)"] };
  if (!["edge", "weight", "search", "pages", "import"].some((name) => runs(name as SectionName))) return { figures: [], notes: [] };
  const out: Section = { figures: [], notes: [] };
  const section = async (what: string, measure: () => Promise<{ figures: Figure[]; notes?: string[] }>) => {
    try {
      const r = await measure();
      out.figures.push(...r.figures);
      out.notes.push(...(r.notes ?? []));
    } catch (e) {
      out.notes.push(`${what} could not be measured: ${(e as Error).message}`);
      out.failed = true;
    }
  };
  const { serveApp } = await import("./bench/served-app");
  let app: Awaited<ReturnType<typeof serveApp>>;
  try {
    app = await serveApp({ worker: true });
  } catch (e) {
    return { figures: [], notes: [`server figures could not be measured: ${(e as Error).message}`], failed: true };
  }
  try {
    if (runs("edge")) await section("the request edge", async () => (await import("./bench/edge")).edgeFigures(app));
    // What a phone gets from the public pages, on the demo scenario (its listings have photos and plots).
    if (runs("weight")) await section("the page weights", async () => (await import("./bench/weight")).weightFigures(app.base));
    // A workshop's 5,000-unit CSV import, upload to drafts written (before the scale seed, on the demo scenario).
    if (runs("import")) await section("the CSV import", async () => (await import("./bench/import")).importFigures(app));
    if (!runs("search") && !runs("pages")) return out;
    const at = process.argv.indexOf("--listings");
    const listings = at > 0 ? Number(process.argv[at + 1]) : 100_000;
    await section("the scale seed", async () => {
      const { seedScale } = await import("../db/seeds/scale/write");
      const r = await seedScale({ databaseUrl: app.databaseUrl, listings, log: (line) => console.error(`[seed:scale] ${line}`) });
      await app.restartWeb(); // no caches from before the seed
      return {
        figures: [
          {
            label: `scale seed: ${r.listings.toLocaleString("en")} listings (${r.sheets.toLocaleString("en")} bench sheets, ${r.verified.toLocaleString("en")} bench-verified) added to the demo scenario`,
            value: r.seconds,
            unit: "s",
            limit: 120,
          },
        ],
      };
    });
    if (runs("search")) await section("search through the API", async () => (await import("./bench/search")).searchFigures(app));
    if (runs("pages"))
      await section("the public pages", async () => ({ figures: await (await import("./bench/pages")).measurePages(app.base) }));
  } finally {
    await app.stop();
  }
  return out;
}

const figures = runs("capture") ? await captureFigures() : [];
if (runs("capture")) figures.push(...(await import("./bench/capture-impedance")).impedanceCaptureFigures());
if (runs("capture")) figures.push(...(await import("./bench/capture-twotone")).captureTwoToneFigures());
if (runs("capture")) figures.push(...(await import("./bench/capture-wow-flutter")).wowFlutterFigures());
const sheet: Awaited<ReturnType<typeof sheetFigures>> = runs("sheet") ? await sheetFigures() : { figures: [] };
figures.push(...sheet.figures);
const notes = [sheet.note];
if (runs("photos")) figures.push(...(await (await import("./bench/photos")).photoFigures()));
const server = await serverFigures();
figures.push(...server.figures);
notes.push(...server.notes);

// The anonymous account forms' timing and health checks under load need a running app: `npm start`,
// or BENCH_URL.
const benchUrl = process.env.BENCH_URL ?? "http://127.0.0.1:3000";
const answers =
  runs("account") &&
  (await fetch(`${benchUrl}/healthz`, { signal: AbortSignal.timeout(5000) }).then(
    () => true,
    () => false,
  ));
const accountNote =
  answers || !runs("account")
    ? undefined
    : `account-form timing skipped: nothing answers at ${benchUrl} (run \`npm start\`, or set BENCH_URL)`;
if (answers) figures.push(...(await (await import("./bench/account-timing")).accountTimingFigures(benchUrl)));
if (answers) figures.push(...(await (await import("./bench/health")).healthFigures(benchUrl)));
else if (runs("account")) notes.push(`health-check load figures skipped: nothing answers at ${benchUrl}`);

let missed = server.failed ? 1 : 0;
for (const f of figures) {
  const over = f.limit !== undefined && !(f.atLeast ? f.value >= f.limit : f.value < f.limit);
  if (over) missed++;
  const limit = f.limit !== undefined ? `  (${f.atLeast ? "at least" : "limit <"} ${f.limit} ${f.unit}${over ? ", MISSED" : ", ok"})` : "";
  console.log(`${f.label}: ${f.value} ${f.unit}${limit}`);
}
for (const note of [...notes, accountNote]) if (note) console.log(note);
console.log(missed ? `\n${missed} limit(s) missed` : "\nAll limits met");
process.exit(missed ? 1 : 0);
