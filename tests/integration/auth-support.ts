import { randomBytes } from "node:crypto";

// Shared by the auth integration suites: unique addresses per run, so suites never collide with
// each other, the demo data or a previous run, and can clean up exactly what they made.
export const RUN = randomBytes(4).toString("hex");

export function testEmail(label: string): string {
  return `auth-it-${RUN}-${label}@example.test`;
}

export const TEST_EMAIL_PATTERN = `auth-it-${RUN}-%@example.test`;

export interface SentMail {
  to: string | string[];
  subject: string;
  text: string;
  html?: string;
}

/** The path+token of the first link to `prefix` in a captured message. */
export function linkToken(mail: SentMail | undefined, prefix: string): string {
  const match = mail?.text.match(new RegExp(`https?://[^\\s]+${prefix}([A-Za-z0-9_-]+)`));
  if (!match) throw new Error(`no ${prefix} link in ${mail?.subject ?? "(no mail)"}`);
  return match[1];
}

/**
 * Runs the account-mail jobs waiting in the queue, as the worker would (the integration suite runs
 * no worker). Returns how many ran.
 */
export async function deliverAccountMail(): Promise<number> {
  const { getBoss, QUEUES } = await import("~/services/jobs.server");
  const { deliverAccountMail: deliver } = await import("~/auth/account-mail-delivery.server");
  const boss = await getBoss();
  let ran = 0;
  for (;;) {
    const jobs = await boss.fetch<unknown>(QUEUES.accountMail, { batchSize: 20 });
    if (jobs.length === 0) return ran;
    for (const job of jobs) {
      await deliver(job.data);
      await boss.complete(QUEUES.accountMail, job.id);
      ran++;
    }
  }
}

/** Account-mail jobs queued (in any state) for an address or an account id. */
export async function accountMailJobs(key: { email: string } | { userId: string }): Promise<{ kind: string }[]> {
  const { sequelize } = await import("~/db.server");
  const [field, value] = "email" in key ? ["email", key.email] : ["userId", key.userId];
  const [rows] = await sequelize.query(
    `SELECT data FROM pgboss.job WHERE name = 'account-mail' AND data->>'${field}' = $1 ORDER BY created_on`,
    { bind: [value] },
  );
  return (rows as { data: { kind: string } }[]).map((r) => r.data);
}
