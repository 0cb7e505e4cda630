import { randomUUID } from "node:crypto";
import { Op } from "sequelize";
import { sequelize } from "~/db.server";
import { BenchSheet, Listing } from "~/models/index.server";
import { Capture } from "~/models/capture.server";
import { analyseCapture } from "~/bench/captures.server";
import { deleteObjects, putObject, randomKey } from "~/services/storage.server";
import { captureConditionsSchema } from "@shared/bench/analysis";
import type { BenchSheet as Sheet, Reading } from "@shared/bench/schema";
import { checkBenchSheet } from "@shared/bench/verdict";
import { listingFacets } from "@shared/listing-facets";
import { DEMO_UNITS } from "./demo-data";
import { impedanceSweepCsv, type Target } from "./impedance-sweep";

// An impedance sweep behind each bench-verified demo loudspeaker's impedance figures, synthesised
// from a lumped driver model (Re + the motional parallel RLC at the system resonance + the voice
// coil's inductance) tuned so that its minimum is the sheet's own figure at the sheet's frequency.
// The capture's readings replace the typed minimum. Idempotent: a sheet with capture figures is left.

function targetOf(sheet: Sheet): Target | null {
  const rated = sheet.readings.find((r) => r.quantity === "nominal_impedance" && r.unit === "Ω");
  const min = sheet.readings.find((r) => r.quantity === "impedance_minimum" && r.origin === "typed" && r.unit === "Ω");
  const f3 = sheet.readings.find((r) => r.quantity === "f3db_low" && r.unit === "Hz");
  if (!rated || !min?.conditions.frequencyHz || !f3) return null;
  // A closed box's system resonance sits near its −3 dB point (common practice for a Q near 0.7–1).
  return { ratedOhm: rated.value, minOhm: min.value, minAtHz: min.conditions.frequencyHz, resonanceHz: f3.value };
}

const hasCaptures = (sheet: Sheet | null) => !!sheet && [...sheet.readings, ...sheet.sweeps].some((r) => r.origin === "capture");

export async function seedDemoImpedance(): Promise<{ created: number }> {
  const serials = DEMO_UNITS.filter((u) => u.category === "loudspeaker").map((u) => u.serial);
  const listings = await Listing.scope("withSerial").findAll({
    where: { serialNumber: { [Op.in]: serials }, category: "loudspeaker", benchVerified: true },
  });
  let created = 0;
  for (const listing of listings) {
    const row = await BenchSheet.findOne({ where: { listingId: listing.id } });
    const target = row?.sheet && !hasCaptures(row.sheet) ? targetOf(row.sheet) : null;
    if (!target) continue;
    const bytes = Buffer.from(impedanceSweepCsv(target));
    const key = randomKey("captures", "csv");
    const fileName = `impedance-${listing.serialNumber?.toLowerCase() ?? listing.id}.csv`;
    await putObject(key, bytes, { contentType: "text/csv", contentLength: bytes.length });
    try {
      const done = await sequelize.transaction(async (t) => {
        await sequelize.query(`SELECT pg_advisory_xact_lock(hashtext('loadline-demo-impedance'))`, { transaction: t });
        const fresh = await BenchSheet.findOne({ where: { listingId: listing.id }, transaction: t, lock: t.LOCK.UPDATE });
        if (!fresh?.sheet || hasCaptures(fresh.sheet)) return false;
        const conditions = captureConditionsSchema.parse({ kind: "impedance", ratedOhm: target.ratedOhm, driveV: 1 });
        const id = randomUUID();
        const result = analyseCapture(new Uint8Array(bytes), fileName, conditions, id);
        const now = new Date();
        await Capture.create(
          {
            id,
            ownerId: listing.sellerId,
            kind: "impedance",
            status: "done",
            fileName,
            contentType: "text/csv",
            byteSize: bytes.length,
            storageKey: key,
            format: result.format,
            conditions,
            analysis: result.analysis,
            readings: result.readings,
            startedAt: now,
            finishedAt: now,
          },
          { transaction: t },
        );
        const measured = (r: Reading) => r.quantity === "impedance_minimum" && r.basis === "measured";
        const sheet: Sheet = { ...fresh.sheet, readings: [...fresh.sheet.readings.filter((r) => !measured(r)), ...result.readings] };
        const verdict = checkBenchSheet(sheet);
        if (!verdict.benchVerified)
          throw new Error(`the demo impedance sweep would cost ${listing.serialNumber} its mark: ${verdict.summary}`);
        await fresh.update({ sheet, verdict, checkedAt: now }, { transaction: t });
        await listing.update({ ...listingFacets(sheet) }, { transaction: t });
        return true;
      });
      if (done) created += 1;
      else await deleteObjects([key]);
    } catch (error) {
      await deleteObjects([key]).catch(() => undefined);
      throw error;
    }
  }
  return { created };
}
