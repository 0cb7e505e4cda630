import { afterAll, beforeAll, describe, expect, it, vi } from "vitest";
import { MASK_TOKEN } from "@shared/contact-mask";
import { account, cleanUp, liveUnit, runQueue, type SentMail } from "./talk-support";

// Contact details typed before a sale never reach the other side: they are masked in what is stored,
// the message says it was, and the e-mail quotes the masked text. Once the buyer's order on the unit
// is funded (or later), the two may swap details.
const sent: SentMail[] = [];
vi.mock("~/services/mail.server", () => ({
  sendMail: async (mail: SentMail) => {
    sent.push(mail);
    return { messageId: `test-${sent.length}` };
  },
}));

const { sequelize } = await import("~/db.server");
const { openThread, conversation, sendMessage } = await import("~/messages/threads.server");
const { deliverMessageMail } = await import("~/messages/message-mail.server");
const { Message } = await import("~/models/message.server");
const { QUEUES } = await import("~/services/jobs.server");

let seller: Awaited<ReturnType<typeof account>>;
let ada: Awaited<ReturnType<typeof account>>;
const orders: string[] = [];

beforeAll(async () => {
  seller = await account("mask-seller", ["buyer", "seller"]);
  ada = await account("mask-ada");
});
afterAll(async () => {
  await runQueue(QUEUES.messageMail, deliverMessageMail);
  if (orders.length) await sequelize.query(`DELETE FROM orders WHERE id = ANY($1)`, { bind: [orders] });
  await cleanUp();
  await sequelize.close();
});

describe("before a sale", () => {
  it("stores and shows the message masked, says so, and mails the masked text", async () => {
    const unit = await liveUnit(seller.id);
    const thread = await openThread(ada.id, unit.id);
    sent.length = 0;
    const out = await sendMessage(
      ada.id,
      thread.id,
      "Cheaper if we skip the fees? Ring 07700 900123 or mail ada@example.test. It is the XR-7700 at 230 V 50 Hz?",
    );
    expect(out.masked).toBe(true);
    const stored = await Message.findByPk(out.id);
    expect(stored?.body).toBe(`Cheaper if we skip the fees? Ring ${MASK_TOKEN} or mail ${MASK_TOKEN}. It is the XR-7700 at 230 V 50 Hz?`);
    expect(stored?.masked).toBe(true);
    await runQueue(QUEUES.messageMail, deliverMessageMail);
    const mail = sent.find((m) => m.to === seller.email);
    expect(mail?.text).toContain(MASK_TOKEN);
    expect(mail?.text).not.toContain("900123");
    expect(mail?.text).not.toContain("ada@example.test");

    const seen = await conversation(seller.id, thread.id);
    expect(seen.thread.masking).toBe(true);
    const item = seen.items[0];
    expect(item.kind === "message" && item.masked && !item.body.includes("900123")).toBe(true);
  });

  it("leaves an ordinary message as typed", async () => {
    const unit = await liveUnit(seller.id);
    const thread = await openThread(ada.id, unit.id);
    const out = await sendMessage(ada.id, thread.id, "THD 0.05 % at 1 kHz into 8 Ω, as listed?");
    expect(out).toMatchObject({ masked: false, body: "THD 0.05 % at 1 kHz into 8 Ω, as listed?" });
  });
});

describe("after the buyer has paid", () => {
  it("stops masking once the buyer's order on the unit is funded, not while it is only reserved", async () => {
    const unit = await liveUnit(seller.id);
    const thread = await openThread(ada.id, unit.id);
    const [[order]] = (await sequelize.query(
      `INSERT INTO orders (listing_id, buyer_id, seller_id, state, currency, price_minor, delivery_method, delivery_zone, reserved_until)
       VALUES ($1, $2, $3, 'reserved', 'EUR', 48000, 'parcel', 'domestic', now() + interval '30 minutes') RETURNING id`,
      { bind: [unit.id, ada.id, seller.id] },
    )) as [{ id: string }[], unknown];
    orders.push(order.id);
    expect((await sendMessage(ada.id, thread.id, "Reserved: my number is 07700 900123")).masked).toBe(true);
    await sequelize.query(`UPDATE orders SET state = 'funded', funded_at = now() WHERE id = $1`, { bind: [order.id] });
    const after = await sendMessage(seller.id, thread.id, "Paid, thanks: collect from the workshop, call 07700 900456");
    expect(after).toMatchObject({ masked: false, body: "Paid, thanks: collect from the workshop, call 07700 900456" });
    expect((await conversation(ada.id, thread.id)).thread.masking).toBe(false);
  });
});
