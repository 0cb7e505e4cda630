import { afterAll, afterEach, describe, expect, it, vi } from "vitest";
import { BenchSheet, Listing, ListingPhoto } from "~/models/index.server";
import { Capture } from "~/models/capture.server";
import { ListingImport } from "~/models/listing-import.server";
import { ownImport, runImport, startImport } from "~/imports/imports.server";
import { cleanUp, makeWorkshopAccount } from "./listing-support";

// An import that fails on our side after a batch of drafts and sheets was written leaves nothing: no
// draft, no sheet, no stored rows. (An import writes no object to storage: it has no photos or captures.)
afterAll(cleanUp);
afterEach(() => {
  vi.restoreAllMocks();
});

const turntables = (n: number) =>
  [
    "category,maker,model,price,currency,speed_error,speed_error_speed",
    ...Array.from({ length: n }, (_, i) => `turntable,Pellquist,DT ${i + 1},${300 + i},EUR,+0.2 %,33⅓ rpm`),
  ].join("\n");

describe("an import that fails midway", () => {
  it("leaves no draft, sheet or row behind when the database fails after the first batch", async () => {
    const shop = await makeWorkshopAccount("fails-midway", { name: "Midway Bench" });
    // 300 units: the job writes 250, then the second batch's sheets fail to insert.
    const started = await startImport(shop.user.id, "midway.csv", turntables(300));
    expect(started.ok && started.import.status).toBe("queued");
    const id = started.ok ? started.import.id : "";
    const insert = BenchSheet.bulkCreate.bind(BenchSheet);
    let calls = 0;
    const seen: number[] = [];
    vi.spyOn(BenchSheet, "bulkCreate").mockImplementation(async (records, options) => {
      calls += 1;
      seen.push(records.length);
      if (calls === 2) throw new Error("connection to the database lost");
      return insert(records, options);
    });
    vi.spyOn(console, "error").mockImplementation(() => undefined);
    await runImport(id);
    // The first batch's sheets went in (inside the transaction) before the second failed.
    expect(seen).toEqual([250, 50]);
    const after = await ownImport(shop.user.id, id);
    expect([after.status, after.doneRows]).toEqual(["failed", 0]);
    expect(after.error).toBe("Something went wrong on our side; nothing was imported. Send the file again.");
    expect((await ListingImport.findByPk(id))?.rows).toBeNull();
    const drafts = await Listing.findAll({ where: { sellerId: shop.user.id }, attributes: ["id"] });
    expect(drafts).toEqual([]);
    expect(await BenchSheet.count({ include: [{ model: Listing, as: "listing", where: { sellerId: shop.user.id } }] })).toBe(0);
    expect(await ListingPhoto.count({ include: [{ model: Listing, as: "listing", where: { sellerId: shop.user.id } }] })).toBe(0);
    expect(await Capture.count({ where: { ownerId: shop.user.id } })).toBe(0);
  });
});
