import { QUEUES, startBoss } from "~/services/jobs.server";
import { DIGEST_SCHEDULE } from "~/alerts/digest.server";
import { handlers } from "./handlers.server";
import { queuePhotoRehashIfNeeded } from "~/photos/rehash.server";
import { runBatch } from "./batch";

// Light jobs (mails, events, deadlines) ten to a fetch; heavy ones (photos, captures) one at a time,
// so a batch stays well inside the queue's expiry and the worker's memory budget.
const HEAVY = new Set<string>([QUEUES.photoProcess, QUEUES.photoRehash, QUEUES.captureAnalyze]);

export async function startWorker({ log = console.log }: { log?: (line: string) => void } = {}) {
  const boss = await startBoss();
  for (const name of Object.values(QUEUES)) {
    const handler = handlers[name];
    if (!handler) continue;
    // pg-boss waits out the polling interval between fetches even when work is waiting, so one job
    // per fetch would cap a queue at two a second.
    await boss.work(name, { batchSize: HEAVY.has(name) ? 1 : 10, pollingIntervalSeconds: 0.5 }, (jobs) =>
      runBatch(jobs, handler, (id, error) => {
        console.error(`[jobs] ${name} ${id} failed: ${error.message}`);
        return boss.fail(name, id, error);
      }),
    );
  }
  // Once a day for every worker together: pg-boss keeps one schedule per name in the database.
  await boss.schedule(QUEUES.alertDigest, DIGEST_SCHEDULE, {}, { tz: "UTC" });
  // Photos stored before the hash changed scheme are hashed again, once, in the background.
  if (await queuePhotoRehashIfNeeded()) log("Queued photo-rehash for photos without a perceptual hash");
  log(`Worker listening on ${Object.keys(handlers).join(", ") || "no queues"}`);
  return { stop: () => boss.stop({ graceful: true, timeout: 10_000 }) };
}
