import { afterAll, beforeAll, describe, expect, it } from "vitest";
import type { Browser, Page } from "playwright-core";
import { SCREEN_DIR, baseUrl, launchBrowser, newContext, screenshot, waitForHydration } from "./support/browser";

// A buyer picks three of the demo amplifiers in the market, opens compare and sees them side by side:
// three columns, the stronger power marked, their responses on one plot. Then the same without JavaScript.

const AMPS = ["Carrowain WQ 46i", "Carrowain WQ 72i", "Vantrell Velt 120 Studio"];

function card(page: Page, title: string) {
  return page.locator("article").filter({ has: page.getByRole("link", { name: title, exact: true }) });
}

/** Presses a card's compare button and waits for the server's answer (the list then reloads). */
async function addToCompare(page: Page, title: string) {
  const [response] = await Promise.all([
    page.waitForResponse((r) => r.request().method() === "POST" && new URL(r.url()).pathname.startsWith("/compare")),
    card(page, title).getByRole("button", { name: "Add to compare" }).click(),
  ]);
  expect(response.status()).toBe(200);
  await card(page, title).getByRole("button", { name: "Comparing" }).waitFor();
}

describe("compare", () => {
  let browser: Browser;
  beforeAll(async () => {
    browser = await launchBrowser();
  });
  afterAll(async () => {
    await browser?.close();
  });

  it("three amplifiers side by side: three columns, the stronger power marked, the responses overlaid", async () => {
    const context = await newContext(browser);
    const page = await context.newPage();
    await page.goto("/market?category=integrated-amplifiers");
    // The market paints before its scripts are fetched: a press before React takes over is the plain form's.
    await waitForHydration(page);
    for (const title of AMPS) await addToCompare(page, title);

    // The tray and the header follow once the list has reloaded.
    const tray = page.getByRole("complementary", { name: "Compare list" });
    await tray.filter({ hasText: /3\s*of 4 chosen to compare/ }).waitFor();
    expect(
      await page
        .getByRole("navigation", { name: "Main" })
        .first()
        .getByRole("link", { name: /Compare/ })
        .textContent(),
    ).toMatch(/Compare\s*3/);
    await tray.getByRole("link", { name: "Compare" }).click();
    await page.waitForURL(/\/compare\?ids=/);

    const heads = page.getByRole("region", { name: "Units side by side" }).locator("thead").getByRole("columnheader");
    await heads.nth(2).waitFor();
    expect(await heads.count()).toBe(3);
    for (const [i, title] of AMPS.entries()) expect(await heads.nth(i).getByRole("link", { name: title }).isVisible()).toBe(true);

    const power = page.locator('[data-figure-row="power8"]');
    expect(await power.getByRole("rowheader").textContent()).toMatch(/Power into 8 Ω\s*higher is better/);
    const marked = power.locator("[data-stronger]");
    expect(await marked.count()).toBe(1);
    expect(await marked.textContent()).toMatch(/^127\s*W\s*Stronger\s*into 8 Ω, 1 kHz, 0\.1 % THD/);
    expect(await power.getByRole("cell").nth(2).locator("[data-stronger]").count()).toBe(1);
    // Reference levels differ (each amplifier's own rated power), so SNR is shown but not ranked.
    const snr = page.locator('[data-figure-row="snr"]');
    expect(await snr.locator("[data-stronger]").count()).toBe(0);
    expect(await snr.getByRole("rowheader").textContent()).toMatch(/Not ranked: the output level differs/);
    expect(await page.getByText("Only measured figures are compared").isVisible()).toBe(true);

    const plot = page.locator("section[aria-labelledby=responses]");
    expect(await plot.locator("path[data-series]").count()).toBe(3);
    for (const title of AMPS) expect(await plot.getByRole("list", { name: "Legend" }).getByText(title).isVisible()).toBe(true);

    await screenshot(page, "compare-1280");
    await page.setViewportSize({ width: 390, height: 844 });
    // On a phone the first column stays put while the table scrolls sideways.
    const region = page.getByRole("region", { name: "Units side by side" });
    expect(await region.evaluate((el) => el.scrollWidth > el.clientWidth)).toBe(true);
    expect(await page.getByText("Swipe the table sideways to see every unit").isVisible()).toBe(true);
    const first = power.getByRole("rowheader");
    const before = await first.boundingBox();
    await region.evaluate((el) => el.scrollBy(300, 0));
    expect((await first.boundingBox())!.x).toBeCloseTo(before!.x, 0);
    await screenshot(page, "compare-390");

    // A fifth unit is refused on its card, saying why; the list stays as it was.
    await page.setViewportSize({ width: 1280, height: 900 });
    await page.goto("/market?category=integrated-amplifiers");
    await addToCompare(page, "Vantrell Velt 80 Mk II");
    const fifth = card(page, "Vantrell Velt 35");
    const [refused] = await Promise.all([
      page.waitForResponse((r) => r.request().method() === "POST" && new URL(r.url()).pathname.startsWith("/compare")),
      fifth.getByRole("button", { name: "Add to compare" }).click(),
    ]);
    expect(refused.status()).toBe(409);
    await fifth.getByText("You are comparing 4 units already").waitFor();
    expect(await fifth.getByRole("button", { name: "Add to compare" }).getAttribute("aria-pressed")).toBe("false");
    await fifth.screenshot({ path: `${SCREEN_DIR}/compare-fifth-refused.png` });
    await context.close();
  });

  it("works without JavaScript: add from the market, open compare, remove", async () => {
    const plain = await browser.newContext({ baseURL: baseUrl(), javaScriptEnabled: false, locale: "en-GB", timezoneId: "UTC" });
    const page = await plain.newPage();
    await page.goto("/market?category=integrated-amplifiers");
    await Promise.all([page.waitForLoadState("load"), card(page, AMPS[1]).getByRole("button", { name: "Add to compare" }).click()]);
    expect(new URL(page.url()).pathname).toBe("/market");
    expect(await card(page, AMPS[1]).getByRole("button", { name: "Comparing" }).getAttribute("aria-pressed")).toBe("true");

    await page.goto("/compare");
    expect(page.url()).toMatch(/\/compare\?ids=[0-9a-f-]{36}$/);
    expect(await page.getByRole("region", { name: "Units side by side" }).locator("thead").getByRole("columnheader").count()).toBe(1);
    await Promise.all([page.waitForLoadState("load"), page.getByRole("button", { name: `Remove ${AMPS[1]} from the comparison` }).click()]);
    await page.getByRole("heading", { name: "Nothing to compare yet" }).waitFor();

    await page.goto("/compare?ids=1,2");
    expect(await page.getByRole("alert").textContent()).toMatch(/not a listing: “1”, “2”/);
    await plain.close();
  });
});
