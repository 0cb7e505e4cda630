import http from "node:http";
import type { AddressInfo } from "node:net";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import type { Browser, BrowserContext, Page } from "playwright-core";
import { baseUrl, launchBrowser, newContext } from "./support/browser";
import { DEMO, signIn } from "./support/accounts";
import { twoToneJpeg } from "../support/photo-files";

// Every page keeps to its Content-Security-Policy (no inline script without the nonce, no blocked
// style, image or connection), responses carry the security headers, and no other page can frame ours.

/** Collects CSP violations a page reports, as events and as console messages, and complaints about the Permissions-Policy header. */
async function watchPolicy(context: BrowserContext): Promise<string[]> {
  const seen: string[] = [];
  await context.addInitScript(() => {
    document.addEventListener("securitypolicyviolation", (e) => {
      console.error(`CSP violation: ${e.violatedDirective} blocked ${e.blockedURI || "inline"} (${e.sourceFile}:${e.lineNumber})`);
    });
  });
  context.on("console", (m) => {
    if (/Content Security Policy|CSP violation|Refused to|Permissions-Policy/i.test(m.text())) seen.push(`${m.page()?.url()}: ${m.text()}`);
  });
  return seen;
}

async function settle(page: Page) {
  await page.waitForLoadState("networkidle");
}

describe("security headers and the content security policy", () => {
  let browser: Browser;
  beforeAll(async () => {
    browser = await launchBrowser();
  });
  afterAll(async () => {
    await browser?.close();
  });

  it("documents carry a per-response nonce policy and the common headers; JSON and files the common headers", async () => {
    const context = await newContext(browser);
    const page = await context.newPage();
    const first = await page.goto("/");
    const second = await page.request.get("/");
    const policy = first!.headers()["content-security-policy"];
    expect(policy).toMatch(/script-src 'self' 'nonce-[A-Za-z0-9+/=]{24}'/);
    expect(policy).toContain("frame-ancestors 'none'");
    expect(policy).toContain("object-src 'none'");
    expect(policy).not.toMatch(/script-src[^;]*'unsafe-(inline|eval)'/);
    // The nonce is new for every response, and the page's inline scripts carry it.
    const nonce = /'nonce-([^']+)'/.exec(policy)![1];
    expect(/'nonce-([^']+)'/.exec(second.headers()["content-security-policy"])![1]).not.toBe(nonce);
    const inline = await page.evaluate(() =>
      [...document.querySelectorAll("script:not([src])")].map((s) => (s as HTMLScriptElement).nonce),
    );
    expect(inline.length).toBeGreaterThan(0);
    expect(inline.every((n) => n === nonce)).toBe(true);

    for (const path of ["/", "/healthz/live", "/api/v1/bench-sheets/check", "/favicon.svg"]) {
      const headers = (await page.request.get(path)).headers();
      expect(headers["x-content-type-options"], path).toBe("nosniff");
      expect(headers["x-frame-options"], path).toBe("DENY");
      expect(headers["referrer-policy"], path).toBe("strict-origin-when-cross-origin");
      expect(headers["permissions-policy"], path).toMatch(/camera=\(\).*geolocation=\(\).*microphone=\(\)/);
      // Served over plain http here: no HSTS, which would pin a local address to https.
      expect(headers["strict-transport-security"], path).toBeUndefined();
    }
    await context.close();
  });

  it("a page on the same site cannot frame /admin/users, even with the admin signed in", async () => {
    const context = await newContext(browser);
    const page = await context.newPage();
    await signIn(page, DEMO.admin);
    // Another port on the same host is the same site: the session cookie goes along.
    const target = `${baseUrl()}/admin/users`;
    const framer = http.createServer((_req, res) => {
      res.setHeader("Content-Type", "text/html");
      res.end(`<!doctype html><title>framer</title><iframe name="victim" src="${target}" width="800" height="600"></iframe>`);
    });
    await new Promise<void>((r) => framer.listen(0, "127.0.0.1", r));
    try {
      const messages: string[] = [];
      page.on("console", (m) => messages.push(m.text()));
      await page.goto(`http://127.0.0.1:${(framer.address() as AddressInfo).port}/`);
      const victim = page.frame({ name: "victim" });
      const shown = await victim?.evaluate(() => document.body?.innerText ?? "").catch(() => "");
      expect(shown ?? "").not.toMatch(/Accounts|admin@loadline\.test/);
      await expect.poll(() => messages.join("\n")).toMatch(/frame-ancestors 'none'/);
    } finally {
      await new Promise((r) => framer.close(r));
      await context.close();
    }
  });

  it("the home page, the market and a listing page with plots run without a policy violation", async () => {
    const context = await newContext(browser);
    const violations = await watchPolicy(context);
    const page = await context.newPage();
    await page.goto("/");
    await settle(page);
    await page.goto("/market?category=integrated-amplifiers");
    await settle(page);
    await page.getByRole("link", { name: "Carrowain WQ 46i" }).click();
    await page.waitForURL(/\/listings\/[0-9a-f-]{36}$/);
    await page.locator('[role="img"] svg path[data-series]').first().waitFor();
    await settle(page);
    // The zoom dialog loads the large photo.
    await page.getByRole("link", { name: /^Zoom/ }).click();
    await page.getByRole("dialog").waitFor();
    await page.waitForFunction(() => (document.querySelector<HTMLImageElement>("dialog img")?.naturalWidth ?? 0) > 0);
    expect(violations).toEqual([]);
    await context.close();
  });

  it("the seller's editor (live bench checks, the photo uploader), /admin/users, the desk and the account page run without a policy violation", async () => {
    const context = await newContext(browser);
    const violations = await watchPolicy(context);
    const page = await context.newPage();
    await signIn(page, "workshop@loadline.test");
    await page.goto("/sell/new");
    await page.getByLabel(/Integrated amplifier/).check();
    await page.getByRole("button", { name: "Start the draft" }).click();
    await page.waitForURL(/\/sell\/[0-9a-f-]{36}\/item$/);
    const id = new URL(page.url()).pathname.split("/")[2];

    await page.goto(`/sell/${id}/photos`);
    await page
      .locator('input[type="file"][accept*="image/jpeg"]')
      .setInputFiles([{ name: "csp-front.jpg", mimeType: "image/jpeg", buffer: await twoToneJpeg(640, 480) }]);
    await page.waitForFunction(() => document.querySelectorAll('ol[aria-label="Photos, in listing order"] li img').length === 1, null, {
      timeout: 120_000,
    });
    await page.waitForFunction(() =>
      [...document.querySelectorAll('ol[aria-label="Photos, in listing order"] li img')].every(
        (i) => (i as HTMLImageElement).naturalWidth > 0,
      ),
    );

    await page.goto(`/sell/${id}/bench`);
    const m1 = page.locator('li[data-row="M1"]');
    await m1.locator('[name$=".value"]').fill("66 W");
    await m1.getByText("reads as 66 W").waitFor();
    await page.locator("[data-verdict]").first().waitFor();
    await settle(page);

    await page
      .getByRole("link", { name: "Sign out" })
      .or(page.getByRole("button", { name: "Sign out" }))
      .first()
      .click();
    await page.waitForLoadState("load");
    await signIn(page, DEMO.admin);
    for (const path of ["/admin/users", "/desk", "/account"]) {
      await page.goto(path);
      await page.getByRole("heading", { level: 1 }).waitFor();
      await settle(page);
    }
    expect(violations).toEqual([]);
    await context.close();
  });
});
