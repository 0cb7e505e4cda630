import { QueryTypes, type Transaction } from "sequelize";
import { z } from "zod";
import { sequelize } from "~/db.server";
import { Listing } from "~/models/index.server";
import { enqueue, QUEUES } from "~/services/jobs.server";
import { formatPrice, listingTitle } from "@shared/catalogue";
import { idSchema } from "@shared/ids";
import { appLink, sendNotice } from "./mail.server";
import { issueUnsubscribeUrl } from "./unsubscribe.server";

// Watchers hear when a watched unit's price drops, or it is sold or withdrawn. The change queues a
// job in its own transaction; the job reads the listing as it is when it runs (so a burst of edits is
// told as where it ended) and mails each watcher at most once per listing and kind per window.

export const NOTICE_WINDOW_HOURS = 12;

export const WatchNoticeJob = z.discriminatedUnion("kind", [
  z.object({ kind: z.literal("price_drop"), listingId: idSchema("listing"), wasMinor: z.number().int(), currency: z.string().length(3) }),
  z.object({ kind: z.literal("sold"), listingId: idSchema("listing") }),
  z.object({ kind: z.literal("withdrawn"), listingId: idSchema("listing") }),
]);
export type WatchNoticeJob = z.infer<typeof WatchNoticeJob>;
export type WatchNoticeKind = WatchNoticeJob["kind"];

/** Queues a watch notice with the change. The sale (escrow) calls this with "sold" in its transaction. */
export function queueWatchNotice(job: WatchNoticeJob, transaction: Transaction): Promise<string> {
  return enqueue(QUEUES.watchNotice, job, { transaction });
}

type PriceState = Pick<Listing, "status" | "priceMinor" | "currency">;

/** The seller's editor saved `after` over `before`: a live unit's lower price, in the same currency, is a drop. */
export async function noticePriceChange(listingId: string, before: PriceState, after: PriceState, transaction: Transaction) {
  if (after.status !== "live" || before.priceMinor === null || after.priceMinor === null) return;
  if (after.currency !== before.currency || after.priceMinor >= before.priceMinor) return;
  await queueWatchNotice({ kind: "price_drop", listingId, wasMinor: before.priceMinor, currency: before.currency }, transaction);
}

interface Watcher {
  id: string;
  email: string;
  display_name: string;
}

/** Whether the listing is still as the notice says; a notice overtaken by a later change is dropped. */
function stillTrue(job: WatchNoticeJob, listing: Listing): boolean {
  if (job.kind === "price_drop")
    return (
      listing.status === "live" && listing.currency === job.currency && listing.priceMinor !== null && listing.priceMinor < job.wasMinor
    );
  return listing.status === job.kind;
}

/** The worker's side: one mail to each watcher (never the seller) not told of this kind within the window. */
export async function deliverWatchNotice(data: unknown, _jobId?: string, now = new Date()): Promise<number> {
  const job = WatchNoticeJob.parse(data);
  const listing = await Listing.findByPk(job.listingId);
  if (!listing || !stillTrue(job, listing)) return 0;
  const watchers = await sequelize.query<Watcher>(
    `SELECT u.id, u.email, u.display_name FROM watches w JOIN users u ON u.id = w.user_id
      WHERE w.listing_id = :listingId AND u.id <> :sellerId AND u.status = 'active' AND u.watch_mail_stopped_at IS NULL
      ORDER BY w.created_at`,
    { replacements: { listingId: listing.id, sellerId: listing.sellerId }, type: QueryTypes.SELECT },
  );
  let sent = 0;
  let failure: Error | null = null;
  for (const watcher of watchers) {
    const claim = await claimNotice(watcher.id, listing, job.kind, now);
    if (!claim) continue;
    try {
      await mailWatcher(watcher, listing, job, now);
      sent++;
    } catch (error) {
      // Give the claim back so pg-boss's retry tries this watcher again; the others stay told.
      await sequelize.query(`DELETE FROM watch_notices WHERE id = :id`, { replacements: { id: claim } });
      failure ??= error instanceof Error ? error : new Error(String(error));
    }
  }
  if (failure) throw failure;
  return sent;
}

/** Records the notice unless one of this kind went to this watcher within the window; the watch row's lock orders racing jobs. */
async function claimNotice(userId: string, listing: Listing, kind: WatchNoticeKind, now: Date): Promise<string | null> {
  return sequelize.transaction(async (transaction) => {
    await sequelize.query(`SELECT 1 FROM watches WHERE user_id = :userId AND listing_id = :listingId FOR UPDATE`, {
      replacements: { userId, listingId: listing.id },
      transaction,
    });
    const rows = await sequelize.query<{ id: string }>(
      `INSERT INTO watch_notices (user_id, listing_id, kind, price_minor, currency, sent_at)
       SELECT :userId, :listingId, :kind, :price, :currency, :now
        WHERE NOT EXISTS (
          SELECT 1 FROM watch_notices WHERE user_id = :userId AND listing_id = :listingId AND kind = :kind
             AND sent_at > CAST(:now AS timestamptz) - make_interval(hours => :hours))
       RETURNING id`,
      {
        replacements: {
          userId,
          listingId: listing.id,
          kind,
          price: listing.priceMinor,
          currency: listing.currency,
          now,
          hours: NOTICE_WINDOW_HOURS,
        },
        type: QueryTypes.SELECT,
        transaction,
      },
    );
    return rows[0]?.id ?? null;
  });
}

function subjectAndLine(job: WatchNoticeJob, listing: Listing, title: string): { subject: string; line: string } {
  const price = listing.priceMinor === null ? "" : formatPrice(listing.priceMinor, listing.currency);
  switch (job.kind) {
    case "price_drop": {
      const was = formatPrice(job.wasMinor, job.currency);
      return { subject: `Price drop: ${title}, now ${price}`, line: `The seller lowered the price of ${title} from ${was} to ${price}.` };
    }
    case "sold":
      return { subject: `Sold: ${title}`, line: `${title}, which you watch, has been sold.` };
    case "withdrawn":
      return {
        subject: `Withdrawn: ${title}`,
        line: `The seller took ${title}, which you watch, off the market. It stays on your watch list in case it returns.`,
      };
  }
}

async function mailWatcher(watcher: Watcher, listing: Listing, job: WatchNoticeJob, now: Date) {
  const title = listingTitle(listing.maker, listing.model);
  const { subject, line } = subjectAndLine(job, listing, title);
  const price = listing.priceMinor === null ? "" : formatPrice(listing.priceMinor, listing.currency);
  await sendNotice({
    to: watcher.email,
    subject,
    greeting: `Hello ${watcher.display_name},`,
    paragraphs: [line],
    groups: [
      { units: [{ title, href: appLink(`/listings/${listing.id}`), detail: job.kind === "price_drop" ? `Now ${price}` : subject }] },
    ],
    links: [
      { label: "Open the listing", href: appLink(`/listings/${listing.id}`) },
      { label: "Your watch list", href: appLink("/watching") },
    ],
    unsubscribe: {
      href: await issueUnsubscribeUrl(watcher.id, { kind: "watch" }, now),
      what: "You get this because you watch this unit on Loadline. To stop all e-mails about watched units:",
    },
  });
}
