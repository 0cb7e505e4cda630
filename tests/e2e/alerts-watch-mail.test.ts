import { afterAll, beforeAll, describe, expect, it } from "vitest";
import type { Browser } from "playwright-core";
import { Listing, User } from "~/models/index.server";
import { blankListing } from "../support/blank-listing";
import { launchBrowser, newContext, screenshot, uniqueEmail, waitForHydration } from "./support/browser";
import { DEMO_PASSWORD, signIn, signUpAndConfirm } from "./support/accounts";
import { extractLink, waitForMail } from "./support/mail";

// A buyer watches a unit; its seller lowers the price in the editor; the worker mails the buyer, whose
// mail links to the unit, the watch list and an unsubscribe page that works without signing in.

describe("watch notices", () => {
  let browser: Browser;
  let listing: Listing;
  beforeAll(async () => {
    browser = await launchBrowser();
    const seller = await User.findOne({ where: { email: "seller@loadline.test" } });
    if (!seller) throw new Error("The demo scenario has no seller@loadline.test: is the seed loaded?");
    // A unit of its own, so no other suite sees its price change.
    listing = await Listing.create(
      blankListing(seller.id, "integrated_amplifier", {
        status: "live",
        maker: "Quillon Audio Works",
        model: `QW ${Date.now().toString(36).toUpperCase()}`,
        priceMinor: 90_000,
        currency: "EUR",
        country: "DE",
        town: "Oskerfeld",
        cosmeticGrade: "clean",
        serviceState: "serviced_measured",
        publishedAt: new Date(),
      }),
    );
  });
  afterAll(async () => {
    await listing?.destroy();
    await browser?.close();
  });

  it("a buyer watches a unit, the seller lowers its price, and the buyer reads the price-drop mail", async () => {
    const title = `Quillon Audio Works ${listing.model}`;
    const buyerContext = await newContext(browser);
    const buyer = await buyerContext.newPage();
    const email = uniqueEmail("price-drop");
    await signUpAndConfirm(buyer, { name: "Orla Brackwater", email, password: "a-long-enough-password" });
    await buyer.goto(`/listings/${listing.id}`);
    await buyer.getByRole("heading", { level: 1, name: title }).waitFor();
    // The page paints before its scripts are fetched: a press before React takes over is the plain form's.
    await waitForHydration(buyer);
    await Promise.all([
      buyer.waitForResponse((r) => r.request().method() === "PUT" && r.url().includes(`/api/v1/watches/${listing.id}`) && r.ok()),
      buyer.getByRole("button", { name: "Watch this unit" }).click(),
    ]);

    const sellerContext = await newContext(browser);
    const seller = await sellerContext.newPage();
    await signIn(seller, "seller@loadline.test", DEMO_PASSWORD);
    await seller.goto(`/sell/${listing.id}/item`);
    await seller.getByLabel("Asking price").fill("750");
    await seller.getByRole("button", { name: "Save", exact: true }).click();
    // "Saved." from the button, or "Saved at …" when the autosave got there first.
    await seller
      .locator("[data-save-status]")
      .filter({ hasText: /^Saved/ })
      .waitFor();

    const mail = await waitForMail(email, { subject: /^Price drop:/ });
    expect(mail.subject).toBe(`Price drop: ${title}, now €750`);
    expect(mail.text).toContain("from €900 to €750");
    // The seller is not told about their own unit.
    expect(
      (await waitForMail("seller@loadline.test", { subject: /Price drop/, timeoutMs: 1 }).catch(() => null))?.subject ?? null,
    ).toBeNull();

    await buyer.goto(extractLink(mail, `/listings/${listing.id}`));
    await buyer.getByRole("heading", { level: 1, name: title }).waitFor();
    await buyer.goto(extractLink(mail, "/watching"));
    await buyer.getByRole("main").getByRole("link", { name: title }).waitFor();

    // The unsubscribe link, opened where nobody is signed in: it asks first, and stops on the button.
    const anonymous = await (await newContext(browser)).newPage();
    await anonymous.goto(extractLink(mail, "/unsubscribe/"));
    await anonymous.getByText("Stop e-mails about the units you watch").waitFor();
    await screenshot(anonymous, "unsubscribe-ask-1280");
    await Promise.all([anonymous.waitForLoadState("load"), anonymous.getByRole("button", { name: "Unsubscribe" }).click()]);
    await anonymous.getByRole("heading", { name: "Unsubscribed" }).waitFor();
    await buyer.goto("/watching");
    await buyer.getByRole("button", { name: "E-mail me again" }).waitFor();
    await Promise.all([buyerContext.close(), sellerContext.close(), anonymous.context().close()]);
  });
});
