import { randomBytes } from "node:crypto";
import fs from "node:fs";
import path from "node:path";
import type { Page } from "playwright-core";
import { QueryTypes } from "sequelize";
import { checkBenchSheet, exampleIntegratedAmplifierSheet } from "@shared/bench";
import { remeasurableFigures, type ListedFigure } from "@shared/bench/remeasure";
import { listingFacets } from "@shared/listing-facets";
import { sequelize } from "~/db.server";
import { BenchSheet, Listing, User, Workshop } from "~/models/index.server";
import { blankListing } from "../../support/blank-listing";
import { inbox, type CaughtMail } from "./mail";

// The buying walkthroughs' helpers: a fresh unit for a demo seller (so no other suite's listing is
// bought), the hosted payment page of the payments stand-in, waiting for an order's state as the page
// shows it, the ledger's balance, and the screenshots a person looks at.

export const SHOTS = "/tmp/shots-pages";

export async function shot(page: Page, name: string) {
  fs.mkdirSync(SHOTS, { recursive: true });
  await page.screenshot({ path: path.join(SHOTS, `${name}.png`), fullPage: true });
}

/** Full-page shots at a phone's width and at a desktop's, then back to the desktop. */
export async function shots(page: Page, name: string) {
  await page.setViewportSize({ width: 390, height: 844 });
  await shot(page, `${name}-390`);
  await page.setViewportSize({ width: 1280, height: 900 });
  await shot(page, `${name}-1280`);
}

export interface DemoUnit {
  listing: Listing;
  title: string;
  figures: ListedFigure[];
}

/** A live amplifier with a bench sheet, listed by a demo seller (`workshop@loadline.test` by default). */
export async function demoUnit(opts: { sellerEmail?: string; weightG?: number; priceMinor?: number } = {}): Promise<DemoUnit> {
  const seller = await User.findOne({ where: { email: opts.sellerEmail ?? "workshop@loadline.test" }, rejectOnEmpty: true });
  const workshop = await Workshop.findOne({ where: { ownerId: seller.id } });
  const model = `Walk ${randomBytes(3).toString("hex").toUpperCase()}`;
  const sheet = exampleIntegratedAmplifierSheet();
  const verdict = checkBenchSheet(sheet);
  const listing = await Listing.create(
    blankListing(seller.id, "integrated_amplifier", {
      workshopId: workshop?.id ?? null,
      status: "live",
      maker: "Tallowmere Audio",
      model,
      yearFrom: 1981,
      yearTo: 1981,
      mainsVoltageV: 230,
      mainsFrequencyHz: 50,
      weightG: opts.weightG ?? 14_200,
      priceMinor: opts.priceMinor ?? 120_000,
      currency: "EUR",
      offersWelcome: true,
      country: "DE",
      region: "Vorland",
      town: "Altmarkhafen",
      shippingOptions: [
        { method: "collection" },
        { method: "parcel", prices: { domestic: 3_900, nearby: 6_900 } },
        { method: "freight", prices: { domestic: 9_500, nearby: 14_500, worldwide: 42_000 } },
      ],
      handlingDays: 3,
      cosmeticGrade: "clean",
      serviceState: "serviced_measured",
      benchVerified: verdict.benchVerified,
      // Back-dated so the market's newest-first pages keep the demo units other suites open from page 1.
      publishedAt: new Date(Date.UTC(2020, 0, 1)),
      ...listingFacets(sheet),
    }),
  );
  await BenchSheet.create({ listingId: listing.id, sheet, verdict, checkedAt: new Date() });
  return { listing, title: `Tallowmere Audio ${model}`, figures: remeasurableFigures(sheet) };
}

/** Pays on the stand-in's hosted page with a test card; stays there on a decline. */
export async function payOnHostedPage(page: Page, card: string) {
  await page.waitForURL(/\/checkout\/pay\/cs_/);
  await page.getByLabel("Card number").fill(card);
  await page.getByLabel("Expiry (MM / YY)").fill("12 / 34");
  await page.getByLabel("Security code").fill("123");
  await page.getByLabel("Name on card").fill("Perrin Gadsby");
  await Promise.all([page.waitForLoadState("load"), page.getByRole("button", { name: /^Pay / }).click()]);
}

/** Reloads `url` until the order's state badge says `state` (the webhook and jobs run in the background). */
export async function waitForState(page: Page, url: string, state: string, timeoutMs = 45_000) {
  const deadline = Date.now() + timeoutMs;
  for (;;) {
    await page.goto(url);
    const shown = await page.getByTestId("order-state").first().getAttribute("data-state");
    if (shown === state) return;
    if (Date.now() > deadline) throw new Error(`order at ${url} is ${shown}, not ${state}, after ${timeoutMs} ms`);
    await page.waitForTimeout(500);
  }
}

/** The order's id from a /purchases/:id or /sales/:id address. */
export const orderIdOf = (url: string) => new URL(url).pathname.split("/")[2];

/** Sum of the order's ledger and the number of its movements that do not sum to zero. */
export async function ledgerOf(orderId: string) {
  const [row] = await sequelize.query<{ total: number; unbalanced: number; entries: number; kinds: string[] }>(
    `SELECT coalesce(sum(amount_minor), 0)::int AS total, count(*)::int AS entries, array_agg(DISTINCT kind) AS kinds,
            (SELECT count(*) FROM (SELECT movement_id FROM ledger_entries WHERE order_id = :id GROUP BY movement_id
              HAVING sum(amount_minor) <> 0) m)::int AS unbalanced
       FROM ledger_entries WHERE order_id = :id`,
    { replacements: { id: orderId }, type: QueryTypes.SELECT },
  );
  return row;
}

/** Waits until `to`'s inbox holds a mail for each subject pattern; returns the subjects found. */
export async function mailsAbout(to: string, title: string, patterns: RegExp[], timeoutMs = 45_000): Promise<string[]> {
  const deadline = Date.now() + timeoutMs;
  for (;;) {
    const subjects = (await inbox(to)).filter((m: CaughtMail) => m.subject.includes(title)).map((m) => m.subject);
    const missing = patterns.filter((p) => !subjects.some((s) => p.test(s)));
    if (!missing.length) return subjects;
    if (Date.now() > deadline) throw new Error(`no mail to ${to} matching ${missing.join(", ")}; have: ${subjects.join(" | ")}`);
    await new Promise((r) => setTimeout(r, 500));
  }
}
