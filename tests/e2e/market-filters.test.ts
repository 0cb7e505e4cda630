import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { QueryTypes } from "sequelize";
import type { Browser, Page } from "playwright-core";
import { sequelize } from "~/db.server";
import { baseUrl, launchBrowser, newContext, screenshot, waitForHydration } from "./support/browser";
import { signIn } from "./support/accounts";

// The market's filters in a browser: an amplifier of at least 100 W into 8 Ω at no more than 0.05 % THD.
// What the page shows is checked against the database (the figures stored from the checked bench sheets)
// and against the figure on each card, never against the panel's own reading.

const POWER = "Power into 8 Ω, at least";
const THD = "THD, at most";

/** Live integrated amplifiers whose bench-verified sheet measured ≥ 100 W into 8 Ω and ≤ 0.05 % THD, by id. */
async function matchingInDatabase(): Promise<string[]> {
  const rows = await sequelize.query<{ id: string }>(
    `SELECT id FROM listings WHERE status = 'live' AND category = 'integrated_amplifier' AND bench_verified
       AND power_8ohm_w >= 100 AND thd_pct <= 0.05 ORDER BY id`,
    { type: QueryTypes.SELECT },
  );
  return rows.map((r) => r.id);
}

async function liveAmplifiers(): Promise<number> {
  const [row] = await sequelize.query<{ n: string }>(
    "SELECT count(*) AS n FROM listings WHERE status = 'live' AND category = 'integrated_amplifier'",
    { type: QueryTypes.SELECT },
  );
  return Number(row.n);
}

/** The units on the page, by id (from each card's link), sorted, with the power figure each card shows. */
async function cards(page: Page): Promise<{ ids: string[]; watts: number[] }> {
  const articles = page.locator("main article");
  const ids: string[] = [];
  const watts: number[] = [];
  for (const card of await articles.all()) {
    const href = (await card.getByRole("heading", { level: 3 }).getByRole("link").getAttribute("href"))!;
    ids.push(href.replace("/listings/", ""));
    const text = (await card.textContent()) ?? "";
    const power = /Power into 8 Ω\s*([\d.]+)\s*W/.exec(text);
    if (power) watts.push(Number(power[1]));
  }
  return { ids: ids.sort(), watts };
}

/** Types into a field and waits until the results for the new URL have arrived. */
async function typeAndWait(page: Page, label: string, text: string, param: string) {
  await Promise.all([
    page.waitForResponse((r) => new URL(r.url()).pathname === "/api/v1/listings" && new URL(r.url()).searchParams.has(param)),
    page.getByLabel(label, { exact: true }).fill(text),
  ]);
  await page.getByRole("status").filter({ hasText: /match/ }).waitFor();
}

/** Submits the panel without JavaScript and waits for the page it lands on to load. */
async function submit(page: Page, landed: (url: URL) => boolean) {
  await Promise.all([page.waitForURL(landed, { waitUntil: "load" }), page.getByRole("button", { name: /^Show \d+ units?$/ }).click()]);
}

describe("the market's filters", () => {
  let browser: Browser;
  beforeAll(async () => {
    browser = await launchBrowser();
  });
  afterAll(async () => {
    await browser?.close();
  });

  it("filtering by power into 8 Ω and THD shows only the units that measured so, and the URL shows the same units elsewhere", async () => {
    const expected = await matchingInDatabase();
    expect(expected.length).toBeGreaterThan(0);
    // The filters must leave some amplifiers out, or the test would prove nothing.
    expect(await liveAmplifiers()).toBeGreaterThan(expected.length);

    const context = await newContext(browser);
    const page = await context.newPage();
    await page.goto("/market");
    await page
      .getByRole("navigation", { name: "Categories" })
      .getByRole("link", { name: /^Integrated amplifiers/ })
      .click();
    await page.waitForURL("**/market?category=integrated-amplifiers");
    await page.getByRole("heading", { level: 1, name: "Integrated amplifiers" }).waitFor();
    await typeAndWait(page, POWER, "100 W", "power8Min");
    await typeAndWait(page, THD, "0.05 %", "thdMax");
    expect(new URL(page.url()).search).toBe("?category=integrated-amplifiers&power8Min=100+W&thdMax=0.05+%25");

    const shown = await cards(page);
    expect(shown.ids).toEqual(expected);
    expect(shown.watts).toHaveLength(expected.length);
    for (const w of shown.watts) expect(w).toBeGreaterThanOrEqual(100);
    expect(await page.getByRole("link", { name: "Remove THD ≤ 0.05 %" }).isVisible()).toBe(true);
    await screenshot(page, "market-filters-1280");

    // Back: the THD filter is gone again, the power filter stays, in the field and in the results.
    await page.goBack();
    await page.waitForURL((u) => u.search === "?category=integrated-amplifiers&power8Min=100+W");
    await page.getByRole("status").filter({ hasText: /match/ }).waitFor();
    expect(await page.getByLabel(THD, { exact: true }).inputValue()).toBe("");
    expect(await page.getByLabel(POWER, { exact: true }).inputValue()).toBe("100 W");
    expect((await cards(page)).ids.length).toBeGreaterThanOrEqual(expected.length);
    await page.goForward();
    await page.waitForURL((u) => u.search.includes("thdMax"));
    await page.getByRole("status").filter({ hasText: /match/ }).waitFor();
    expect((await cards(page)).ids).toEqual(expected);

    // The address, opened in a fresh browser (own cookies, nothing cached), shows the same units.
    const shared = page.url();
    const fresh = await newContext(browser);
    const other = await fresh.newPage();
    await other.goto(shared);
    expect((await cards(other)).ids).toEqual(expected);
    expect(await other.getByLabel(POWER, { exact: true }).inputValue()).toBe("100 W");

    // On a phone the panel is a disclosure above the results.
    await other.setViewportSize({ width: 390, height: 844 });
    const toggle = other.getByRole("button", { name: "Filters (2)" });
    expect(await toggle.getAttribute("aria-expanded")).toBe("false");
    expect(await other.getByLabel(POWER, { exact: true }).isVisible()).toBe(false);
    await toggle.click();
    expect(await other.getByLabel(POWER, { exact: true }).isVisible()).toBe(true);
    await screenshot(other, "market-filters-390-open");
    await fresh.close();
    await context.close();
  });

  it("without JavaScript the panel is a form: submitting it filters", async () => {
    const expected = await matchingInDatabase();
    const plain = await browser.newContext({ baseURL: baseUrl(), javaScriptEnabled: false, locale: "en-GB", timezoneId: "UTC" });
    const page = await plain.newPage();
    await page.goto("/market?category=integrated-amplifiers");
    expect((await cards(page)).ids.length).toBeGreaterThan(expected.length);
    await page.getByLabel(POWER, { exact: true }).fill("100 W");
    await page.getByLabel(THD, { exact: true }).fill("0.05 %");
    await submit(page, (u) => u.searchParams.get("thdMax") === "0.05 %");
    // The empty fields the form sent are gone: the address is the canonical one.
    expect(new URL(page.url()).search).toBe("?category=integrated-amplifiers&power8Min=100+W&thdMax=0.05+%25");
    expect((await cards(page)).ids).toEqual(expected);

    // A value it cannot read stays in its field with the message beside it; the other filters still apply.
    await page.getByLabel(THD, { exact: true }).fill("loud");
    await submit(page, (u) => u.searchParams.get("thdMax") === "loud");
    const thd = page.getByLabel(THD, { exact: true });
    expect(await thd.inputValue()).toBe("loud");
    expect(await thd.getAttribute("aria-invalid")).toBe("true");
    const described = (await thd.getAttribute("aria-describedby"))!.split(" ");
    const message = (await page.locator(`[id="${described.at(-1)}"]`).textContent())!;
    expect(message.length).toBeGreaterThan(0);
    await plain.close();
  });

  it("a signed-in buyer can watch the units the panel fetched after the page loaded", async () => {
    const context = await newContext(browser);
    const page = await context.newPage();
    await signIn(page, "buyer@loadline.test");
    await page.goto("/market?category=turntables");
    await page.locator("main article").first().waitFor();
    await waitForHydration(page);
    await Promise.all([
      page.waitForResponse((r) => new URL(r.url()).pathname === "/api/v1/listings"),
      page
        .getByRole("navigation", { name: "Categories" })
        .getByRole("link", { name: /^Integrated amplifiers/ })
        .click(),
    ]);
    await page.getByRole("heading", { level: 1, name: "Integrated amplifiers" }).waitFor();
    const cardsShown = page.locator("main article");
    await cardsShown.first().getByRole("button", { name: /watch/i }).waitFor();
    expect(await cardsShown.getByRole("button", { name: /watch/i }).count()).toBe(await cardsShown.count());
    await context.close();
  });

  it("moving to another page on a slow network shows progress", async () => {
    const context = await newContext(browser);
    const page = await context.newPage();
    await page.goto("/market");
    await page.locator("main article").first().waitFor();
    await waitForHydration(page);
    // Hold the next page's data back, as a slow network would.
    let release!: () => void;
    const gate = new Promise<void>((r) => (release = r));
    await page.route(/\.data(\?|$)/, async (route) => {
      await gate;
      await route.continue();
    });
    await page.locator("main article").first().getByRole("heading", { level: 3 }).getByRole("link").click();
    const bar = page.locator(".navigation-progress");
    await bar.waitFor({ state: "visible" });
    expect(await page.locator("#main").getAttribute("aria-busy")).toBe("true");
    release();
    await page.waitForURL("**/listings/**");
    await bar.waitFor({ state: "detached" });
    expect(await page.locator("#main").getAttribute("aria-busy")).toBeNull();
    await context.close();
  });
});
