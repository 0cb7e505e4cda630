import PgBoss from "pg-boss";
import type { Transaction } from "sequelize";
import { env } from "~/env.server";
import { sequelize } from "~/db.server";

// Background work goes through pg-boss in the same PostgreSQL database, so app servers stay
// stateless and any number of worker processes can share the queues.
export const QUEUES = {
  captureAnalyze: "capture-analyze",
  photoProcess: "photo-process",
  // Hashes again the photos stored before the perceptual hash changed scheme (queued at worker start).
  photoRehash: "photo-rehash",
  accountMail: "account-mail",
  // Keeping track (app/alerts): watchers' notices, spec-alert matching on publish, the daily digest.
  watchNotice: "watch-notice",
  alertMatch: "spec-alert-match",
  alertDigest: "spec-alert-digest",
  // Talking before buying (app/messages, app/offers): one mail per burst of messages, offer mails,
  // and each open offer's expiry (deferred to its expires_at).
  messageMail: "message-mail",
  offerMail: "offer-mail",
  offerExpiry: "offer-expiry",
  // Buying (app/orders): one deferred job per order deadline and the order mails; the provider's
  // side (app/payments): a recorded webhook event, paying the seller, refunding the buyer.
  orderDeadline: "order-deadline",
  orderMail: "order-mail",
  // A contest's photos re-encoded without their metadata (app/orders/contest-photos.server.ts).
  contestPhoto: "contest-photo",
  paymentEvent: "payment-event",
  orderRelease: "order-release",
  orderRefund: "order-refund",
  // The review desk (app/workshops): the applicant's mail about the desk's decision.
  workshopMail: "workshop-mail",
  // The review desk (app/desk): the mail to the person a moderator's action affects, one per audit record.
  deskMail: "desk-mail",
  // The seller's editor (app/listings/delete-draft.server.ts): a deleted draft's stored objects.
  draftStorageClean: "draft-storage-clean",
  // Working in bulk (app/imports): a workshop's CSV import written as drafts, all or nothing.
  listingImport: "listing-import",
} as const;
export type QueueName = (typeof QUEUES)[keyof typeof QUEUES];

const SHORT_QUEUES = new Set<string>([QUEUES.messageMail]);

declare global {
  var __loadlineBoss: Promise<PgBoss> | undefined;
}

async function startBoss(options: Partial<PgBoss.ConstructorOptions> = {}): Promise<PgBoss> {
  const boss = new PgBoss({ connectionString: env().databaseUrl, max: 4, ...options });
  boss.on("error", (error) => console.error("[jobs]", error));
  await boss.start();
  for (const name of Object.values(QUEUES)) {
    // 'short' queues hold one waiting job per singletonKey: a burst of messages is one mail job.
    const policy = SHORT_QUEUES.has(name) ? "short" : undefined;
    await boss.createQueue(name, { name, retryLimit: 2, retryDelay: 5, expireInSeconds: 300, ...(policy ? { policy } : {}) });
  }
  return boss;
}

// Web processes only send; the worker process (app/jobs/worker.server.ts) supervises and schedules.
export function getBoss(): Promise<PgBoss> {
  globalThis.__loadlineBoss ??= startBoss({ supervise: false, schedule: false }).catch((error) => {
    globalThis.__loadlineBoss = undefined;
    throw error;
  });
  return globalThis.__loadlineBoss;
}

/**
 * Queues a job. With `transaction`, the job is written in that transaction: it exists exactly when
 * the rows written beside it do, and a worker never sees it before they are committed.
 */
export async function enqueue(
  name: QueueName,
  data: object,
  { transaction, ...options }: PgBoss.SendOptions & { transaction?: Transaction } = {},
) {
  const boss = await getBoss();
  const id = await boss.send(name, data, transaction ? { ...options, db: transactionDb(transaction) } : options);
  if (!id) throw new Error(`Could not queue a ${name} job`);
  return id;
}

/**
 * Like enqueue, for a job with a singletonKey on a 'short' queue: when one with the same key is
 * already waiting, nothing is queued and the answer is null.
 */
export async function enqueueOnce(
  name: QueueName,
  data: object,
  { transaction, ...options }: PgBoss.SendOptions & { transaction?: Transaction; singletonKey: string },
): Promise<string | null> {
  const boss = await getBoss();
  return boss.send(name, data, transaction ? { ...options, db: transactionDb(transaction) } : options);
}

// pg-boss runs its insert through any executor; this one is our open transaction.
function transactionDb(transaction: Transaction) {
  return {
    executeSql: async (text: string, values: unknown[] = []) => {
      // pg reads undefined as NULL; Sequelize's bind wants it said.
      const bind = values.map((v) => (v === undefined ? null : v));
      const [rows] = await sequelize.query(text, { bind, transaction });
      return { rows };
    },
  };
}

export { startBoss };
