import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { randomBytes } from "node:crypto";
import type { Browser } from "playwright-core";
import { DeskFlag, Listing, ListingPhoto, User } from "~/models/index.server";
import { hashPassword } from "~/auth/password.server";
import { mediaUrl } from "~/catalogue/media-url";
import { hashDistance, PHOTO_MATCH_MAX_DISTANCE } from "~/photos/perceptual-hash.server";
import { launchBrowser, newContext, screenshot } from "./support/browser";
import { DEMO, signIn } from "./support/accounts";
import { blankListing } from "../support/blank-listing";

// A seller of our own (never a demo account others use) saves a demo listing's photo from its page
// and publishes it on a listing of theirs: the listing is held with the photo reason, a copied_photo
// flag names both photos, and the review desk lists it. The listing is deleted afterwards.

const RUN = randomBytes(3).toString("hex");
const EMAIL = `copier-${RUN}@example.test`;
const PASSWORD = `copier-pass-${RUN}`;

let browser: Browser;
let copier: User;

beforeAll(async () => {
  browser = await launchBrowser();
  copier = await User.create({
    email: EMAIL,
    displayName: `Copier ${RUN}`,
    passwordHash: await hashPassword(PASSWORD),
    roles: ["buyer", "seller"],
    emailVerifiedAt: new Date(),
    lastSignInAt: null,
  });
});

afterAll(async () => {
  await browser?.close();
  if (copier) {
    await Listing.destroy({ where: { sellerId: copier.id } }); // cascades to photos and flags
    await User.destroy({ where: { id: copier.id } });
  }
});

describe("a photo copied from another seller's listing", () => {
  it("holds the new listing for the review desk with both photos on the flag", async () => {
    // A live demo listing of the workshop's and its cover photo as a visitor downloads it.
    const workshop = await User.findOne({ where: { email: "workshop@loadline.test" }, rejectOnEmpty: true });
    const source = await Listing.findOne({ where: { sellerId: workshop.id, status: "live", maker: "Carrowain", model: "WQ 46i" } });
    expect(source).not.toBeNull();
    const original = await ListingPhoto.findOne({ where: { listingId: source!.id, position: 0 }, rejectOnEmpty: true });

    const context = await newContext(browser);
    const page = await context.newPage();
    const download = await page.request.get(mediaUrl(original.listingKey!));
    expect(download.status()).toBe(200);
    const copied = await download.body();

    // The copier's listing, complete but for its photo.
    const draft = await Listing.create(
      blankListing(copier.id, "integrated_amplifier", {
        maker: "Carrowain",
        model: "WQ 46i",
        priceMinor: 39_000,
        currency: "GBP",
        country: "GB",
        town: "Somewhere",
        weightG: 11_200,
        shippingOptions: [{ method: "collection" }],
        cosmeticGrade: "clean",
        serviceState: "working_unserviced",
      }),
    );

    await signIn(page, EMAIL, PASSWORD);
    const uploaded = await page.request.post(`/api/v1/listings/${draft.id}/photos`, {
      multipart: { photo: { name: "front.jpg", mimeType: "image/jpeg", buffer: copied } },
    });
    expect(uploaded.status()).toBe(202);
    await page.goto(`/sell/${draft.id}/photos`);
    await page.waitForFunction(() => document.querySelectorAll('ol[aria-label="Photos, in listing order"] li img').length === 1, null, {
      timeout: 90_000,
    });
    const photo = await ListingPhoto.findOne({ where: { listingId: draft.id }, rejectOnEmpty: true });
    const distance = hashDistance(photo.phash!, original.phash!);
    expect(distance).toBeLessThanOrEqual(PHOTO_MATCH_MAX_DISTANCE);

    await page.goto(`/sell/${draft.id}/review`);
    await page.getByRole("button", { name: "Publish", exact: true }).click();
    await page.getByText(/is published and waiting at the review desk/).waitFor();
    await page
      .getByText(/a photo matches one on another seller's listing/)
      .first()
      .waitFor();
    await screenshot(page, "copied-photo-held-1280");

    const held = await Listing.findByPk(draft.id, { rejectOnEmpty: true });
    expect(held.status).toBe("held");
    const flags = await DeskFlag.findAll({ where: { listingId: draft.id, kind: "copied_photo" } });
    expect(flags.map((f) => f.details)).toEqual([{ photoId: photo.id, matchesPhotoId: original.id, distance }]);
    // Off the market: the public page is not found for a visitor.
    const visitor = await newContext(browser);
    expect((await visitor.request.get(`/listings/${draft.id}`)).status()).toBe(404);
    await visitor.close();
    await context.close();

    // The review desk lists it with the photo reason.
    const desk = await newContext(browser);
    const moderator = await desk.newPage();
    await signIn(moderator, DEMO.moderator);
    await moderator.goto("/desk");
    await moderator
      .getByText(/a photo matches one on another seller's listing/)
      .first()
      .waitFor();

    // Its page shows both photos side by side; the moderator removes the listing with a note.
    await moderator.goto(`/desk/listings/${draft.id}`);
    const pair = moderator.getByTestId("copied-photo-pair");
    await pair.waitFor();
    expect(await pair.getByTestId("copied-photo-this").getByRole("img").count()).toBe(1);
    expect(await pair.getByTestId("copied-photo-other").getByRole("img").count()).toBe(1);
    await screenshot(moderator, "desk-copied-photo-1280");
    const note = "The front photo is another seller's: removed, and the seller asked to photograph their own unit.";
    await moderator.getByLabel("Note", { exact: true }).fill(note);
    await Promise.all([moderator.waitForURL(/\/desk(\?|$)/), moderator.getByRole("button", { name: "Remove the listing" }).click()]);
    // Back at the queue; the listing's page keeps the trail with the note.
    await moderator.goto(`/desk/listings/${draft.id}`);
    await moderator.getByText(note).first().waitFor();
    expect((await Listing.findByPk(draft.id))?.status).toBe("removed");
    await desk.close();
  }, 180_000);
});
