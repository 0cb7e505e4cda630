import { afterAll, beforeAll, describe, expect, it } from "vitest";
import type { Browser, Page } from "playwright-core";
import { baseUrl, launchBrowser, newContext, screenshot, uniqueEmail } from "./support/browser";
import { DEMO } from "./support/accounts";

// "Sign in with your Loadline pass" through the local identity provider: authorization code with PKCE and
// state, exactly as against a hosted provider.

async function chooseIdentity(page: Page, email: string, name?: string) {
  await page.waitForURL((url) => url.origin !== new URL(baseUrl()).origin);
  await page.getByLabel("E-mail address").fill(email);
  if (name) await page.getByLabel(/Display name/).fill(name);
  await page.getByRole("button", { name: "Continue" }).click();
}

describe("OAuth sign-in", () => {
  let browser: Browser;
  beforeAll(async () => {
    browser = await launchBrowser();
  });
  afterAll(async () => {
    await browser?.close();
  });

  it("creates an account for a new identity and signs it in, coming back to the page asked for", async () => {
    const context = await newContext(browser);
    const page = await context.newPage();
    const email = uniqueEmail("oauth");
    await page.goto("/sign-in?redirectTo=%2Faccount");
    await page.getByRole("button", { name: "Sign in with your Loadline pass" }).click();
    // The request the app made: code flow, PKCE S256, a state value, the registered callback.
    await page.waitForURL(/\/authorize\?/);
    const authorize = new URL(page.url()).searchParams;
    expect(authorize.get("response_type")).toBe("code");
    expect(authorize.get("code_challenge_method")).toBe("S256");
    expect(authorize.get("state")?.length).toBeGreaterThan(16);
    expect(new URL(authorize.get("redirect_uri")!).pathname).toBe("/auth/oauth/callback");
    await screenshot(page, "auth-oauth-provider");
    await chooseIdentity(page, email, "Sasha Solder");
    await page.waitForURL((url) => url.origin === new URL(baseUrl()).origin && url.pathname === "/account");
    await page.getByRole("heading", { name: "Sasha Solder" }).waitFor();
    expect(await page.getByText("Confirmed", { exact: true }).isVisible()).toBe(true);
    expect(await page.getByText("With your Loadline pass").isVisible()).toBe(true);
    // The one-time state cookies are gone once used.
    const cookies = await context.cookies();
    expect(cookies.filter((c) => c.name.startsWith("loadline_oauth"))).toEqual([]);
    await screenshot(page, "auth-oauth-account");
    await context.close();
  });

  it("links to the existing account with the same verified address", async () => {
    const context = await newContext(browser);
    const page = await context.newPage();
    await page.goto("/sign-in");
    await page.getByRole("button", { name: "Sign in with your Loadline pass" }).click();
    await chooseIdentity(page, DEMO.buyer);
    await page.waitForURL((url) => url.origin === new URL(baseUrl()).origin && url.pathname === "/");
    await page.goto("/account");
    // The seeded buyer's own account (its password still works too), now with the identity linked.
    expect(await page.getByText(DEMO.buyer).first().isVisible()).toBe(true);
    expect(await page.getByText("With your e-mail address and password.").isVisible()).toBe(true);
    expect(await page.getByText("With your Loadline pass").isVisible()).toBe(true);
    await context.close();
  });

  it("says so plainly when the person cancels at the provider", async () => {
    const context = await newContext(browser);
    const page = await context.newPage();
    await page.goto("/sign-in");
    await page.getByRole("button", { name: "Sign in with your Loadline pass" }).click();
    await page.waitForURL(/\/authorize/);
    await page.getByRole("button", { name: "Cancel" }).click();
    await page.waitForURL((url) => url.pathname === "/sign-in");
    await page.getByText("Signing in with your Loadline pass was cancelled").waitFor();
    await page.goto("/account");
    expect(new URL(page.url()).pathname).toBe("/sign-in");
    await context.close();
  });
});
