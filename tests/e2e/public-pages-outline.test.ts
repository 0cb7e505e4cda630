import { afterAll, beforeAll, describe, expect, it } from "vitest";
import type { Browser, Page } from "playwright-core";
import { launchBrowser, newContext } from "./support/browser";

// What search engines and screen readers get from the public pages: a description of their own, and a
// heading outline with one h1 that never skips a level (h1 → h3 with no h2 between).

async function outline(page: Page) {
  return page.evaluate(() => ({
    description: document.querySelector('meta[name="description"]')?.getAttribute("content") ?? null,
    descriptions: document.querySelectorAll('meta[name="description"]').length,
    headings: [...document.querySelectorAll("h1, h2, h3, h4, h5, h6")].map((h) => ({
      level: Number(h.tagName.slice(1)),
      text: (h.textContent ?? "").trim(),
    })),
  }));
}

/** Headings that sit more than one level below the heading before them. */
function skips(headings: { level: number; text: string }[]): string[] {
  return headings.flatMap((h, i) =>
    i > 0 && h.level > headings[i - 1].level + 1 ? [`h${headings[i - 1].level} → h${h.level} "${h.text}"`] : [],
  );
}

describe("the public pages' description and outline", () => {
  let browser: Browser;
  beforeAll(async () => {
    browser = await launchBrowser();
  });
  afterAll(async () => {
    await browser?.close();
  });

  it.each(["/", "/market", "/market?category=turntables", "/market?page=2"])(
    "%s has a description and headings that do not skip a level",
    async (path) => {
      const context = await newContext(browser);
      const page = await context.newPage();
      await page.goto(path);
      const { description, descriptions, headings } = await outline(page);
      expect(descriptions).toBe(1);
      expect(description?.length ?? 0).toBeGreaterThan(50);
      expect(headings.filter((h) => h.level === 1)).toHaveLength(1);
      expect(headings[0].level).toBe(1);
      expect(skips(headings)).toEqual([]);
      await context.close();
    },
  );

  it("a listing found in the market has its own description and an outline that does not skip", async () => {
    const context = await newContext(browser);
    const page = await context.newPage();
    await page.goto("/market?category=integrated-amplifiers");
    const { description: marketText } = await outline(page);
    // Opened afresh, as a search engine's crawler reads it.
    const href = await page.getByRole("link", { name: "Carrowain WQ 46i" }).getAttribute("href");
    expect(href).toMatch(/^\/listings\/[0-9a-f-]{36}$/);
    await page.goto(href!);
    const { description, headings } = await outline(page);
    expect(description).toMatch(/Integrated amplifier/);
    expect(description).not.toBe(marketText);
    expect(headings.filter((h) => h.level === 1)).toHaveLength(1);
    expect(skips(headings)).toEqual([]);
    await context.close();
  });
});
