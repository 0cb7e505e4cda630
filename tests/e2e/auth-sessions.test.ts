import { afterAll, beforeAll, describe, expect, it } from "vitest";
import type { Browser, BrowserContext } from "playwright-core";
import { baseUrl, launchBrowser, newContext, screenshot, uniqueEmail } from "./support/browser";
import { signIn, signUpAndConfirm } from "./support/accounts";

// Sessions end on the server: a copied cookie is worthless after sign-out, and /account lists the
// account's sessions with a way to end them, with or without JavaScript.

async function sessionCookie(context: BrowserContext): Promise<string> {
  const cookie = (await context.cookies()).find((c) => c.name.endsWith("loadline_session"));
  if (!cookie) throw new Error("no session cookie in the browser");
  return `${cookie.name}=${cookie.value}`;
}

/** What someone holding a copy of the cookie gets from the account page's data request. */
async function replay(cookie: string) {
  const res = await fetch(`${baseUrl()}/account.data`, { headers: { Cookie: cookie }, redirect: "manual" });
  return { status: res.status, body: await res.text() };
}

describe("sessions", () => {
  let browser: Browser;
  beforeAll(async () => {
    browser = await launchBrowser();
  });
  afterAll(async () => {
    await browser?.close();
  });

  it("a cookie copied before signing out opens nothing afterwards", async () => {
    const email = uniqueEmail("replay");
    const password = "copied-cookie-test";
    const context = await newContext(browser);
    const page = await context.newPage();
    await signUpAndConfirm(page, { name: "Robin Replay", email, password });
    const copied = await sessionCookie(context);

    const before = await replay(copied);
    expect(before.status).toBe(200);
    expect(before.body).toContain(email);

    await page.getByRole("main").getByRole("button", { name: "Sign out", exact: true }).click();
    await page.waitForURL((url) => url.pathname === "/");

    const after = await replay(copied);
    expect(after.body).not.toContain(email);
    expect(after.body).toContain("/sign-in?redirectTo=%2Faccount");
    await context.close();
  }, 120_000);

  it("lists the sessions on /account and signs out everywhere else, keeping this one, without JavaScript", async () => {
    const email = uniqueEmail("devices");
    const password = "two-devices-test";
    const phone = await newContext(browser);
    const phonePage = await phone.newPage();
    await signUpAndConfirm(phonePage, { name: "Dana Devices", email, password });

    const desk = await browser.newContext({ baseURL: baseUrl(), javaScriptEnabled: false, locale: "en-GB", timezoneId: "UTC" });
    desk.setDefaultTimeout(30_000);
    const deskPage = await desk.newPage();
    await signIn(deskPage, email, password);
    await deskPage.goto("/account");
    const list = deskPage.getByRole("list").filter({ has: deskPage.getByText("This device") });
    expect(await list.getByRole("listitem").count()).toBe(2);
    await screenshot(deskPage, "auth-sessions-list");

    await deskPage.getByRole("button", { name: "Sign out everywhere else" }).click();
    await deskPage.getByText("Signed out everywhere else (1 session).").waitFor();
    expect(await list.getByRole("listitem").count()).toBe(1);

    // The phone was signed out; the desk still is signed in.
    await phonePage.goto("/account");
    expect(new URL(phonePage.url()).pathname).toBe("/sign-in");
    await deskPage.goto("/account");
    expect(new URL(deskPage.url()).pathname).toBe("/account");
    await phone.close();
    await desk.close();
  }, 180_000);
});
