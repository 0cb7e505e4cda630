import { afterAll, beforeAll, beforeEach, describe, expect, it, vi } from "vitest";
import { testClock } from "../support/clock";
import { account, cleanUp, hours, liveUnit, recipients, runQueue, type SentMail } from "./talk-support";

// Offers from start to end: the buyer offers, the seller counters, the buyer accepts and may check
// out at that price for its window; declines, withdrawals and the checks on every amount. Time moves
// by passing `now`, never by waiting.
const sent: SentMail[] = [];
vi.mock("~/services/mail.server", () => ({
  sendMail: async (mail: SentMail) => {
    sent.push(mail);
    return { messageId: `test-${sent.length}` };
  },
}));

const { sequelize } = await import("~/db.server");
const { makeOffer, answerOffer } = await import("~/offers/offers.server");
const { deliverOfferMail } = await import("~/offers/offer-mail.server");
const { acceptedOfferFor } = await import("~/offers/accepted.server");
const { conversation } = await import("~/messages/threads.server");
const { Offer } = await import("~/models/offer.server");
const { QUEUES } = await import("~/services/jobs.server");

const mails = () => runQueue(QUEUES.offerMail, deliverOfferMail);

let seller: Awaited<ReturnType<typeof account>>;
let ada: Awaited<ReturnType<typeof account>>;
let bo: Awaited<ReturnType<typeof account>>;

beforeAll(async () => {
  seller = await account("of-seller", ["buyer", "seller"]);
  ada = await account("of-ada");
  bo = await account("of-bo");
  await mails();
});
beforeEach(() => {
  sent.length = 0;
});
afterAll(async () => {
  await runQueue(QUEUES.offerExpiry, async () => undefined);
  await cleanUp();
  await sequelize.close();
});

const t0 = new Date();
const at = (h: number) => new Date(t0.getTime() + hours(h));
const clockAt = (h: number) => testClock(at(h));
const offer = (buyer: { id: string; roles: ["buyer"] | string[] }, listingId: string, amountMinor: number, now = t0, currency = "EUR") =>
  makeOffer({ id: buyer.id, roles: ["buyer"] }, { listingId, amountMinor, currency }, testClock(now));

describe("offer, counter, accept", () => {
  it("walks the whole way, with the conversation and the mails at each step", async () => {
    const unit = await liveUnit(seller.id);
    const made = await offer(ada, unit.id, 40_000);
    expect(made.state).toBe("open");
    const first = await Offer.findByPk(made.offerId);
    expect(first?.expiresAt.getTime()).toBe(at(48).getTime());
    await mails();
    expect(recipients(sent)).toEqual([seller.email]);
    expect(sent[0].subject).toContain("€400");

    const countered = await answerOffer(seller.id, made.offerId, { action: "counter", amountMinor: 45_000, currency: "EUR" }, clockAt(2));
    await first?.reload();
    expect(first?.state).toBe("countered");
    const counter = await Offer.findByPk(countered.offerId);
    expect(counter).toMatchObject({ madeBy: "seller", parentOfferId: made.offerId, amountMinor: 45_000, state: "open" });
    expect(counter?.expiresAt.getTime()).toBe(at(50).getTime());
    sent.length = 0;
    await mails();
    expect(recipients(sent)).toEqual([ada.email]);

    // The seller cannot accept their own counter; the buyer can.
    await expect(answerOffer(seller.id, countered.offerId, { action: "accept" }, clockAt(3))).rejects.toMatchObject({ status: 403 });
    const accepted = await answerOffer(ada.id, countered.offerId, { action: "accept" }, clockAt(3));
    expect(accepted.state).toBe("accepted");
    await counter?.reload();
    expect(counter?.checkoutUntil?.getTime()).toBe(at(27).getTime());
    sent.length = 0;
    await mails();
    expect(recipients(sent)).toEqual([ada.email, seller.email].sort());

    // Checkout sees the accepted price for Ada only, inside its window.
    await sequelize.transaction(async (tx) => {
      expect(await acceptedOfferFor(unit.id, ada.id, at(26), tx)).toEqual({ offerId: countered.offerId, amountMinor: 45_000 });
      expect(await acceptedOfferFor(unit.id, ada.id, at(27), tx)).toBeNull();
      expect(await acceptedOfferFor(unit.id, bo.id, at(26), tx)).toBeNull();
    });

    // The offers are in the conversation, in order, with nothing left to do on them.
    const seen = await conversation(ada.id, made.threadId, clockAt(4));
    const offers = seen.items.filter((i) => i.kind === "offer");
    expect(offers.map((o) => (o.kind === "offer" ? [o.madeBy, o.amountMinor, o.state, o.actions] : null))).toEqual([
      ["buyer", 40_000, "countered", []],
      ["seller", 45_000, "accepted", []],
    ]);
    expect(seen.thread.canOffer).toBe(false);
  });

  it("lets the seller decline and the buyer withdraw, each telling the other side", async () => {
    const unit = await liveUnit(seller.id);
    const a = await offer(ada, unit.id, 30_000);
    await answerOffer(seller.id, a.offerId, { action: "decline" }, clockAt(1));
    expect((await Offer.findByPk(a.offerId))?.state).toBe("declined");
    const b = await offer(ada, unit.id, 35_000, at(2));
    await answerOffer(ada.id, b.offerId, { action: "withdraw" }, clockAt(3));
    expect((await Offer.findByPk(b.offerId))?.state).toBe("withdrawn");
    await mails();
    const steps = sent.map((m) => [m.to, m.subject.split(":")[0]]);
    expect(steps).toContainEqual([ada.email, "Offer declined"]);
    expect(steps).toContainEqual([seller.email, "Offer withdrawn"]);
  });
});

describe("who may answer", () => {
  it("gives a stranger a 404, the buyer a 403 on their own offer, and 409 offer_closed once it is answered", async () => {
    const unit = await liveUnit(seller.id);
    const made = await offer(ada, unit.id, 40_000);
    await expect(answerOffer(bo.id, made.offerId, { action: "decline" }, clockAt(1))).rejects.toMatchObject({ status: 404 });
    await expect(answerOffer(ada.id, made.offerId, { action: "accept" }, clockAt(1))).rejects.toMatchObject({ status: 403 });
    await expect(answerOffer(seller.id, made.offerId, { action: "withdraw" }, clockAt(1))).rejects.toMatchObject({ status: 403 });
    await answerOffer(seller.id, made.offerId, { action: "decline" }, clockAt(1));
    await expect(answerOffer(seller.id, made.offerId, { action: "accept" }, clockAt(2))).rejects.toMatchObject({
      status: 409,
      code: "offer_closed",
    });
  });

  it("refuses a counter that is not above the offer, or above the asking price", async () => {
    const unit = await liveUnit(seller.id);
    const made = await offer(ada, unit.id, 40_000);
    const counter = (amountMinor: number) =>
      answerOffer(seller.id, made.offerId, { action: "counter", amountMinor, currency: "EUR" }, clockAt(1));
    await expect(counter(40_000)).rejects.toMatchObject({ status: 400, issues: [{ path: "amountMinor" }] });
    await expect(counter(48_001)).rejects.toMatchObject({ status: 400, issues: [{ path: "amountMinor" }] });
    expect((await Offer.findByPk(made.offerId))?.state).toBe("open");
  });
});

describe("what may be offered", () => {
  it("checks the amount, the currency, the unit and the buyer", async () => {
    const unit = await liveUnit(seller.id);
    await expect(offer(ada, unit.id, 48_001)).rejects.toMatchObject({ status: 400, issues: [{ path: "amountMinor" }] });
    await expect(offer(ada, unit.id, 0)).rejects.toMatchObject({ status: 400, issues: [{ path: "amountMinor" }] });
    await expect(offer(ada, unit.id, 400.5)).rejects.toMatchObject({ status: 400, issues: [{ path: "amountMinor" }] });
    await expect(offer(ada, unit.id, 40_000, t0, "GBP")).rejects.toMatchObject({ status: 400, issues: [{ path: "currency" }] });
    await expect(offer(seller, unit.id, 40_000)).rejects.toMatchObject({ status: 409 });
    // The asking price itself is a fair offer.
    await expect(offer(ada, unit.id, 48_000)).resolves.toMatchObject({ state: "open" });
    // One open offer per buyer and unit.
    await expect(offer(ada, unit.id, 47_000)).rejects.toMatchObject({ status: 409 });
    await expect(offer(bo, unit.id, 47_000)).resolves.toMatchObject({ state: "open" });
  });

  it("refuses a unit whose seller takes no offers, one not live, and one the buyer may not see", async () => {
    const noOffers = await liveUnit(seller.id, { offersWelcome: false });
    await expect(offer(ada, noOffers.id, 40_000)).rejects.toMatchObject({ status: 409 });
    const sold = await liveUnit(seller.id, { status: "sold" });
    await expect(offer(ada, sold.id, 40_000)).rejects.toMatchObject({ status: 409 });
    const held = await liveUnit(seller.id, { status: "held", heldReason: "Figures to check." });
    await expect(offer(ada, held.id, 40_000)).rejects.toMatchObject({ status: 404 });
  });

  it("holds a second offer back while an accepted one can still be used", async () => {
    const unit = await liveUnit(seller.id);
    const made = await offer(ada, unit.id, 40_000);
    await answerOffer(seller.id, made.offerId, { action: "accept" }, clockAt(1));
    await expect(offer(ada, unit.id, 39_000, at(2))).rejects.toMatchObject({ status: 409 });
    // After the checkout window a new offer is welcome.
    await expect(offer(ada, unit.id, 39_000, at(26))).resolves.toMatchObject({ state: "open" });
  });
});
