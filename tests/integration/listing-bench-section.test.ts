import { afterAll, describe, expect, it } from "vitest";
import { Capture } from "~/models/capture.server";
import { saveBenchSheet } from "~/listings/bench.server";
import { loadListingPage } from "~/listings/public.server";
import { exampleIntegratedAmplifierSheet } from "@shared/bench";
import type { SineAnalysis } from "@shared/bench/analysis";
import { cleanUp, makeAccount, readyDraft, withOwnCaptures, type Seller } from "./listing-support";

// A listing page's bench part is kept between views (bench-section.server.ts): these check that what a
// visitor reads follows the sheet and its captures as soon as either changes, never the kept copy.

afterAll(cleanUp);

const page = async (id: string, seller: Seller) => (await loadListingPage({ id, viewer: seller.session }))!;

describe("the listing page's bench part", () => {
  it("shows a re-saved sheet at once, the page having been seen before", async () => {
    const seller = await makeAccount("section-sheet", ["workshop"]);
    const draft = await readyDraft(seller);
    const sheet = await withOwnCaptures(exampleIntegratedAmplifierSheet(), seller.user.id);
    await saveBenchSheet(draft.id, seller.user.id, { ...sheet, notes: "Bias set on both channels." });
    expect((await page(draft.id, seller)).bench?.notes).toBe("Bias set on both channels.");
    expect((await page(draft.id, seller)).bench?.notes).toBe("Bias set on both channels.");

    await saveBenchSheet(draft.id, seller.user.id, { ...sheet, notes: "Bias and offset set on both channels." });
    expect((await page(draft.id, seller)).bench?.notes).toBe("Bias and offset set on both channels.");
  });

  it("follows a capture's analysis done again, the sheet unchanged", async () => {
    const seller = await makeAccount("section-capture", ["workshop"]);
    const draft = await readyDraft(seller);
    const sheet = await withOwnCaptures(exampleIntegratedAmplifierSheet(), seller.user.id);
    await saveBenchSheet(draft.id, seller.user.id, sheet);
    const before = await page(draft.id, seller);
    expect(before.plots.spectra.length).toBeGreaterThan(0);
    expect(before.plots.spectra[0].bars.find((b) => b.order === 2)?.levels.mono).not.toBe(-42.5);

    // An analysis re-run (a corrected analyser, a backfill) stores new figures on the capture itself.
    const [capture] = await Capture.findAll({ where: { ownerId: seller.user.id } });
    const analysis = structuredClone(capture.analysis) as SineAnalysis;
    for (const ch of analysis.channels) for (const h of ch.harmonics) if (h.order === 2) h.relativeDb = { ...h.relativeDb, value: -42.5 };
    await Capture.update({ analysis }, { where: { ownerId: seller.user.id } });
    const after = await page(draft.id, seller);
    expect(after.plots.spectra[0].bars.find((b) => b.order === 2)?.levels.mono).toBe(-42.5);
  });

  it("shows nothing of the bench for a listing without a sheet", async () => {
    const seller = await makeAccount("section-none", ["workshop"]);
    const draft = await readyDraft(seller);
    const seen = await page(draft.id, seller);
    expect(seen.bench).toBeNull();
    expect(seen.keyFigures).toEqual([]);
    expect(seen.plots).toEqual({ spectra: [], responses: [], squares: [], impedances: [], speedDrifts: [] });
  });
});
