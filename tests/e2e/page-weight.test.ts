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
});
