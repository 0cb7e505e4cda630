import { afterAll, beforeAll, describe, expect, it } from "vitest";
import type { Browser, Locator, Page } from "playwright-core";
import { launchBrowser, newContext, screenshot } from "./support/browser";
import { signIn } from "./support/accounts";
import { twoToneJpeg } from "../support/photo-files";
import { toneWav } from "../support/capture-files";

// The workshop's path in a browser: a restored integrated amplifier from draft to a bench-verified
// listing (details, condition, restoration log, six photos with progress, a bench sheet with a WAV
// capture, the live verdict, publish); and a sheet whose 4 Ω power is three times its 8 Ω power, which
// gets no mark and is held for the review desk.
//
// The capture: a stereo 24-bit WAV of a 1 kHz sine at half of full scale, full scale standing for 65 V
// peak, into 8 Ω: Vpk = 32.5 V, P = Vpk² / (2·8 Ω) = 66 W (left); the right channel 65 W. Harmonics
// at −80 dB (2nd) and −86 dB (3rd): THD = √(0.0001² + 0.00005²) = 0.0112 % (sine relations: common practice).

const WORKSHOP = "workshop@loadline.test";

function capture(): Buffer {
  return Buffer.from(
    toneWav({
      sampleRate: 48_000,
      seconds: 1,
      f0: 1000,
      peak: 0.5,
      harmonics: [1, 1e-4, 5e-5],
      bits: "24",
      channels: 2,
      noiseRms: 2e-6,
      rightGain: Math.sqrt(65 / 66),
    }),
  );
}

const row = (page: Page, label: string): Locator => page.locator(`li[data-row="${label}"]`);
const field = (r: Locator, name: string) => r.locator(`[name$=".${name}"]`);

async function saved(page: Page) {
  await page.locator('[data-save-status="saved"]').waitFor();
}

async function startDraft(page: Page): Promise<string> {
  await page.goto("/sell/new");
  await page.getByLabel(/Integrated amplifier/).check();
  await page.getByRole("button", { name: "Start the draft" }).click();
  await page.waitForURL(/\/sell\/[0-9a-f-]{36}\/item$/);
  return new URL(page.url()).pathname.split("/")[2];
}

describe("listing a restored integrated amplifier", () => {
  let browser: Browser;
  beforeAll(async () => {
    browser = await launchBrowser();
  });
  afterAll(async () => {
    await browser?.close();
  });

  it("goes from draft to a live, bench-verified listing with photos and a capture", async () => {
    const context = await newContext(browser);
    const page = await context.newPage();
    await signIn(page, WORKSHOP);
    await page.getByRole("link", { name: "Sell", exact: true }).first().click();
    await page.waitForURL("**/sell");
    const id = await startDraft(page);

    // Item: typed the way a seller writes it; the draft saves itself as they go.
    await page.getByLabel("Maker").fill("Veldham Acoustics");
    await page.getByLabel("Model").fill("vd-26");
    await page.getByLabel("Year or era").fill("1975-79");
    await page.getByText("Shown as 1975–79").waitFor();
    await saved(page);
    await page.reload();
    expect(await page.getByLabel("Maker").inputValue()).toBe("Veldham Acoustics");

    await page.getByLabel("Serial number").fill("VA2607734");
    await page.getByLabel("Mains voltage").fill("230");
    await page.getByLabel("Frequency").selectOption("50");
    await page.getByLabel("Weight").fill("31,5");
    await page.getByText("Heavy unit: two people and freight packing").waitFor();
    await page.getByLabel("Asking price").fill("1,250");
    // The currency follows the seller's country (tested in tests/unit/sell): either is right here.
    await page.getByText(/Buyers see [£€]1,250/).waitFor();
    await page.getByLabel("Offers welcome").check();
    await page.locator('input[name="freight.domestic"]').fill("120");
    await page.locator('input[name="freight.nearby"]').fill("185");
    await page.getByLabel("Handling time").fill("5");
    await screenshot(page, "sell-item-1280");
    await page.getByRole("button", { name: "Save and go to condition" }).click();
    await page.waitForURL(`**/sell/${id}/condition`);

    // Condition in our words.
    await page.locator('input[name="cosmeticGrade"][value="clean"]').check();
    await page.locator('input[name="serviceState"][value="serviced_measured"]').check();
    await page.getByLabel("In your own words").fill("Faint hairline mark on the lid; every control quiet.");
    await page.getByRole("button", { name: "Save and go to the restoration log" }).click();
    await page.waitForURL(`**/sell/${id}/restoration`);

    // A dated log entry with parts and a reading after the work.
    await page.getByLabel("Date").fill("2025-02-20");
    await page.getByLabel("Done by").fill("Bench 2");
    await page.getByLabel("Work done").fill("Replaced the main filter capacitors, new bias trimmers, set bias and offset.");
    await page.locator('input[name="parts.0.quantity"]').fill("2");
    await page.locator('input[name="parts.0.part"]').fill("Filter capacitor 10 000 µF 63 V");
    await page.locator('input[name="parts.0.reference"]').fill("C401, C402");
    await page.locator('input[name="after.0.quantity"]').fill("DC offset, left");
    await page.locator('input[name="after.0.value"]').fill("4 mV");
    await page.locator('input[name="after.0.conditions"]').fill("at idle after 30 min, inputs shorted");
    await page.getByRole("button", { name: "Add to the log" }).click();
    await page.getByRole("article", { name: "Log entry of 2025-02-20" }).waitFor();
    await page.getByText("Filter capacitor 10 000 µF 63 V").waitFor();

    // Six photos, each with its own progress bar, processed to ready.
    await page
      .getByRole("link", { name: /Photos/ })
      .first()
      .click();
    await page.waitForURL(`**/sell/${id}/photos`);
    const files = await Promise.all(
      [0, 1, 2, 3, 4, 5].map(async (n) => ({ name: `va-260-${n + 1}.jpg`, mimeType: "image/jpeg", buffer: await twoToneJpeg(960, 720) })),
    );
    await page.locator('input[type="file"][accept*="image/jpeg"]').setInputFiles(files);
    const bars = page.locator('progress[aria-label^="Uploading va-260-"]');
    await bars.first().waitFor();
    expect(await bars.count()).toBe(6);
    await page.waitForFunction(() =>
      [...document.querySelectorAll('progress[aria-label^="Uploading va-260-"]')].every((p) => (p as HTMLProgressElement).value === 100),
    );
    await page.waitForFunction(() => document.querySelectorAll('ol[aria-label="Photos, in listing order"] li img').length === 6, null, {
      timeout: 180_000,
    });
    await screenshot(page, "sell-photos-1280");

    // The bench sheet: cautions first; typed values read back as the bench understands them.
    await page
      .getByRole("link", { name: /Bench sheet/ })
      .first()
      .click();
    await page.waitForURL(`**/sell/${id}/bench`);
    await page.getByText("Before you measure: this work can kill or burn").waitFor();
    await page.getByText(/Never short or bridge outputs carelessly/).waitFor();
    const m1 = row(page, "M1");
    await field(m1, "value").fill("66");
    expect(await m1.getByRole("alert").textContent()).toMatch(/Add a unit/);
    await field(m1, "value").fill("66 W");
    await m1.getByText("reads as 66 W").waitFor();
    await field(row(page, "M2"), "value").fill("65 W");
    await field(row(page, "M3"), "value").fill("98 W");
    await field(row(page, "M4"), "value").fill("96 W");
    await field(row(page, "M6"), "value").fill("98 dB(A)");
    await field(row(page, "M6"), "level").fill("60 W");
    await field(row(page, "M7"), "value").fill("95 kHz");
    await row(page, "M7").getByText("reads as 95 kHz").waitFor();

    const rated = row(page, "R1");
    await field(rated, "quantity").selectOption("output_power");
    await field(rated, "channel").selectOption("both");
    await field(rated, "value").fill("2 × 60 W");
    await field(rated, "load").fill("8 Ω");
    await field(rated, "range").fill("20 Hz – 20 kHz");
    await field(rated, "limit").fill("0.1 % THD");
    await field(rated, "driven").selectOption("both");

    // The WAV capture through the captures API; its figures join the sheet, marked as from a capture.
    await page
      .locator('input[type="file"][form="capture-form"]')
      .setInputFiles({ name: "va-260-1k-66w.wav", mimeType: "audio/wav", buffer: capture() });
    await page.locator('input[name="loadOhm"][form="capture-form"]').fill("8");
    await page.locator('input[name="volts"][form="capture-form"]').fill("65");
    await page.getByRole("button", { name: "Upload and analyse" }).click();
    await page.locator('[data-capture-state="done"]').waitFor({ timeout: 90_000 });
    const fromCapture = page.locator('li[data-origin="capture"]');
    expect(await fromCapture.count()).toBe(12);
    expect(await fromCapture.filter({ hasText: /THD, left:\s*0\.011 %/ }).count()).toBe(1);
    expect(await fromCapture.filter({ hasText: /Output power, left:\s*66 W\s*into 8 Ω, 1 kHz/ }).count()).toBe(1);

    // The live verdict: every rule consistent, so the sheet earns the mark.
    const verdict = page.locator('[data-verdict="verified"]');
    await verdict.waitFor();
    expect(await verdict.textContent()).toMatch(/Bench-verified integrated amplifier: every required reading is measured/);
    expect(await verdict.locator('[data-outcome="implausible"], [data-outcome="questionable"], [data-outcome="missing"]').count()).toBe(0);
    expect(await verdict.locator('[data-rule="power-voltage-load"]').first().textContent()).toMatch(/23(\.0)? V into 8 Ω gives 66/);
    await saved(page);
    await screenshot(page, "sell-bench-verified-1280");
    await page.setViewportSize({ width: 375, height: 812 });
    await screenshot(page, "sell-bench-verified-375");
    await page.setViewportSize({ width: 1280, height: 900 });

    // Review and publish: the server checks the stored sheet again and grants the mark.
    await page.getByRole("button", { name: "Save and review" }).click();
    await page.waitForURL(`**/sell/${id}/review`);
    expect(await page.locator('[data-check][data-ok="false"]').count()).toBe(0);
    await page.getByRole("button", { name: "Publish", exact: true }).click();
    await page.getByText("Veldham Acoustics vd-26 is live and bench-verified.").waitFor();
    await screenshot(page, "sell-review-published-1280");

    await page.goto("/sell");
    const mine = page.locator(`tr[data-listing="${id}"]`);
    await mine.getByText("Live", { exact: true }).waitFor();
    await mine.getByText("Bench-verified").waitFor();

    // The public page shows the mark.
    await page.goto(`/listings/${id}`);
    await page.getByRole("heading", { level: 1, name: /Veldham Acoustics vd-26/ }).waitFor();
    await page.getByText("Bench-verified", { exact: true }).first().waitFor();
    expect(await page.content()).not.toContain("VA2607734");
    await context.close();
  }, 300_000);

  it("holds a sheet with 4 Ω power three times the 8 Ω power for the review desk, with no mark", async () => {
    const context = await newContext(browser);
    const page = await context.newPage();
    await signIn(page, WORKSHOP);
    const id = await startDraft(page);

    // The steps the first test walked through in the browser go through the owner's API here.
    const patched = await page.request.patch(`/api/v1/listings/${id}`, {
      data: {
        item: {
          maker: "Veldham Acoustics",
          model: "vd-26 (second)",
          weightG: 31_500,
          priceMinor: 99_000,
          country: "GB",
          shippingOptions: [{ method: "collection" }],
        },
        condition: { cosmeticGrade: "lived_in", serviceState: "working_unserviced" },
      },
    });
    expect(patched.status()).toBe(200);
    const photo = await page.request.post(`/api/v1/listings/${id}/photos`, {
      multipart: { photo: { name: "front.jpg", mimeType: "image/jpeg", buffer: await twoToneJpeg(800, 600) } },
    });
    expect(photo.status()).toBeLessThan(300);

    await page.goto(`/sell/${id}/bench`);
    await field(row(page, "M1"), "value").fill("66 W");
    await field(row(page, "M2"), "value").fill("65 W");
    await field(row(page, "M3"), "value").fill("198 W");
    await field(row(page, "M4"), "value").fill("195 W");
    await field(row(page, "M6"), "value").fill("98 dB(A)");
    await field(row(page, "M6"), "level").fill("60 W");
    await field(row(page, "M7"), "value").fill("95 kHz");
    const verdict = page.locator('[data-verdict="implausible"]');
    await verdict.waitFor();
    const halfLoad = verdict.locator('[data-rule="half-load-power"][data-outcome="implausible"]').first();
    expect(await halfLoad.textContent()).toMatch(/198 W into 4 Ω is 3\.00× the 66 W into 8 Ω/);
    await row(page, "M3").getByText("Implausible").first().waitFor();
    await saved(page);
    await screenshot(page, "sell-bench-implausible-1280");

    // Photos finish processing in the background; publishing waits for them.
    await page.goto(`/sell/${id}/photos`);
    await page.waitForFunction(() => document.querySelectorAll('ol[aria-label="Photos, in listing order"] li img').length === 1, null, {
      timeout: 90_000,
    });
    await page.goto(`/sell/${id}/review`);
    await page.getByText("Publishing sends this listing to the review desk first").waitFor();
    await page.getByRole("button", { name: "Publish", exact: true }).click();
    await page.getByText(/is published and waiting at the review desk/).waitFor();
    await page.getByText("Held for review.").first().waitFor();

    await page.goto("/sell");
    const mine = page.locator(`tr[data-listing="${id}"]`);
    await mine.getByText("Held for review", { exact: true }).waitFor();
    expect(await mine.getByText("Bench-verified").count()).toBe(0);
    expect(await mine.textContent()).toMatch(/half the load/);
    await context.close();
  }, 240_000);
});
