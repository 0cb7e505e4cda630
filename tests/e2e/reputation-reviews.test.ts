import { randomBytes } from "node:crypto";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import type { Browser, Page } from "playwright-core";
import { sequelize } from "~/db.server";
import { Listing as ListingModel, Review, User } from "~/models/index.server";
import type { Listing, Order } from "~/models/index.server";
import { hashPassword } from "~/auth/password.server";
import * as t from "~/orders/transitions.server";
import { blankListing } from "../support/blank-listing";
import { testClock } from "../support/clock";
import { launchBrowser, newContext, screenshot, uniqueEmail } from "./support/browser";
import { DEMO, DEMO_PASSWORD, signIn } from "./support/accounts";

// A buyer rates the seller after a completed order and the seller's page shows it; the seller answers
// once; a moderator hides the review with a note and it leaves the page and the average. The order is
// walked to released through the real steps (a fresh seller and buyer, the unit back-dated so the
// market's first page keeps the demo units); the payout is recorded with a test transfer id.

const PASSWORD = `rate-${randomBytes(6).toString("hex")}`;
let browser: Browser;
let seller: User;
let buyer: User;
let listing: Listing;
let order: Order;

async function account(label: string, name: string, roles: ("buyer" | "seller")[], payouts = false) {
  return User.create({
    email: uniqueEmail(label),
    displayName: name,
    passwordHash: await hashPassword(PASSWORD),
    roles,
    emailVerifiedAt: new Date(),
    lastSignInAt: null,
    payoutsEnabled: payouts,
    payoutAccountId: payouts ? `acct_e2e_${randomBytes(6).toString("hex")}` : null,
  });
}

beforeAll(async () => {
  browser = await launchBrowser();
  seller = await account("rated-seller", "Tamsin Vollery", ["buyer", "seller"], true);
  buyer = await account("rating-buyer", "Corin Haldane", ["buyer"]);
  listing = await ListingModel.create(
    blankListing(seller.id, "integrated_amplifier", {
      status: "live",
      maker: "Tallowmere Audio",
      model: `Rate ${randomBytes(3).toString("hex").toUpperCase()}`,
      priceMinor: 52_000,
      currency: "EUR",
      country: "DE",
      town: "Altmarkhafen",
      cosmeticGrade: "clean",
      serviceState: "serviced_measured",
      publishedAt: new Date("2020-06-01T10:00:00Z"),
      shippingOptions: [{ method: "collection" }],
      handlingDays: 2,
    }),
  );
  const clock = testClock(new Date(Date.now() - 10 * 86_400_000));
  order = await t.reserveUnit({ listingId: listing.id, buyerId: buyer.id, deliveryMethod: "collection", deliveryZone: "domestic" }, clock);
  const ref = `e2e_${order.id}`;
  order = await t.markFunded(
    order.id,
    { paymentIntentId: `pi_${ref}`, chargeId: `ch_${ref}`, amountMinor: order.totalMinor, currency: order.currency, eventId: `evt_${ref}` },
    clock,
  );
  await t.markShipped(order.id, seller.id, { carrier: "Collected", trackingNumber: "IN PERSON" }, clock);
  await t.confirmArrival(order.id, buyer.id, clock);
  await t.acceptUnit(order.id, buyer.id, clock);
  // Paid out at once with a test transfer id, so the worker's payout job finds nothing to do.
  await t.markReleased(order.id, { transferId: `tr_${ref}` }, clock);
  await sequelize.query(`DELETE FROM pgboss.job WHERE data->>'orderId' = :id AND name IN ('order-release', 'order-deadline')`, {
    replacements: { id: order.id },
  });
}, 60_000);

afterAll(async () => {
  await browser?.close();
});

async function signedIn(email: string, password = PASSWORD, viewport?: { width: number; height: number }): Promise<Page> {
  const page = await (await newContext(browser, viewport ? { viewport } : {})).newPage();
  await signIn(page, email, password);
  return page;
}

describe("rating a seller", () => {
  it("the buyer rates after a completed order, the seller's page shows it, the seller answers once, a moderator hides it", async () => {
    const review = "Exactly as listed, and the seller waited an hour for me at collection.";

    // The buyer: from the completed order to the review form.
    const b = await signedIn(buyer.email);
    await b.goto(`/purchases/${order.id}`);
    await Promise.all([b.waitForURL(`**/purchases/${order.id}/review`), b.getByRole("link", { name: "Rate the seller" }).click()]);
    await b.getByRole("heading", { name: "Rate Tamsin Vollery" }).waitFor();
    // Sent without a rating: the error stands beside the rating, nothing is saved.
    await b.getByLabel("Your review").fill(review);
    await b.getByRole("button", { name: "Post the review" }).click();
    await b.getByText("Choose a rating from 1 to 5.").waitFor();
    await b.getByRole("radio", { name: /^4/ }).check();
    await b.getByRole("button", { name: "Post the review" }).click();
    await b.getByTestId("review").getByText(review).waitFor();
    expect(await b.getByRole("button", { name: "Post the review" }).count()).toBe(0);

    // Anyone: the sold unit's page links to the seller's page, which shows the review and the figures.
    const visitor = await (await newContext(browser)).newPage();
    await visitor.goto(`/listings/${listing.id}`);
    await Promise.all([visitor.waitForURL(`**/sellers/${seller.id}`), visitor.getByRole("link", { name: "The seller's page" }).click()]);
    await visitor.getByRole("heading", { name: "Tamsin Vollery", level: 1 }).waitFor();
    await visitor.getByText(review).waitFor();
    expect(await visitor.getByTestId("review-count").textContent()).toBe("1 review");
    expect(await visitor.getByTestId("completed-sales").textContent()).toBe("1");
    expect(await visitor.getByText("4 out of 5").count()).toBeGreaterThan(0);
    await expect(visitor.getByText("Corin H.", { exact: false }).first().textContent()).resolves.toMatch(/Corin H\./);

    // The seller answers from the sale; a second answer is not offered.
    const s = await signedIn(seller.email);
    await s.goto(`/sales/${order.id}`);
    await Promise.all([s.waitForURL(`**/sales/${order.id}/review`), s.getByRole("link", { name: "Read the review" }).click()]);
    await s.getByText(review).waitFor();
    await s.getByLabel("Your answer").fill("Thank you, enjoy it. Keep the vents clear.");
    await s.getByRole("button", { name: "Post the answer" }).click();
    await s.getByText("Thank you, enjoy it. Keep the vents clear.").waitFor();
    expect(await s.getByLabel("Your answer").count()).toBe(0);

    await visitor.reload();
    await visitor.getByText("Thank you, enjoy it. Keep the vents clear.").waitFor();
    await screenshot(visitor, "reputation-seller-page-desktop");
    const phone = await (await newContext(browser, { viewport: { width: 390, height: 844 } })).newPage();
    await phone.goto(`/sellers/${seller.id}`);
    await screenshot(phone, "reputation-seller-page-phone");

    // A moderator hides it with a note: gone from the page and the count; the trail keeps the note.
    const m = await signedIn(DEMO.moderator, DEMO_PASSWORD);
    const stored = await Review.findOne({ where: { orderId: order.id }, rejectOnEmpty: true });
    expect([stored.rating, stored.body]).toEqual([4, review]);
    await m.goto(`/desk/reviews/${stored.id}`);
    await m.getByRole("button", { name: "Hide the review" }).click();
    await m.getByText("Say why the review is hidden.").waitFor();
    await m.getByLabel("Why hide it").fill("Test of hiding: no abuse in it, only the procedure.");
    await m.getByRole("button", { name: "Hide the review" }).click();
    await m.getByText(/The review desk hid this review on .*: Test of hiding/).waitFor();
    await m.getByText("Test of hiding: no abuse in it, only the procedure.").last().waitFor();
    await visitor.reload();
    expect(await visitor.getByTestId("review-count").textContent()).toBe("0 reviews");
    expect(await visitor.getByText(review).count()).toBe(0);
  });
});
