import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { sequelize } from "~/db.server";
import { MessageThread } from "~/models/message-thread.server";
import { UNREAD_COUNT_SQL, unreadCount } from "~/messages/unread.server";
import { account, cleanUp, liveUnit } from "./talk-support";

// The header's badge: threads with something the user has not read, counted per side.

let seller: Awaited<ReturnType<typeof account>>;
let ada: Awaited<ReturnType<typeof account>>;

beforeAll(async () => {
  seller = await account("unread-seller", ["buyer", "seller"]);
  ada = await account("unread-ada");
});
afterAll(async () => {
  await cleanUp();
  await sequelize.close();
});

describe("unreadCount", () => {
  it("counts threads whose last message is later than the side's read mark", async () => {
    const t = new Date("2026-12-30T10:00:00Z");
    const later = new Date("2026-12-30T11:00:00Z");
    const [a, b, c] = [await liveUnit(seller.id), await liveUnit(seller.id), await liveUnit(seller.id)];
    // a: Ada wrote (her mark moved with it); the seller has not read it.
    await MessageThread.create({
      listingId: a.id,
      buyerId: ada.id,
      sellerId: seller.id,
      buyerReadAt: t,
      sellerReadAt: null,
      lastMessageAt: t,
    });
    // b: the seller answered after Ada last looked.
    await MessageThread.create({
      listingId: b.id,
      buyerId: ada.id,
      sellerId: seller.id,
      buyerReadAt: t,
      sellerReadAt: later,
      lastMessageAt: later,
    });
    // c: opened, nothing written yet.
    await MessageThread.create({
      listingId: c.id,
      buyerId: ada.id,
      sellerId: seller.id,
      buyerReadAt: null,
      sellerReadAt: null,
      lastMessageAt: null,
    });
    expect(await unreadCount(ada.id)).toBe(1);
    expect(await unreadCount(seller.id)).toBe(1);
    await MessageThread.update({ sellerReadAt: later }, { where: { listingId: a.id } });
    expect(await unreadCount(seller.id)).toBe(0);
  });

  it("reads the two partial unread indexes (its predicates match theirs)", async () => {
    const plan = await sequelize.transaction(async (transaction) => {
      // Forbid the table scan a near-empty table would get anyway, so the plan shows which index fits.
      await sequelize.query("SET LOCAL enable_seqscan = off", { transaction });
      const [rows] = await sequelize.query(`EXPLAIN (FORMAT JSON) ${UNREAD_COUNT_SQL}`, { bind: [ada.id], transaction });
      return JSON.stringify(rows);
    });
    expect(plan).toContain("message_threads_buyer_unread_idx");
    expect(plan).toContain("message_threads_seller_unread_idx");
  });
});
