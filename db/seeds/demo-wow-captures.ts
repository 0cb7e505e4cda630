import { randomUUID } from "node:crypto";
import { sequelize } from "~/db.server";
import { BenchSheet, Listing } from "~/models/index.server";
import { Capture } from "~/models/capture.server";
import { analyseCapture } from "~/bench/captures.server";
import { deleteObjects, putObject, randomKey } from "~/services/storage.server";
import { analyseWowFlutter, captureConditionsSchema, flutterWeighting, flutterWeightingDb } from "@shared/bench/analysis";
import type { Reading } from "@shared/bench/schema";
import { checkBenchSheet } from "@shared/bench/verdict";
import { listingFacets } from "@shared/listing-facets";
import { DEMO_UNITS } from "./demo-data";
import { wav24 } from "./demo-captures";

// A test-tone capture behind the speed and wow & flutter figures of every bench-verified demo turntable
// and tape deck: the tone (3150 Hz, or 3000 Hz where the sheet quotes WRMS) runs at the sheet's speed
// error, frequency-modulated at the platter's once-around rate (turntables) or at 6 Hz capstan flutter
// (tape) by the amount that makes the weighted reading come out at the sheet's figure. The bench's own
// analysis then reads the file, and its figures replace the typed ones, so sheet and capture agree.
// Idempotent: a sheet that already has a wow & flutter capture is left alone.

const FS = 48_000;
const SECONDS = 9; // five turns of a platter at 33⅓ rpm: a whole number of wow cycles, so the mean speed is the offset

function tone(carrierHz: number, offset: number, rateHz: number, relDeviation: number): Float64Array {
  const n = FS * SECONDS;
  const x = new Float64Array(n);
  const fc = carrierHz * (1 + offset);
  const dev = carrierHz * relDeviation;
  for (let i = 0; i < n; i++) {
    const t = i / FS;
    const cycles = fc * t + (dev / (2 * Math.PI * rateHz)) * (1 - Math.cos(2 * Math.PI * rateHz * t));
    x[i] = 0.4 * Math.sin(2 * Math.PI * cycles);
  }
  return x;
}

const ROLE = new Set<Reading["quantity"]>(["speed_error", "wow_flutter"]);

async function seedOne(serial: string): Promise<boolean> {
  const listing = await Listing.scope("withSerial").findOne({ where: { serialNumber: serial } });
  if (!listing?.benchVerified) return false;
  const row = await BenchSheet.findOne({ where: { listingId: listing.id } });
  const sheet = row?.sheet;
  if (!sheet || sheet.readings.some((r) => r.origin === "capture" && ROLE.has(r.quantity))) return false;
  const measured = (q: Reading["quantity"]) => sheet.readings.find((r) => r.basis === "measured" && r.quantity === q);
  const speed = measured("speed_error");
  const wf = measured("wow_flutter");
  if (!speed || !wf) return false;
  const wrms = wf.conditions?.weighting === "WRMS";
  const testToneHz = wrms ? 3000 : 3150;
  const turntable = listing.category === "turntable";
  const speedRpm = turntable ? 100 / 3 : undefined;
  const rateHz = turntable ? speedRpm! / 60 : 6;
  // Weighted peak of a sinusoidal modulation ≈ its peak × the weighting's gain there (the reading is the
  // 95 % point, 0.997 of the peak); WRMS is that over √2.
  const gain = 10 ** (flutterWeightingDb(flutterWeighting(2000), rateHz) / 20);
  const guess = (wf.value * (wrms ? Math.SQRT2 : 1 / 0.997)) / gain;
  // The reading is linear in the deviation: one trial run sets the scale exactly.
  const trial = analyseWowFlutter(tone(testToneHz, speed.value, rateHz, guess), FS, {
    nominalHz: testToneHz,
    convention: wrms ? "WRMS" : "IEC-60386-peak",
  });
  const relDeviation = guess * (wf.value / (wrms ? trial.weightedRms.value : trial.weightedPeak.value));
  const conditions = captureConditionsSchema.parse({
    kind: "wow_flutter",
    testToneHz,
    ...(turntable ? { speedRpm: 33.33 } : { tapeSpeedCmS: speed.conditions?.tapeSpeedCmS ?? 4.76 }),
  });
  const fileName = `${serial.toLowerCase()}-${testToneHz}hz.wav`;
  const bytes = wav24([tone(testToneHz, speed.value, rateHz, relDeviation)], FS);
  const key = randomKey("captures", "wav");
  await putObject(key, bytes, { contentType: "audio/wav", contentLength: bytes.length });
  try {
    const done = await sequelize.transaction(async (t) => {
      const fresh = await BenchSheet.findOne({ where: { listingId: listing.id }, transaction: t, lock: t.LOCK.UPDATE });
      if (!fresh?.sheet || fresh.sheet.readings.some((r) => r.origin === "capture" && ROLE.has(r.quantity))) return false;
      const id = randomUUID();
      const result = analyseCapture(new Uint8Array(bytes), fileName, conditions, id);
      const now = new Date();
      await Capture.create(
        {
          id,
          ownerId: listing.sellerId,
          kind: "wow_flutter",
          status: "done",
          fileName,
          contentType: "audio/wav",
          byteSize: bytes.length,
          storageKey: key,
          format: result.format,
          conditions,
          analysis: result.analysis,
          readings: result.readings,
          sweep: null,
          startedAt: now,
          finishedAt: now,
        },
        { transaction: t },
      );
      const next = {
        ...fresh.sheet,
        readings: [...fresh.sheet.readings.filter((r) => !(r.basis === "measured" && ROLE.has(r.quantity))), ...result.readings],
      };
      const verdict = checkBenchSheet(next);
      if (!verdict.benchVerified) throw new Error(`the demo test tone would cost ${serial} its mark: ${verdict.summary}`);
      await fresh.update({ sheet: next, verdict, checkedAt: now }, { transaction: t });
      await listing.update({ ...listingFacets(next) }, { transaction: t });
      return true;
    });
    if (!done) await deleteObjects([key]);
    return done;
  } catch (error) {
    await deleteObjects([key]).catch(() => undefined);
    throw error;
  }
}

export async function seedDemoWowCaptures(): Promise<{ created: number }> {
  let created = 0;
  for (const unit of DEMO_UNITS) {
    if (unit.category !== "turntable" && unit.category !== "tape_deck") continue;
    if (await seedOne(unit.serial)) created++;
  }
  return { created };
}
