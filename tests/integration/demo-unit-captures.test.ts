import { beforeAll, describe, expect, it } from "vitest";
import { BenchSheet, Listing } from "~/models/index.server";
import { Capture } from "~/models/capture.server";
import { ensureBucket, headObject } from "~/services/storage.server";
import { seedDemo } from "../../db/seeds/demo";
import { DEMO_UNITS } from "../../db/seeds/demo-data";

// Every bench-verified demo amplifier, receiver and phono stage shows captures behind its figures,
// and the captures' readings agree with the figures the demo sheet was written with.

const CATEGORIES = new Set(["integrated_amplifier", "power_amplifier", "receiver", "phono_stage"]);
const units = DEMO_UNITS.filter((u) => CATEGORIES.has(u.category) && u.sheet);

describe("demo captures behind the bench-verified units", () => {
  beforeAll(async () => {
    await ensureBucket();
    await seedDemo();
  }, 240_000);

  it("each verified unit's THD, damping factor and sweep come from captures that read the sheet's figures", async () => {
    let checked = 0;
    for (const unit of units) {
      const listing = await Listing.scope("withSerial").findOne({ where: { serialNumber: unit.serial } });
      if (!listing?.benchVerified) continue;
      const sheet = (await BenchSheet.findOne({ where: { listingId: listing.id } }))?.sheet;
      expect(sheet, unit.serial).toBeTruthy();
      const typedThd = unit.sheet!.readings.find((r) => r.quantity === "thd" && r.channel === "left" && r.basis === "measured");
      if (typedThd) {
        const captured = sheet!.readings.find((r) => r.quantity === "thd" && r.channel === "left" && r.origin === "capture");
        expect(captured, `${unit.serial}: THD from a capture`).toBeTruthy();
        // The synthesised harmonics give the typed THD; the noise (about as strong as the harmonics, as THD+N
        // asks) that lands in their nine zones adds about 1 %, a few % at worst in half a second of audio.
        expect(Math.abs(captured!.value / typedThd.value - 1), unit.serial).toBeLessThan(0.05);
        const typedThdN = unit.sheet!.readings.find((r) => r.quantity === "thd_n" && r.channel === "left" && r.basis === "measured");
        const capturedThdN = sheet!.readings.find((r) => r.quantity === "thd_n" && r.channel === "left" && r.origin === "capture");
        if (typedThdN && unit.serial !== "CW-46I-017924")
          expect(Math.abs(capturedThdN!.value / typedThdN.value - 1), unit.serial).toBeLessThan(0.02);
        const capture = await Capture.findByPk(captured!.captureId);
        expect(capture?.status).toBe("done");
        expect(await headObject(capture!.storageKey!)).not.toBeNull();
      }
      const typedDf = unit.sheet!.readings.find((r) => r.quantity === "damping_factor" && r.basis === "measured");
      // The first demo unit's captures (sine, square, sweep) were written by hand before the rest; its damping factor stays typed.
      if (typedDf && unit.serial !== "CW-46I-017924") {
        // Z_out = 8/DF from a tone open then into 8 Ω, read back as DF = 8/Z_out: the same figure.
        const capturedDf = sheet!.readings.find((r) => r.quantity === "damping_factor" && r.origin === "capture");
        expect(capturedDf, `${unit.serial}: damping factor from a capture`).toBeTruthy();
        expect(Math.abs(capturedDf!.value / typedDf.value - 1), unit.serial).toBeLessThan(0.01);
        expect(sheet!.readings.some((r) => r.quantity === "output_impedance" && r.origin === "capture")).toBe(true);
      }
      if (unit.sheet!.sweeps.length || unit.sheet!.readings.some((r) => r.quantity === "f3db_high")) {
        expect(
          sheet!.sweeps.some((s) => s.origin === "capture"),
          `${unit.serial}: sweep from a capture`,
        ).toBe(true);
      }
      checked++;
    }
    expect(checked).toBeGreaterThanOrEqual(20);
  });
});
