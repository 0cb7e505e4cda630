import { randomBytes } from "node:crypto";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import type { Browser, Page } from "playwright-core";
import { Listing } from "~/models/index.server";
import { hashPassword } from "~/auth/password.server";
import { saveBenchSheet } from "~/listings/bench.server";
import { exampleIntegratedAmplifierSheet } from "@shared/bench";
import { baseUrl, launchBrowser, newContext } from "./support/browser";
import { DEMO, signIn } from "./support/accounts";
import { shots } from "./support/buying";
import { makeAccount, readyDraft, withOwnCaptures, type Seller } from "../integration/listing-support";

// The review desk in a browser: a moderator (desk@) clears a held listing with a note; asks for
// changes on another, the seller reads the note in the editor and publishes again, and it is back in
// the queue; the trail shows each note. Two moderators open one item: the second sees who has it and
// cannot act. The units are this file's own seller's, held because the note-taking desk needs them
// held (a republished unit goes to the desk), published back-dated so the market's first page is
// untouched.

const run = randomBytes(3).toString("hex");
const password = `desk-${run}-password`;
let browser: Browser;
let seller: Seller;

beforeAll(async () => {
  browser = await launchBrowser();
  seller = await makeAccount(`desk-e2e-${run}`, ["seller"]);
  await seller.user.update({ passwordHash: await hashPassword(password), displayName: "Maren Tollick" });
});
afterAll(async () => {
  await browser?.close();
});

/** A complete draft of the seller's, published and then held for the desk, as a moderator would find it. */
async function heldUnit(model: string): Promise<Listing> {
  const draft = await readyDraft(seller);
  await saveBenchSheet(draft.id, seller.user.id, await withOwnCaptures(exampleIntegratedAmplifierSheet(), seller.user.id));
  const listing = await draft.update({ model });
  await listing.update({
    status: "held",
    heldReason: "Power into 4 Ω is more than double the power into 8 Ω.",
    publishedAt: new Date(Date.UTC(2020, 0, 1)),
  });
  return listing;
}

async function moderatorPage(email: string): Promise<Page> {
  const page = await (await newContext(browser)).newPage();
  await signIn(page, email);
  return page;
}

async function decide(page: Page, listingId: string, note: string, button: string) {
  await page.goto(`/desk/listings/${listingId}`);
  await page.getByLabel("Note", { exact: true }).fill(note);
  await Promise.all([page.waitForURL(/\/desk(\?|$)/), page.getByRole("button", { name: button }).click()]);
  // The desk goes back to the queue; the listing's page keeps the trail.
  await page.goto(`/desk/listings/${listingId}`);
}

describe("the review desk", () => {
  it("clears a hold with a note: the unit goes live and the trail shows the note", async () => {
    const unit = await heldUnit(`Desk Clear ${run}`);
    const desk = await moderatorPage(DEMO.moderator);
    await desk.goto("/desk?kind=held_listing");
    await desk
      .getByRole("link", { name: new RegExp(`Desk Clear ${run}`) })
      .first()
      .waitFor();
    await shots(desk, "desk-queue");

    await desk.goto(`/desk/listings/${unit.id}`);
    await shots(desk, "desk-listing-held");
    // No note, no decision: the field says why and nothing changes.
    await Promise.all([desk.waitForLoadState("load"), desk.getByRole("button", { name: "Clear the hold" }).click()]);
    expect((await Listing.findByPk(unit.id))?.status).toBe("held");

    await decide(desk, unit.id, "Checked against the capture: the 4 Ω figure was a typing slip, corrected.", "Clear the hold");
    await desk.getByText("Checked against the capture: the 4 Ω figure was a typing slip").first().waitFor();
    expect((await Listing.findByPk(unit.id))?.status).toBe("live");
    // From the listing's public page a moderator reaches its desk page and trail.
    await desk.goto(`/listings/${unit.id}`);
    await Promise.all([
      desk.waitForURL(`**/desk/listings/${unit.id}`),
      desk.getByRole("link", { name: "Its trail at the review desk" }).click(),
    ]);
    await desk.getByText("Checked against the capture: the 4 Ω figure was a typing slip").first().waitFor();
  }, 120_000);

  it("asks for changes: the seller reads the note, publishes again and the unit is back in the queue", async () => {
    const unit = await heldUnit(`Desk Changes ${run}`);
    const desk = await moderatorPage(DEMO.moderator);
    const note = "Please add the 8 Ω power measured at 1 kHz; the sheet only has the 4 Ω figure.";
    await decide(desk, unit.id, note, "Ask for changes");
    await desk.getByText(note).first().waitFor();
    expect((await Listing.findByPk(unit.id))?.status).toBe("draft");

    const own = await (await newContext(browser)).newPage();
    await signIn(own, seller.user.email, password);
    await own.goto(`/sell/${unit.id}/review`);
    await own.getByText(note).first().waitFor();
    await shots(own, "editor-changes-asked");
    await own.getByRole("button", { name: "Publish", exact: true }).click();
    await own.getByText(/is back at the review desk with your changes/).waitFor();
    const after = await Listing.findByPk(unit.id);
    expect(after?.status).toBe("held");
    expect(after?.heldReason).toMatch(/^Resubmitted after changes/);

    await desk.goto("/desk?kind=held_listing");
    await desk
      .getByRole("link", { name: new RegExp(`Desk Changes ${run}`) })
      .first()
      .waitFor();
    await desk.goto(`/desk/listings/${unit.id}`);
    await desk.getByText(note).first().waitFor();
  }, 120_000);

  it("two moderators open one item: the second sees who has it and cannot act", async () => {
    const unit = await heldUnit(`Desk Race ${run}`);
    const first = await moderatorPage(DEMO.moderator);
    const second = await moderatorPage(DEMO.admin);
    await first.goto(`/desk/listings/${unit.id}`);
    await first.getByLabel("Note", { exact: true }).waitFor();

    await second.goto(`/desk/listings/${unit.id}`);
    await second
      .getByText(/^Taken by /)
      .first()
      .waitFor();
    await shots(second, "desk-listing-taken");
    expect(await second.getByRole("button", { name: "Clear the hold" }).isDisabled()).toBe(true);
    // A post straight from the second moderator's session is refused on the server too.
    const refused = await second.request.post(`/desk/listings/${unit.id}`, {
      form: { intent: "clear_hold", note: "Second moderator trying to clear it." },
      headers: { Origin: baseUrl() },
      maxRedirects: 0,
    });
    expect(refused.status()).toBe(409);
    expect((await Listing.findByPk(unit.id))?.status).toBe("held");

    await decide(first, unit.id, "Removed: the sheet was copied from another unit's.", "Remove the listing");
    expect((await Listing.findByPk(unit.id))?.status).toBe("removed");
  }, 120_000);
});
