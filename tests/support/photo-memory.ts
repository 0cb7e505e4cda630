// Renders one photo in a process of its own and reports the peak memory, for tests that bound what
// a hostile upload can cost (the bound is behaviour, not timing). Run with tsx:
//   tsx tests/support/photo-memory.ts <file> <image/jpeg|image/png>
// Prints one line of JSON: { outcome, message?, baselineMb, peakMb, ms }. scripts/bench.ts uses it too.
import { readFileSync } from "node:fs";
import { renderPhoto, UnreadableImage } from "../../app/photos/render.server";

const [file, type] = process.argv.slice(2);
const input = readFileSync(file);
const mb = () => Math.round(process.resourceUsage().maxRSS / 1024);
const baselineMb = mb();
const started = performance.now();
let outcome = "ready";
let message: string | undefined;
try {
  await renderPhoto(input, type as "image/jpeg" | "image/png");
} catch (error) {
  outcome = error instanceof UnreadableImage ? "refused" : "error";
  message = (error as Error).message;
}
console.log(JSON.stringify({ outcome, message, baselineMb, peakMb: mb(), ms: Math.round(performance.now() - started) }));
