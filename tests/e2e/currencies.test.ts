import { afterAll, beforeAll, describe, expect, it } from "vitest";
import type { Browser, Locator, Page } from "playwright-core";
import { launchBrowser, newContext, screenshot } from "./support/browser";
import { DEMO, signIn } from "./support/accounts";

// Prices stay in the seller's currency; a buyer who shows prices in another sees an approximate
// figure beside them. The admin's rate moves that figure at once.

/** A seller's price in pounds (not an approximation in pounds, which reads "≈ about £…"). */
const POUNDS = /^£[\d,.]+$/;
/** "£1,250" or "£1,250.50" → 125000 / 125050. */
const minorOf = (text: string) => Math.round(Number(text.replace(/[^\d.]/g, "")) * 100);
/** A whole-euro approximation worked by hand: pence / rate, to the nearest euro. */
const approxEuro = (pence: number, gbpPerEur: number) => `€${Math.round(pence / 100 / gbpPerEur).toLocaleString("en-GB")}`;

async function chooseDisplayCurrency(page: Page, code: string) {
  await page.getByLabel("Show approximate prices in").selectOption(code);
  await Promise.all([page.waitForLoadState("load"), page.getByRole("button", { name: "Apply", exact: true }).click()]);
  await page.waitForFunction((c) => (document.getElementById("display-currency") as HTMLSelectElement | null)?.value === c, code);
}

/** Sets GBP's rate on the admin page, confirming a large change when asked. */
async function setGbpRate(page: Page, value: string) {
  await page.goto("/admin/rates");
  await page.getByLabel("GBP per euro").fill(value);
  await page.getByRole("button", { name: "Save rates" }).click();
  const confirm = page.getByLabel("Yes, these rates are right: re-price the listings.");
  const saved = page.getByRole("status").filter({ hasText: /Saved|No rate changed/ });
  await confirm.or(saved).first().waitFor();
  if (await confirm.isVisible()) {
    await confirm.check();
    await page.getByRole("button", { name: "Save rates" }).click();
    await saved.waitFor();
  }
}

function cardTitled(page: Page, title: string): Locator {
  return page.locator("article").filter({ has: page.getByRole("heading", { level: 3, name: title, exact: true }) });
}

describe("prices in several currencies", () => {
  let browser: Browser;
  beforeAll(async () => {
    browser = await launchBrowser();
  });
  afterAll(async () => {
    await browser?.close();
  });

  it("a visitor switching currency sees approximations beside the seller's prices", async () => {
    const context = await newContext(browser);
    const page = await context.newPage();
    // The browser says en-GB: prices in pounds show as they are.
    await page.goto("/market");
    const card = page
      .locator("article")
      .filter({ has: page.getByText(POUNDS) })
      .first();
    await card.waitFor();
    expect(await card.getByTestId("approx-price").count()).toBe(0);

    await chooseDisplayCurrency(page, "USD");
    expect(new URL(page.url()).pathname).toBe("/market");
    const approx = card.getByTestId("approx-price");
    expect(await approx.textContent()).toMatch(/^≈ about US\$[\d,]+$/);
    expect(await approx.locator(".sr-only").textContent()).toBe("about ");
    await screenshot(page, "currencies-market-usd-1280");

    // The listing page shows both on one line; the choice holds across pages.
    await card.getByRole("heading", { level: 3 }).getByRole("link").click();
    await page.getByRole("heading", { level: 1 }).waitFor();
    expect(await page.getByTestId("price").textContent()).toMatch(/^£[\d,.]+ · , ≈ about US\$[\d,]+$/);
    await page.setViewportSize({ width: 390, height: 844 });
    await screenshot(page, "currencies-listing-usd-390");
    await context.close();
  });

  it("an admin changes GBP's rate and a card's approximate euro figure follows", async () => {
    const context = await newContext(browser);
    const page = await context.newPage();
    await signIn(page, DEMO.admin);
    await page.goto("/admin/rates");
    const original = await page.getByLabel("GBP per euro").inputValue();
    try {
      await setGbpRate(page, "0.86");
      await screenshot(page, "currencies-admin-rates-1280");
      await page.goto("/market");
      await chooseDisplayCurrency(page, "EUR");
      const first = page
        .locator("article")
        .filter({ has: page.getByText(POUNDS) })
        .first();
      const title = (await first.getByRole("heading", { level: 3 }).textContent())!.trim();
      const card = cardTitled(page, title);
      const pence = minorOf((await card.getByText(POUNDS).textContent())!);
      expect(await card.getByTestId("approx-price").textContent()).toBe(`≈ about ${approxEuro(pence, 0.86)}`);

      await setGbpRate(page, "0.8");
      expect(await page.getByRole("status").filter({ hasText: "Saved" }).textContent()).toMatch(
        /Saved 1 EUR = 0\.8 GBP; \d+ listings? re-priced\./,
      );
      // The change log names it (waits: the log may arrive a moment after the notice).
      await page.getByRole("region", { name: "Changes" }).getByText("GBP: 0.86 → 0.8", { exact: true }).first().waitFor();

      await page.goto("/market");
      expect(await card.getByTestId("approx-price").textContent()).toBe(`≈ about ${approxEuro(pence, 0.8)}`);
    } finally {
      await setGbpRate(page, original);
      await context.close();
    }
  });
});
