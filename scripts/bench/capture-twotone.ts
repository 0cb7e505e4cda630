// Timing of the separation, intermodulation and output-impedance analyses: each on a 10 s stereo
// 96 kHz 24-bit WAV, from its bytes to readings, against a bare fft.js transform of the same samples
// (both channels). Medians of several alternating runs; limits on CPU time (300 ms, and 2× the FFT).
// Alone: `npx tsx scripts/bench/capture-twotone.ts`.
import wavefile from "wavefile";
import { analyseCapture } from "../../app/bench/captures.server";
import { decodeWavData, readWavFormat } from "../../app/bench/wav.server";
import { bareFft, captureConditionsSchema, type CaptureConditionsInput } from "../../shared/bench/analysis";

type Figure = { label: string; value: number; unit: string; limit?: number; atLeast?: boolean };

const { WaveFile } = wavefile as unknown as {
  WaveFile: new () => { fromScratch(c: number, r: number, b: string, s: ArrayLike<number>[]): void; toBuffer(): Uint8Array };
};

const FS = 96_000;
const SECONDS = 10;
const TAU = 2 * Math.PI;

function wav(left: (t: number) => number, right: (t: number) => number): Uint8Array {
  const n = FS * SECONDS;
  const l = new Int32Array(n);
  const r = new Int32Array(n);
  let seed = 99;
  const noise = () => ((seed = (seed * 1103515245 + 12345) >>> 0) / 2 ** 32 - 0.5) * 2e-6;
  for (let i = 0; i < n; i++) {
    const t = i / FS;
    l[i] = Math.round((left(t) + noise()) * 8388607);
    r[i] = Math.round((right(t) + noise()) * 8388607);
  }
  const w = new WaveFile();
  w.fromScratch(2, FS, "24", [l, r]);
  return w.toBuffer();
}

const smpte = (t: number) => 0.4 * Math.sin(TAU * 60 * t) + 0.1 * (1 + 0.001 * Math.cos(TAU * 60 * t)) * Math.sin(TAU * 7000 * t);
const steps = (t: number) => 0.5 * Math.sin(TAU * [100, 1000, 10_000][Math.min(2, Math.floor((t * 3) / SECONDS))] * t);
const openLoaded = (t: number) => (t < SECONDS / 2 ? 1 : 8 / 8.05) * 0.5 * Math.sin(TAU * 1000 * t);

const CASES: { name: string; bytes: () => Uint8Array; conditions: CaptureConditionsInput }[] = [
  { name: "SMPTE intermodulation", bytes: () => wav(smpte, smpte), conditions: { kind: "imd", method: "smpte" } },
  {
    name: "output impedance, open then loaded",
    bytes: () => wav(openLoaded, openLoaded),
    conditions: { kind: "output_impedance", loadOhm: 8, nominalLoadOhm: 8 },
  },
  { name: "separation, three stepped tones", bytes: () => wav(steps, (t) => 1e-4 * steps(t)), conditions: { kind: "separation" } },
];

const median = (a: number[]) => [...a].sort((x, y) => x - y)[a.length >> 1];
const ms = (x: number) => Math.round(x * 10) / 10;

function cpu(fn: () => void): number {
  const c = process.cpuUsage();
  fn();
  const u = process.cpuUsage(c);
  return (u.user + u.system) / 1000;
}

export function captureTwoToneFigures(runs = 7): Figure[] {
  const out: Figure[] = [];
  for (const k of CASES) {
    const bytes = k.bytes();
    const conditions = captureConditionsSchema.parse(k.conditions);
    const { format, data } = readWavFormat(bytes);
    const channels = decodeWavData(format, data).samples;
    const analyse = () =>
      cpu(() => {
        const r = analyseCapture(bytes, "bench.wav", conditions, "bench");
        if (r.readings.length === 0) throw new Error(`the ${k.name} bench capture gave no readings`);
      });
    const bare = () => cpu(() => channels.forEach((ch) => bareFft(ch)));
    analyse();
    bare();
    const a: number[] = [];
    const f: number[] = [];
    for (let i = 0; i < runs; i++) {
      a.push(analyse());
      f.push(bare());
    }
    const aCpu = median(a);
    const fCpu = median(f);
    out.push(
      { label: `${k.name}, 10 s stereo 96 kHz 24-bit WAV, CPU time, median of ${runs}`, value: ms(aCpu), unit: "ms", limit: 300 },
      {
        label: `${k.name} ÷ bare FFT of both channels (${ms(fCpu)} ms), CPU-time medians`,
        value: Math.round((aCpu / fCpu) * 100) / 100,
        unit: "×",
        limit: 2,
      },
    );
  }
  return out;
}

if (import.meta.url === `file://${process.argv[1]}`) {
  for (const f of captureTwoToneFigures()) console.log(`${f.label}: ${f.value} ${f.unit}${f.limit ? ` (limit ${f.limit})` : ""}`);
}
