import { QUEUES, startBoss } from "~/services/jobs.server";
import { DIGEST_SCHEDULE } from "~/alerts/digest.server";
import { handlers } from "./handlers.server";
import { queuePhotoRehashIfNeeded } from "~/photos/rehash.server";

export async function startWorker({ log = console.log }: { log?: (line: string) => void } = {}) {
  const boss = await startBoss();
  for (const name of Object.values(QUEUES)) {
    const handler = handlers[name];
    if (!handler) continue;
    await boss.work(name, { batchSize: 1, pollingIntervalSeconds: 0.5 }, async ([job]) => {
      if (job) await handler(job.data, job.id);
    });
  }
  // Once a day for every worker together: pg-boss keeps one schedule per name in the database.
  await boss.schedule(QUEUES.alertDigest, DIGEST_SCHEDULE, {}, { tz: "UTC" });
  // Photos stored before the hash changed scheme are hashed again, once, in the background.
  if (await queuePhotoRehashIfNeeded()) log("Queued photo-rehash for photos without a perceptual hash");
  log(`Worker listening on ${Object.keys(handlers).join(", ") || "no queues"}`);
  return { stop: () => boss.stop({ graceful: true, timeout: 10_000 }) };
}
