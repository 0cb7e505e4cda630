import { afterAll, beforeAll, beforeEach, describe, expect, it, vi } from "vitest";
import { testClock } from "../support/clock";
import { account, cleanUp, hours, liveUnit, runQueue, type SentMail } from "./talk-support";

// Accepting one offer on a unit closes its other open offers: each becomes declined in the same
// transaction and its buyer gets one "Offer closed" mail. The seller's counter to another buyer closes
// too; an offer already past its time is left to its expiry job; another unit's offers are untouched.
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
const { Offer } = await import("~/models/offer.server");
const { QUEUES } = await import("~/services/jobs.server");

const mails = () => runQueue(QUEUES.offerMail, deliverOfferMail);

let seller: Awaited<ReturnType<typeof account>>;
const buyers: Awaited<ReturnType<typeof account>>[] = [];

beforeAll(async () => {
  seller = await account("close-seller", ["buyer", "seller"]);
  for (const name of ["ada", "bo", "cy", "di"]) buyers.push(await account(`close-${name}`));
  await mails();
});
beforeEach(() => void (sent.length = 0));
afterAll(async () => {
  await runQueue(QUEUES.offerExpiry, async () => undefined);
  await cleanUp();
  await sequelize.close();
});

const t0 = new Date();
const clockAt = (h: number) => testClock(new Date(t0.getTime() + hours(h)));
const offer = (buyerId: string, listingId: string, amountMinor: number, h: number) =>
  makeOffer({ id: buyerId, roles: ["buyer"] }, { listingId, amountMinor, currency: "EUR" }, clockAt(h));
const stateOf = async (id: string) => (await Offer.findByPk(id, { rejectOnEmpty: true })).state;

describe("accepting one offer", () => {
  it("declines the unit's other open offers and tells each of those buyers once", async () => {
    const [ada, bo, cy, di] = buyers;
    const unit = await liveUnit(seller.id);
    const elsewhere = await liveUnit(seller.id);
    const fromAda = await offer(ada.id, unit.id, 40_000, 0);
    const fromBo = await offer(bo.id, unit.id, 42_000, 1);
    // Cy's offer is answered with the seller's counter, which is then the open one between them.
    const fromCy = await offer(cy.id, unit.id, 38_000, 1);
    const counterToCy = await answerOffer(
      seller.id,
      fromCy.offerId,
      { action: "counter", amountMinor: 44_000, currency: "EUR" },
      clockAt(2),
    );
    // Di offered early; by the time of the acceptance her offer's 48 hours have run out (its expiry job has not run yet).
    const lapsed = await offer(di.id, unit.id, 30_000, -47);
    const onAnotherUnit = await offer(ada.id, elsewhere.id, 41_000, 1);
    await mails();
    sent.length = 0;

    const accepted = await answerOffer(seller.id, fromBo.offerId, { action: "accept" }, clockAt(3));
    expect(accepted.state).toBe("accepted");
    expect(await stateOf(fromAda.offerId)).toBe("declined");
    expect(await stateOf(counterToCy.offerId)).toBe("declined");
    expect(await stateOf(fromCy.offerId)).toBe("countered");
    expect(await stateOf(lapsed.offerId)).toBe("open");
    expect(await stateOf(onAnotherUnit.offerId)).toBe("open");
    const closedAda = await Offer.findByPk(fromAda.offerId, { rejectOnEmpty: true });
    expect(closedAda.decidedAt?.getTime()).toBe(clockAt(3).now().getTime());

    await mails();
    const closed = sent.filter((m) => m.subject.startsWith("Offer closed"));
    expect(closed.map((m) => m.to).sort()).toEqual([ada.email, cy.email].sort());
    expect(closed.find((m) => m.to === ada.email)?.text).toContain("€400");
    expect(closed.find((m) => m.to === cy.email)?.text).toContain("€440");
    // Bo and the seller hear of the acceptance; nobody else hears anything.
    expect(sent.filter((m) => m.subject.startsWith("Offer accepted")).map((m) => m.to)).toEqual(
      expect.arrayContaining([bo.email, seller.email]),
    );
    expect(sent.map((m) => m.to)).not.toContain(di.email);
    expect(sent).toHaveLength(4);

    // A closed offer can no longer be accepted by the seller.
    await expect(answerOffer(seller.id, fromAda.offerId, { action: "accept" }, clockAt(4))).rejects.toMatchObject({ code: "offer_closed" });
  });

  it("the buyer accepting the seller's counter closes the other buyers' offers too", async () => {
    const [ada, bo] = buyers;
    const unit = await liveUnit(seller.id);
    const fromAda = await offer(ada.id, unit.id, 40_000, 0);
    const fromBo = await offer(bo.id, unit.id, 41_000, 0);
    const counter = await answerOffer(seller.id, fromAda.offerId, { action: "counter", amountMinor: 45_000, currency: "EUR" }, clockAt(1));
    await mails();
    sent.length = 0;
    await answerOffer(ada.id, counter.offerId, { action: "accept" }, clockAt(2));
    expect(await stateOf(fromBo.offerId)).toBe("declined");
    await mails();
    expect(sent.filter((m) => m.subject.startsWith("Offer closed")).map((m) => m.to)).toEqual([bo.email]);
  });

  it("two acceptances on one unit at once: neither deadlocks, and one unit never has two accepted offers from them", async () => {
    const [ada, bo] = buyers;
    const unit = await liveUnit(seller.id);
    const fromAda = await offer(ada.id, unit.id, 40_000, 0);
    const fromBo = await offer(bo.id, unit.id, 41_000, 0);
    const counterToBo = await answerOffer(
      seller.id,
      fromBo.offerId,
      { action: "counter", amountMinor: 46_000, currency: "EUR" },
      clockAt(1),
    );
    const results = await Promise.allSettled([
      answerOffer(seller.id, fromAda.offerId, { action: "accept" }, clockAt(2)),
      answerOffer(bo.id, counterToBo.offerId, { action: "accept" }, clockAt(2)),
    ]);
    const ok = results.filter((r) => r.status === "fulfilled");
    expect(ok).toHaveLength(1);
    const refused = results.find((r) => r.status === "rejected");
    expect(refused && "reason" in refused ? refused.reason : null).toMatchObject({ code: "offer_closed" });
    const accepted = await Offer.count({ where: { listingId: unit.id, state: "accepted" } });
    expect(accepted).toBe(1);
    await mails();
  });
});
