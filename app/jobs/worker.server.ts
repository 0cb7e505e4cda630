import { QUEUES, startBoss } from "~/services/jobs.server";
import { handlers } from "./handlers.server";

export async function startWorker({ log = console.log }: { log?: (line: string) => void } = {}) {
  const boss = await startBoss();
  for (const name of Object.values(QUEUES)) {
    const handler = handlers[name];
    if (!handler) continue;
    await boss.work(name, { batchSize: 1, pollingIntervalSeconds: 0.5 }, async ([job]) => {
      if (job) await handler(job.data, job.id);
    });
  }
  log(`Worker listening on ${Object.keys(handlers).join(", ") || "no queues"}`);
  return { stop: () => boss.stop({ graceful: true, timeout: 10_000 }) };
}
