import { randomUUID } from "node:crypto";
import { Op } from "sequelize";
import { sequelize } from "~/db.server";
import { BenchSheet, Listing } from "~/models/index.server";
import { Capture } from "~/models/capture.server";
import { analyseCapture } from "~/bench/captures.server";
import { deleteObjects, putObject, randomKey } from "~/services/storage.server";
import { captureConditionsSchema, type CaptureConditionsInput } from "@shared/bench/analysis";
import type { BenchSheet as Sheet, Reading, Sweep } from "@shared/bench/schema";
import { checkBenchSheet } from "@shared/bench/verdict";
import { listingFacets } from "@shared/listing-facets";
import { noise, wav24 } from "./demo-captures";
import { DEMO_UNITS } from "./demo-data";

// Synthesised captures behind the figures of every bench-verified demo amplifier, receiver and phono
// stage, built from the sheet's own typed figures so the captures' readings agree with them: a stereo
// 1 kHz sine at the THD figures' power (harmonics giving each channel's THD, noise giving the THD+N)
// and a response sweep through the sheet's −3 dB corners (phono stages: their RIAA sweep as typed),
// and for a damping factor a tone played open and then into its load. The captures' THD, THD+N and
// damping factor replace the typed ones; the captured sweep replaces the typed sweep. A
// unit whose sheet would lose its mark is left as it was. Idempotent: a sheet with capture figures is
// left alone. Half a second of 48 kHz audio per sine keeps the whole run to a second or two.

const FS = 48_000;
const SECONDS = 0.5;
const CATEGORIES = ["integrated_amplifier", "power_amplifier", "receiver", "phono_stage"] as const;

interface Made {
  kind: "sine" | "sweep" | "output_impedance";
  fileName: string;
  contentType: string;
  bytes: Buffer;
  conditions: CaptureConditionsInput;
}

/** A 1 kHz tone whose second and third harmonics give `thd` (4:3 in amplitude) plus white noise of rms `noiseRms`, both re the fundamental's rms. */
function tone(peak: number, thd: number, noiseRms: number, seed: number): Float64Array {
  const n = FS * SECONDS;
  const x = new Float64Array(n);
  const rnd = noise(seed);
  const w = (2 * Math.PI * 1000) / FS;
  const h2 = thd * 0.8;
  const h3 = thd * 0.6; // √(0.8² + 0.6²) = 1
  // Uniform noise in ±0.5 has rms 1/√12; the fundamental's rms is its peak / √2.
  const k = (noiseRms * Math.sqrt(12)) / Math.SQRT2;
  for (let i = 0; i < n; i++) x[i] = peak * (Math.sin(w * i) + h2 * Math.sin(2 * w * i + 0.3) + h3 * Math.sin(3 * w * i + 1.1) + k * rnd());
  return x;
}

/** Noise (re the fundamental, over the whole 0–24 kHz band) that brings THD+N in 20 Hz–20 kHz to `thdN`. */
function noiseFor(thd: number, thdN: number | undefined): number {
  const inBand = thdN && thdN > thd ? Math.sqrt(thdN * thdN - thd * thd) : thd * 0.3;
  return inBand * Math.sqrt(24_000 / 19_980);
}

const measured = (s: Sheet, q: Reading["quantity"], channel?: string) =>
  s.readings.find((r) => r.quantity === q && r.basis === "measured" && r.origin !== "capture" && (!channel || r.channel === channel));

function sweepCsv(points: { frequencyHz: number; levelDb: number }[]): string {
  return ["frequency (Hz),level (dB)", ...points.map((p) => `${p.frequencyHz.toPrecision(6)},${p.levelDb.toFixed(3)}`)].join("\n");
}

function flatPoints(lowHz: number, highHz: number): { frequencyHz: number; levelDb: number }[] {
  return Array.from({ length: 45 }, (_, i) => {
    const f = 5 * 10 ** (i / 10);
    return { frequencyHz: f, levelDb: -10 * Math.log10(1 + (lowHz / f) ** 2) - 10 * Math.log10(1 + (f / highHz) ** 2) };
  }).filter((p) => p.frequencyHz <= 200_000);
}

/** The files for one unit (exported for tests). */
export function filesFor(sheet: Sheet, serial: string, seed: number): Made[] {
  const out: Made[] = [];
  const slug = serial.toLowerCase().replace(/[^a-z0-9]+/g, "-");
  const thdL = measured(sheet, "thd", "left");
  const thdR = measured(sheet, "thd", "right") ?? thdL;
  const thdN = measured(sheet, "thd_n", "left");
  if (thdL && thdR) {
    const load = thdL.conditions.loadOhm;
    const power = thdL.conditions.powerW;
    // Amplifiers: the THD figures' power into their load; line and phono outputs: their voltage (1 V by default).
    const vrms = power && load ? Math.sqrt(power * load) : (thdL.conditions.voltageV ?? 1);
    const fullScale = Math.ceil(vrms * Math.SQRT2 * 2);
    const peak = (vrms * Math.SQRT2) / fullScale;
    out.push({
      kind: "sine",
      fileName: `${slug}-1khz.wav`,
      contentType: "audio/wav",
      bytes: wav24(
        [
          tone(peak, thdL.value, noiseFor(thdL.value, thdN?.value), seed),
          tone(peak, thdR.value, noiseFor(thdR.value, thdN ? thdN.value * (thdR.value / thdL.value) : undefined), seed + 1),
        ],
        FS,
      ),
      conditions: {
        kind: "sine",
        scale: { kind: "volts-per-full-scale", volts: fullScale, basis: "peak" },
        ...(load ? { loadOhm: load } : {}),
        fundamentalHz: 1000,
        bandwidth: { lowHz: 20, highHz: 20_000 },
        channelsDriven: "both",
      },
    });
  }
  // The damping factor from a tone played open and then into 8 Ω: V_loaded = V_open·8/(8 + Z_out), Z_out = 8/DF.
  const df = measured(sheet, "damping_factor");
  const dfLoad = df?.conditions.loadOhm ?? 8;
  if (df && df.value > 0) {
    const zOut = dfLoad / df.value;
    const rnd = noise(seed + 2);
    const x = Float64Array.from({ length: Math.round(FS * 0.6) }, (_, i) => {
      const level = i < FS * 0.3 ? 0.5 : (0.5 * dfLoad) / (dfLoad + zOut);
      return level * Math.sin((2 * Math.PI * 1000 * i) / FS) + 2e-6 * rnd();
    });
    out.push({
      kind: "output_impedance",
      fileName: `${slug}-open-then-${dfLoad}ohm.wav`,
      contentType: "audio/wav",
      bytes: wav24([x], FS),
      conditions: { kind: "output_impedance", loadOhm: dfLoad, nominalLoadOhm: dfLoad, channel: df.channel ?? "left", frequencyHz: 1000 },
    });
  }
  const typed = sheet.sweeps.find((s) => s.origin !== "capture");
  const low = measured(sheet, "f3db_low")?.value;
  const high = measured(sheet, "f3db_high")?.value;
  if (typed?.kind === "riaa") {
    out.push({
      kind: "sweep",
      fileName: `${slug}-riaa-sweep.csv`,
      contentType: "text/csv",
      bytes: Buffer.from(sweepCsv(typed.points)),
      conditions: { kind: "sweep", reference: "riaa", channel: typed.channel ?? "left" },
    });
  } else if (typed || (low && high)) {
    const points = low && high ? flatPoints(low, high) : (typed?.points ?? []);
    out.push({
      kind: "sweep",
      fileName: `${slug}-sweep-1w.csv`,
      contentType: "text/csv",
      bytes: Buffer.from(sweepCsv(points)),
      conditions: { kind: "sweep", reference: "flat", channel: typed?.channel ?? "left", loadOhm: 8 },
    });
  }
  return out;
}

function hasCaptures(sheet: Sheet | null): boolean {
  return !!sheet && [...sheet.readings, ...sheet.sweeps].some((r) => r.origin === "capture");
}

const FROM_SINE = new Set<Reading["quantity"]>(["thd", "thd_n"]);
const FROM_OUTPUT_IMPEDANCE = new Set<Reading["quantity"]>(["damping_factor", "output_impedance"]);

/** One unit: files to storage, then captures and the changed sheet in one transaction. */
async function seedUnit(listing: Listing): Promise<boolean> {
  const row = await BenchSheet.findOne({ where: { listingId: listing.id } });
  if (!row?.sheet || hasCaptures(row.sheet)) return false;
  const made = filesFor(row.sheet, listing.serialNumber ?? listing.id, listing.id.charCodeAt(0) * 7);
  if (!made.length) return false;
  const files = made.map((f) => ({ ...f, key: randomKey("captures", f.kind === "sweep" ? "csv" : "wav") }));
  for (const f of files) await putObject(f.key, f.bytes, { contentType: f.contentType, contentLength: f.bytes.length });
  let kept = false;
  try {
    kept = await sequelize.transaction(async (t) => {
      await sequelize.query(`SELECT pg_advisory_xact_lock(hashtext('loadline-demo-captures'))`, { transaction: t });
      const fresh = await BenchSheet.findOne({ where: { listingId: listing.id }, transaction: t, lock: t.LOCK.UPDATE });
      if (!fresh?.sheet || hasCaptures(fresh.sheet)) return false;
      const sheet: Sheet = { ...fresh.sheet };
      const added: Reading[] = [];
      const sweeps: Sweep[] = [];
      const rows = [];
      for (const f of files) {
        const conditions = captureConditionsSchema.parse(f.conditions);
        const id = randomUUID();
        const result = analyseCapture(new Uint8Array(f.bytes), f.fileName, conditions, id);
        const now = new Date();
        rows.push({
          id,
          ownerId: listing.sellerId,
          kind: f.kind,
          status: "done" as const,
          fileName: f.fileName,
          contentType: f.contentType,
          byteSize: f.bytes.length,
          storageKey: f.key,
          format: result.format,
          conditions,
          analysis: result.analysis,
          readings: result.readings,
          sweep: result.kind === "sweep" ? result.sweep : null,
          startedAt: now,
          finishedAt: now,
        });
        if (result.kind === "sine") added.push(...result.readings.filter((r) => FROM_SINE.has(r.quantity)));
        if (result.kind === "sweep") sweeps.push(result.sweep);
        if (result.kind === "output_impedance") added.push(...result.readings.filter((r) => FROM_OUTPUT_IMPEDANCE.has(r.quantity)));
      }
      const replaced = new Set(added.map((r) => r.quantity));
      sheet.readings = [...sheet.readings.filter((r) => !(r.basis === "measured" && replaced.has(r.quantity))), ...added];
      if (sweeps.length) sheet.sweeps = [...sheet.sweeps.filter((s) => s.origin === "capture"), ...sweeps];
      const verdict = checkBenchSheet(sheet);
      // The demo unit must stay as good as it was; one that would not is left with its typed figures.
      if (!verdict.benchVerified) {
        console.warn(`demo captures: ${listing.serialNumber} would lose its mark (${verdict.summary}); left as typed`);
        return false;
      }
      for (const r of rows) await Capture.create(r, { transaction: t });
      await fresh.update({ sheet, verdict, checkedAt: new Date() }, { transaction: t });
      await listing.update({ benchVerified: true, ...listingFacets(sheet) }, { transaction: t });
      return true;
    });
  } finally {
    if (!kept) await deleteObjects(files.map((f) => f.key)).catch(() => undefined);
  }
  return kept;
}

export async function seedDemoUnitCaptures(): Promise<{ created: number }> {
  const listings = await Listing.scope("withSerial").findAll({
    where: { benchVerified: true, category: { [Op.in]: [...CATEGORIES] }, serialNumber: { [Op.in]: DEMO_UNITS.map((u) => u.serial) } },
  });
  let created = 0;
  for (const listing of listings) if (await seedUnit(listing)) created++;
  return { created };
}
