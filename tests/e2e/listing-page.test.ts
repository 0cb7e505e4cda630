import { afterAll, beforeAll, describe, expect, it } from "vitest";
import type { Browser, Page } from "playwright-core";
import { baseUrl, launchBrowser, newContext, screenshot, waitForHydration } from "./support/browser";
import { DEMO, DEMO_PASSWORD, submitSignIn } from "./support/accounts";

// A buyer finds the seeded, bench-verified Carrowain WQ 46i in the market and reads its page: the mark,
// the key figures with units, plots drawn from its captures, photos from object storage and the zoom;
// then signs in from the page and watches it.

async function openDemoAmplifier(page: Page): Promise<string> {
  await page.goto("/market?category=integrated-amplifiers");
  await page.getByRole("link", { name: "Carrowain WQ 46i" }).click();
  await page.waitForURL(/\/listings\/[0-9a-f-]{36}$/);
  await page.getByRole("heading", { level: 1, name: "Carrowain WQ 46i" }).waitFor();
  return new URL(page.url()).pathname;
}

describe("the listing page", () => {
  let browser: Browser;
  beforeAll(async () => {
    browser = await launchBrowser();
  });
  afterAll(async () => {
    await browser?.close();
  });

  it("shows a bench-verified amplifier with its figures, plots, photos and zoom", async () => {
    const context = await newContext(browser);
    const page = await context.newPage();
    await openDemoAmplifier(page);

    expect(await page.getByText("Bench-verified", { exact: true }).first().isVisible()).toBe(true);

    // Key figures lead, each with its unit and conditions.
    const power8 = page.locator('[data-figure="power8"]');
    expect(await power8.textContent()).toMatch(/Power into 8 Ω\s*65\s*W\s*into 8 Ω, 1 kHz, 0\.1 % THD/);
    expect(await page.locator('[data-figure="power4"]').textContent()).toMatch(/96\s*W\s*into 4 Ω/);
    expect(await page.locator('[data-figure="distortion"]').textContent()).toMatch(/\d\.\d+\s*%.*at 60 W/);

    // Plots: SVG drawn on the server (there before any script runs), named, with labelled axes.
    expect(await page.locator('[role="img"]:has(svg [data-series])').count()).toBeGreaterThanOrEqual(3);
    const spectrum = page.getByRole("img", { name: /Harmonic spectrum/ });
    expect(await spectrum.locator("svg").first().isVisible()).toBe(true);
    expect(await spectrum.locator("svg rect[data-series]").count()).toBeGreaterThan(0);
    expect(await page.getByText("Level re fundamental (dB)").first().isVisible()).toBe(true);
    expect(await page.getByText("Frequency (Hz)").first().isVisible()).toBe(true);

    // Photos come from the media route, which streams them from object storage.
    const cover = page.getByRole("img", { name: /Carrowain WQ 46i, photo 1 of/ }).first();
    const src = await cover.getAttribute("src");
    expect(src).toMatch(/^\/media\/photos\/listing\//);
    const res = await page.request.get(src!);
    expect(res.status()).toBe(200);
    expect(res.headers()["content-type"]).toBe("image/jpeg");
    expect(await cover.evaluate((img: HTMLImageElement) => img.naturalWidth)).toBeGreaterThan(0);
    await screenshot(page, "listing-page-1280");

    // Zoom opens a dialog on the zoom size; the keyboard steps through photos and Esc closes it.
    const zoom = page.getByRole("link", { name: /^Zoom/ });
    await zoom.focus();
    await page.keyboard.press("Enter");
    const dialog = page.getByRole("dialog");
    await dialog.waitFor();
    const zoomed = dialog.getByRole("img");
    expect(await zoomed.getAttribute("src")).toMatch(/^\/media\/photos\/zoom\//);
    await page.waitForFunction(() => (document.querySelector<HTMLImageElement>("dialog img")?.naturalWidth ?? 0) > 0);
    expect(await dialog.getByText("Photo 1 of 2").isVisible()).toBe(true);
    await page.keyboard.press("ArrowRight");
    await dialog.getByText("Photo 2 of 2").waitFor();
    await screenshot(page, "listing-page-zoom");
    await page.keyboard.press("Escape");
    await dialog.waitFor({ state: "detached" });
    // Focus goes back to where the visitor was.
    expect(await page.evaluate(() => document.activeElement?.tagName === "A" && document.activeElement.textContent?.trim())).toMatch(
      /^Zoom/,
    );
    await context.close();
  });

  it("draws its plots on the server, and loads no chart library", async () => {
    // With script off, the plots are there as sent: spectrum, square wave and response, each an SVG.
    const bare = await browser.newContext({ baseURL: baseUrl(), javaScriptEnabled: false });
    const still = await bare.newPage();
    await openDemoAmplifier(still);
    expect(await still.locator('[role="img"]:has(svg [data-series])').count()).toBeGreaterThanOrEqual(3);
    await bare.close();

    // With script on, nothing the page loads is the chart library the plots replaced.
    const context = await newContext(browser);
    const page = await context.newPage();
    const scripts: Promise<string>[] = [];
    page.on("response", (r) => {
      if (r.request().resourceType() === "script") scripts.push(r.text());
    });
    await openDemoAmplifier(page);
    await page.waitForLoadState("networkidle");
    const bodies = await Promise.all(scripts);
    expect(bodies.length).toBeGreaterThan(0);
    expect(bodies.filter((b) => b.includes("recharts"))).toEqual([]);
    await context.close();
  });

  it("lets a buyer sign in from the page and watch the unit", async () => {
    const context = await newContext(browser, { viewport: { width: 375, height: 812 } });
    const page = await context.newPage();
    const path = await openDemoAmplifier(page);
    await page.getByRole("link", { name: "Sign in to watch" }).click();
    await page.waitForURL("**/sign-in?**");
    await submitSignIn(page, DEMO.buyer, DEMO_PASSWORD);
    await page.waitForURL((url) => url.pathname === path);
    // The page paints before its scripts are fetched: a press before React takes over is the plain form's.
    await waitForHydration(page);

    const watch = page.getByRole("button", { name: /Watch this unit|Watching/ });
    // Leave the demo as found, whatever an earlier run did.
    if ((await watch.getAttribute("aria-pressed")) === "true") {
      await Promise.all([page.waitForResponse((r) => r.url().includes("/api/v1/watches/")), watch.click()]);
      await page.getByRole("button", { name: "Watch this unit" }).waitFor();
    }
    // The button turns at once; wait for the API's answer before reading stored state.
    await Promise.all([
      page.waitForResponse((r) => r.request().method() === "PUT" && r.url().includes("/api/v1/watches/")),
      page.getByRole("button", { name: "Watch this unit" }).click(),
    ]);
    const watching = page.getByRole("button", { name: "Watching" });
    await watching.waitFor();
    expect(await watching.getAttribute("aria-pressed")).toBe("true");
    await screenshot(page, "listing-page-375-watching");

    // It is stored, not just shown: a fresh load still says so.
    await page.reload();
    await page.getByRole("button", { name: "Watching" }).waitFor();
    await Promise.all([
      page.waitForResponse((r) => r.request().method() === "DELETE" && r.url().includes("/api/v1/watches/")),
      page.getByRole("button", { name: "Watching" }).click(),
    ]);
    await page.getByRole("button", { name: "Watch this unit" }).waitFor();
    await page.reload();
    expect(await page.getByRole("button", { name: "Watch this unit" }).getAttribute("aria-pressed")).toBe("false");
    await context.close();
  });

  it("answers a listing that is not there with a 404 page", async () => {
    const context = await newContext(browser);
    const page = await context.newPage();
    const res = await page.goto("/listings/3f1b7a9e-0000-4000-8000-000000000000");
    expect(res?.status()).toBe(404);
    await page.getByRole("link", { name: "Go to the market" }).waitFor();
    await context.close();
  });
});
