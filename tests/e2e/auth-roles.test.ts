import { afterAll, beforeAll, describe, expect, it } from "vitest";
import type { Browser, Page } from "playwright-core";
import { baseUrl, launchBrowser, newContext, screenshot, uniqueEmail } from "./support/browser";
import { DEMO, signIn, submitSignIn } from "./support/accounts";

// The review desk is for moderators, the accounts page for admins. Others get a 403 page; visitors
// who are not signed in are sent to sign in and brought back.

async function expectForbidden(page: Page, path: string) {
  const response = await page.goto(path);
  expect(response?.status()).toBe(403);
  await page.getByText("Your account does not have that role.").waitFor();
  expect(new URL(page.url()).pathname).toBe(path);
}

describe("role-only pages", () => {
  let browser: Browser;
  beforeAll(async () => {
    browser = await launchBrowser();
  });
  afterAll(async () => {
    await browser?.close();
  });

  it("sends an anonymous visitor of the review desk to sign in, and back to the desk afterwards", async () => {
    const context = await newContext(browser);
    const page = await context.newPage();
    await page.goto("/desk");
    const url = new URL(page.url());
    expect(url.pathname).toBe("/sign-in");
    expect(url.searchParams.get("redirectTo")).toBe("/desk");
    await submitSignIn(page, DEMO.moderator, "bench-demo-2026");
    await page.waitForURL("**/desk");
    await page.getByRole("heading", { name: "Review desk" }).waitFor();
    const kinds = page.getByRole("navigation", { name: "Filter by kind" });
    await kinds.getByRole("link", { name: /^Held listings/ }).waitFor();
    await kinds.getByRole("link", { name: /^Workshop applications/ }).waitFor();
    await screenshot(page, "auth-desk");
    // A moderator is not an admin.
    await expectForbidden(page, "/admin/users");
    await context.close();
  });

  it("sends an anonymous visitor of the accounts page to sign in, and back to it afterwards", async () => {
    const context = await newContext(browser);
    const page = await context.newPage();
    await page.goto("/admin/users");
    expect(new URL(page.url()).searchParams.get("redirectTo")).toBe("/admin/users");
    await submitSignIn(page, DEMO.admin, "bench-demo-2026");
    await page.waitForURL("**/admin/users");
    await page.getByRole("heading", { name: "Accounts" }).waitFor();
    // The admin's own row (found by search: the newest accounts come first) cannot drop the admin role.
    await page.goto(`/admin/users?q=${encodeURIComponent(DEMO.admin)}`);
    const own = page.getByRole("listitem", { name: DEMO.admin });
    expect(await own.getByRole("checkbox", { name: "Admin" }).isDisabled()).toBe(true);
    await screenshot(page, "auth-admin-users");
    // An admin includes the moderator (README, "Roles"): the desk opens too.
    expect((await page.goto("/desk"))?.status()).toBe(200);
    await page.getByRole("heading", { name: "Review desk" }).waitFor();
    await context.close();
  });

  it("refuses a buyer both pages with a 403 page", async () => {
    const context = await newContext(browser);
    const page = await context.newPage();
    await signIn(page, DEMO.buyer);
    await expectForbidden(page, "/desk");
    await screenshot(page, "auth-403");
    await expectForbidden(page, "/admin/users");
    await context.close();
  });

  it("lets an admin grant the moderator role, which opens the desk at once", async () => {
    // A fresh account, made the quick way (a Loadline pass).
    const email = uniqueEmail("promoted");
    const person = await newContext(browser);
    const page = await person.newPage();
    await page.goto("/sign-in");
    await page.getByRole("button", { name: "Sign in with your Loadline pass" }).click();
    await page.waitForURL(/\/authorize\?/);
    await page.getByLabel("E-mail address").fill(email);
    await page.getByRole("button", { name: "Continue" }).click();
    await page.waitForURL((url) => url.origin === new URL(baseUrl()).origin && url.pathname === "/");
    await expectForbidden(page, "/desk");

    const admin = await newContext(browser);
    const adminPage = await admin.newPage();
    await signIn(adminPage, DEMO.admin);
    await adminPage.goto(`/admin/users?q=${encodeURIComponent(email)}`);
    const row = adminPage.getByRole("listitem", { name: email });
    await row.getByRole("checkbox", { name: "Moderator" }).check();
    await row.getByRole("button", { name: "Save roles" }).click();
    await row.getByText(/^Roles of .* saved\.$/).waitFor();
    expect(await row.getByRole("checkbox", { name: "Moderator" }).isChecked()).toBe(true);

    await page.goto("/desk");
    await page.getByRole("heading", { name: "Review desk" }).waitFor();
    await admin.close();
    await person.close();
  }, 180_000);
});
