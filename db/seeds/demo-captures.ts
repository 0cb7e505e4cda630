import { randomUUID } from "node:crypto";
import { sequelize } from "~/db.server";
import { BenchSheet, Listing } from "~/models/index.server";
import { Capture } from "~/models/capture.server";
import { analyseCapture } from "~/bench/captures.server";
import { deleteObjects, putObject, randomKey } from "~/services/storage.server";
import { captureConditionsSchema, type CaptureConditionsInput } from "@shared/bench/analysis";
import type { BenchSheet as Sheet, Reading } from "@shared/bench/schema";
import { checkBenchSheet } from "@shared/bench/verdict";
import { listingFacets } from "@shared/listing-facets";

// Raw captures for one demo amplifier (the Carrowain WQ 46i), synthesised here and analysed by the
// bench's own capture analysis, so the listing page has a harmonic spectrum, a square-wave trace and a
// response sweep to show: a stereo 1 kHz sine at 60 W into 8 Ω (WAV, 24-bit), a 10 kHz square wave
// through a 95 kHz single-pole response and a 10 Hz–100 kHz sweep with corners at 7 Hz and 95 kHz
// (CSV). Idempotent: a sheet that already has capture figures is left alone.

const TARGET_SERIAL = "CW-46I-017924";
const FS = 48_000;

/** 24-bit PCM WAV from channels scaled to ±1 full scale. */
export function wav24(channels: Float64Array[], sampleRate: number): Buffer {
  const frames = channels[0].length;
  const n = channels.length;
  const data = Buffer.alloc(frames * n * 3);
  let o = 0;
  for (let i = 0; i < frames; i++) {
    for (const ch of channels) {
      const v = Math.max(-8_388_608, Math.min(8_388_607, Math.round(ch[i] * 8_388_608)));
      data.writeIntLE(v, o, 3);
      o += 3;
    }
  }
  const h = Buffer.alloc(44);
  h.write("RIFF", 0);
  h.writeUInt32LE(36 + data.length, 4);
  h.write("WAVE", 8);
  h.write("fmt ", 12);
  h.writeUInt32LE(16, 16);
  h.writeUInt16LE(1, 20);
  h.writeUInt16LE(n, 22);
  h.writeUInt32LE(sampleRate, 24);
  h.writeUInt32LE(sampleRate * n * 3, 28);
  h.writeUInt16LE(n * 3, 32);
  h.writeUInt16LE(24, 34);
  h.write("data", 36);
  h.writeUInt32LE(data.length, 40);
  return Buffer.concat([h, data]);
}

/** Deterministic noise (mulberry32), so every seed writes the same files. */
export function noise(seed: number): () => number {
  let a = seed >>> 0;
  return () => {
    a = (a + 0x6d2b79f5) >>> 0;
    let t = Math.imul(a ^ (a >>> 15), a | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296 - 0.5;
  };
}

/** A 1 kHz tone with the given harmonic amplitudes (re the fundamental) and a noise floor 100 dB down. */
function tone(peak: number, harmonics: number[], seed: number): Float64Array {
  const x = new Float64Array(FS);
  const rnd = noise(seed);
  const w = (2 * Math.PI * 1000) / FS;
  for (let i = 0; i < FS; i++) {
    let v = Math.sin(w * i);
    harmonics.forEach((a, k) => (v += a * Math.sin(w * (k + 2) * i + 0.4 * k)));
    x[i] = v * peak + rnd() * peak * 1.7e-5;
  }
  return x;
}

function squareCsv(): string {
  // 10 kHz square wave, ±0.5 V, through a single pole at 95 kHz, sampled every 20 ns for two periods.
  const tau = 1 / (2 * Math.PI * 95_000);
  const dt = 2e-8;
  const a = Math.exp(-dt / tau);
  const rows = ["time (s),volts (V)"];
  let y = -0.5;
  for (let i = 0; i < 10_000; i++) {
    const target = Math.floor((i * dt) / 5e-5) % 2 === 0 ? 0.5 : -0.5;
    if (i > 0) y = target + (y - target) * a;
    rows.push(`${(i * dt).toExponential(6)},${y.toFixed(6)}`);
  }
  return rows.join("\n");
}

function sweepCsv(): string {
  const rows = ["frequency (Hz),level (dB)"];
  for (let i = 0; i <= 40; i++) {
    const f = 10 * 10 ** (i / 10);
    const level = 26 - 10 * Math.log10(1 + (7 / f) ** 2) - 10 * Math.log10(1 + (f / 95_000) ** 2);
    rows.push(`${f.toPrecision(5)},${level.toFixed(3)}`);
  }
  return rows.join("\n");
}

interface Made {
  kind: "sine" | "square" | "sweep";
  fileName: string;
  contentType: string;
  bytes: Buffer;
  conditions: CaptureConditionsInput;
}

function files(): Made[] {
  // Analyser full scale 2 V rms behind a 20:1 divider is 56.6 V peak at the output; 60 W into 8 Ω is 31 V peak.
  const peak = Math.sqrt(2 * 60 * 8) / (2 * Math.SQRT2 * 20);
  return [
    {
      kind: "sine",
      fileName: "ca-460-1khz-60w-8ohm.wav",
      contentType: "audio/wav",
      bytes: wav24(
        [
          tone(peak, [0.00005, 0.00011, 0.00002, 0.000015, 0, 0.000005], 11),
          tone(peak, [0.00006, 0.00013, 0.00002, 0.00002, 0, 0.000006], 12),
        ],
        FS,
      ),
      conditions: {
        kind: "sine",
        scale: { kind: "analyser", fullScaleVolts: 2, basis: "rms", attenuation: 20 },
        loadOhm: 8,
        fundamentalHz: 1000,
        bandwidth: { lowHz: 20, highHz: 20_000 },
        channelsDriven: "both",
        mainsV: 230,
        warmUpS: 1800,
      },
    },
    {
      kind: "square",
      fileName: "ca-460-square-10khz.csv",
      contentType: "text/csv",
      bytes: Buffer.from(squareCsv()),
      conditions: { kind: "square", channel: "left", loadOhm: 8, frequencyHz: 10_000 },
    },
    {
      kind: "sweep",
      fileName: "ca-460-sweep-1w.csv",
      contentType: "text/csv",
      bytes: Buffer.from(sweepCsv()),
      conditions: { kind: "sweep", reference: "flat", channel: "left", loadOhm: 8 },
    },
  ];
}

const KEEP_FROM_SINE = new Set<Reading["quantity"]>(["thd", "thd_n"]);

export async function seedDemoCaptures(): Promise<{ created: boolean }> {
  const listing = await Listing.scope("withSerial").findOne({ where: { serialNumber: TARGET_SERIAL } });
  const row = listing ? await BenchSheet.findOne({ where: { listingId: listing.id } }) : null;
  if (!listing || !row || hasCaptures(row.sheet)) return { created: false };

  const made = files().map((f) => ({ ...f, key: randomKey("captures", f.kind === "sine" ? "wav" : "csv") }));
  for (const f of made) await putObject(f.key, f.bytes, { contentType: f.contentType, contentLength: f.bytes.length });
  try {
    const created = await sequelize.transaction(async (t) => {
      await sequelize.query(`SELECT pg_advisory_xact_lock(hashtext('loadline-demo-captures'))`, { transaction: t });
      const fresh = await BenchSheet.findOne({ where: { listingId: listing.id }, transaction: t, lock: t.LOCK.UPDATE });
      if (!fresh || hasCaptures(fresh.sheet)) return false;
      if (!fresh.sheet) throw new Error(`the demo bench sheet of ${TARGET_SERIAL} does not read`);
      const sheet = { ...fresh.sheet };
      const added: Reading[] = [];
      for (const f of made) {
        const conditions = captureConditionsSchema.parse(f.conditions);
        const id = randomUUID();
        const result = analyseCapture(new Uint8Array(f.bytes), f.fileName, conditions, id);
        const now = new Date();
        await Capture.create(
          {
            id,
            ownerId: listing.sellerId,
            kind: f.kind,
            status: "done",
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
          },
          { transaction: t },
        );
        if (result.kind === "sine") added.push(...result.readings.filter((r) => KEEP_FROM_SINE.has(r.quantity)));
        if (result.kind === "square") added.push(...result.readings);
        if (result.kind === "sweep") sheet.sweeps = [...(sheet.sweeps ?? []), result.sweep];
      }
      // The captures replace the typed distortion figures they measured again.
      sheet.readings = [...sheet.readings.filter((r) => !(r.basis === "measured" && KEEP_FROM_SINE.has(r.quantity))), ...added];
      const verdict = checkBenchSheet(sheet);
      // The demo unit must stay as good as it was; anything else is a bug in the synthesised files.
      if (!verdict.benchVerified) throw new Error(`demo captures would cost ${TARGET_SERIAL} its mark: ${verdict.summary}`);
      await fresh.update({ sheet, verdict, checkedAt: new Date() }, { transaction: t });
      await listing.update({ benchVerified: true, ...listingFacets(sheet) }, { transaction: t });
      return true;
    });
    if (!created) await deleteObjects(made.map((f) => f.key));
    return { created };
  } catch (error) {
    await deleteObjects(made.map((f) => f.key)).catch(() => undefined);
    throw error;
  }
}

function hasCaptures(sheet: Sheet | null): boolean {
  return !!sheet && [...sheet.readings, ...sheet.sweeps].some((r) => r.origin === "capture");
}
