import fs from "node:fs";
import path from "node:path";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import type { Browser } from "playwright-core";
import { exampleIntegratedAmplifierSheet } from "@shared/bench";
import { Listing, User } from "~/models/index.server";
import { normaliseRoles } from "~/auth/roles";
import { saveBenchSheet } from "~/listings/bench.server";
import { publishListing } from "~/listings/publish.server";
import { SCREEN_DIR, baseUrl, launchBrowser, newContext, screenshot } from "./support/browser";
import { signIn } from "./support/accounts";
import { renderPdfPages } from "./support/pdf-render";
import { readyDraft, withOwnCaptures } from "../integration/listing-support";
import { pdfPages, pdfQrCode } from "../support/pdf";

// A visitor downloads a bench-verified unit's certificate from its listing page, reads the figures in
// the PDF's text, scans its QR code and finds the page saying the certificate matches; the workshop
// edits the bench sheet and the same page then says superseded, with the day. The unit is the bench
// core's invented demo amplifier, listed by the demo workshop and back-dated to 2020; the figures
// expected are its readings as written in shared/bench/examples.ts.

const WORKSHOP = "workshop@loadline.test";
const PHONE = { width: 390, height: 844 };
const day = new Intl.DateTimeFormat("en-GB", { day: "numeric", month: "short", year: "numeric", timeZone: "UTC" });

describe("a bench certificate", () => {
  let browser: Browser;
  let listingId: string;
  let ownerId: string;
  beforeAll(async () => {
    browser = await launchBrowser();
    const user = await User.findOne({ where: { email: WORKSHOP }, rejectOnEmpty: true });
    const session = {
      id: user.id,
      email: user.email,
      displayName: user.displayName,
      roles: normaliseRoles(user.roles),
      emailVerified: true,
    };
    const draft = await readyDraft({ user, session, cookie: "" });
    listingId = draft.id;
    ownerId = user.id;
    await saveBenchSheet(draft.id, user.id, await withOwnCaptures(exampleIntegratedAmplifierSheet(), user.id));
    await publishListing(draft.id, session);
    await Listing.update({ publishedAt: new Date(Date.UTC(2020, 0, 1)) }, { where: { id: draft.id } });
  });
  afterAll(async () => {
    await browser?.close();
  });

  it("is downloaded, read, scanned, and shows superseded after the sheet is edited", async () => {
    const visitor = await newContext(browser);
    const page = await visitor.newPage();
    await page.goto(`/listings/${listingId}`);
    const link = page.getByRole("link", { name: "Bench certificate (PDF)" });
    await link.scrollIntoViewIfNeeded();
    await screenshot(page, "certificate-listing-link-1280");
    const [download] = await Promise.all([page.waitForEvent("download"), link.click()]);
    expect(download.suggestedFilename()).toMatch(/^loadline-bench-certificate-[0-9a-f]{8}\.pdf$/);
    const pdf = new Uint8Array(fs.readFileSync(await download.path()));

    const text = (await pdfPages(pdf)).join("\n");
    expect(text).toContain("Harrowgate Sound 120-HG");
    expect(text).toContain("Measured by Kestrel Lane Workshop");
    expect(text).toMatch(/Output power \(left\) 66 W into 8 Ω, 1 kHz, 0\.1 % THD/);
    expect(text).toMatch(/Output power \(right\) 96 W into 4 Ω/);
    expect(text).toMatch(/THD\+N \(right\) 0\.021 % into 8 Ω, 1 kHz, at 60 W, 20 Hz–20 kHz bandwidth/);
    expect(text).toMatch(/Low −3 dB point \(both channels\) 7 Hz into 8 Ω, at 1 W/);

    const scanned = await pdfQrCode(pdf);
    expect(scanned).toMatch(new RegExp(`^${baseUrl()}/certificates/[0-9a-f-]{36}$`));
    const certificateId = scanned!.split("/").pop()!;
    expect(text).toContain(certificateId);
    const pictures = await renderPdfPages(browser, pdf);
    fs.mkdirSync(SCREEN_DIR, { recursive: true });
    pictures.forEach((png, i) => fs.writeFileSync(path.join(SCREEN_DIR, `certificate-pdf-page-${i + 1}.png`), png));

    await page.goto(scanned!);
    await page.getByRole("heading", { name: "This certificate matches the current bench sheet." }).waitFor();
    await screenshot(page, "certificate-matches-1280");
    await page.setViewportSize(PHONE);
    await screenshot(page, "certificate-matches-390");

    // The workshop adds a note to the sheet: another sheet, so the certificate no longer matches it.
    const workshop = await newContext(browser);
    const seller = await workshop.newPage();
    await signIn(seller, WORKSHOP);
    const edited = await seller.request.patch(`/api/v1/listings/${listingId}`, {
      // The sheet's capture references must be the owner's own captures.
      data: {
        benchSheet: await withOwnCaptures(
          { ...exampleIntegratedAmplifierSheet(), notes: "Bias re-set after a week on the bench." },
          ownerId,
        ),
      },
    });
    expect(edited.status()).toBe(200);
    await workshop.close();

    await page.reload();
    await page.getByRole("heading", { name: "This certificate has been superseded." }).waitFor();
    expect(await page.locator("main").textContent()).toContain(`The bench sheet changed on ${day.format(new Date())}`);
    await screenshot(page, "certificate-superseded-390");
    await page.setViewportSize({ width: 1280, height: 900 });
    await screenshot(page, "certificate-superseded-1280");
    const json = await page.request.get(`/api/v1/certificates/${certificateId}`);
    expect(await json.json()).toMatchObject({ id: certificateId, state: "superseded", listing: { id: listingId } });
    await visitor.close();
  }, 180_000);

  it("money per month for the demo workshop, on a desktop and a phone", async () => {
    const context = await newContext(browser);
    const page = await context.newPage();
    await signIn(page, WORKSHOP);
    await page.goto("/sales");
    await page.getByRole("link", { name: "Money per month" }).click();
    await page.waitForURL(/\/sales\/money$/);
    await page.getByRole("heading", { level: 1, name: "Money" }).waitFor();
    await page
      .getByRole("img", { name: /sales, fees and payouts per month/ })
      .first()
      .waitFor();
    await screenshot(page, "money-1280");
    await page.setViewportSize(PHONE);
    await screenshot(page, "money-390");
    const csv = await page.request.get("/sales/money.csv");
    expect(csv.headers()["content-type"]).toMatch(/^text\/csv/);
    expect((await csv.text()).split("\r\n")[0]).toMatch(/^Month,Month name,Currency,Sales/);
    await context.close();
  }, 120_000);
});
