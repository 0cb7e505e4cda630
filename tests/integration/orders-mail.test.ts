import { afterAll, beforeEach, describe, expect, it, vi } from "vitest";

// Order mails: each transition queues one 'order-mail' job per side it tells, in its own transaction;
// the job words the mail from the timeline row it was queued for, in the notices' layout, without an
// unsubscribe link (it is about the reader's own order). Heavy units carry the two-person caution, and
// the audition mail the receiving-safely cautions. Each event and side is mailed once, however often its job runs.
interface SentMail {
  to: string;
  subject: string;
  text: string;
  html: string;
  headers?: Record<string, string>;
}
const sent: SentMail[] = [];
let sendFails = false;
vi.mock("~/services/mail.server", () => ({
  sendMail: async (mail: SentMail) => {
    if (sendFails) throw new Error("mail server down");
    sent.push(mail);
    return { messageId: `test-${sent.length}` };
  },
}));

const { sequelize } = await import("~/db.server");
const { QUEUES } = await import("~/services/jobs.server");
const t = await import("~/orders/transitions.server");
const { deliverOrderMail } = await import("~/orders/mail.server");
const { testClock } = await import("../support/clock");
const { cast, fund, jobsFor, liveUnit, reserve } = await import("./orders-support");

afterAll(() => sequelize.close());
beforeEach(() => void (sent.length = 0));

const done = new Set<string>();
/** Delivers this order's mail jobs not yet delivered, as the worker would. */
async function deliver(orderId: string): Promise<SentMail[]> {
  const from = sent.length;
  for (const job of await jobsFor(QUEUES.orderMail, orderId)) {
    if (done.has(job.id)) continue;
    done.add(job.id);
    await deliverOrderMail(job.data);
  }
  return sent.slice(from);
}

describe("order mails along the path", () => {
  it("tell both sides at each step, with the heavy-unit and receiving cautions where they belong", async () => {
    const clock = testClock();
    const c = await cast();
    c.listing = await liveUnit(c.seller.id, { weightG: 32_000 });
    const order = await reserve(c, clock);
    expect(await deliver(order.id)).toEqual([]);

    await fund(order, clock);
    const paid = await deliver(order.id);
    expect(paid.map((m) => m.to).sort()).toEqual([c.buyer.email, c.seller.email].sort());
    const toSeller = paid.find((m) => m.to === c.seller.email)!;
    expect(toSeller.subject).toMatch(/^Sold, ship by 1 Jan 2027, 10:00 UTC: Brannock Audio/);
    expect(toSeller.text).toContain("two people");
    expect(toSeller.text).toContain(`/sales/${order.id}`);
    expect(toSeller.headers ?? {}).not.toHaveProperty("List-Unsubscribe");
    expect(toSeller.text).not.toMatch(/unsubscribe/i);
    expect(paid.find((m) => m.to === c.buyer.email)!.text).toContain("Your payment of €505 is held");

    await t.markShipped(order.id, c.seller.id, { carrier: "Parcelwise", trackingNumber: "PW777" }, clock);
    const shipped = await deliver(order.id);
    const toBuyer = shipped.find((m) => m.to === c.buyer.email)!;
    expect(toBuyer.text).toContain("PW777");
    expect(toBuyer.text).toContain("two people");
    expect(toBuyer.text).toContain(`/purchases/${order.id}`);

    await t.confirmArrival(order.id, c.buyer.id, clock);
    const audition = await deliver(order.id);
    expect(audition).toHaveLength(2);
    const opened = audition.find((m) => m.to === c.buyer.email)!;
    expect(opened.subject).toMatch(/audition window is open/);
    expect(opened.text).toMatch(/cold/);
    expect(opened.text).toMatch(/dummy load/);
    expect(opened.text).toMatch(/qualified technician/);

    await t.acceptUnit(order.id, c.buyer.id, clock);
    const released = await deliver(order.id);
    expect(released.map((m) => m.subject).sort()).toEqual(
      [expect.stringMatching(/^Complete/), expect.stringMatching(/^Payment released/)].sort(),
    );
    expect(released.find((m) => m.to === c.seller.email)!.text).toContain("€40.40");

    await t.markReleased(order.id, { transferId: "tr_mail" }, clock);
    const payout = await deliver(order.id);
    expect(payout.map((m) => [m.to, m.subject.split(":")[0]])).toEqual([[c.seller.email, "Payout sent"]]);
  });

  it("a refused step queues no mail, and a mail for an unknown order sends nothing", async () => {
    const clock = testClock();
    const c = await cast();
    const order = await reserve(c, clock);
    const before = (await jobsFor(QUEUES.orderMail, order.id)).length;
    await expect(t.markShipped(order.id, c.seller.id, { carrier: "X", trackingNumber: "1" }, clock)).rejects.toThrow();
    expect(await jobsFor(QUEUES.orderMail, order.id)).toHaveLength(before);
    expect(await deliverOrderMail({ orderId: order.id, eventId: "00000000-0000-4000-8000-000000000000", to: "buyer" })).toBe(false);
    expect(sent).toEqual([]);
  });
});

describe("once per event and side", () => {
  it("a retried or doubled job sends nothing twice; a failed send leaves no mark and its retry sends", async () => {
    const clock = testClock();
    const c = await cast();
    const order = await reserve(c, clock);
    await fund(order, clock);
    const jobs = await jobsFor(QUEUES.orderMail, order.id);
    const toBuyer = jobs.find((j) => j.data.to === "buyer")!;
    const toSeller = jobs.find((j) => j.data.to === "seller")!;

    // The same job twice at once (a doubled job), then again (a retry after the send): one mail.
    const runs = await Promise.all([deliverOrderMail(toBuyer.data), deliverOrderMail(toBuyer.data)]);
    expect(runs.filter(Boolean)).toHaveLength(1);
    expect(await deliverOrderMail(toBuyer.data)).toBe(false);
    expect(sent.filter((m) => m.to === c.buyer.email)).toHaveLength(1);

    // The seller's side is its own mark: the buyer's mail does not stand for it.
    sendFails = true;
    await expect(deliverOrderMail(toSeller.data)).rejects.toThrow("mail server down");
    sendFails = false;
    expect(sent.filter((m) => m.to === c.seller.email)).toHaveLength(0);
    expect(await deliverOrderMail(toSeller.data)).toBe(true);
    expect(await deliverOrderMail(toSeller.data)).toBe(false);
    expect(sent.filter((m) => m.to === c.seller.email)).toHaveLength(1);
    for (const j of jobs) done.add(j.id);
  });
});
