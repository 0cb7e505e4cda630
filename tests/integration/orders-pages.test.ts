import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { isData, routeArgs } from "../support/route-args";
import { signedInCookie } from "../support/sessions";
import { testClock } from "../support/clock";
import { cast, liveUnit, orderIn, person } from "./orders-support";

// The buying pages through their route modules, as the server calls them: who reaches which order
// (anyone else's is a 404), what each side's forms refuse and the message they put beside the field,
// the checkout's reservation and redirect to the provider's hosted page, the desk's decision and the
// admin's settings.

const { sequelize } = await import("~/db.server");
const { Order, Listing } = await import("~/models/index.server");
const { marketplaceSettings, updateMarketplaceSettings } = await import("~/orders/settings.server");
const checkout = await import("~/routes/buying/checkout");
const purchases = await import("~/routes/buying/purchases");
const purchase = await import("~/routes/buying/purchase");
const sales = await import("~/routes/buying/sales");
const sale = await import("~/routes/buying/sale");
const deskOrder = await import("~/routes/desk/order");
const desk = await import("~/routes/desk/desk");
const settings = await import("~/routes/admin/settings");
const listingPage = await import("~/routes/listings/listing");

const BASE = "http://127.0.0.1";
const clock = testClock(new Date());

type Outcome = { status: number; body?: any; location?: string | null };
async function run(fn: () => Promise<unknown>): Promise<Outcome> {
  let value: unknown;
  try {
    value = await fn();
  } catch (thrown) {
    value = thrown;
  }
  if (value instanceof Response) return { status: value.status, location: value.headers.get("Location") };
  if (isData(value)) return { status: value.init?.status ?? 200, body: value.data };
  return { status: 200, body: value };
}

function get<P extends Record<string, string>>(path: string, params: P, cookie?: string) {
  return routeArgs(new Request(BASE + path, { headers: cookie ? { Cookie: cookie } : {} }), params);
}
function post<P extends Record<string, string>>(path: string, params: P, fields: Record<string, string>, cookie?: string) {
  const headers: Record<string, string> = { "Content-Type": "application/x-www-form-urlencoded", Origin: BASE };
  if (cookie) headers.Cookie = cookie;
  return routeArgs(new Request(BASE + path, { method: "POST", body: new URLSearchParams(fields), headers }), params);
}
const cookieOf = (u: { id: string }) => signedInCookie(u);

let savedSettings: Awaited<ReturnType<typeof marketplaceSettings>>;
beforeAll(async () => {
  savedSettings = await marketplaceSettings();
});
afterAll(async () => {
  await updateMarketplaceSettings(savedSettings, savedSettings.updatedBy ?? (await person("settings-restorer", ["admin"])).id);
  await sequelize.close();
});

describe("Buy on the listing page", () => {
  it("offers Buy to a buyer, and says why not to the seller, for a seller without payouts and for a reserved unit", async () => {
    const c = await cast();
    const buyer = await run(() => listingPage.loader(get(`/listings/${c.listing.id}`, { id: c.listing.id }, undefined)));
    expect(buyer.body.buy).toEqual({ kind: "buy", href: `/checkout/${c.listing.id}` });
    const own = await run(async () => listingPage.loader(get(`/listings/${c.listing.id}`, { id: c.listing.id }, await cookieOf(c.seller))));
    expect(own.body.buy.kind).toBe("blocked");
    expect(own.body.buy.reason).toMatch(/your listing/);

    const unconnected = await person("unconnected", ["seller"], false);
    const unit = await liveUnit(unconnected.id);
    const blocked = await run(() => listingPage.loader(get(`/listings/${unit.id}`, { id: unit.id })));
    expect(blocked.body.buy.reason).toMatch(/payout account/);

    const { c: other, order } = await orderIn("reserved", clock);
    const holder = await run(async () =>
      listingPage.loader(get(`/listings/${other.listing.id}`, { id: other.listing.id }, await cookieOf(other.buyer))),
    );
    expect(holder.body.buy).toEqual({ kind: "continue", href: `/purchases/${order.id}` });
    const stranger = await run(async () =>
      listingPage.loader(get(`/listings/${other.listing.id}`, { id: other.listing.id }, await cookieOf(other.stranger))),
    );
    expect(stranger.body.buy.reason).toMatch(/^Reserved/);
  });
});

describe("checkout", () => {
  it("sends a visitor to sign in and back", async () => {
    const c = await cast();
    const out = await run(() => checkout.loader(get(`/checkout/${c.listing.id}`, { listingId: c.listing.id })));
    expect(out.status).toBe(302);
    expect(out.location).toBe(`/sign-in?redirectTo=${encodeURIComponent(`/checkout/${c.listing.id}`)}`);
  });

  it("lists the delivery for the buyer's zone with each total, and refuses a delivery the seller does not offer there", async () => {
    const c = await cast();
    const cookie = await cookieOf(c.buyer);
    const page = await run(() => checkout.loader(get(`/checkout/${c.listing.id}?zone=nearby`, { listingId: c.listing.id }, cookie)));
    expect(page.status).toBe(200);
    expect(page.body.choices.map((x: { method: string; totalMinor: number }) => [x.method, x.totalMinor])).toEqual([
      ["collection", 48_000],
      ["parcel", 52_000],
    ]);
    const far = await run(() => checkout.loader(get(`/checkout/${c.listing.id}?zone=worldwide`, { listingId: c.listing.id }, cookie)));
    expect(far.body.choices.map((x: { method: string }) => x.method)).toEqual(["collection"]);

    const refused = await run(() =>
      checkout.action(
        post(`/checkout/${c.listing.id}`, { listingId: c.listing.id }, { zone: "worldwide", deliveryMethod: "parcel" }, cookie),
      ),
    );
    expect(refused.status).toBe(400);
    expect(refused.body.errors.deliveryMethod).toMatch(/does not offer this delivery/);
    expect(await Order.count({ where: { listingId: c.listing.id } })).toBe(0);
  });

  it("reserves the unit and sends the buyer to the provider's hosted page; a second buyer is told it is reserved", async () => {
    const c = await cast();
    const out = await run(async () =>
      checkout.action(
        post(
          `/checkout/${c.listing.id}`,
          { listingId: c.listing.id },
          { zone: "domestic", deliveryMethod: "parcel" },
          await cookieOf(c.buyer),
        ),
      ),
    );
    expect(out.status).toBe(302);
    expect(out.location).toMatch(/\/checkout\/pay\/cs_/);
    const order = await Order.findOne({ where: { listingId: c.listing.id }, rejectOnEmpty: true });
    expect(order).toMatchObject({ state: "reserved", buyerId: c.buyer.id, priceMinor: 48_000, deliveryMinor: 2_500 });
    expect(order.checkoutSessionId).toMatch(/^cs_/);
    expect((await Listing.findByPk(c.listing.id))?.status).toBe("reserved");

    const second = await run(async () =>
      checkout.action(
        post(
          `/checkout/${c.listing.id}`,
          { listingId: c.listing.id },
          { zone: "domestic", deliveryMethod: "parcel" },
          await cookieOf(c.stranger),
        ),
      ),
    );
    expect(second.status).toBe(409);
    expect(second.body.errors.form).toBeTruthy();
    // Back on the checkout, the buyer holding it goes on to their purchase.
    const again = await run(async () =>
      checkout.loader(get(`/checkout/${c.listing.id}`, { listingId: c.listing.id }, await cookieOf(c.buyer))),
    );
    expect(again.location).toBe(`/purchases/${order.id}`);
  });
});

describe("purchases and sales", () => {
  it("shows the buyer their order waiting for the provider; anyone else gets a 404", async () => {
    const { c, order } = await orderIn("reserved", clock);
    const mine = await run(async () =>
      purchase.loader(get(`/purchases/${order.id}?paid=1`, { orderId: order.id }, await cookieOf(c.buyer))),
    );
    expect(mine.status).toBe(200);
    expect(mine.body.paid).toBe(true);
    expect(mine.body.view.state).toBe("reserved");
    expect(mine.body.view.next.yours).toBe(true);
    // A redirect back from the provider changed nothing.
    expect((await Order.findByPk(order.id))?.state).toBe("reserved");
    for (const who of [c.stranger, c.seller, c.moderator]) {
      const other = await run(async () => purchase.loader(get(`/purchases/${order.id}`, { orderId: order.id }, await cookieOf(who))));
      expect(other.status).toBe(404);
    }
    const notSeller = await run(async () => sale.loader(get(`/sales/${order.id}`, { orderId: order.id }, await cookieOf(c.buyer))));
    expect(notSeller.status).toBe(404);
    const list = await run(async () => purchases.loader(get("/purchases", {}, await cookieOf(c.buyer))));
    expect(list.body.orders.map((o: { id: string }) => o.id)).toEqual([order.id]);
    const none = await run(async () => purchases.loader(get("/purchases", {}, await cookieOf(c.stranger))));
    expect(none.body.orders).toEqual([]);
  });

  it("the ship form refuses an empty tracking number with the message by the field, and keeps what was typed", async () => {
    const { c, order } = await orderIn("funded", clock);
    const cookie = await cookieOf(c.seller);
    const out = await run(() =>
      sale.action(
        post(`/sales/${order.id}`, { orderId: order.id }, { intent: "ship", carrier: "Palletline Freight", trackingNumber: " " }, cookie),
      ),
    );
    expect(out.status).toBe(400);
    expect(Object.keys(out.body.errors)).toEqual(["trackingNumber"]);
    expect(out.body.errors.trackingNumber).toBe("Type the tracking number the carrier gave you.");
    expect(out.body.values.carrier).toBe("Palletline Freight");
    expect((await Order.findByPk(order.id))?.state).toBe("funded");

    const shipped = await run(() =>
      sale.action(
        post(
          `/sales/${order.id}`,
          { orderId: order.id },
          { intent: "ship", carrier: "Palletline Freight", trackingNumber: "PLF-00417" },
          cookie,
        ),
      ),
    );
    expect(shipped).toMatchObject({ status: 302, location: `/sales/${order.id}` });
    expect(await Order.findByPk(order.id)).toMatchObject({ state: "shipped", carrier: "Palletline Freight", trackingNumber: "PLF-00417" });
  });

  it("a stranger cannot ship someone else's sale, and the buyer cannot ship at all", async () => {
    const { c, order } = await orderIn("funded", clock);
    const fields = { intent: "ship", carrier: "Parcelwise", trackingNumber: "PW1" };
    for (const who of [c.stranger, c.buyer]) {
      const out = await run(async () => sale.action(post(`/sales/${order.id}`, { orderId: order.id }, fields, await cookieOf(who))));
      expect(out.status).toBe(404);
    }
    expect((await Order.findByPk(order.id))?.state).toBe("funded");
  });

  it("the seller cannot confirm arrival; the buyer can, which opens the audition window; accepting releases", async () => {
    const { c, order } = await orderIn("shipped", clock);
    const asSeller = await run(async () =>
      sale.action(post(`/sales/${order.id}`, { orderId: order.id }, { intent: "arrived" }, await cookieOf(c.seller))),
    );
    expect(asSeller.status).toBe(400);
    const sellerOnBuyersPage = await run(async () =>
      purchase.action(post(`/purchases/${order.id}`, { orderId: order.id }, { intent: "arrived" }, await cookieOf(c.seller))),
    );
    expect(sellerOnBuyersPage.status).toBe(404);
    expect((await Order.findByPk(order.id))?.state).toBe("shipped");

    const buyerCookie = await cookieOf(c.buyer);
    const arrived = await run(() =>
      purchase.action(post(`/purchases/${order.id}`, { orderId: order.id }, { intent: "arrived" }, buyerCookie)),
    );
    expect(arrived).toMatchObject({ status: 302, location: `/purchases/${order.id}` });
    expect((await Order.findByPk(order.id))?.state).toBe("audition");

    // Twice is refused with a message, not an error page.
    const again = await run(() =>
      purchase.action(post(`/purchases/${order.id}`, { orderId: order.id }, { intent: "arrived" }, buyerCookie)),
    );
    expect(again.status).toBe(409);
    expect(again.body.errors.form).toBeTruthy();
  });

  it("lists the seller's sales with whose move it is; /sales is for sellers", async () => {
    const { c, order } = await orderIn("funded", clock);
    const list = await run(async () => sales.loader(get("/sales", {}, await cookieOf(c.seller))));
    const row = list.body.orders.find((o: { id: string }) => o.id === order.id);
    expect(row.next.yours).toBe(true);
    expect(list.body.payouts.enabled).toBe(true);
    const buyer = await run(async () => sales.loader(get("/sales", {}, await cookieOf(c.buyer))));
    expect(buyer.status).toBe(403);
  });
});

describe("the desk's contested order", () => {
  it("is for moderators; a decision needs a note, and a part refund less than the whole", async () => {
    const { c, order } = await orderIn("contested", clock);
    const refusedRole = await run(async () =>
      deskOrder.loader(get(`/desk/orders/${order.id}`, { orderId: order.id }, await cookieOf(c.buyer))),
    );
    expect(refusedRole.status).toBe(403);
    const cookie = await cookieOf(c.moderator);
    const page = await run(() => deskOrder.loader(get(`/desk/orders/${order.id}`, { orderId: order.id }, cookie)));
    expect(page.body.contest.reason).toBe("Left channel hums.");
    const queue = await run(() => desk.loader(get("/desk", {}, cookie)));
    const contested = queue.body.items.filter((i: { kind: string }) => i.kind === "contested_order");
    expect(contested.map((i: { subject: { id: string } }) => i.subject.id)).toContain(order.id);

    const path = `/desk/orders/${order.id}`;
    const noNote = await run(() =>
      deskOrder.action(post(path, { orderId: order.id }, { resolution: "refund_part", amount: "100", note: "" }, cookie)),
    );
    expect(noNote.status).toBe(400);
    expect(Object.keys(noNote.body.errors)).toEqual(["note"]);
    const tooMuch = await run(() =>
      deskOrder.action(
        post(path, { orderId: order.id }, { resolution: "refund_part", amount: "505", note: "More than was paid, on purpose." }, cookie),
      ),
    );
    expect(tooMuch.body.errors.amount).toMatch(/whole refund/);
    expect((await Order.findByPk(order.id))?.state).toBe("contested");

    const done = await run(() =>
      deskOrder.action(
        post(
          path,
          { orderId: order.id },
          { resolution: "refund_part", amount: "144", note: "Hum confirmed on the left channel; 30 % back." },
          cookie,
        ),
      ),
    );
    expect(done).toMatchObject({ status: 302, location: path });
    const after = await Order.findByPk(order.id, { rejectOnEmpty: true });
    expect(after.state).not.toBe("contested");
    const missing = await run(() => deskOrder.loader(get(`/desk/orders/${crypto.randomUUID()}`, { orderId: crypto.randomUUID() }, cookie)));
    expect(missing.status).toBe(404);
  });
});

describe("the admin's marketplace settings", () => {
  it("is the admin's alone; errors come back by field and nothing is saved; a good form saves", async () => {
    const admin = await person("settings-admin", ["admin"]);
    const moderator = await person("settings-moderator", ["moderator"]);
    const cookie = await cookieOf(admin);
    expect((await run(async () => settings.loader(get("/admin/settings", {}, await cookieOf(moderator))))).status).toBe(403);
    const page = await run(() => settings.loader(get("/admin/settings", {}, cookie)));
    const values: Record<string, string> = { ...page.body.values };

    const bad = await run(() =>
      settings.action(post("/admin/settings", {}, { ...values, feePercent: "8,555", auditionDays: "0" }, cookie)),
    );
    expect(bad.status).toBe(400);
    expect(Object.keys(bad.body.errors).sort()).toEqual(["auditionDays", "feePercent"]);
    expect(bad.body.values.auditionDays).toBe("0");
    expect((await marketplaceSettings()).auditionDays).toBe(savedSettings.auditionDays);

    const good = await run(() =>
      settings.action(post("/admin/settings", {}, { ...values, feePercent: "7.5", "minimum.GBP": "2.50", auditionDays: "4" }, cookie)),
    );
    expect(good.body).toEqual({ kind: "saved" });
    const stored = await marketplaceSettings();
    expect(stored).toMatchObject({ feeBasisPoints: 750, auditionDays: 4, updatedBy: admin.id });
    expect(stored.feeMinimumMinor.GBP).toBe(250);
  });
});
