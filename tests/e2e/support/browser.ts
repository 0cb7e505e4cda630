import fs from "node:fs";
import path from "node:path";
import { chromium, type Browser, type BrowserContext, type Page } from "playwright-core";
import { onTestFailed } from "vitest";

// Headless Debian Chromium for the browser suites. The app's address comes from the test runner
// (E2E_BASE_URL); nothing here starts servers.

export const CHROMIUM_ARGS = [
  "--no-sandbox",
  "--disable-gpu",
  "--disable-background-networking",
  "--disable-component-update",
  "--no-first-run",
];

export function baseUrl(): string {
  const url = process.env.E2E_BASE_URL;
  if (!url) throw new Error("E2E_BASE_URL is not set: run the browser suite through `npm test`.");
  return url.replace(/\/+$/, "");
}

export function launchBrowser(): Promise<Browser> {
  return chromium.launch({ executablePath: process.env.CHROMIUM_PATH ?? "/usr/bin/chromium", headless: true, args: CHROMIUM_ARGS });
}

/** A fresh context (own cookies) whose relative page.goto paths resolve against the app. */
export async function newContext(
  browser: Browser,
  options: { viewport?: { width: number; height: number } } = {},
): Promise<BrowserContext> {
  const context = await browser.newContext({
    baseURL: baseUrl(),
    viewport: options.viewport ?? { width: 1280, height: 900 },
    locale: "en-GB",
    timezoneId: "UTC",
  });
  context.setDefaultTimeout(30_000);
  context.setDefaultNavigationTimeout(30_000);
  // When the test that made this context fails, keep a picture of each of its pages.
  onTestFailed(async ({ task }) => {
    for (const [i, page] of context.pages().entries()) {
      await screenshot(page, `FAILED-${task.name.slice(0, 60)}-${i}`).catch(() => undefined);
    }
  });
  return context;
}

export const SCREEN_DIR = path.resolve("test-results/screens");

/** Full-page screenshot to test-results/screens/<name>.png, for a person to look at. */
export async function screenshot(page: Page, name: string): Promise<string> {
  fs.mkdirSync(SCREEN_DIR, { recursive: true });
  const file = path.join(SCREEN_DIR, `${name.replace(/[^a-z0-9._-]+/gi, "-")}.png`);
  await page.screenshot({ path: file, fullPage: true });
  return file;
}

/** An address nobody else in this run uses, so tests never see each other's mail or accounts. */
export function uniqueEmail(label: string): string {
  return `${label}-${Date.now().toString(36)}${Math.random().toString(36).slice(2, 7)}@example.test`;
}

/**
 * React has taken the document over: home, the market and a listing paint before their scripts are fetched
 * (docs/decisions/0035), so a click on what is painted may still be the browser's own until then. From here
 * on a click is the client router's (React hydrates a clicked part at once if it has not reached it yet).
 */
export async function waitForHydration(page: Page): Promise<void> {
  await page.waitForFunction(() => Object.keys(document).some((k) => k.startsWith("__reactContainer$")));
}
