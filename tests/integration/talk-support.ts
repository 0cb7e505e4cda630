import type { CreationAttributes } from "sequelize";
import type { Listing } from "~/models/index.server";
import { madeAccounts } from "../support/made-accounts";

// Shared by the messages and offers suites: accounts and live listings made straight in the
// database, and clean-up (threads, messages and offers go with their listing).

const made = madeAccounts("talk");
export const RUN = made.run;
export const { account, cleanUp } = made;

/** A live amplifier of `sellerId`'s at €480 that welcomes offers, unless told otherwise. */
export function liveUnit(sellerId: string, extra: Partial<CreationAttributes<Listing>> = {}): Promise<Listing> {
  return made.liveAmplifier(sellerId, { offersWelcome: true, ...extra });
}

export const hours = (h: number) => h * 3_600_000;

export interface SentMail {
  to: string | string[];
  subject: string;
  text: string;
  html?: string;
}

/**
 * Runs a queue's jobs as the worker would, including those deferred to later (their start is moved
 * to now first: the suite moves time, it does not wait). Returns how many ran.
 */
export async function runQueue(queue: string, handler: (data: unknown) => Promise<unknown>): Promise<number> {
  const { sequelize } = await import("~/db.server");
  const { getBoss } = await import("~/services/jobs.server");
  // Started first: on a fresh database pg-boss makes its schema as it starts.
  const boss = await getBoss();
  await sequelize.query(`UPDATE pgboss.job SET start_after = now() WHERE name = $1 AND state = 'created'`, { bind: [queue] });
  let ran = 0;
  for (;;) {
    const jobs = await boss.fetch<unknown>(queue, { batchSize: 20 });
    if (jobs.length === 0) return ran;
    for (const job of jobs) {
      await handler(job.data);
      await boss.complete(queue, job.id);
      ran++;
    }
  }
}

/** Jobs waiting in a queue whose data has `key` = `value`, with when each may start. */
export async function waiting(
  queue: string,
  key: string,
  value: string,
): Promise<{ data: Record<string, unknown>; startAfter: Date; singletonKey: string | null }[]> {
  const { sequelize } = await import("~/db.server");
  const [rows] = await sequelize.query(
    `SELECT data, start_after, singleton_key FROM pgboss.job WHERE name = $1 AND state = 'created' AND data->>$2 = $3 ORDER BY created_on`,
    { bind: [queue, key, value] },
  );
  return (rows as { data: Record<string, unknown>; start_after: Date; singleton_key: string | null }[]).map((r) => ({
    data: r.data,
    startAfter: new Date(r.start_after),
    singletonKey: r.singleton_key,
  }));
}

export function recipients(mails: SentMail[]): string[] {
  return mails.flatMap((m) => (Array.isArray(m.to) ? m.to : [m.to])).sort();
}
