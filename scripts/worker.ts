import os from "node:os";
import { startWorker } from "../app/jobs/worker.server";

// The background worker as its own process; `npm start` runs one beside the web server. Where both
// share a machine, the worker's CPU-heavy jobs (capture analysis, photo decoding) yield to the web
// process, whose visitors are waiting: it runs at a lower priority. WORKER_NICE=0 turns this off.
const nice = Number(process.env.WORKER_NICE ?? 10);
try {
  if (nice) os.setPriority(nice);
} catch (error) {
  console.warn(`[worker] could not lower its priority: ${(error as Error).message}`);
}
const worker = await startWorker();
for (const signal of ["SIGINT", "SIGTERM"] as const) {
  process.once(signal, () => void worker.stop().then(() => process.exit(0)));
}
