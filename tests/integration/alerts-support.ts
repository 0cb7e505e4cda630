import { Listing, User } from "~/models/index.server";
import { Watch } from "~/models/watch.server";
import { madeAccounts } from "../support/made-accounts";

// Shared by the keeping-track suites: accounts and live listings made straight in the database, the
// jobs run by hand as the worker would (the integration suite runs no worker), and clean-up.

const made = madeAccounts("alerts");
export const RUN = made.run;
export const { account, liveAmplifier, cleanUp } = made;

export interface SentMail {
  to: string | string[];
  subject: string;
  text: string;
  html?: string;
  headers?: Record<string, string>;
}

export async function watch(user: User, listing: Listing) {
  await Watch.create({ userId: user.id, listingId: listing.id });
}

/** Jobs of a queue waiting for a worker, for these listings (their data as queued). */
export async function queued(queue: string, listingIds: string[]): Promise<Record<string, unknown>[]> {
  const { sequelize } = await import("~/db.server");
  const [rows] = await sequelize.query(
    `SELECT data FROM pgboss.job WHERE name = $1 AND state = 'created' AND data->>'listingId' = ANY($2) ORDER BY created_on`,
    { bind: [queue, listingIds] },
  );
  return (rows as { data: Record<string, unknown> }[]).map((r) => r.data);
}

/** Runs a queue's waiting jobs through `handler` as the worker would; returns how many ran. */
export async function runJobs(queue: string, handler: (data: unknown) => Promise<unknown>): Promise<number> {
  const { getBoss } = await import("~/services/jobs.server");
  const boss = await getBoss();
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

export function recipients(mails: SentMail[]): string[] {
  return mails.flatMap((m) => (Array.isArray(m.to) ? m.to : [m.to])).sort();
}

/** The token of the first unsubscribe link in a mail's text. */
export function unsubscribeToken(mail: SentMail): string {
  const m = /\/unsubscribe\/([A-Za-z0-9_-]{43})/.exec(mail.text);
  if (!m) throw new Error(`no unsubscribe link in "${mail.subject}"`);
  return m[1];
}
