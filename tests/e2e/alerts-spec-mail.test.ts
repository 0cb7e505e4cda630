import { afterAll, beforeAll, describe, expect, it } from "vitest";
import type { Browser } from "playwright-core";
import { User } from "~/models/index.server";
import { hashPassword } from "~/auth/password.server";
import { createAmplifierListing, removeFixtureUsers } from "../support/listing-fixtures";
import { launchBrowser, newContext, screenshot, uniqueEmail } from "./support/browser";
import { signIn, signUpAndConfirm } from "./support/accounts";
import { extractLink, inbox, type CaughtMail } from "./support/mail";

// A buyer saves the market's filters as a spec alert; a workshop publishes a unit that matches; the
// worker's match job mails the buyer at once, with a link to the unit and an unsubscribe link that
// works without signing in.

const FILTERS = "category=integrated-amplifiers&power8Min=60+W&thdMax=0.05+%25&seller=workshop";

/** The newest mail to `to` that links to `path`, polling the catcher. */
async function mailLinkingTo(to: string, path: string, timeoutMs = 30_000): Promise<CaughtMail> {
  const deadline = Date.now() + timeoutMs;
  for (;;) {
    const found = (await inbox(to)).find((m) => m.links.some((l) => new URL(l).pathname === path));
    if (found) return found;
    if (Date.now() > deadline) throw new Error(`no mail to ${to} linking to ${path} within ${timeoutMs} ms`);
    await new Promise((r) => setTimeout(r, 250));
  }
}

describe("spec alerts", () => {
  let browser: Browser;
  let fixture: Awaited<ReturnType<typeof createAmplifierListing>>;
  const password = "a-workshop-password-for-alerts";
  beforeAll(async () => {
    browser = await launchBrowser();
    // A workshop's draft with everything publishing asks for (bench sheet, log, photos, shipping).
    fixture = await createAmplifierListing({ status: "draft", label: `alert-e2e-${Date.now().toString(36)}` });
    await fixture.seller.update({ passwordHash: await hashPassword(password) });
  });
  afterAll(async () => {
    if (fixture) await removeFixtureUsers([(await User.findByPk(fixture.seller.id))!]);
    await browser?.close();
  });

  it("a buyer saves the filters, a workshop publishes a matching unit, and the alert arrives in the mail", async () => {
    const buyerContext = await newContext(browser);
    const buyer = await buyerContext.newPage();
    const email = uniqueEmail("spec-alert");
    await signUpAndConfirm(buyer, { name: "Tamsin Ashgrove", email, password: "a-long-enough-password" });

    await buyer.goto(`/alerts/new?${FILTERS}&page=2`);
    const filters = buyer.getByRole("region", { name: "The filters" });
    for (const words of ["Integrated amplifiers", "Power into 8 Ω, at least 60 W", "THD, at most 0.05 %", "Sold by a workshop"])
      await filters.getByText(words, { exact: true }).waitFor();
    const name = `Workshop amps ${Date.now().toString(36)}`;
    await buyer.getByLabel("Name").fill(name);
    await buyer.getByLabel(/At once/).check();
    await screenshot(buyer, "alert-new-1280");
    await buyer.getByRole("button", { name: "Save the alert" }).click();
    await buyer.waitForURL("**/alerts?saved=*");
    await buyer.getByRole("heading", { level: 2, name }).waitFor();
    await screenshot(buyer, "alerts-1280");
    await buyer.setViewportSize({ width: 390, height: 844 });
    await screenshot(buyer, "alerts-390");

    const workshopContext = await newContext(browser);
    const workshop = await workshopContext.newPage();
    await signIn(workshop, fixture.seller.email, password);
    await workshop.goto(`/sell/${fixture.listing.id}/review`);
    await Promise.all([workshop.waitForLoadState("load"), workshop.getByRole("button", { name: "Publish", exact: true }).click()]);

    const mail = await mailLinkingTo(email, `/listings/${fixture.listing.id}`);
    expect(mail.subject).toBe(`New for your alert “${name}”: Tallowmere Audio Ostry 60`);
    await buyer.goto(extractLink(mail, `/listings/${fixture.listing.id}`));
    await buyer.getByRole("heading", { level: 1, name: "Tallowmere Audio Ostry 60" }).waitFor();

    // Unsubscribing needs no account, and only the button does it.
    const anonymous = await (await newContext(browser)).newPage();
    await anonymous.goto(extractLink(mail, "/unsubscribe/"));
    await anonymous.getByText(`Stop e-mails from your spec alert “${name}”?`).waitFor();
    await Promise.all([anonymous.waitForLoadState("load"), anonymous.getByRole("button", { name: "Unsubscribe" }).click()]);
    await anonymous.getByRole("heading", { name: "Unsubscribed" }).waitFor();
    await buyer.goto("/alerts");
    const item = buyer.getByRole("listitem").filter({ has: buyer.getByRole("heading", { name }) });
    expect(await item.getByLabel(/No e-mail/).isChecked()).toBe(true);
    await Promise.all([buyerContext.close(), workshopContext.close(), anonymous.context().close()]);
  });
});
