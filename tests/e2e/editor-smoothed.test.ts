import { afterAll, beforeAll, describe, expect, it } from "vitest";
import type { Browser, Page } from "playwright-core";
import { ListingPhoto } from "~/models/index.server";
import { photoKeys } from "~/photos/access.server";
import fs from "node:fs";
import path from "node:path";
import { baseUrl, launchBrowser, newContext, SCREEN_DIR } from "./support/browser";
import { signIn } from "./support/accounts";
import { twoToneJpeg } from "../support/photo-files";
import { toneWav } from "../support/capture-files";
import { bucketKeys } from "../support/bucket-keys";

// The editor, smoothed: the new-listing cards line up, sideways rows show there is more, a capture
// uploads with JavaScript off, and a deleted draft leaves nothing in storage.

const PHONE = { width: 390, height: 844 };
const DESKTOP = { width: 1280, height: 900 };

/** A 1 kHz sine at the output, 65 V peak at full scale (as the amplifier walk-through uses). */
function sineWav(): Buffer {
  return Buffer.from(
    toneWav({ sampleRate: 48_000, seconds: 1, f0: 1000, peak: 0.5, harmonics: [1, 1e-4, 5e-5], bits: "24", channels: 2, noiseRms: 2e-6 }),
  );
}

async function startDraft(page: Page, kind: RegExp): Promise<string> {
  await page.goto("/sell/new");
  await page.getByLabel(kind).check();
  await page.getByRole("button", { name: "Start the draft" }).click();
  await page.waitForURL(/\/sell\/[0-9a-f-]{36}\/item$/);
  return new URL(page.url()).pathname.split("/")[2];
}

/** What the viewport shows (the full page of a long market is no picture to look at). */
async function shot(page: Page, name: string) {
  fs.mkdirSync(SCREEN_DIR, { recursive: true });
  await page.screenshot({ path: path.join(SCREEN_DIR, `${name}.png`) });
}

/** How far the fades reach at each end of a sideways row, as the browser computes them. */
const fades = (page: Page, selector: string) =>
  page.locator(selector).evaluate((el) => {
    const s = getComputedStyle(el);
    return {
      start: s.getPropertyValue("--scroll-fade-start").trim(),
      end: s.getPropertyValue("--scroll-fade-end").trim(),
      left: el.scrollLeft,
    };
  });

describe("the editor, smoothed", () => {
  let browser: Browser;
  beforeAll(async () => {
    browser = await launchBrowser();
  });
  afterAll(async () => {
    await browser?.close();
  });

  it("lines up the new-listing cards: every radio the same size, every title at the same offset", async () => {
    for (const viewport of [PHONE, DESKTOP]) {
      const context = await newContext(browser, { viewport });
      const page = await context.newPage();
      await signIn(page, "seller@loadline.test");
      await page.goto("/sell/new");
      const cards = await page.locator('input[name="category"]').evaluateAll((radios) =>
        radios.map((r) => {
          const card = r.closest("label")!.getBoundingClientRect();
          const box = r.getBoundingClientRect();
          const title = r.closest("label")!.querySelector("span span")!.getBoundingClientRect();
          return { value: (r as HTMLInputElement).value, width: box.width, height: box.height, titleOffset: title.left - card.left };
        }),
      );
      expect(cards.find((c) => c.value === "turntable")).toBeTruthy();
      for (const c of cards) expect({ ...c, value: undefined }).toEqual({ ...cards[0], value: undefined });
      await shot(page, `editor-sell-new-${viewport.width}`);
      await context.close();
    }
  }, 120_000);

  it("fades the market's category chips and the editor's steps where more is off-screen, and keeps them reachable by keyboard", async () => {
    const context = await newContext(browser, { viewport: PHONE });
    const page = await context.newPage();
    await page.goto("/market");
    const chips = 'nav[aria-label="Categories"]';
    expect(await fades(page, chips)).toEqual({ start: "0px", end: "40px", left: 0 });
    // Tab through the chips: the last one scrolls into view and the fade moves to the start.
    const links = page.locator(`${chips} a`);
    await links.first().focus();
    const n = await links.count();
    for (let i = 1; i < n; i++) await page.keyboard.press("Tab");
    expect(await links.last().evaluate((a) => a === document.activeElement)).toBe(true);
    const end = await fades(page, chips);
    expect(end.left).toBeGreaterThan(0);
    expect(end.start).toBe("40px");
    expect(parseFloat(end.end)).toBeLessThan(40);
    await shot(page, "editor-market-chips-390");

    await signIn(page, "seller@loadline.test");
    const id = await startDraft(page, /Integrated amplifier/);
    await page.goto(`/sell/${id}/item`);
    const steps = 'nav[aria-label="Listing steps"]';
    const first = await fades(page, steps);
    expect(first.end).toBe("40px");
    expect(first.start).toBe("0px");
    await shot(page, "editor-steps-390");
    await page.getByLabel("Country", { exact: true }).selectOption("GB");
    await page.getByLabel("Country", { exact: true }).scrollIntoViewIfNeeded();
    expect(await page.getByLabel("Currency", { exact: true }).inputValue()).toBe("GBP");
    await shot(page, "editor-currency-gb-390");

    // On a desktop the chips wrap and the steps fit: nothing fades.
    await page.setViewportSize(DESKTOP);
    await page.goto("/market");
    expect(await fades(page, chips)).toEqual({ start: "0px", end: "0px", left: 0 });
    await context.close();
  }, 120_000);

  it("uploads a capture with JavaScript off and shows its readings, or the reason it was refused", async () => {
    const context = await browser.newContext({
      baseURL: baseUrl(),
      javaScriptEnabled: false,
      viewport: PHONE,
      locale: "en-GB",
      timezoneId: "UTC",
    });
    context.setDefaultTimeout(30_000);
    const page = await context.newPage();
    await signIn(page, "seller@loadline.test");
    const id = await startDraft(page, /Integrated amplifier/);
    await page.goto(`/sell/${id}/bench`);

    // No file: the server's refusal comes back beside the form.
    await page.getByRole("button", { name: "Upload and analyse" }).click();
    await page
      .getByRole("alert")
      .filter({ hasText: /The file is empty|no `file` field/ })
      .waitFor();
    await shot(page, "editor-capture-no-js-refused-390");

    await page
      .locator('input[type="file"][form="capture-form"]')
      .setInputFiles({ name: "amp-1k.wav", mimeType: "audio/wav", buffer: sineWav() });
    await page.locator('input[name="loadOhm"][form="capture-form"]').fill("8");
    await page.locator('input[name="volts"][form="capture-form"]').fill("65");
    await page.getByRole("button", { name: "Upload and analyse" }).click();
    await page.waitForURL(new RegExp(`/sell/${id}/bench\\?capture=[0-9a-f-]{36}`));
    const posted = page.getByTestId("posted-capture");
    await posted.waitFor();
    expect(await posted.getAttribute("data-capture-state")).toBe("done");
    const readings = await posted.getByRole("list", { name: "Readings from this capture" }).textContent();
    expect(readings).toMatch(/THD, left/);
    expect(await posted.textContent()).toMatch(/on the sheet below/);
    // The readings joined the saved sheet, marked as from the capture.
    expect(await page.locator('li[data-origin="capture"]').count()).toBeGreaterThan(0);
    await posted.scrollIntoViewIfNeeded();
    await shot(page, "editor-capture-no-js-390");
    await context.close();
  }, 120_000);

  it("deletes a draft with its photos after asking once more, and nothing is left in storage", async () => {
    const context = await newContext(browser, { viewport: DESKTOP });
    const page = await context.newPage();
    await signIn(page, "seller@loadline.test");
    const id = await startDraft(page, /Integrated amplifier/);
    await page.goto(`/sell/${id}/photos`);
    const files = await Promise.all(
      [1, 2].map(async (n) => ({ name: `front-${n}.jpg`, mimeType: "image/jpeg", buffer: await twoToneJpeg(960, 720) })),
    );
    await page.locator('input[type="file"][accept*="image/jpeg"]').setInputFiles(files);
    await page.waitForFunction(() => document.querySelectorAll('ol[aria-label="Photos, in listing order"] li img').length === 2, null, {
      timeout: 120_000,
    });
    const photos = await ListingPhoto.findAll({ where: { listingId: id } });
    const keys = photos.flatMap(photoKeys).filter((k) => !k.startsWith("incoming/"));
    expect(keys).toHaveLength(8);
    const before = await bucketKeys();
    for (const k of keys) expect(before.has(k), k).toBe(true);

    await page.getByRole("link", { name: "Delete draft…" }).click();
    await page.waitForURL(`**/sell/${id}/delete`);
    await page.getByRole("heading", { name: "Delete this draft?" }).waitFor();
    await shot(page, "editor-delete-confirm-1280");
    await page.getByRole("button", { name: "Delete this draft" }).click();
    await page.waitForURL(/\/sell$/);
    await page.getByText("The draft is deleted.").waitFor();
    await shot(page, "editor-delete-done-1280");

    // The worker's job removes every size; wait for it.
    const deadline = Date.now() + 60_000;
    let left = keys;
    while (left.length && Date.now() < deadline) {
      await new Promise((r) => setTimeout(r, 500));
      const now = await bucketKeys();
      left = keys.filter((k) => now.has(k));
    }
    expect(left).toEqual([]);
    expect((await page.goto(`/sell/${id}/item`))?.status()).toBe(404);
    await context.close();
  }, 240_000);
});
