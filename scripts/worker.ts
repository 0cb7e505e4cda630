import { startWorker } from "../app/jobs/worker.server";

// The background worker as its own process; `npm start` runs one beside the web server.
const worker = await startWorker();
for (const signal of ["SIGINT", "SIGTERM"] as const) {
  process.once(signal, () => void worker.stop().then(() => process.exit(0)));
}
