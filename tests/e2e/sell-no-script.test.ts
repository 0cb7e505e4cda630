import { afterAll, beforeAll, describe, expect, it } from "vitest";
import type { Browser } from "playwright-core";
import { baseUrl, launchBrowser, screenshot } from "./support/browser";
import { signIn } from "./support/accounts";

// The seller's basic forms with JavaScript switched off: plain HTML posts, the server reads them the
// same way the browser would, and its messages come back next to the fields.

describe("selling without JavaScript", () => {
  let browser: Browser;
  beforeAll(async () => {
    browser = await launchBrowser();
  });
  afterAll(async () => {
    await browser?.close();
  });

  it("starts a draft, saves the item step with a message beside a bad field, and saves a typed bench reading", async () => {
    const context = await browser.newContext({
      baseURL: baseUrl(),
      javaScriptEnabled: false,
      viewport: { width: 375, height: 812 },
      locale: "en-GB",
      timezoneId: "UTC",
    });
    context.setDefaultTimeout(15_000);
    context.setDefaultNavigationTimeout(30_000);
    const page = await context.newPage();
    await signIn(page, "seller@loadline.test");

    await page.goto("/sell/new");
    await page.getByLabel(/Turntable/).check();
    await page.getByRole("button", { name: "Start the draft" }).click();
    await page.waitForURL(/\/sell\/[0-9a-f-]{36}\/item$/);
    const id = new URL(page.url()).pathname.split("/")[2];

    await page.getByLabel("Maker").fill("Orrin Platterworks");
    await page.getByLabel("Model").fill("OP-3");
    await page.getByLabel("Asking price").fill("1.250,50");
    await page.getByRole("button", { name: "Save", exact: true }).click();
    await page.getByText("Saved.", { exact: true }).waitFor();
    expect(await page.getByLabel("Asking price").inputValue()).toBe("1250.50");

    await page.getByLabel("Asking price").fill("a lot");
    await page.getByRole("button", { name: "Save", exact: true }).click();
    await page
      .getByRole("alert")
      .filter({ hasText: /"a lot" is not a price/ })
      .waitFor();
    expect(await page.getByLabel("Model").inputValue()).toBe("OP-3");
    await screenshot(page, "sell-no-script-item-375");

    // A turntable's sheet: speed error typed with its unit, saved by the plain form and checked by the server.
    await page.goto(`/sell/${id}/bench`);
    await page.locator('li[data-row="M1"] [name$=".value"]').fill("+0.2 %");
    await page.getByRole("button", { name: "Save", exact: true }).click();
    await page.getByText("Saved and checked.").waitFor();
    await page.locator('li[data-row="M1"]').getByText("reads as 0.20 %").waitFor();
    expect(await page.locator('[data-rule="required-readings"]').filter({ hasText: "Speed error: measured." }).count()).toBe(1);

    // Removing a row is a post too.
    await page.getByRole("button", { name: "Remove reading M1" }).click();
    await page.getByText("Saved and checked.").waitFor();
    expect(await page.locator('[data-rule="required-readings"]').filter({ hasText: "Speed error: measured." }).count()).toBe(0);
    expect(
      await page
        .locator('[data-rule="required-readings"][data-outcome="missing"]')
        .filter({ hasText: /needs Speed error/ })
        .count(),
    ).toBe(1);
    await context.close();
  }, 120_000);
});
