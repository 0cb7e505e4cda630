import type { Page } from "playwright-core";
import { extractLink, waitForMail } from "./mail";

// Demo accounts the seed creates (README lists them); one password for all.
export const DEMO_PASSWORD = "bench-demo-2026";
export const DEMO = {
  admin: "admin@loadline.test",
  moderator: "desk@loadline.test",
  buyer: "buyer@loadline.test",
} as const;

/** Fills and sends the sign-in form on the current /sign-in page. */
export async function submitSignIn(page: Page, email: string, password: string) {
  await page.getByLabel("E-mail address").fill(email);
  await page.getByLabel("Password", { exact: true }).fill(password);
  await Promise.all([page.waitForLoadState("load"), page.getByRole("button", { name: "Sign in", exact: true }).click()]);
}

export async function signIn(page: Page, email: string, password = DEMO_PASSWORD) {
  await page.goto("/sign-in");
  await submitSignIn(page, email, password);
  await page.waitForURL((url) => url.pathname !== "/sign-in");
}

/** Signs up through the form and confirms through the e-mailed link; ends signed in on /account. */
export async function signUpAndConfirm(page: Page, { name, email, password }: { name: string; email: string; password: string }) {
  await page.goto("/sign-up");
  await page.getByLabel("Your name").fill(name);
  await page.getByLabel("E-mail address").fill(email);
  await page.getByLabel("Password").fill(password);
  await page.getByRole("button", { name: "Create account" }).click();
  await page.getByRole("heading", { name: "Check your inbox" }).waitFor();
  const mail = await waitForMail(email, { subject: /confirm your e-mail/i });
  await page.goto(extractLink(mail, "/verify-email/"));
  await page.getByRole("button", { name: "Confirm and sign in" }).click();
  await page.waitForURL("**/account");
}
