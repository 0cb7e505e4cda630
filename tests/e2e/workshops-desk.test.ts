import { afterAll, beforeAll, describe, expect, it } from "vitest";
import type { Browser, Page } from "playwright-core";
import { Listing, User, Workshop, WorkshopApplication } from "~/models/index.server";
import { hashPassword } from "~/auth/password.server";
import type { Role } from "~/auth/roles";
import { signDocumentLink, DOCUMENT_LINK_SECONDS } from "~/workshops/document-link.server";
import { blankListing } from "../support/blank-listing";
import { testClock } from "../support/clock";
import { plainPng } from "../support/photo-files";
import { launchBrowser, newContext, uniqueEmail } from "./support/browser";
import { signIn } from "./support/accounts";
import { waitForMail } from "./support/mail";
import { shots } from "./support/buying";

// The review desk's workshop applications and reports in a browser, with accounts of this file's own:
// a seller applies with a document; a moderator opens the document through its signed link (a link
// whose time has passed is refused), verifies with a note, and the trail and the applicant's mail say
// so. A buyer reports a listing (back-dated, so the market's first page is left to the demo units) and
// the report is in the desk's queue. Screenshots at phone and desktop width go to /tmp/shots-pages.

const PASSWORD = "workshop-desk-e2e-2026";
let browser: Browser;
const people = new Map<"seller" | "moderator" | "buyer", User>();
const who = (key: "seller" | "moderator" | "buyer"): User => {
  const user = people.get(key);
  if (!user) throw new Error(`no ${key}: beforeAll did not run`);
  return user;
};

async function person(label: string, roles: Role[]): Promise<User> {
  return User.create({
    email: uniqueEmail(`desk-${label}`),
    displayName: `${label[0].toUpperCase()}${label.slice(1)} Tarrant-${Math.random().toString(36).slice(2, 5)}`,
    passwordHash: await hashPassword(PASSWORD),
    roles,
    emailVerifiedAt: new Date(),
    lastSignInAt: null,
  });
}

beforeAll(async () => {
  browser = await launchBrowser();
  people.set("seller", await person("seller", ["buyer", "seller"]));
  people.set("moderator", await person("moderator", ["buyer", "moderator"]));
  people.set("buyer", await person("buyer", ["buyer"]));
});
afterAll(async () => {
  await browser?.close();
});

async function signedIn(user: User): Promise<Page> {
  const page = await (await newContext(browser)).newPage();
  await signIn(page, user.email, PASSWORD);
  return page;
}

describe("workshop applications on the desk", () => {
  it("a seller applies; the moderator opens the document through its signed link, verifies with a note; an expired link is refused", async () => {
    const name = `Ferrowby Amplifier Rooms ${Date.now().toString(36)}`;
    const scan = await plainPng(120, 80, 0x2f5d3aff);
    const seller = await signedIn(who("seller"));
    await seller.goto("/account/workshop");
    await seller.getByLabel("Business name").fill(name);
    await seller.getByLabel("Street address").fill("Yard 7, Tanners Walk");
    await seller.getByLabel("Town").fill("Ferrowby");
    await seller.getByLabel("Country").selectOption("GB");
    await seller.getByLabel("Registration number").fill("FA-220871");
    await seller.getByLabel("Registration document").setInputFiles({ name: "register.png", mimeType: "image/png", buffer: scan });
    await Promise.all([
      seller.waitForURL("**/account/workshop?sent=1"),
      seller.getByRole("button", { name: "Send the application" }).click(),
    ]);
    await seller.getByText("Your application is with the review desk.").waitFor();
    await expect(seller.getByTestId("application-status").textContent()).resolves.toContain("Waiting for the desk");
    await shots(seller, "workshop-applied");
    const workshop = await Workshop.findOne({ where: { ownerId: who("seller").id }, rejectOnEmpty: true });
    const application = await WorkshopApplication.findOne({ where: { workshopId: workshop.id }, rejectOnEmpty: true });

    // The moderator finds it in the queue and opens its page.
    const desk = await signedIn(who("moderator"));
    await desk.goto("/desk?kind=workshop_application");
    await Promise.all([desk.waitForURL(`**/desk/workshops/${workshop.id}`), desk.getByRole("link", { name }).click()]);
    await desk.getByText("FA-220871").waitFor();

    // The document opens through the page's link (another tab), byte for byte, never cached.
    const href = await desk.getByRole("link", { name: "Open the document" }).getAttribute("href");
    expect(href).toMatch(new RegExp(`^/desk/documents/${application.id}\\?expires=\\d+&sig=`));
    const [tab] = await Promise.all([desk.context().waitForEvent("page"), desk.getByRole("link", { name: "Open the document" }).click()]);
    const opened = await tab.waitForLoadState().then(() => desk.request.get(href!));
    expect(opened.status()).toBe(200);
    expect(opened.headers()["content-type"]).toBe("image/png");
    expect(opened.headers()["cache-control"]).toBe("private, no-store");
    expect(Buffer.from(await opened.body())).toEqual(scan);
    await tab.close();

    // The same kind of link, made six minutes ago, has expired.
    const sixMinutesAgo = testClock(new Date(Date.now() - (DOCUMENT_LINK_SECONDS + 60) * 1000));
    const stale = signDocumentLink(application.id, who("moderator").id, sixMinutesAgo).href;
    const refused = await desk.goto(stale);
    expect(refused?.status()).toBe(410);
    await desk.getByText(/This link to the document has expired/).waitFor();
    // The page's own link, in the applicant's session: not theirs to open.
    expect((await seller.request.get(href!)).status()).toBe(403);

    // Verify with a note: the page says so, the trail has the note, the applicant is told.
    await desk.goto(`/desk/workshops/${workshop.id}`);
    await shots(desk, "desk-workshop-application");
    await desk.getByLabel("Note").fill("Register extract matches the business name and the address.");
    await Promise.all([desk.waitForLoadState("load"), desk.getByRole("button", { name: "Verify the workshop" }).click()]);
    await desk.getByTestId("application-verified").waitFor();
    const trail = desk.getByTestId("audit-trail");
    await expect(trail.textContent()).resolves.toContain("Verified the workshop");
    await expect(trail.textContent()).resolves.toContain("Register extract matches the business name and the address.");
    await shots(desk, "desk-workshop-verified");
    const mail = await waitForMail(who("seller").email, { subject: /^Verified: / });
    expect(mail.text).toContain("Register extract matches the business name and the address.");
    await seller.goto("/account/workshop");
    await expect(seller.getByTestId("application-status").textContent()).resolves.toContain("Verified");
  }, 180_000);
});

describe("reports", () => {
  it("a buyer reports a listing and the report is in the desk's queue", async () => {
    // The applicant's own unit, published in 2020 so it sits far below the market's first page.
    const unit = await Listing.create(
      blankListing(who("seller").id, "integrated_amplifier", {
        status: "live",
        maker: "Ferrowby",
        model: `Tallis ${Date.now().toString(36).slice(-4)}`,
        priceMinor: 52_000,
        currency: "GBP",
        country: "GB",
        town: "Ferrowby",
        cosmeticGrade: "clean",
        serviceState: "serviced_measured",
        publishedAt: new Date("2020-03-02T10:00:00Z"),
      }),
    );
    const title = `Ferrowby ${unit.model}`;
    const buyer = await signedIn(who("buyer"));
    await buyer.goto(`/listings/${unit.id}`);
    await Promise.all([
      buyer.waitForURL(`**/listings/${unit.id}/report`),
      buyer.getByRole("link", { name: "Report this listing" }).click(),
    ]);
    await buyer.getByRole("radio", { name: /^Looks like a scam/ }).check();
    await buyer.getByLabel("Note for the moderators").fill("Asked me to pay by bank transfer before any message here.");
    await Promise.all([buyer.waitForURL("**/report?sent=1"), buyer.getByRole("button", { name: "Send the report" }).click()]);
    await buyer.getByText("The review desk has your report").waitFor();
    await buyer.getByTestId("already-reported").waitFor();
    await shots(buyer, "report-sent");

    const desk = await signedIn(who("moderator"));
    await desk.goto("/desk?kind=report");
    await desk.getByRole("link", { name: title }).first().waitFor();
    await shots(desk, "desk-reports");
  }, 120_000);
});
