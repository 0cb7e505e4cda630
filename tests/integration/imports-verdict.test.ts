import { afterAll, describe, expect, it } from "vitest";
import { BenchSheet, Listing } from "~/models/index.server";
import { startImport } from "~/imports/imports.server";
import { EXAMPLE_ROWS } from "~/imports/files";
import { createDraft } from "~/listings/drafts.server";
import { saveBenchSheet } from "~/listings/bench.server";
import { editorData } from "~/listings/view.server";
import { deskListingPage } from "~/desk/listing-page.server";
import { inventoryCsv } from "@shared/inventory-csv";
import { cleanUp, makeWorkshopAccount } from "./listing-support";

// An imported draft's bench sheet is stored as the bench step stores a typed one: with the bench's
// verdict, so the editor's bench and review steps, its checklist and the desk show the same outcome.
afterAll(cleanUp);

const AMP = EXAMPLE_ROWS.find((r) => r.category === "integrated_amplifier")!;

const workshop = (label: string) => makeWorkshopAccount(label, { name: `Verdict Bench ${label}` });

describe("an imported draft's bench verdict", () => {
  it("shows a failed check on the draft as the editor would, and a passed one as passed, as the bench step would for the same sheet", async () => {
    const shop = await workshop("verdict");
    // DC offset: ±50 mV is the limit (shared/bench/rules/hazards.ts, common practice), so 80 mV fails the
    // check (questionable, a hazard) and 4 mV passes it. Neither is implausible, so the file imports.
    const csv = inventoryCsv([
      { ...AMP, reference: "VB-1", dc_offset: "80 mV" },
      { ...AMP, reference: "VB-2", dc_offset: "4 mV" },
    ]);
    const started = await startImport(shop.user.id, "verdict.csv", csv);
    expect(started.ok && started.import.status).toBe("done");
    const byRef = async (ref: string) => (await Listing.findOne({ where: { sellerId: shop.user.id, stockReference: ref } }))!;
    const failing = await byRef("VB-1");
    const passing = await byRef("VB-2");

    const dcOutcome = (v: { results: { ruleId: string; outcome: string }[] } | null | undefined) =>
      v?.results.filter((r) => r.ruleId === "dc-offset-safe").map((r) => r.outcome);

    const editorFail = await editorData(failing.id, shop.session);
    expect(dcOutcome(editorFail.verdict)).toEqual(["questionable"]);
    expect(editorFail.verdict?.hazards?.map((h) => h.refs.length)).toEqual([1]);
    expect(editorFail.verdict?.benchVerified).toBe(false);
    expect(editorFail.checkedAt).not.toBeNull();
    const editorPass = await editorData(passing.id, shop.session);
    expect(dcOutcome(editorPass.verdict)).toEqual(["consistent"]);
    expect(editorPass.verdict?.hazards ?? []).toEqual([]);

    // The desk reads the stored verdict too: the failed check is among the lines it shows.
    const desk = await deskListingPage({ id: shop.user.id, displayName: "Moderator" }, failing.id);
    expect(desk.verdict?.lines.map((l) => l.outcome)).toContain("questionable");

    // The same sheet typed into the bench step of a draft: the same verdict.
    for (const imported of [failing, passing]) {
      const row = await BenchSheet.findOne({ where: { listingId: imported.id } });
      const typed = await createDraft(shop.session, "integrated_amplifier");
      const saved = await saveBenchSheet(typed.id, shop.user.id, row!.sheet);
      expect(row!.verdict).toEqual(saved.verdict);
      const [a, b] = [await editorData(imported.id, shop.session), await editorData(typed.id, shop.session)];
      expect(a.verdict).toEqual(b.verdict);
      // The publish checklist's bench line counts measured readings; the imported one has its three.
      expect(a.checklist.find((c) => c.id === "bench")?.ok).toBe(true);
    }
  });
});
