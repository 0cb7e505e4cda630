import { randomBytes } from "node:crypto";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import type { Browser, Page } from "playwright-core";
import { Listing, User } from "~/models/index.server";
import { hashPassword } from "~/auth/password.server";
import { baseUrl, launchBrowser, newContext, screenshot } from "./support/browser";
import { signIn } from "./support/accounts";
import { blankListing } from "../support/blank-listing";

// Talking before buying in the browser: a buyer asks about a unit and makes an offer from its page,
// a contact detail typed into a message reaches the seller masked, the seller (who sees the unread
// badge) answers with a counter-offer, the buyer accepts it and is offered checkout at that price.
// Then the same conversation without JavaScript: the plain form sends a message.

const run = randomBytes(4).toString("hex");
const password = `talk-${run}-password`;
let browser: Browser;
let seller: User;
let buyer: User;
let unit: Listing;

async function account(label: string, roles: ("buyer" | "seller")[]) {
  return User.create({
    email: `talk-e2e-${run}-${label}@example.test`,
    displayName: label === "seller" ? "Oskar Fenwold" : "Ilse Marram",
    passwordHash: await hashPassword(password),
    roles,
    emailVerifiedAt: new Date(),
    lastSignInAt: null,
  });
}

beforeAll(async () => {
  browser = await launchBrowser();
  seller = await account("seller", ["buyer", "seller"]);
  buyer = await account("buyer", ["buyer"]);
  unit = await Listing.create(
    blankListing(seller.id, "integrated_amplifier", {
      status: "live",
      maker: "Fenwold Acoustics",
      model: `FW-${run}`,
      priceMinor: 48_000,
      currency: "EUR",
      offersWelcome: true,
      country: "DE",
      town: "Oskerfeld",
      cosmeticGrade: "clean",
      serviceState: "serviced_measured",
      publishedAt: new Date(),
    }),
  );
});
afterAll(async () => {
  await browser?.close();
  await Listing.destroy({ where: { id: unit.id } });
  await User.destroy({ where: { id: [seller.id, buyer.id] } });
});

async function submit(page: Page, button: ReturnType<Page["getByRole"]>) {
  await Promise.all([page.waitForResponse((r) => r.request().method() === "POST"), button.click()]);
}

describe("messages and offers", () => {
  it("asks, offers, counters and accepts; contact details reach the seller masked", async () => {
    const buyerContext = await newContext(browser);
    const b = await buyerContext.newPage();
    await signIn(b, buyer.email, password);
    await b.goto(`/listings/${unit.id}`);
    await Promise.all([b.waitForURL(/\/messages\/[0-9a-f-]{36}/), b.getByRole("button", { name: "Make an offer" }).click()]);
    const threadPath = new URL(b.url()).pathname;

    // A phone number is flagged while typing, and sent masked.
    const box = b.getByLabel(/Write to Oskar Fenwold/);
    await box.fill("Is the phono stage MM only? Ring me on 07700 900123.");
    await b
      .getByText(/Contact details are hidden until the unit is paid for/)
      .first()
      .waitFor();
    await submit(b, b.getByRole("button", { name: "Send" }));
    const conversation = b.getByTestId("conversation");
    await conversation.getByText("Is the phono stage MM only? Ring me on [contact details hidden].").waitFor();
    expect(await box.inputValue()).toBe("");

    await b.getByLabel("Your offer").fill("400");
    await submit(b, b.getByRole("button", { name: "Make the offer" }));
    await conversation.getByTestId("offer").getByText("Waiting for an answer").waitFor();
    await screenshot(b, "thread-buyer-1280");

    // The seller sees the badge, the thread first, the masked text, and counters.
    const sellerContext = await newContext(browser);
    const s = await sellerContext.newPage();
    await signIn(s, seller.email, password);
    expect((await s.getByTestId("unread-count").first().textContent())?.trim()).toMatch(/^1/);
    await s.goto("/messages");
    await s.getByTestId("threads").getByRole("link").first().click();
    await s.waitForURL(`**${threadPath}`);
    expect(await s.getByTestId("conversation").textContent()).not.toContain("900123");
    await s.getByTestId("masked-note").first().waitFor();
    await s.getByLabel("Counter-offer").fill("450");
    await submit(s, s.getByRole("button", { name: "Counter" }));
    await s.getByTestId("conversation").getByText("Answered with a counter-offer").waitFor();

    // The buyer accepts the counter and may buy at that price.
    await b.reload();
    await submit(b, b.getByRole("button", { name: "Accept" }));
    await b.getByTestId("conversation").getByText("Accepted", { exact: true }).waitFor();
    expect(await b.getByRole("link", { name: "Buy at this price" }).getAttribute("href")).toBe(`/checkout/${unit.id}`);
    await b.setViewportSize({ width: 390, height: 844 });
    await screenshot(b, "thread-buyer-390");

    // Without JavaScript the compose box is a plain form to the page.
    const plain = await browser.newContext({ baseURL: baseUrl(), javaScriptEnabled: false, locale: "en-GB", timezoneId: "UTC" });
    await plain.addCookies(await sellerContext.cookies());
    const noJs = await plain.newPage();
    await noJs.goto(threadPath);
    await noJs.getByLabel(/Write to Ilse Marram/).fill("Yes, MM only; it plays through the line stage too.");
    await Promise.all([noJs.waitForLoadState("load"), noJs.getByRole("button", { name: "Send" }).click()]);
    await noJs.getByText("Yes, MM only; it plays through the line stage too.").waitFor();
    await plain.close();
    await sellerContext.close();
    await buyerContext.close();
  });
});
