import { afterAll, beforeAll, describe, expect, it } from "vitest";
import type { Browser, Page } from "playwright-core";
import { baseUrl, launchBrowser, newContext, screenshot, uniqueEmail, waitForHydration } from "./support/browser";
import { signUpAndConfirm } from "./support/accounts";

// A new buyer watches a unit from the market, finds it on the watch list, and stops watching it there.

/** Clicks a watch button and waits until the API has answered, so what follows reads stored state. */
async function pressAndSave(page: Page, click: () => Promise<void>, method: "PUT" | "DELETE") {
  const [response] = await Promise.all([
    page.waitForResponse((r) => r.request().method() === method && new URL(r.url()).pathname.startsWith("/api/v1/watches/")),
    click(),
  ]);
  expect(response.status()).toBe(200);
}

describe("the watch list", () => {
  let browser: Browser;
  beforeAll(async () => {
    browser = await launchBrowser();
  });
  afterAll(async () => {
    await browser?.close();
  });

  it("a buyer watches a unit from the market, sees it on /watching and unwatches it there", async () => {
    const context = await newContext(browser);
    const page = await context.newPage();
    await signUpAndConfirm(page, { name: "Ferren Oakhollow", email: uniqueEmail("watcher"), password: "a-long-enough-password" });

    await page.goto("/watching");
    await page.getByRole("heading", { name: "Nothing on your watch list yet" }).waitFor();
    expect(await page.getByRole("main").getByRole("link", { name: "Browse the market" }).getAttribute("href")).toBe("/market");

    await page.goto("/market");
    // The page paints before its scripts are fetched: a press before React takes over is the plain form's.
    await waitForHydration(page);
    const card = page.locator("article").first();
    const title = (await card.getByRole("heading", { level: 3 }).textContent())!.trim();
    const watch = card.getByRole("button", { name: "Watch this unit" });
    await pressAndSave(page, () => watch.click(), "PUT");
    expect(await card.getByRole("button", { name: "Stop watching this unit" }).getAttribute("aria-pressed")).toBe("true");

    await page.getByRole("link", { name: "Watching", exact: true }).click();
    await page.waitForURL("**/watching");
    // The address changes before the new page is drawn: wait for the list itself, not the market's cards.
    await page.getByRole("heading", { level: 2, name: "Watched units" }).waitFor({ state: "attached" });
    const watched = page.getByRole("main").locator("article");
    await watched.first().waitFor();
    expect(await watched.count()).toBe(1);
    expect(await watched.getByRole("link", { name: title }).isVisible()).toBe(true);
    await screenshot(page, "watching-1280");
    await page.setViewportSize({ width: 375, height: 812 });
    await screenshot(page, "watching-375");

    await pressAndSave(page, () => watched.getByRole("button", { name: "Stop watching this unit" }).click(), "DELETE");
    expect(await watched.getByRole("button", { name: "Watch this unit" }).getAttribute("aria-pressed")).toBe("false");
    await page.reload();
    await page.getByRole("heading", { name: "Nothing on your watch list yet" }).waitFor();
    expect(await page.locator("article").count()).toBe(0);

    // Without JavaScript the same buttons are forms: watch on the listing page, unwatch on the list.
    const plain = await browser.newContext({ baseURL: baseUrl(), javaScriptEnabled: false, locale: "en-GB", timezoneId: "UTC" });
    await plain.addCookies(await context.cookies());
    const noJs = await plain.newPage();
    await noJs.goto("/market");
    await noJs.locator("article").first().getByRole("link", { name: title }).click();
    await noJs.getByRole("heading", { level: 1, name: title }).waitFor();
    await Promise.all([noJs.waitForLoadState("load"), noJs.getByRole("button", { name: "Watch this unit" }).click()]);
    expect(await noJs.getByRole("button", { name: "Watching" }).getAttribute("aria-pressed")).toBe("true");
    await noJs.goto("/watching");
    await Promise.all([noJs.waitForLoadState("load"), noJs.getByRole("button", { name: "Stop watching this unit" }).click()]);
    await noJs.getByRole("heading", { name: "Nothing on your watch list yet" }).waitFor();
    await plain.close();
    await context.close();
  });
});
