import { afterAll, beforeAll, describe, expect, it } from "vitest";
import type { Browser, Page } from "playwright-core";
import { Listing, Order } from "~/models/index.server";
import { runDeadline } from "~/orders/deadlines.server";
import { figureField } from "~/orders/readings-form";
import { testClock } from "../support/clock";
import { toneWav } from "../support/capture-files";
import { twoToneJpeg, withExif } from "../support/photo-files";
import { launchBrowser, newContext } from "./support/browser";
import { DEMO, signIn } from "./support/accounts";
import { demoUnit, ledgerOf, mailsAbout, orderIdOf, payOnHostedPage, shot, shots, waitForState, type DemoUnit } from "./support/buying";

// The buying path in a browser with the demo accounts: the buyer (buyer@loadline.test) and the demo
// workshop (workshop@loadline.test, its payout account connected by the seed) on a fresh unit of the
// workshop's, the payments stand-in's hosted page with its test cards, the worker running the webhook
// events, deadlines, mails and payouts, and the local mail catcher. Screenshots of the checkout,
// purchase and sale pages at phone and desktop width go to /tmp/shots-pages.

const SELLER = "workshop@loadline.test";
const SUCCESS_CARD = "4242 4242 4242 4242";
const DECLINED_CARD = "4000 0000 0000 0002";

let browser: Browser;
beforeAll(async () => {
  browser = await launchBrowser();
});
afterAll(async () => {
  await browser?.close();
});

async function signedIn(email: string): Promise<Page> {
  const page = await (await newContext(browser)).newPage();
  await signIn(page, email);
  return page;
}

/** From the listing page through the checkout to the provider's page; returns after paying with `card`. */
async function buyAtListedPrice(buyer: Page, unit: DemoUnit, card: string | null, delivery = "Freight on a pallet") {
  await buyer.goto(`/listings/${unit.listing.id}`);
  await Promise.all([buyer.waitForURL(`**/checkout/${unit.listing.id}`), buyer.getByRole("link", { name: "Buy", exact: true }).click()]);
  await buyer.getByRole("radio", { name: new RegExp(delivery) }).check();
  await Promise.all([buyer.waitForURL(/\/checkout\/pay\/cs_/), buyer.getByRole("button", { name: "Reserve and pay" }).click()]);
  if (card) await payOnHostedPage(buyer, card);
}

async function ship(seller: Page, orderId: string) {
  await seller.goto(`/sales/${orderId}`);
  await seller.getByLabel("Carrier").fill("Palletline Freight");
  await seller.getByLabel("Tracking number").fill(`PLF-${orderId.slice(0, 6).toUpperCase()}`);
  await Promise.all([seller.waitForLoadState("load"), seller.getByRole("button", { name: "Mark as shipped" }).click()]);
  await waitForState(seller, `/sales/${orderId}`, "shipped");
}

async function confirmArrival(buyer: Page, orderId: string) {
  await buyer.goto(`/purchases/${orderId}`);
  await Promise.all([buyer.waitForLoadState("load"), buyer.getByRole("button", { name: "It has arrived" }).click()]);
  await waitForState(buyer, `/purchases/${orderId}`, "audition");
}

/** The sheet's power figure into 8 Ω, as the buyer types it: the listed value times `factor`. */
function powerReading(unit: DemoUnit, factor: number) {
  const powers = unit.figures.filter((x) => x.quantity === "output_power");
  const f = powers.find((x) => x.conditions.loadOhm === 8) ?? powers[0];
  if (!f) throw new Error(`the demo sheet has no power figure: ${unit.figures.map((x) => x.quantity).join(", ")}`);
  return { field: figureField(f.ref), text: `${Number((f.value * factor).toPrecision(4))} W` };
}

describe("buying in the browser", () => {
  it("offer, counter, accept, pay, ship, confirm arrival, re-measure and accept: the seller is paid, every mail is sent, the ledger balances", async () => {
    const unit = await demoUnit();
    const buyer = await signedIn(DEMO.buyer);
    const seller = await signedIn(SELLER);

    // The buyer offers €1,000 on a €1,200 unit; the seller counters at €1,100; the buyer accepts.
    await buyer.goto(`/listings/${unit.listing.id}`);
    await Promise.all([buyer.waitForURL(/\/messages\/[0-9a-f-]{36}/), buyer.getByRole("button", { name: "Make an offer" }).click()]);
    const thread = buyer.url().split("#")[0];
    await buyer.getByLabel("Your offer").fill("1000");
    await Promise.all([buyer.waitForLoadState("load"), buyer.getByRole("button", { name: "Make the offer" }).click()]);
    await seller.goto(thread);
    await seller.getByLabel("Counter-offer").fill("1100");
    await Promise.all([seller.waitForLoadState("load"), seller.getByRole("button", { name: "Counter", exact: true }).click()]);
    await buyer.goto(thread);
    await Promise.all([buyer.waitForLoadState("load"), buyer.getByRole("button", { name: "Accept", exact: true }).click()]);
    await buyer.getByRole("link", { name: "Buy at this price" }).click();

    // Checkout at the accepted price, paid on the stand-in's page with the success card.
    await buyer.waitForURL(`**/checkout/${unit.listing.id}`);
    await buyer.getByText("Your accepted offer").waitFor();
    await shots(buyer, "checkout");
    // The browser's en-GB puts the buyer in the seller's "rest of the world" zone: freight is offered there.
    await buyer.getByRole("radio", { name: /Freight on a pallet/ }).check();
    await Promise.all([buyer.waitForURL(/\/checkout\/pay\/cs_/), buyer.getByRole("button", { name: "Reserve and pay" }).click()]);
    await payOnHostedPage(buyer, SUCCESS_CARD);
    await buyer.waitForURL(/\/purchases\/[0-9a-f-]{36}\?paid=1/);
    const orderId = orderIdOf(buyer.url());
    await waitForState(buyer, `/purchases/${orderId}`, "funded");
    const order = await Order.findByPk(orderId, { rejectOnEmpty: true });
    expect(order.priceMinor).toBe(110_000);
    expect(order.deliveryMinor).toBe(42_000);
    await shots(buyer, "purchase-funded");

    // The seller ships; the buyer confirms arrival, re-measures (it matches) and accepts.
    await seller.goto(`/sales/${orderId}`);
    await shots(seller, "sale-to-ship");
    await ship(seller, orderId);
    await confirmArrival(buyer, orderId);
    await shots(buyer, "purchase-audition");
    const reading = powerReading(unit, 1);
    await buyer.locator(`input[name="${reading.field}"]`).first().fill(reading.text);
    await Promise.all([buyer.waitForLoadState("load"), buyer.getByRole("button", { name: "Accept the unit" }).click()]);
    await waitForState(buyer, `/purchases/${orderId}`, "released");

    // The payout reaches the seller's list once the transfer is made.
    const deadline = Date.now() + 45_000;
    for (;;) {
      await seller.goto("/sales");
      if (await seller.getByTestId("payouts").getByText(unit.title).count()) break;
      if (Date.now() > deadline) throw new Error("the payout never appeared on /sales");
      await seller.waitForTimeout(500);
    }
    await shots(seller, "sales-payout");
    await seller.goto(`/sales/${orderId}`);
    await seller.getByText("Paid out to you").waitFor();
    await shots(seller, "sale-released");

    // Every step's mail, to both sides.
    await mailsAbout(DEMO.buyer, unit.title, [
      /^A counter-offer/,
      /^Offer accepted/,
      /^Paid/,
      /^On its way/,
      /^Your audition window is open/,
      /^Complete/,
    ]);
    await mailsAbout(SELLER, unit.title, [
      /^An offer of/,
      /^Offer accepted/,
      /^Sold, ship by/,
      /^Shipment recorded/,
      /^Arrived/,
      /^(Payment released|Payout sent)/,
    ]);

    const ledger = await ledgerOf(orderId);
    expect(ledger.total).toBe(0);
    expect(ledger.unbalanced).toBe(0);
    expect(ledger.kinds).toEqual(expect.arrayContaining(["buyer_payment", "platform_fee", "seller_payable", "transfer"]));
    expect((await Listing.findByPk(unit.listing.id))?.status).toBe("sold");
  }, 300_000);

  it("a contest with a photo, a capture and a re-measurement showing 30 % less power ends in a part refund by a moderator, on the trail", async () => {
    const unit = await demoUnit({ weightG: 31_500 });
    const buyer = await signedIn(DEMO.buyer);
    const seller = await signedIn(SELLER);
    await buyAtListedPrice(buyer, unit, SUCCESS_CARD, "Freight on a pallet");
    await buyer.waitForURL(/\/purchases\/[0-9a-f-]{36}\?paid=1/);
    const orderId = orderIdOf(buyer.url());
    await waitForState(buyer, `/purchases/${orderId}`, "funded");
    await seller.goto(`/sales/${orderId}`);
    await seller
      .getByText(/Heavy unit/)
      .first()
      .waitFor();
    await shots(seller, "sale-heavy-to-ship");
    await ship(seller, orderId);
    await confirmArrival(buyer, orderId);

    await buyer.getByText("Something wrong? Contest the order").click();
    await buyer.getByLabel("It measures worse than its bench sheet").check();
    await buyer.getByLabel("In your words").fill("Into 8 Ω it clips well below the sheet's figure: about 30 % less power at 1 kHz.");
    const reading = powerReading(unit, 0.7);
    const contestForm = buyer.locator("form", { has: buyer.getByRole("button", { name: "Contest the order" }) });
    await contestForm.locator(`input[name="${reading.field}"]`).fill(reading.text);
    // A photo (with a camera's location in it) and a capture: 60 W into 8 Ω at 1 kHz with ten times the sheet's THD+N.
    const photo = withExif(await twoToneJpeg(320, 240), { orientation: 1, gps: true });
    await contestForm.locator('input[name="photos"]').setInputFiles({ name: "clipping.jpg", mimeType: "image/jpeg", buffer: photo });
    const wav = toneWav({
      sampleRate: 48_000,
      seconds: 1,
      f0: 1000,
      peak: (Math.sqrt(480) * Math.SQRT2) / 40,
      harmonics: [1, 0.002],
      bits: "24",
      channels: 1,
    });
    await contestForm
      .locator('input[name="capture"]')
      .setInputFiles({ name: "left-60w.wav", mimeType: "audio/wav", buffer: Buffer.from(wav) });
    await contestForm.locator('input[name="capture.volts"]').fill("40");
    await contestForm.locator('input[name="capture.loadOhm"]').fill("8");
    await contestForm.locator('select[name="capture.channel"]').selectOption("left");
    await Promise.all([buyer.waitForLoadState("load"), buyer.getByRole("button", { name: "Contest the order" }).click()]);
    await waitForState(buyer, `/purchases/${orderId}`, "contested");

    const moderator = await signedIn(DEMO.moderator);
    await moderator.goto("/desk");
    // The desk lists the contested order and links to its screen.
    const deskLink = moderator.locator(`a[href="/desk/orders/${orderId}"]`);
    expect(await deskLink.innerText()).toContain(unit.title);
    // The worker strips the photo and analyses the capture; the screen shows both once done.
    const ready = Date.now() + 60_000;
    for (;;) {
      await moderator.goto(`/desk/orders/${orderId}`);
      const done = await moderator.locator('[data-testid="contest-captures"] li[data-status="done"]').count();
      const photos = await moderator.locator('[data-testid="contest-photos"] img').count();
      if (done && photos) break;
      if (Date.now() > ready) throw new Error(`capture analysed: ${done}, photos ready: ${photos}`);
      await moderator.waitForTimeout(500);
    }
    await moderator.getByTestId("claim-banner").getByText("You have taken this item").waitFor();
    await moderator.locator('[data-outcome="outside"]').first().waitFor();
    // The moderator opens the photo through its short-lived link: a JPEG without the camera's metadata.
    const href = await moderator.locator('[data-testid="contest-photos"] a').first().getAttribute("href");
    const opened = await moderator.context().request.get(href!);
    expect(opened.status()).toBe(200);
    expect(opened.headers()["content-type"]).toBe("image/jpeg");
    expect(Buffer.from(await opened.body()).includes(Buffer.from("Exif"))).toBe(false);
    // The same link opens nothing for the seller.
    expect((await seller.context().request.get(href!)).status()).toBe(404);
    // The buyer sees their own photo on their order, through a link of their own.
    await buyer.goto(`/purchases/${orderId}`);
    const own = buyer.getByRole("img", { name: "Your photo 1" });
    await own.waitFor();
    const ownHref = (await own.getAttribute("src"))!;
    expect(ownHref).not.toBe(href);
    expect((await buyer.context().request.get(ownHref)).status()).toBe(200);
    await shots(moderator, "desk-contested");
    await moderator.getByLabel("Refund the buyer in part").check();
    await moderator.getByLabel("Part refund (EUR)").fill("360");
    await moderator.getByLabel("Note").fill("The buyer's reading is 30 % under the sheet's power into 8 Ω; 30 % of the price goes back.");
    await Promise.all([moderator.waitForLoadState("load"), moderator.getByRole("button", { name: "Record the decision" }).click()]);
    await moderator.getByText("The buyer's reading is 30 % under").first().waitFor();
    // The order's trail shows the decision with its note.
    const trail = moderator.getByTestId("audit-trail");
    await trail.getByText("Refunded the order").waitFor();
    await trail.getByText("The buyer's reading is 30 % under").waitFor();
    await shots(moderator, "desk-contest-decided");

    const deadline = Date.now() + 45_000;
    for (;;) {
      const o = await Order.findByPk(orderId, { rejectOnEmpty: true });
      if (o.refundedMinor === 36_000 && o.state !== "contested") break;
      if (Date.now() > deadline) throw new Error(`order is ${o.state} with ${o.refundedMinor} refunded`);
      await new Promise((r) => setTimeout(r, 500));
    }
    await buyer.goto(`/purchases/${orderId}`);
    await buyer.getByText("Refunded to you").waitFor();
    await shots(buyer, "purchase-part-refund");
    await mailsAbout(DEMO.buyer, unit.title, [/^Contest received/, /^(Contest decided|Refund sent)/]);
    const ledger = await ledgerOf(orderId);
    expect(ledger.total).toBe(0);
    expect(ledger.unbalanced).toBe(0);
  }, 300_000);

  it("a declined card leaves the order unpaid and the unit held for the buyer to try again", async () => {
    const unit = await demoUnit();
    const buyer = await signedIn(DEMO.buyer);
    await buyAtListedPrice(buyer, unit, DECLINED_CARD);
    await buyer.getByText("Your card was declined.").waitFor();
    expect(buyer.url()).toMatch(/\/checkout\/pay\/cs_/);
    await shot(buyer, "hosted-declined-1280");
    const order = await Order.findOne({ where: { listingId: unit.listing.id }, rejectOnEmpty: true });
    expect(order.state).toBe("reserved");
    await buyer.goto(`/purchases/${order.id}`);
    await buyer.getByRole("button", { name: "Go to payment" }).waitFor();
    await shots(buyer, "purchase-unpaid");
    expect((await Order.findByPk(order.id))?.state).toBe("reserved");
    expect((await ledgerOf(order.id)).entries).toBe(0);
  }, 180_000);

  it("a reservation that is not paid lapses and the unit returns to the market", async () => {
    const unit = await demoUnit();
    const buyer = await signedIn(DEMO.buyer);
    await buyAtListedPrice(buyer, unit, null);
    const order = await Order.findOne({ where: { listingId: unit.listing.id }, rejectOnEmpty: true });
    const other = await signedIn("buyer2@loadline.test");
    await other.goto(`/listings/${unit.listing.id}`);
    await other.getByText(/^Reserved: another buyer is checking out/).waitFor();

    // Move time past the reservation through the deadline job's clock (as the worker would run it).
    const later = testClock(new Date(order.reservedUntil.getTime() + 60_000));
    expect(await runDeadline({ orderId: order.id, kind: "reservation" }, later)).toBe("done");

    await other.goto(`/listings/${unit.listing.id}`);
    await other.getByRole("link", { name: "Buy", exact: true }).waitFor();
    await buyer.goto(`/purchases/${order.id}`);
    expect(await buyer.getByTestId("order-state").first().getAttribute("data-state")).toBe("cancelled");
    await shots(buyer, "purchase-lapsed");
    await mailsAbout(DEMO.buyer, unit.title, [/^Cancelled/]);
  }, 180_000);
});
