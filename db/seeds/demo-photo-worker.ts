import { parentPort } from "node:worker_threads";
import type { Category } from "@shared/catalogue";
import { demoPhotoFiles } from "./demo-photo-files";

// Draws and encodes demo photos off the main thread (see drawDemoPhotos).
parentPort!.on("message", (job: Job) => void draw(job));

type Job = { id: number; category: Category; key: string; view: number };

async function draw(job: Job) {
  try {
    const files = await demoPhotoFiles(job.category, job.key, job.view);
    parentPort!.postMessage({ id: job.id, files });
  } catch (error) {
    parentPort!.postMessage({ id: job.id, error: String(error instanceof Error ? error.stack : error) });
  }
}
