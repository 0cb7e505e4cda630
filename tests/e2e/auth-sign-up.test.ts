import { afterAll, beforeAll, describe, expect, it } from "vitest";
import type { Browser } from "playwright-core";
import { launchBrowser, newContext, screenshot, uniqueEmail } from "./support/browser";
import { extractLink, inbox, waitForMail } from "./support/mail";
import { signIn } from "./support/accounts";

describe("sign-up, e-mail confirmation and sign-out", () => {
  let browser: Browser;
  beforeAll(async () => {
    browser = await launchBrowser();
  });
  afterAll(async () => {
    await browser?.close();
  });

  it("signs up, confirms through the e-mailed link, lands signed in, and signs out", async () => {
    const context = await newContext(browser);
    const page = await context.newPage();
    const email = uniqueEmail("signup");

    await page.goto("/sign-up");
    await page.getByRole("button", { name: "Create account" }).click();
    // Server-side validation, shown beside each field (the form has noValidate).
    await page.getByText("Enter the name other people on Loadline will see.").waitFor();
    await page.getByText("Enter your e-mail address.").waitFor();
    expect(await page.getByText("Choose a password.").count()).toBe(0);
    expect(await page.getByText("Use at least 10 characters.").isVisible()).toBe(true);

    await page.getByLabel("Your name").fill("Rowan Testbench");
    await page.getByLabel("E-mail address").fill(email);
    await page.getByLabel("Password").fill("short");
    await page.getByRole("button", { name: "Create account" }).click();
    await page.getByText("Use at least 10 characters.").waitFor();
    await page.getByLabel("Password").fill("valve-rectifier-warmup");
    await page.getByRole("button", { name: "Create account" }).click();
    await page.getByRole("heading", { name: "Check your inbox" }).waitFor();
    await screenshot(page, "auth-sign-up-sent");

    const mail = await waitForMail(email, { subject: /confirm your e-mail/i });
    const link = extractLink(mail, "/verify-email/");
    expect(new URL(link).origin).toBe(new URL(process.env.E2E_BASE_URL!).origin);

    await page.goto(link);
    await screenshot(page, "auth-verify-email");
    await page.getByRole("button", { name: "Confirm and sign in" }).click();
    await page.waitForURL("**/account");
    await page.getByText("Your e-mail address is confirmed").waitFor();
    expect(await page.getByText("Confirmed", { exact: true }).isVisible()).toBe(true);
    expect(await page.getByRole("heading", { name: "Rowan Testbench" }).isVisible()).toBe(true);
    await screenshot(page, "auth-account");

    // The link is single-use.
    await page.goto(link);
    await page.getByText("already been used").waitFor();

    // Sign out: the account page then asks to sign in again.
    await page.goto("/account");
    await page.getByRole("main").getByRole("button", { name: "Sign out" }).click();
    await page.waitForURL((url) => url.pathname === "/");
    await page.goto("/account");
    expect(new URL(page.url()).pathname).toBe("/sign-in");
    expect(new URL(page.url()).searchParams.get("redirectTo")).toBe("/account");
    await context.close();
  });

  it("answers a second sign-up with a taken address the same way, and mails its owner instead", async () => {
    const context = await newContext(browser);
    const page = await context.newPage();
    const email = uniqueEmail("taken");
    await page.goto("/sign-up");
    await page.getByLabel("Your name").fill("First Owner");
    await page.getByLabel("E-mail address").fill(email);
    await page.getByLabel("Password").fill("first-owner-password");
    await page.getByRole("button", { name: "Create account" }).click();
    await page.getByRole("heading", { name: "Check your inbox" }).waitFor();
    const first = await waitForMail(email, { subject: /confirm your e-mail/i });

    await page.goto("/sign-up");
    await page.getByLabel("Your name").fill("Someone Else");
    await page.getByLabel("E-mail address").fill(email);
    await page.getByLabel("Password").fill("someone-else-password");
    await page.getByRole("button", { name: "Create account" }).click();
    await page.getByRole("heading", { name: "Check your inbox" }).waitFor();
    const second = await waitForMail(email, { subject: /already have a Loadline account/i, after: [first.id] });
    expect(second.text).toContain("/sign-in");
    expect((await inbox(email)).filter((m) => /confirm your e-mail/i.test(m.subject))).toHaveLength(1);
    await context.close();
  });

  it("refuses a wrong password with one message that does not say whether the address exists", async () => {
    const context = await newContext(browser);
    const page = await context.newPage();
    const messages: string[] = [];
    for (const email of ["buyer@loadline.test", uniqueEmail("nobody")]) {
      await page.goto("/sign-in");
      await page.getByLabel("E-mail address").fill(email);
      await page.getByLabel("Password", { exact: true }).fill("not-the-password");
      await page.getByRole("button", { name: "Sign in", exact: true }).click();
      const alert = page.locator("[role=alert]").first();
      await alert.waitFor();
      messages.push((await alert.textContent()) ?? "");
    }
    expect(messages[0]).toContain("do not match an account");
    expect(messages[1]).toBe(messages[0]);
    // The right password still works after one failure.
    await signIn(page, "buyer@loadline.test");
    await page.goto("/account");
    expect(await page.getByText("buyer@loadline.test").first().isVisible()).toBe(true);
    await context.close();
  });
});
