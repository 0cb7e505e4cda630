import { QueryTypes } from "sequelize";
import { sequelize } from "~/db.server";
import { Listing, User, Workshop } from "~/models/index.server";
import type { Clock } from "~/orders/clock.server";
import * as t from "~/orders/transitions.server";
import { answerReview, writeReview } from "~/reputation/reviews.server";
import { DEMO_ACCOUNTS, DEMO_UNITS, type AccountKey, type DemoUnit } from "./demo-data";

// Completed sales for the demo: enough released orders of three models for their listing pages to
// show the sold-price index, and reviews (some answered) for the sellers' pages. Each sale is walked
// through the real order steps (reserve, paid, shipped, arrived, accepted, paid out) with a clock set
// in the past, so its timeline and ledger are those of a real sale and balance to zero. The provider
// ids are the demo's own (no charge exists at the payments stand-in for them; `npm run reconcile`
// names these orders). The mails and payout jobs those steps queue are dropped: the demo's history
// is not news. Idempotent: a sale whose unit exists (by seller and serial number) is left as it is.

const DAY = 86_400_000;

interface DemoSale {
  serial: string;
  seller: AccountKey;
  buyer: AccountKey;
  /** The demo unit whose maker, model and details (and bench sheet, when `sheet`) the sold unit shares. */
  like: string;
  price: number;
  sheet: boolean;
  soldDaysAgo: number;
  review?: { rating: number; body: string; answer?: string };
}

export const DEMO_SALES: DemoSale[] = [
  {
    serial: "SOLD-CW46-0101",
    seller: "workshop",
    buyer: "buyer",
    like: "CW-46I-017924",
    price: 640,
    sheet: true,
    soldDaysAgo: 120,
    review: {
      rating: 5,
      body: "Measured exactly as the bench sheet said when I checked it with my own dummy load. Packed in a double box with corner blocks.",
      answer: "Thank you. Enjoy it, and keep the vents clear.",
    },
  },
  {
    serial: "SOLD-CW46-0102",
    seller: "workshop",
    buyer: "buyer2",
    like: "CW-46I-017924",
    price: 710,
    sheet: true,
    soldDaysAgo: 90,
    review: {
      rating: 4,
      body: "Lovely unit, as described. Took a day longer to ship than the handling time said, but I was told in advance.",
    },
  },
  {
    serial: "SOLD-CW46-0103",
    seller: "workshop",
    buyer: "buyer",
    like: "CW-46I-017924",
    price: 675,
    sheet: true,
    soldDaysAgo: 60,
    review: { rating: 5, body: "Second amplifier from this workshop. Same care, same honest figures." },
  },
  {
    serial: "SOLD-CW46-0104",
    seller: "seller",
    buyer: "buyer2",
    like: "CW-46I-017924",
    price: 480,
    sheet: false,
    soldDaysAgo: 45,
    review: {
      rating: 3,
      body: "Works, but the balance control crackles more than the note suggested. Fair price for what it is.",
      answer: "Sorry about the crackle: it was quiet here. A little contact cleaner sorts it.",
    },
  },
  {
    serial: "SOLD-VT35-0201",
    seller: "seller",
    buyer: "buyer",
    like: "VT-35-553190",
    price: 225,
    sheet: false,
    soldDaysAgo: 100,
    review: { rating: 4, body: "Friendly seller, quick answers, unit as described." },
  },
  { serial: "SOLD-VT35-0202", seller: "seller", buyer: "buyer2", like: "VT-35-553190", price: 250, sheet: false, soldDaysAgo: 70 },
  {
    serial: "SOLD-VT35-0203",
    seller: "workshop",
    buyer: "buyer",
    like: "VT-35-553190",
    price: 310,
    sheet: true,
    soldDaysAgo: 50,
    review: { rating: 5, body: "Serviced properly and the figures on the sheet hold up. Worth the extra over an unserviced one." },
  },
  {
    serial: "SOLD-QVT3-0301",
    seller: "workshop3",
    buyer: "buyer",
    like: "QV-T3-118070",
    price: 395,
    sheet: true,
    soldDaysAgo: 110,
    review: { rating: 5, body: "Speed spot on with my strobe disc, new belt fitted, arm set up. Arrived on a pallet, well strapped." },
  },
  {
    serial: "SOLD-QVT3-0302",
    seller: "workshop3",
    buyer: "buyer2",
    like: "QV-T3-118070",
    price: 440,
    sheet: true,
    soldDaysAgo: 80,
    review: {
      rating: 4,
      body: "Very good deck. The lid has a scratch the photos did not show.",
      answer: "You are right, we missed it under the lights; we have refunded the difference we agreed by message.",
    },
  },
  { serial: "SOLD-QVT3-0303", seller: "workshop3", buyer: "buyer", like: "QV-T3-118070", price: 360, sheet: false, soldDaysAgo: 30 },
];

/** A clock for one sale's steps: starts at `at` and moves forward as the steps are taken. */
function walkClock(at: number): Clock & { advance(ms: number): void } {
  let now = at;
  return { now: () => new Date(now), advance: (ms) => void (now += ms) };
}

export async function seedDemoSales(
  ensureListing: (unit: DemoUnit, users: Record<AccountKey, string>, workshops: Partial<Record<AccountKey, string>>) => Promise<boolean>,
  log: (line: string) => void = console.warn,
): Promise<{ created: number }> {
  const users = await accountIds();
  if (!users) return { created: 0 };
  const workshops = Object.fromEntries(
    (await Workshop.findAll({ where: { ownerId: Object.values(users) }, attributes: ["id", "ownerId"] })).map((w) => [
      (Object.keys(users) as AccountKey[]).find((k) => users[k] === w.ownerId)!,
      w.id,
    ]),
  ) as Partial<Record<AccountKey, string>>;
  let created = 0;
  for (const sale of DEMO_SALES) {
    const sellerId = users[sale.seller];
    if (await Listing.findOne({ where: { sellerId, serialNumber: sale.serial }, attributes: ["id"] })) continue;
    const seller = await User.findByPk(sellerId, { attributes: ["id", "payoutsEnabled", "payoutAccountId"] });
    // Without a payout account (the stand-in was down) a unit cannot be bought: the next start sells it.
    if (!seller?.payoutsEnabled || !seller.payoutAccountId) continue;
    const like = DEMO_UNITS.find((u) => u.serial === sale.like)!;
    const unit: DemoUnit = {
      ...like,
      serial: sale.serial,
      seller: sale.seller,
      price: sale.price,
      offers: false,
      sheet: sale.sheet ? like.sheet : undefined,
      log: undefined,
      photos: 0,
      status: "live",
      daysAgo: sale.soldDaysAgo + 9,
    };
    if (!(await ensureListing(unit, users, workshops))) continue;
    try {
      await sell(sale, users);
      created++;
    } catch (error) {
      // A unit that could not be sold must not sit in the market as a fresh live listing.
      await Listing.update({ status: "withdrawn" }, { where: { sellerId, serialNumber: sale.serial, status: "live" } });
      log(`The demo sale ${sale.serial} could not be completed: ${error instanceof Error ? error.message : String(error)}`);
    }
  }
  return { created };
}

async function accountIds(): Promise<Record<AccountKey, string> | null> {
  const rows = await User.findAll({ where: { email: DEMO_ACCOUNTS.map((a) => a.email) }, attributes: ["id", "email"] });
  const ids: Partial<Record<AccountKey, string>> = {};
  for (const a of DEMO_ACCOUNTS) {
    const row = rows.find((r) => r.email.toLowerCase() === a.email.toLowerCase());
    if (!row) return null;
    ids[a.key] = row.id;
  }
  return ids as Record<AccountKey, string>;
}

async function sell(sale: DemoSale, users: Record<AccountKey, string>): Promise<void> {
  const listing = await Listing.findOne({ where: { sellerId: users[sale.seller], serialNumber: sale.serial }, rejectOnEmpty: true });
  const buyerId = users[sale.buyer];
  const clock = walkClock(Date.now() - sale.soldDaysAgo * DAY - 6 * DAY);
  let order = await t.reserveUnit({ listingId: listing.id, buyerId, deliveryMethod: "collection", deliveryZone: "domestic" }, clock);
  clock.advance(4 * 60_000);
  const ref = `demo_${order.id.replace(/-/g, "").slice(0, 20)}`;
  order = await t.markFunded(
    order.id,
    { paymentIntentId: `pi_${ref}`, chargeId: `ch_${ref}`, amountMinor: order.totalMinor, currency: order.currency, eventId: `evt_${ref}` },
    clock,
  );
  clock.advance(DAY);
  await t.markShipped(order.id, users[sale.seller], { carrier: "Collected by the buyer", trackingNumber: "IN PERSON" }, clock);
  clock.advance(2 * 3_600_000);
  await t.confirmArrival(order.id, buyerId, clock);
  clock.advance(4 * DAY);
  await t.acceptUnit(order.id, buyerId, clock);
  clock.advance(3_600_000);
  await t.markReleased(order.id, { transferId: `tr_${ref}` }, clock);
  // The steps queued mails, deadlines, the payout and the watchers' notice: all settled already.
  await sequelize.query(`DELETE FROM pgboss.job WHERE data->>'orderId' = :orderId OR data->>'listingId' = :listingId`, {
    replacements: { orderId: order.id, listingId: listing.id },
    type: QueryTypes.DELETE,
  });
  if (sale.review) {
    clock.advance(DAY);
    const wrote = await writeReview(buyerId, order.id, { rating: String(sale.review.rating), body: sale.review.body }, clock);
    if (!wrote.ok) throw new Error(`the demo review was refused: ${JSON.stringify(wrote.errors)}`);
    if (sale.review.answer) {
      clock.advance(DAY / 2);
      const answered = await answerReview(users[sale.seller], order.id, { answer: sale.review.answer }, clock);
      if (!answered.ok) throw new Error(`the demo answer was refused: ${JSON.stringify(answered.errors)}`);
    }
  }
}
