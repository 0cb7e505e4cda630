import { afterAll, beforeAll, beforeEach, describe, expect, it, vi } from "vitest";
import type { Role } from "~/auth/roles";
import { account, cleanUp, liveAmplifier, queued, recipients, runJobs, unsubscribeToken, watch, type SentMail } from "./alerts-support";

// Watchers hear of a price drop, a sale and a withdrawal: each watcher once, never the seller, not on
// a rise, and a burst of edits is one mail. Changes go through the seller's own services; the job
// runs as the worker would run it.
const sent: SentMail[] = [];
vi.mock("~/services/mail.server", () => ({
  sendMail: async (mail: SentMail) => {
    sent.push(mail);
    return { messageId: `test-${sent.length}` };
  },
}));

const { sequelize } = await import("~/db.server");
const { saveItem, withdrawListing } = await import("~/listings/drafts.server");
const { deliverWatchNotice, queueWatchNotice, NOTICE_WINDOW_HOURS } = await import("~/alerts/watch-notices.server");
const { unsubscribe } = await import("~/alerts/unsubscribe.server");
const { Watch } = await import("~/models/watch.server");
const { enqueue, QUEUES } = await import("~/services/jobs.server");
const { loadListingPage } = await import("~/listings/public.server");

const run = (now?: Date) => runJobs(QUEUES.watchNotice, (data) => deliverWatchNotice(data, undefined, now));

let seller: Awaited<ReturnType<typeof account>>;
let ada: Awaited<ReturnType<typeof account>>;
let bo: Awaited<ReturnType<typeof account>>;

beforeAll(async () => {
  seller = await account("seller", ["buyer", "seller"]);
  ada = await account("ada");
  bo = await account("bo");
  await run(); // whatever an earlier suite left
});
beforeEach(() => {
  sent.length = 0;
});
afterAll(async () => {
  await cleanUp();
  await sequelize.close();
});

/** A live unit watched by Ada and Bo, and (as no page allows, but a row could say) by its own seller. */
async function watchedUnit() {
  const listing = await liveAmplifier(seller.id);
  await watch(ada, listing);
  await watch(bo, listing);
  await Watch.create({ userId: seller.id, listingId: listing.id });
  return listing;
}

describe("price drops", () => {
  it("the editor's lower price queues one job in its transaction; the job mails each watcher once, not the seller", async () => {
    const listing = await watchedUnit();
    await saveItem(listing.id, seller.id, { priceMinor: 42_000 });
    expect(await queued(QUEUES.watchNotice, [listing.id])).toEqual([
      { kind: "price_drop", listingId: listing.id, wasMinor: 48_000, currency: "EUR" },
    ]);
    expect(await run()).toBe(1);
    expect(recipients(sent)).toEqual([ada.email, bo.email].sort());
    const mail = sent[0];
    expect(mail.subject).toBe(`Price drop: Fenwold Acoustics ${listing.model}, now €420`);
    expect(mail.text).toContain("from €480 to €420");
    expect(mail.text).toMatch(new RegExp(`https?://[^\\s]+/listings/${listing.id}\\b`));
    expect(mail.text).toMatch(/https?:\/\/[^\s]+\/watching\b/);
    const token = unsubscribeToken(mail);
    expect(mail.headers?.["List-Unsubscribe"]).toMatch(/^<https?:\/\/[^>]+\/unsubscribe\/[A-Za-z0-9_-]{43}>$/);
    expect(mail.headers?.["List-Unsubscribe-Post"]).toBe("List-Unsubscribe=One-Click");
    expect(mail.html).toContain(`/unsubscribe/${token}`);
  });

  it("a rise, an unchanged price or a change of currency mails nobody", async () => {
    const listing = await watchedUnit();
    await saveItem(listing.id, seller.id, { priceMinor: 52_000 });
    await saveItem(listing.id, seller.id, { priceMinor: 52_000, offersWelcome: false });
    // Fewer minor units, but pounds: not comparable in the listing's own currency.
    await saveItem(listing.id, seller.id, { priceMinor: 40_000, currency: "GBP" });
    expect(await queued(QUEUES.watchNotice, [listing.id])).toEqual([]);
    await run();
    expect(sent).toEqual([]);
  });

  it("a burst of lower prices is one mail per watcher, with the price where it ended; after the window a new drop mails again", async () => {
    const listing = await watchedUnit();
    for (const price of [46_000, 45_000, 43_500]) await saveItem(listing.id, seller.id, { priceMinor: price });
    expect(await queued(QUEUES.watchNotice, [listing.id])).toHaveLength(3);
    await run();
    expect(recipients(sent)).toEqual([ada.email, bo.email].sort());
    expect(sent[0].subject).toMatch(/now €435$/);

    sent.length = 0;
    await saveItem(listing.id, seller.id, { priceMinor: 41_000 });
    await run(new Date(Date.now() + (NOTICE_WINDOW_HOURS - 1) * 3_600_000));
    expect(sent).toEqual([]);
    await saveItem(listing.id, seller.id, { priceMinor: 40_000 });
    await run(new Date(Date.now() + (NOTICE_WINDOW_HOURS + 1) * 3_600_000));
    expect(recipients(sent)).toEqual([ada.email, bo.email].sort());
  });

  it("a drop undone before the job runs mails nobody", async () => {
    const listing = await watchedUnit();
    await saveItem(listing.id, seller.id, { priceMinor: 40_000 });
    await saveItem(listing.id, seller.id, { priceMinor: 48_000 });
    await run();
    expect(sent).toEqual([]);
  });

  it("a watcher who used the unsubscribe link hears no more; the others still do", async () => {
    const first = await watchedUnit();
    await saveItem(first.id, seller.id, { priceMinor: 40_000 });
    await run();
    const adas = sent.find((m) => m.to === ada.email)!;
    expect(await unsubscribe(unsubscribeToken(adas))).toEqual({ kind: "watch", stopped: true });

    sent.length = 0;
    const second = await watchedUnit();
    await saveItem(second.id, seller.id, { priceMinor: 40_000 });
    await run();
    expect(recipients(sent)).toEqual([bo.email]);
    await sequelize.query(`UPDATE users SET watch_mail_stopped_at = NULL WHERE id = :id`, { replacements: { id: ada.id } });
  });
});

describe("sold and withdrawn", () => {
  it("withdrawing queues a notice with the change; each watcher gets one mail, the seller none", async () => {
    const listing = await watchedUnit();
    await withdrawListing(listing.id, seller.id);
    expect(await queued(QUEUES.watchNotice, [listing.id])).toEqual([{ kind: "withdrawn", listingId: listing.id }]);
    await run();
    expect(recipients(sent)).toEqual([ada.email, bo.email].sort());
    expect(sent[0].subject).toBe(`Withdrawn: Fenwold Acoustics ${listing.model}`);
    // The mail's link works for a watcher (the page says it was withdrawn); anyone else still gets nothing.
    const page = (viewer: { id: string; roles: Role[] }) => loadListingPage({ id: listing.id, viewer });
    expect((await page({ id: ada.id, roles: ["buyer"] }))?.listing.status).toBe("withdrawn");
    const stranger = await account("stranger");
    expect(await page({ id: stranger.id, roles: ["buyer"] })).toBeNull();
  });

  // No sale exists yet (escrow comes later): the sale will mark the unit sold and call queueWatchNotice
  // in its transaction, as done here by hand.
  it("a sale queued with its change mails each watcher once; a rolled-back sale queues nothing", async () => {
    const listing = await watchedUnit();
    await sequelize
      .transaction(async (transaction) => {
        await listing.update({ status: "sold" }, { transaction });
        await queueWatchNotice({ kind: "sold", listingId: listing.id }, transaction);
        throw new Error("payment failed");
      })
      .catch(() => undefined);
    expect(await queued(QUEUES.watchNotice, [listing.id])).toEqual([]);

    await listing.reload();
    await sequelize.transaction(async (transaction) => {
      await listing.update({ status: "sold" }, { transaction });
      await queueWatchNotice({ kind: "sold", listingId: listing.id }, transaction);
    });
    // The same notice queued twice (a retried sale) is still one mail each.
    await enqueue(QUEUES.watchNotice, { kind: "sold", listingId: listing.id });
    await run();
    expect(recipients(sent)).toEqual([ada.email, bo.email].sort());
    expect(sent[0].subject).toBe(`Sold: Fenwold Acoustics ${listing.model}`);
  });

  it("a notice the listing no longer bears out (withdrawn, then published again) is dropped", async () => {
    const listing = await watchedUnit();
    await withdrawListing(listing.id, seller.id);
    await (await listing.reload()).update({ status: "live" });
    await run();
    expect(sent).toEqual([]);
  });
});
