import { describe, expect, it } from "vitest";
import { Op } from "sequelize";
import { BenchSheet, Listing } from "~/models/index.server";
import { Capture } from "~/models/capture.server";
import { loader } from "~/routes/listings/listing";
import type { ListingPageData } from "~/listings/types";
import { seedDemoWowCaptures } from "../../db/seeds/demo-wow-captures";
import { DEMO_UNITS } from "../../db/seeds/demo-data";
import { routeArgs, isData } from "../support/route-args";

// Every bench-verified demo turntable and tape deck has a test-tone capture behind its speed and
// wow & flutter figures, the figures on its sheet are what that capture reads, and its listing page
// plots the speed drift.

const SERIALS = DEMO_UNITS.filter((u) => u.category === "turntable" || u.category === "tape_deck").map((u) => u.serial);

describe("demo turntables and tape decks measured from a test tone", () => {
  it("each bench-verified one has a wow & flutter capture whose readings are the sheet's", async () => {
    await seedDemoWowCaptures(); // the stack's seed has run already; a second run must change nothing
    const listings = await Listing.scope("withSerial").findAll({ where: { serialNumber: { [Op.in]: SERIALS }, benchVerified: true } });
    expect(listings.length).toBeGreaterThanOrEqual(4);
    for (const listing of listings) {
      const sheet = (await BenchSheet.findOne({ where: { listingId: listing.id } }))!.sheet!;
      const speed = sheet.readings.filter((r) => r.basis === "measured" && r.quantity === "speed_error");
      const wf = sheet.readings.filter((r) => r.basis === "measured" && r.quantity === "wow_flutter");
      expect(speed, listing.serialNumber!).toHaveLength(1);
      expect(wf, listing.serialNumber!).toHaveLength(1);
      expect(speed[0].origin).toBe("capture");
      expect(wf[0].captureId).toBe(speed[0].captureId);
      const capture = (await Capture.findByPk(speed[0].captureId))!;
      expect(capture.kind).toBe("wow_flutter");
      expect(capture.ownerId).toBe(listing.sellerId);
      const a = capture.analysis!;
      if (a.kind !== "wow_flutter") throw new Error("expected a wow & flutter analysis");
      expect(speed[0].value).toBe(a.speedError.value);
      const wrms = wf[0].conditions?.weighting === "WRMS";
      expect(wf[0].value).toBe(wrms ? a.weightedRms.value : a.weightedPeak.value);
      expect(wf[0].conditions?.testToneHz).toBe(wrms ? 3000 : 3150);
    }
  });

  it("the listing page plots the speed drift with the weighted figures beside it", async () => {
    const listing = (await Listing.scope("withSerial").findOne({ where: { serialNumber: "QV-T3-118070", benchVerified: true } }))!;
    const request = new Request(`http://127.0.0.1/listings/${listing.id}`);
    const value = await loader(routeArgs(request, { id: listing.id }));
    const body = (isData(value) ? value.data : value) as ListingPageData;
    const [plot] = body.plots.speedDrifts;
    expect(plot.title).toBe("Speed drift");
    expect(plot.conditions).toContain("3150 Hz test tone, 33⅓ rpm");
    expect(plot.points.length).toBeGreaterThan(100);
    // The typed sheet said 0.10 % fast and 0.05 % weighted; the tone was made to read the same.
    const mean = plot.points.reduce((s, p) => s + p.percent, 0) / plot.points.length;
    expect(mean).toBeCloseTo(0.1, 2);
    expect(plot.figures.find((f) => f.label.startsWith("Wow & flutter, weighted peak"))?.display).toMatch(/^±0\.05\d? %$/);
  });
});
