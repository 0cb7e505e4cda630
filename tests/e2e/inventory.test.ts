import fs from "node:fs";
import path from "node:path";
import { randomBytes } from "node:crypto";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import type { Browser, Page } from "playwright-core";
import { Listing, User } from "~/models/index.server";
import { hashPassword } from "~/auth/password.server";
import type { ListingStatus } from "@shared/catalogue";
import { launchBrowser, newContext, screenshot } from "./support/browser";
import { submitSignIn } from "./support/accounts";

// A workshop's inventory in the browser: the table of its units, five live ones ticked and withdrawn
// together (after the confirmation), the table showing them withdrawn before and after a reload.

const RUN = randomBytes(4).toString("hex");
const PASSWORD = `inventory-${RUN}`;
const SHOTS = process.env.INVENTORY_SHOTS ?? "";
let user: User;

async function unit(n: number, status: ListingStatus, priceMinor: number | null) {
  const published = status !== "draft";
  return Listing.create({
    sellerId: user.id,
    status,
    category: n % 3 === 0 ? "turntable" : "integrated_amplifier",
    maker: "Kelloran",
    model: `ZK ${n}.${n % 4}`,
    priceMinor,
    currency: n % 5 === 0 ? "GBP" : "EUR",
    country: "DE",
    handlingDays: published ? 2 + (n % 4) : null,
    cosmeticGrade: published ? "clean" : null,
    serviceState: published ? "serviced_measured" : null,
    // Back-dated, so the test's units never lead the market's first page.
    publishedAt: published ? new Date(Date.UTC(2020, 2, n)) : null,
    heldReason: status === "held" ? "Power into 4 Ω is implausible for these rails." : null,
    stockReference: `WS-${String(400 + n).padStart(4, "0")}`,
  });
}

async function shot(page: Page, name: string) {
  const file = await screenshot(page, name);
  if (SHOTS) {
    fs.mkdirSync(SHOTS, { recursive: true });
    fs.copyFileSync(file, path.join(SHOTS, path.basename(file)));
  }
}

describe("the inventory", () => {
  let browser: Browser;
  const live: string[] = [];
  beforeAll(async () => {
    browser = await launchBrowser();
    user = await User.create({
      email: `inventory-${RUN}@example.test`,
      displayName: "Oskerfeld Bench Works",
      passwordHash: await hashPassword(PASSWORD),
      roles: ["buyer", "seller", "workshop"],
      emailVerifiedAt: new Date(),
      lastSignInAt: null,
    });
    for (let n = 1; n <= 6; n++) live.push((await unit(n, "live", 90_000 + n * 12_500)).id);
    await unit(7, "draft", null);
    await unit(8, "draft", 45_000);
    await unit(9, "sold", 210_000);
    await unit(10, "held", 132_000);
  });
  afterAll(async () => {
    await browser?.close();
    if (user) {
      await Listing.destroy({ where: { sellerId: user.id } });
      await user.destroy();
    }
  });

  it("withdraws five live units in one go", async () => {
    const context = await newContext(browser);
    const page = await context.newPage();
    await page.goto("/sign-in");
    await submitSignIn(page, user.email, PASSWORD);
    await page.waitForURL((url) => url.pathname !== "/sign-in");
    await page.goto("/sell");
    await page.getByRole("heading", { level: 1, name: "Inventory" }).waitFor();
    expect(await page.locator("tr[data-listing]").count()).toBe(10);
    await shot(page, "inventory-1280");

    await page.getByRole("link", { name: /^Live\s*6$/ }).click();
    await page.waitForURL(/state=live/);
    await page.waitForFunction(() => document.querySelectorAll("tr[data-listing]").length === 6);
    const five = live.slice(0, 5);
    for (const id of five) await page.locator(`tr[data-listing="${id}"] input[name="ids"]`).check();
    await page.getByLabel("Action").selectOption("withdraw");
    await page.getByRole("button", { name: "Apply to 5 units" }).click();
    await page.getByRole("button", { name: "Yes, withdraw 5 units" }).click();
    await page.getByText("5 units are withdrawn.").waitFor();
    // The live filter's refetch may already have dropped the withdrawn rows: the store and the
    // withdrawn filter below are what count.
    await page.locator(`tr[data-listing="${live[5]}"][data-status="live"]`).waitFor();

    const stored = await Listing.findAll({ where: { id: live }, attributes: ["id", "status"] });
    expect(Object.fromEntries(stored.map((l) => [l.id, l.status]))).toEqual(
      Object.fromEntries(live.map((id, i) => [id, i < 5 ? "withdrawn" : "live"])),
    );
    await page.goto("/sell?state=withdrawn");
    await page.waitForFunction(() => document.querySelectorAll("tr[data-listing]").length === 5);

    await page.setViewportSize({ width: 390, height: 844 });
    await page.goto("/sell");
    await page.getByRole("heading", { level: 1, name: "Inventory" }).waitFor();
    await shot(page, "inventory-390");
    await context.close();
  }, 120_000);
});
