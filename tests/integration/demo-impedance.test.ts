import { beforeAll, describe, expect, it } from "vitest";
import { Op } from "sequelize";
import { BenchSheet, Listing } from "~/models/index.server";
import { Capture } from "~/models/capture.server";
import { ensureBucket } from "~/services/storage.server";
import { capturesForSheet } from "~/listings/captures.server";
import { plotsFor } from "~/listings/plots.server";
import { seedDemo } from "../../db/seeds/demo";
import { DEMO_UNITS } from "../../db/seeds/demo-data";

// Every bench-verified demo loudspeaker has an impedance sweep behind its impedance figures: the
// capture's minimum is the figure its sheet was written with, and its listing page plots the sweep.

const speakers = DEMO_UNITS.filter((u) => u.category === "loudspeaker");

describe("demo loudspeakers' impedance sweeps", () => {
  beforeAll(async () => {
    await ensureBucket();
    await seedDemo();
  }, 240_000);

  it("each verified speaker's minimum comes from its capture and agrees with its written figures; the page plots it", async () => {
    const listings = await Listing.scope("withSerial").findAll({
      where: { serialNumber: { [Op.in]: speakers.map((s) => s.serial) }, benchVerified: true },
    });
    expect(listings.length).toBeGreaterThan(0);
    for (const listing of listings) {
      const unit = speakers.find((s) => s.serial === listing.serialNumber)!;
      const written = unit.sheet!.readings.find((r) => r.quantity === "impedance_minimum")!;
      const sheet = (await BenchSheet.findOne({ where: { listingId: listing.id } }))!.sheet!;
      const mins = sheet.readings.filter((r) => r.quantity === "impedance_minimum");
      expect(mins).toHaveLength(1);
      expect(mins[0]).toMatchObject({ origin: "capture", value: written.value });
      expect(mins[0].conditions.frequencyHz).toBeCloseTo(written.conditions.frequencyHz ?? NaN, -1);
      expect(sheet.readings.some((r) => r.quantity === "resonance_frequency" && r.origin === "capture")).toBe(true);
      const capture = await Capture.findByPk(mins[0].captureId);
      expect(capture).toMatchObject({ kind: "impedance", status: "done" });
      const plots = await plotsFor(sheet, await capturesForSheet(sheet, listing.sellerId));
      expect(plots.impedances).toHaveLength(1);
      expect(plots.impedances[0].points.length).toBeGreaterThan(100);
    }
  });
});
