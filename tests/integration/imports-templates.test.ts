import { afterAll, describe, expect, it } from "vitest";
import { BenchSheet, Listing } from "~/models/index.server";
import { ListingImport } from "~/models/listing-import.server";
import { HttpError } from "~/http/errors.server";
import { ownImport, runImport, startImport } from "~/imports/imports.server";
import { exampleCsv } from "~/imports/files";
import {
  createTemplate,
  deleteTemplate,
  getTemplate,
  listTemplates,
  templatesForEditor,
  updateTemplate,
} from "~/restoration-templates/templates.server";
import { cleanUp, makeAccount, makeWorkshopAccount } from "./listing-support";

// Imports and templates go with their accounts (ON DELETE CASCADE).
afterAll(cleanUp);

const workshopAccount = (label: string) => makeWorkshopAccount(label, { name: `Import Bench ${label}` });

const rows = (n: number) =>
  ["category,maker,model,price,currency", ...Array.from({ length: n }, (_, i) => `turntable,Pellquist,DT ${i + 1},${300 + i},EUR`)].join(
    "\n",
  );

describe("importing a CSV file", () => {
  it("writes a small file at once: each row a draft at the workshop with its stock number and bench sheet, the rows not kept", async () => {
    const shop = await workshopAccount("small");
    const started = await startImport(shop.user.id, "example.csv", exampleCsv());
    expect(started.ok && started.import.status).toBe("done");
    const drafts = await Listing.findAll({ where: { sellerId: shop.user.id }, order: [["priceMinor", "ASC"]] });
    // The example's prices by hand: 295, 380, 420 and 649.00 EUR.
    expect(drafts.map((d) => [d.status, d.priceMinor, d.country, d.town])).toEqual([
      ["draft", 29_500, "DE", "Kellbach"],
      ["draft", 38_000, "DE", "Kellbach"],
      ["draft", 42_000, "DE", "Kellbach"],
      ["draft", 64_900, "DE", "Kellbach"],
    ]);
    const amp = drafts[3];
    // "2 × 72 W" into "8 Ω": 72 W per channel is the market's 8 Ω power facet.
    expect(amp.power8ohmW).toBe(72);
    expect(drafts.map((d) => d.stockReference)).toEqual(["WB-1044", "WB-1043", "WB-1042", "WB-1041"]);
    // The sheet holds the row's three figures (power, THD, DC offset), checked by the bench as the bench
    // step stores a typed sheet (imports-verdict.test.ts compares the two).
    const sheet = await BenchSheet.findOne({ where: { listingId: amp.id } });
    expect(sheet?.sheet?.readings.map((r) => r.quantity)).toEqual(["output_power", "thd", "dc_offset"]);
    expect(sheet?.verdict?.category).toBe("integrated_amplifier");
    expect(sheet?.checkedAt).toBeInstanceOf(Date);
    const stored = await ListingImport.findByPk(started.ok ? started.import.id : "");
    expect(stored?.rows).toBeNull();
  });

  it("writes nothing from a file with a problem", async () => {
    const shop = await workshopAccount("bad");
    const started = await startImport(shop.user.id, "bad.csv", rows(3).replace("DT 2,301", "DT 2,three hundred"));
    expect(!started.ok && started.check.problems).toEqual([
      { row: 3, column: "price", message: '"three hundred" is not a price; type it like 1250 or 1,250.00.' },
    ]);
    expect(await Listing.count({ where: { sellerId: shop.user.id } })).toBe(0);
    expect(await ListingImport.count({ where: { ownerId: shop.user.id } })).toBe(0);
  });

  it("is all or nothing: a row that fails after the first batch was written leaves no draft at all", async () => {
    const shop = await workshopAccount("whole");
    const started = await startImport(shop.user.id, "big.csv", rows(300));
    expect(started.ok && started.import.status).toBe("queued");
    const id = started.ok ? started.import.id : "";
    // Unit 281 (after the first 250 were written in the transaction) is spoiled where the job reads it.
    const imp = (await ListingImport.findByPk(id))!;
    const stored = imp.rows as { row: number; cells: Record<string, string> }[];
    stored[280].cells.category = "kettle";
    await ListingImport.update({ rows: stored }, { where: { id } });
    await runImport(id);
    const after = await ownImport(shop.user.id, id);
    expect([after.status, after.doneRows]).toEqual(["failed", 0]);
    expect(after.error).toMatch(/^Row 282 no longer reads/);
    expect(await Listing.count({ where: { sellerId: shop.user.id } })).toBe(0);
  });

  it("runs one import at a time per workshop, and shows an import to its owner only", async () => {
    const shop = await workshopAccount("queue");
    const other = await workshopAccount("other");
    const first = await startImport(shop.user.id, "one.csv", rows(30));
    await expect(startImport(shop.user.id, "two.csv", rows(30))).rejects.toMatchObject({ status: 409, code: "conflict" });
    const id = first.ok ? first.import.id : "";
    await expect(ownImport(other.user.id, id)).rejects.toMatchObject({ status: 404 });
    await runImport(id);
    expect((await ownImport(shop.user.id, id)).status).toBe("done");
    expect(await Listing.count({ where: { sellerId: shop.user.id } })).toBe(30);
    // A job that runs again after the import ended changes nothing.
    await runImport(id);
    expect(await Listing.count({ where: { sellerId: shop.user.id } })).toBe(30);
  });
});

describe("restoration templates", () => {
  const RECAP = {
    title: "Power supply recap",
    work: "Replaced the main filter capacitors; checked the rails under load.",
    parts: [{ part: "Filter capacitor 10 000 µF 63 V", quantity: 2, reference: "C801, C802" }],
  };

  it("keeps a workshop's own templates, one per title, and fills the entry form from one", async () => {
    const shop = await workshopAccount("tpl");
    const other = await workshopAccount("tpl-other");
    const t = await createTemplate(shop.user.id, RECAP);
    await expect(createTemplate(shop.user.id, { ...RECAP, title: "power supply RECAP" })).rejects.toMatchObject({ status: 409 });
    await expect(getTemplate(other.user.id, t.id)).rejects.toMatchObject({ status: 404 });
    await expect(deleteTemplate(other.user.id, t.id)).rejects.toBeInstanceOf(HttpError);
    await expect(createTemplate(shop.user.id, { ...RECAP, title: "" })).rejects.toMatchObject({ status: 400, code: "invalid" });
    await updateTemplate(shop.user.id, t.id, { ...RECAP, work: "Recapped the supply." });
    expect((await listTemplates(shop.user.id)).map((x) => x.work)).toEqual(["Recapped the supply."]);

    const editor = await templatesForEditor(shop.session, t.id);
    expect(editor.choices).toEqual([{ id: t.id, title: RECAP.title }]);
    expect(editor.values).toMatchObject({
      work: "Recapped the supply.",
      "parts.0.quantity": "2",
      "parts.0.part": "Filter capacitor 10 000 µF 63 V",
      "parts.0.reference": "C801, C802",
    });
    // Someone else's template id fills nothing; a seller without the workshop role is offered none.
    expect((await templatesForEditor(other.session, t.id)).values).toBeNull();
    const seller = await makeAccount("tpl-seller");
    expect(await templatesForEditor(seller.session, t.id)).toEqual({ offered: false, choices: [], chosenId: null, values: null });
  });
});
