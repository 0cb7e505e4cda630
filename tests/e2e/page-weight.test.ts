import { afterAll, beforeAll, describe, expect, it } from "vitest";
import type { Browser } from "playwright-core";
import { launchBrowser, newContext } from "./support/browser";

// What the public pages must not load: a chart library (the plots are our own SVG, drawn on the
// server) or zod (the forms' business; a schema built at a module's top level drags it onto every page
// that imports the module). Sizes and scores are `npm run bench`'s; this checks what is loaded, not how fast.

const MARKERS = { "the chart library the plots replaced": "recharts", zod: "$ZodError" };

describe("the public pages' scripts", () => {
  let browser: Browser;
  beforeAll(async () => {
    browser = await launchBrowser();
  });
  afterAll(async () => {
    await browser?.close();
  });

  it("home, the market and a listing with plots load neither a chart library nor zod", async () => {
    const context = await newContext(browser, { viewport: { width: 390, height: 844 } });
    const page = await context.newPage();
    const found: string[] = [];
    const pending: Promise<void>[] = [];
    page.on("response", (r) => {
      if (r.request().resourceType() !== "script") return;
      pending.push(
        r.text().then((body) => {
          for (const [what, marker] of Object.entries(MARKERS))
            if (body.includes(marker)) found.push(`${new URL(r.url()).pathname}: ${what}`);
        }),
      );
    });
    await page.goto("/", { waitUntil: "networkidle" });
    await page.goto("/market?category=integrated-amplifiers", { waitUntil: "networkidle" });
    await page.getByRole("link", { name: "Carrowain WQ 46i" }).click();
    await page.waitForURL(/\/listings\/[0-9a-f-]{36}$/);
    await page.getByRole("heading", { level: 1, name: "Carrowain WQ 46i" }).waitFor();
    await page.waitForLoadState("networkidle");
    expect(await page.locator('[role="img"]:has(svg [data-series])').count()).toBeGreaterThanOrEqual(3);
    await Promise.all(pending);
    expect(pending.length).toBeGreaterThan(0);
    expect(found).toEqual([]);
    await context.close();
  });

  // docs/decisions/0035: the server's HTML is painted before any script is fetched, then the page hydrates.
  it("home, the market and a listing fetch no script before their first paint, then hydrate", async () => {
    const context = await newContext(browser, { viewport: { width: 390, height: 844 } });
    const page = await context.newPage();
    await page.goto("/market?category=integrated-amplifiers", { waitUntil: "networkidle" });
    const listing = await page.getByRole("link", { name: "Carrowain WQ 46i" }).getAttribute("href");
    for (const path of ["/", "/market", listing!]) {
      await page.goto(path, { waitUntil: "networkidle" });
      const timing = await page.evaluate(() => ({
        paint: performance.getEntriesByName("first-contentful-paint")[0]?.startTime,
        scripts: performance
          .getEntriesByType("resource")
          .filter((e) => new URL(e.name).pathname.endsWith(".js"))
          .map((e) => e.startTime),
      }));
      expect(timing.paint, path).toBeGreaterThan(0);
      expect(timing.scripts.length, path).toBeGreaterThan(0);
      expect(Math.min(...timing.scripts), path).toBeGreaterThanOrEqual(timing.paint);
    }
    // Hydrated: a link is followed by the client router (the document stays, a marker on window survives).
    await page.evaluate(() => Object.assign(window, { samePage: true }));
    await page.getByRole("navigation", { name: "Main" }).getByRole("link", { name: "Market" }).click();
    await page.waitForURL(/\/market$/);
    await page.getByRole("heading", { level: 1 }).waitFor();
    expect(await page.evaluate(() => "samePage" in window)).toBe(true);
    await context.close();
  });
});
