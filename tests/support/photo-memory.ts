// Renders one photo in a process of its own and reports the peak memory, for tests that bound what
// a hostile upload can cost (the bound is behaviour, not timing). Run with tsx:
//   tsx tests/support/photo-memory.ts <file> <image/jpeg|image/png> [--warm]
// `--warm`: a small photo is processed first, as in a worker that has been running (its encoder
// thread started, its code compiled); the figures are then the second photo's.
// Prints one line of JSON: { outcome, message?, baselineMb, peakMb, ms, cpuMs, phases, heapMb,
// buffersMb }; scripts/bench.ts uses it too. `phases`: wall milliseconds per step of renderPhoto;
// `heapMb`, `buffersMb`: the largest JavaScript heap and heap plus buffers seen at a step's end.
import { readFileSync } from "node:fs";
import { renderPhoto, UnreadableImage } from "../../app/photos/render.server";
import { encodeJpeg } from "../../app/photos/jpeg-encode.server";

const [file, type, warm] = process.argv.slice(2);
const input = readFileSync(file);
if (warm === "--warm") {
  const data = Buffer.alloc(640 * 480 * 4);
  for (let i = 0; i < data.length; i++) data[i] = (i * 37) & 255;
  await renderPhoto(encodeJpeg({ data, width: 640, height: 480 }, { quality: 88 }), "image/jpeg");
}
const mb = () => Math.round(process.resourceUsage().maxRSS / 1024);
const baselineMb = mb();
const phases: Record<string, number> = {};
let heap = 0;
let buffers = 0;
const started = performance.now();
const cpu = process.cpuUsage();
let outcome = "ready";
let message: string | undefined;
try {
  await renderPhoto(input, type as "image/jpeg" | "image/png", (phase, ms) => {
    phases[phase] = Math.round((phases[phase] ?? 0) + ms);
    const m = process.memoryUsage();
    heap = Math.max(heap, m.heapUsed);
    buffers = Math.max(buffers, m.heapUsed + m.arrayBuffers);
  });
} catch (error) {
  outcome = error instanceof UnreadableImage ? "refused" : "error";
  message = (error as Error).message;
}
const ms = Math.round(performance.now() - started);
const used = process.cpuUsage(cpu);
const cpuMs = Math.round((used.user + used.system) / 1000);
const toMb = (b: number) => Math.round(b / 2 ** 20);
console.log(
  JSON.stringify({ outcome, message, baselineMb, peakMb: mb(), ms, cpuMs, phases, heapMb: toMb(heap), buffersMb: toMb(buffers) }),
);
