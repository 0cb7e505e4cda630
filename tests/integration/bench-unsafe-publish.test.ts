import { afterAll, describe, expect, it } from "vitest";
import { Listing } from "~/models/index.server";
import { saveBenchSheet } from "~/listings/bench.server";
import { publishListing } from "~/listings/publish.server";
import { loadListingPage } from "~/listings/public.server";
import { deskQueue } from "~/desk/queue.server";
import { exampleIntegratedAmplifierSheet, type BenchSheet } from "@shared/bench";
import { cleanUp, makeAccount, readyDraft, reload, withOwnCaptures } from "./listing-support";

// A reading that makes the unit unsafe to connect (here 120 mV of DC at the left loudspeaker output, beyond
// the ±50 mV commonly used as the limit) blocks the mark, holds the listing for the review desk with that
// reason, and puts a plain warning on the listing page. Listings made here are removed afterwards.

afterAll(cleanUp);

function withDcOffset(volts: number): BenchSheet {
  const sheet = exampleIntegratedAmplifierSheet();
  sheet.readings = sheet.readings.map((r) => (r.quantity === "dc_offset" && r.channel === "left" ? { ...r, value: volts } : r));
  return sheet;
}

describe("publishing a sheet that says the unit is unsafe to connect", () => {
  it("holds it for the desk with the reason, without the mark, and the listing page warns", async () => {
    const seller = await makeAccount("unsafe-dc", ["workshop"]);
    const draft = await readyDraft(seller);
    await saveBenchSheet(draft.id, seller.user.id, await withOwnCaptures(withDcOffset(0.12), seller.user.id));
    const { listing: published, verdict } = await publishListing(draft.id, seller.session);
    expect(published.status).toBe("held");
    expect(verdict!.benchVerified).toBe(false);
    expect(verdict!.hazards.map((h) => h.ruleId)).toEqual(["dc-offset-safe"]);
    // Nothing implausible on the sheet: the hold is for safety alone.
    expect(verdict!.counts.implausible).toBe(0);

    const { listing } = await reload(draft.id);
    expect(listing.status).toBe("held");
    expect(listing.benchVerified).toBe(false);
    expect(listing.heldReason).toMatch(
      /^Unsafe to connect: no harmful DC at the loudspeaker outputs — Left DC offset at the output 120 mV/,
    );
    expect(listing.heldReason).toMatch(/qualified technician/);
    expect(await Listing.count({ where: { id: draft.id, status: "live" } })).toBe(0);

    // The moderator reads the reason on the desk's queue.
    const desk = await deskQueue({ kind: "held_listing", limit: 10_000 });
    const row = desk.items.find((i) => i.subject.id === draft.id);
    expect(row?.summary).toMatch(/Unsafe to connect: no harmful DC/);

    const page = await loadListingPage({ id: draft.id, viewer: seller.session, zone: null, acceptLanguage: null });
    expect(page!.bench!.hazards).toEqual([expect.objectContaining({ title: "No harmful DC at the loudspeaker outputs" })]);
  });

  it("goes live with the mark when the offset is within ±50 mV", async () => {
    const seller = await makeAccount("safe-dc", ["workshop"]);
    const draft = await readyDraft(seller);
    await saveBenchSheet(draft.id, seller.user.id, await withOwnCaptures(withDcOffset(0.05), seller.user.id));
    const { listing: published, verdict } = await publishListing(draft.id, seller.session);
    expect(published.status).toBe("live");
    expect(verdict!.hazards).toEqual([]);
    expect((await reload(draft.id)).listing.benchVerified).toBe(true);
    // Back-dated: the market's first page is for the demo units other suites open.
    await Listing.update({ publishedAt: new Date("2020-06-01T00:00:00Z") }, { where: { id: draft.id } });
  });
});
