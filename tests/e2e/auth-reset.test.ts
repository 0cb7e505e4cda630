import { afterAll, beforeAll, describe, expect, it } from "vitest";
import type { Browser } from "playwright-core";
import { launchBrowser, newContext, screenshot, uniqueEmail } from "./support/browser";
import { extractLink, waitForMail } from "./support/mail";
import { signUpAndConfirm, submitSignIn } from "./support/accounts";

describe("password reset by e-mail", () => {
  let browser: Browser;
  beforeAll(async () => {
    browser = await launchBrowser();
  });
  afterAll(async () => {
    await browser?.close();
  });

  it("mails a one-time link that sets a new password, signs in, and ends the other sessions", async () => {
    const email = uniqueEmail("reset");
    const oldPassword = "first-password-here";
    const newPassword = "second-password-here";

    // A second device that is signed in throughout.
    const other = await newContext(browser);
    const otherPage = await other.newPage();
    await signUpAndConfirm(otherPage, { name: "Morgan Meter", email, password: oldPassword });

    const context = await newContext(browser);
    const page = await context.newPage();
    await page.goto("/sign-in");
    await page.getByRole("link", { name: "Forgotten your password?" }).click();
    // Wait for the new page: the sign-in form has an "E-mail address" field too.
    await page.getByRole("heading", { name: "Forgotten your password?" }).waitFor();
    await page.getByLabel("E-mail address").fill(email);
    await page.getByRole("button", { name: "Send me a link" }).click();
    await page.getByText(`If a Loadline account uses ${email}`).waitFor();

    const mail = await waitForMail(email, { subject: /new Loadline password/i });
    const link = extractLink(mail, "/reset-password/");
    await page.goto(link);
    await page.getByLabel("New password", { exact: true }).fill(newPassword);
    await page.getByLabel("New password again").fill("something-else-entirely");
    await page.getByRole("button", { name: "Set password and sign in" }).click();
    await page.getByText("The two passwords are not the same.").waitFor();
    await screenshot(page, "auth-reset-mismatch");

    await page.getByLabel("New password", { exact: true }).fill(newPassword);
    await page.getByLabel("New password again").fill(newPassword);
    await page.getByRole("button", { name: "Set password and sign in" }).click();
    await page.waitForURL("**/account");
    await page.getByText("Your new password is set").waitFor();

    // The link cannot be used twice.
    await page.goto(link);
    await page.getByText("already been used").waitFor();

    // The other device was signed out by the reset.
    await otherPage.goto("/account");
    expect(new URL(otherPage.url()).pathname).toBe("/sign-in");

    // Old password refused, new one accepted.
    await submitSignIn(otherPage, email, oldPassword);
    await otherPage.getByText("do not match an account").waitFor();
    await submitSignIn(otherPage, email, newPassword);
    await otherPage.waitForURL("**/account");
    await other.close();
    await context.close();
  }, 180_000); // two browsers and a sign-up on the way: longer than the suite's default

  it("gives the same answer for an address with no account, and sends nothing", async () => {
    const context = await newContext(browser);
    const page = await context.newPage();
    const email = uniqueEmail("ghost");
    await page.goto("/forgot-password");
    await page.getByLabel("E-mail address").fill(email);
    await page.getByRole("button", { name: "Send me a link" }).click();
    await page.getByText(`If a Loadline account uses ${email}`).waitFor();
    await expect(waitForMail(email, { timeoutMs: 1_500 })).rejects.toThrow(/no mail/);
    await context.close();
  });
});
