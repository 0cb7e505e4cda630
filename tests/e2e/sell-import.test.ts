import { afterAll, beforeAll, describe, expect, it } from "vitest";
import type { Browser, Page } from "playwright-core";
import { Op } from "sequelize";
import { Listing, User } from "~/models/index.server";
import { launchBrowser, newContext, screenshot } from "./support/browser";
import { signIn } from "./support/accounts";

// A workshop imports 200 units from a CSV file. Three rows are wrong (a price that is not one, a kind of
// unit Loadline does not know, a power figure with a unit no meter gives): the preview names each by row
// and column and nothing is written. Fixed, the same file is imported whole by the job, the page's
// progress bar runs to the end, and exactly 200 drafts exist. The drafts are removed afterwards.

const WORKSHOP = "workshop@loadline.test";
const TAG = `IMP${Date.now().toString(36).toUpperCase()}`;
const HEADER = "reference,category,maker,model,era,cosmetic_grade,service_state,price,currency,power,power_load,power_limit,power_driven";
// Rows as a spreadsheet numbers them: the header is row 1, unit n is row n + 1.
const BAD: Record<number, [string, string]> = { 12: ["price", "12O0"], 77: ["category", "kettle"], 150: ["power", "2 × 60 Q"] };

function csv(withMistakes: boolean): Buffer {
  const lines = [HEADER];
  for (let n = 1; n <= 200; n++) {
    const row = n + 1;
    const cells: Record<string, string> = {
      reference: `${TAG}-${n}`,
      category: "integrated_amplifier",
      maker: "Vantrell",
      model: `${TAG} ${n}`,
      era: "1979",
      cosmetic_grade: "clean",
      service_state: "serviced_measured",
      price: String(400 + n),
      currency: "EUR",
      power: "2 × 60 W",
      power_load: "8 Ω",
      power_limit: "0.1 % THD",
      power_driven: "both",
    };
    if (withMistakes && BAD[row]) cells[BAD[row][0]] = BAD[row][1];
    lines.push(
      HEADER.split(",")
        .map((c) => cells[c])
        .join(","),
    );
  }
  return Buffer.from(lines.join("\r\n") + "\r\n");
}

async function ours(sellerId: string) {
  return Listing.findAll({ where: { sellerId, model: { [Op.like]: `${TAG} %` } }, attributes: ["id", "status", "priceMinor"] });
}

async function send(page: Page, name: string, body: Buffer) {
  await page.goto("/sell/import");
  await page.getByLabel("CSV file", { exact: true }).setInputFiles({ name, mimeType: "text/csv", buffer: body });
  await page.getByRole("button", { name: "Check and import" }).click();
}

describe("importing units from a CSV file", () => {
  let browser: Browser;
  let sellerId = "";
  beforeAll(async () => {
    browser = await launchBrowser();
    sellerId = (await User.findOne({ where: { email: WORKSHOP }, rejectOnEmpty: true })).id;
  });
  afterAll(async () => {
    await browser?.close();
    if (sellerId) await Listing.destroy({ where: { sellerId, model: { [Op.like]: `${TAG} %` }, status: "draft" } });
  });

  it("names each bad row's problem, writes nothing, then imports the fixed file as exactly 200 drafts", async () => {
    const context = await newContext(browser);
    const page = await context.newPage();
    await signIn(page, WORKSHOP);

    await send(page, "stock-with-mistakes.csv", csv(true));
    await page.getByRole("heading", { name: /3 problems in 3 rows: nothing was imported/ }).waitFor();
    const problems = page.locator("tbody tr[data-row]");
    expect(await problems.count()).toBe(3);
    const named = await problems.evaluateAll((rows) =>
      rows.map((r) => [Number(r.getAttribute("data-row")), r.getAttribute("data-column")]),
    );
    expect(named).toEqual([
      [12, "price"],
      [77, "category"],
      [150, "power"],
    ]);
    await expect(page.locator('tr[data-row="12"]').textContent()).resolves.toContain('"12O0" is not a price');
    await expect(page.locator('tr[data-row="77"]').textContent()).resolves.toContain('"kettle" is not a category');
    await screenshot(page, "import-problems-desktop");
    expect(await ours(sellerId)).toHaveLength(0);

    await send(page, "stock.csv", csv(false));
    await page.waitForURL(/\/sell\/import\/[0-9a-f-]{36}$/);
    // The job writes the drafts; the page polls the status API until it is done.
    await page.locator('[data-import-status="done"]').waitFor({ timeout: 60_000 });
    expect(await page.getByRole("progressbar").getAttribute("aria-valuenow")).toBe("200");
    await screenshot(page, "import-done-desktop");

    const drafts = await ours(sellerId);
    expect(drafts).toHaveLength(200);
    expect(drafts.every((d) => d.status === "draft")).toBe(true);
    // Unit 11 (row 12, the one whose price was wrong) was written with its fixed price: 411 EUR.
    expect(drafts.map((d) => d.priceMinor).sort((a, b) => a! - b!)[10]).toBe(41_100);
    // An imported draft's review step shows the bench's verdict on its sheet, as for a sheet typed in.
    const reviewed = drafts[0].id;
    await page.goto(`/sell/${reviewed}/review`);
    await page.getByRole("link", { name: "Open the bench sheet" }).waitFor();
    expect(await page.getByText("No bench sheet yet").count()).toBe(0);
    await screenshot(page, "import-draft-review-desktop");
    await context.close();

    // The same pages on a phone, for a person to look at.
    const phone = await newContext(browser, { viewport: { width: 390, height: 844 } });
    const small = await phone.newPage();
    await signIn(small, WORKSHOP);
    await send(small, "stock-with-mistakes.csv", csv(true));
    await small.getByRole("heading", { name: /3 problems in 3 rows/ }).waitFor();
    await screenshot(small, "import-problems-phone");
    await small.goto(`/sell/${reviewed}/review`);
    await small.getByRole("link", { name: "Open the bench sheet" }).waitFor();
    await screenshot(small, "import-draft-review-phone");
    await small.goto("/sell/templates");
    await screenshot(small, "templates-phone");
    await phone.close();
  });
});
