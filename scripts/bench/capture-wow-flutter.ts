import os from "node:os";
import wavefile from "wavefile";
import { analyseCapture } from "../../app/bench/captures.server";
import { decodeWavData, readWavFormat } from "../../app/bench/wav.server";
import { bareFft, captureConditionsSchema, nextPowerOfTwo } from "../../shared/bench/analysis";

// Timing of the wow & flutter analysis on a 10 s test-tone capture (decode, demodulation, weighting,
// readings), against a bare FFT of the same samples. The analysis has no FFT at its core (it mixes the
// tone down and filters it), so the FFT ratio is shown for scale only; the budget is 300 ms of CPU.

type Figure = { label: string; value: number; unit: string; limit?: number; atLeast?: boolean };
const { WaveFile } = wavefile as unknown as {
  WaveFile: new () => { fromScratch(c: number, r: number, b: string, s: ArrayLike<number>[]): void; toBuffer(): Uint8Array };
};

function testToneWav(seconds: number, sampleRate: number): Uint8Array {
  const n = seconds * sampleRate;
  const ch = [new Int32Array(n), new Int32Array(n)];
  for (let i = 0; i < n; i++) {
    const t = i / sampleRate;
    // 3150 Hz, 0.1 % fast, ±0.12 % of once-around wow at 0.556 Hz and ±0.03 % of flutter at 8 Hz.
    const cycles =
      3153.15 * t +
      (3.78 / (2 * Math.PI * 0.556)) * (1 - Math.cos(2 * Math.PI * 0.556 * t)) +
      (0.945 / (2 * Math.PI * 8)) * (1 - Math.cos(2 * Math.PI * 8 * t));
    const v = Math.round(0.4 * Math.sin(2 * Math.PI * cycles) * 8_388_607);
    ch[0][i] = v;
    ch[1][i] = v;
  }
  const w = new WaveFile();
  w.fromScratch(2, sampleRate, "24", ch);
  return w.toBuffer();
}

const median = (xs: number[]) => [...xs].sort((a, b) => a - b)[Math.floor(xs.length / 2)];
const ms = (x: number) => Math.round(x * 10) / 10;

export function wowFlutterFigures(): Figure[] {
  const sampleRate = 96_000;
  const bytes = testToneWav(10, sampleRate);
  const conditions = captureConditionsSchema.parse({ kind: "wow_flutter", testToneHz: 3150, speedRpm: 33.33 });
  const { format, data } = readWavFormat(bytes);
  const samples = decodeWavData(format, data).samples[0];
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
      const r = analyseCapture(bytes, "bench-3150.wav", conditions, "bench");
      if (r.kind !== "wow_flutter" || r.readings.length !== 2) throw new Error("the wow & flutter capture did not analyse");
    });
  const bare = () => timed(() => void bareFft(samples));
  const [coldWall, coldCpu] = analyse();
  bare();
  const runs = 7;
  const a: [number, number][] = [];
  const f: [number, number][] = [];
  for (let i = 0; i < runs; i++) {
    a.push(analyse());
    f.push(bare());
  }
  const aCpu = median(a.map((x) => x[1]));
  const fCpu = median(f.map((x) => x[1]));
  const file = `10 s stereo 96 kHz 24-bit 3150 Hz test tone (${(bytes.length / 1048576).toFixed(1)} MB)`;
  return [
    {
      label: `wow & flutter analysis, ${file}, first run, wall / CPU ${ms(coldWall)} / ${ms(coldCpu)} ms`,
      value: ms(coldCpu),
      unit: "ms CPU",
    },
    { label: `wow & flutter analysis, same file, wall time, median of ${runs}`, value: ms(median(a.map((x) => x[0]))), unit: "ms" },
    { label: `wow & flutter analysis, same file, CPU time, median of ${runs}`, value: ms(aCpu), unit: "ms", limit: 300 },
    {
      label: `bare fft.js real FFT of one channel (${nextPowerOfTwo(samples.length)} points), CPU median of ${runs}`,
      value: ms(fCpu),
      unit: "ms CPU",
    },
    {
      label: "wow & flutter analysis ÷ bare FFT, CPU-time medians (no FFT at its core: for scale)",
      value: Math.round((aCpu / fCpu) * 100) / 100,
      unit: "×",
    },
    { label: "load average over the last minute (2 cores)", value: Math.round(os.loadavg()[0] * 100) / 100, unit: "" },
  ];
}
