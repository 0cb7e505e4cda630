import { afterAll, beforeAll, beforeEach, describe, expect, it, vi } from "vitest";
import { testClock } from "../support/clock";
import { account, cleanUp, hours, liveUnit, recipients, runQueue, waiting, type SentMail } from "./talk-support";

// An open offer expires at its deadline through a deferred 'offer-expiry' job that re-reads the row:
// not a moment early, not after it was answered, and both sides hear. Time moves by passing `now`.
const sent: SentMail[] = [];
vi.mock("~/services/mail.server", () => ({
  sendMail: async (mail: SentMail) => {
    sent.push(mail);
    return { messageId: `test-${sent.length}` };
  },
}));

const { sequelize } = await import("~/db.server");
const { makeOffer, answerOffer, expireOffer } = await import("~/offers/offers.server");
const { deliverOfferMail } = await import("~/offers/offer-mail.server");
const { Offer } = await import("~/models/offer.server");
const { QUEUES } = await import("~/services/jobs.server");

let seller: Awaited<ReturnType<typeof account>>;
let ada: Awaited<ReturnType<typeof account>>;

beforeAll(async () => {
  seller = await account("ex-seller", ["buyer", "seller"]);
  ada = await account("ex-ada");
  await runQueue(QUEUES.offerMail, deliverOfferMail);
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

describe("offer expiry", () => {
  it("queues a job for the deadline that expires the offer then, and not before", async () => {
    const unit = await liveUnit(seller.id);
    const clock = testClock(t0);
    const made = await makeOffer({ id: ada.id, roles: ["buyer"] }, { listingId: unit.id, amountMinor: 40_000, currency: "EUR" }, clock);
    const jobs = await waiting(QUEUES.offerExpiry, "offerId", made.offerId);
    expect(jobs).toHaveLength(1);
    expect(jobs[0].startAfter.getTime()).toBe(at(48).getTime());

    clock.advance(hours(47));
    expect(await expireOffer({ offerId: made.offerId }, clock)).toBe(false);
    expect((await Offer.findByPk(made.offerId))?.state).toBe("open");
    clock.advance(hours(1));
    expect(await expireOffer({ offerId: made.offerId }, clock)).toBe(true);
    expect((await Offer.findByPk(made.offerId))?.state).toBe("expired");
    // Run again (a retried job): nothing more.
    clock.advance(hours(1));
    expect(await expireOffer({ offerId: made.offerId }, clock)).toBe(false);

    await runQueue(QUEUES.offerMail, deliverOfferMail);
    const expiredMails = sent.filter((m) => m.subject.startsWith("Offer expired"));
    expect(recipients(expiredMails)).toEqual([ada.email, seller.email].sort());
  });

  it("leaves an answered offer alone when its job runs", async () => {
    const unit = await liveUnit(seller.id);
    const made = await makeOffer(
      { id: ada.id, roles: ["buyer"] },
      { listingId: unit.id, amountMinor: 40_000, currency: "EUR" },
      testClock(t0),
    );
    await answerOffer(seller.id, made.offerId, { action: "accept" }, clockAt(1));
    expect(await expireOffer({ offerId: made.offerId }, clockAt(48))).toBe(false);
    expect((await Offer.findByPk(made.offerId))?.state).toBe("accepted");
  });

  it("refuses an answer after the deadline even before the job has run, and records the lapse", async () => {
    const unit = await liveUnit(seller.id);
    const made = await makeOffer(
      { id: ada.id, roles: ["buyer"] },
      { listingId: unit.id, amountMinor: 40_000, currency: "EUR" },
      testClock(t0),
    );
    await expect(answerOffer(seller.id, made.offerId, { action: "accept" }, clockAt(48))).rejects.toMatchObject({
      status: 409,
      code: "offer_closed",
    });
    expect((await Offer.findByPk(made.offerId))?.state).toBe("expired");
  });
});
