import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { sequelize } from "~/db.server";
import { Offer } from "~/models/offer.server";
import { acceptedOfferFor, markOfferUsed, restoreOfferUse } from "~/offers/accepted.server";
import { account, cleanUp, hours, liveUnit } from "./talk-support";

// What checkout asks of offers: an accepted offer's price holds for its buyer only, only inside its
// checkout window, and once spent it is gone.

let seller: Awaited<ReturnType<typeof account>>;
let ada: Awaited<ReturnType<typeof account>>;
let bo: Awaited<ReturnType<typeof account>>;

beforeAll(async () => {
  seller = await account("acc-seller", ["buyer", "seller"]);
  ada = await account("acc-ada");
  bo = await account("acc-bo");
});
afterAll(async () => {
  await cleanUp();
  await sequelize.close();
});

const t0 = new Date("2026-12-30T10:00:00Z");

async function accepted(listingId: string, buyerId: string, amountMinor: number, state: "accepted" | "open" | "declined" = "accepted") {
  const done = state === "accepted";
  return Offer.create({
    listingId,
    buyerId,
    sellerId: seller.id,
    amountMinor,
    currency: "EUR",
    madeBy: "buyer",
    state,
    expiresAt: new Date(t0.getTime() + hours(48)),
    acceptedAt: done ? t0 : null,
    checkoutUntil: done ? new Date(t0.getTime() + hours(24)) : null,
  });
}

describe("acceptedOfferFor", () => {
  it("gives the accepted price inside the window, to that buyer only", async () => {
    const unit = await liveUnit(seller.id);
    const offer = await accepted(unit.id, ada.id, 42_000);
    await sequelize.transaction(async (tx) => {
      expect(await acceptedOfferFor(unit.id, ada.id, new Date(t0.getTime() + hours(23)), tx)).toEqual({
        offerId: offer.id,
        amountMinor: 42_000,
      });
      expect(await acceptedOfferFor(unit.id, bo.id, new Date(t0.getTime() + hours(1)), tx)).toBeNull();
    });
  });

  it("gives nothing once the checkout window has closed (the end itself included)", async () => {
    const unit = await liveUnit(seller.id);
    await accepted(unit.id, ada.id, 42_000);
    await sequelize.transaction(async (tx) => {
      expect(await acceptedOfferFor(unit.id, ada.id, new Date(t0.getTime() + hours(24)), tx)).toBeNull();
      expect(await acceptedOfferFor(unit.id, ada.id, new Date(t0.getTime() + hours(30)), tx)).toBeNull();
    });
  });

  it("gives nothing for an offer that is open or declined, or on another listing", async () => {
    const unit = await liveUnit(seller.id);
    const other = await liveUnit(seller.id);
    await accepted(unit.id, ada.id, 40_000, "open");
    await accepted(other.id, bo.id, 40_000, "declined");
    await accepted(other.id, ada.id, 41_000);
    await sequelize.transaction(async (tx) => {
      expect(await acceptedOfferFor(unit.id, ada.id, t0, tx)).toBeNull();
      expect(await acceptedOfferFor(other.id, bo.id, t0, tx)).toBeNull();
    });
  });
});

describe("markOfferUsed", () => {
  it("spends the offer once: a second use, or a use after it was spent, is refused", async () => {
    const unit = await liveUnit(seller.id);
    const offer = await accepted(unit.id, ada.id, 42_000);
    await sequelize.transaction((tx) => markOfferUsed(offer.id, tx));
    await offer.reload();
    expect(offer.state).toBe("used");
    await sequelize.transaction(async (tx) => {
      expect(await acceptedOfferFor(unit.id, ada.id, t0, tx)).toBeNull();
    });
    await expect(sequelize.transaction((tx) => markOfferUsed(offer.id, tx))).rejects.toMatchObject({ status: 409 });
  });

  it("refuses an offer that was never accepted", async () => {
    const unit = await liveUnit(seller.id);
    const offer = await accepted(unit.id, ada.id, 42_000, "open");
    await expect(sequelize.transaction((tx) => markOfferUsed(offer.id, tx))).rejects.toMatchObject({ status: 409 });
    await offer.reload();
    expect(offer.state).toBe("open");
  });
});

describe("restoreOfferUse", () => {
  it("gives a spent offer back inside its window only", async () => {
    const unit = await liveUnit(seller.id);
    const offer = await accepted(unit.id, ada.id, 42_000);
    await sequelize.transaction((tx) => markOfferUsed(offer.id, tx));
    expect(await sequelize.transaction((tx) => restoreOfferUse(offer.id, new Date(t0.getTime() + hours(24)), tx))).toBe(false);
    expect(await sequelize.transaction((tx) => restoreOfferUse(offer.id, new Date(t0.getTime() + hours(1)), tx))).toBe(true);
    await sequelize.transaction(async (tx) => {
      expect(await acceptedOfferFor(unit.id, ada.id, new Date(t0.getTime() + hours(2)), tx)).toEqual({
        offerId: offer.id,
        amountMinor: 42_000,
      });
    });
    // An offer that was never spent is not changed.
    const open = await accepted(unit.id, bo.id, 40_000, "open");
    expect(await sequelize.transaction((tx) => restoreOfferUse(open.id, t0, tx))).toBe(false);
  });
});
