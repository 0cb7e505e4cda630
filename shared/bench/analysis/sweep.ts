// Frequency-response sweep: deviation from flat or from the RIAA playback curve, and the −3 dB points.
import { riaaPlaybackDb } from "../curves";
import { CaptureError } from "./errors";
import { fig, type Figure } from "./types";

export interface SweepConditions {
  /** Unit of the level column: dB (any reference) or volts rms. */
  levelUnit?: "dB" | "V";
  /** What the response should follow: flat, or the RIAA playback curve (phono stages). */
  reference?: "flat" | "riaa";
  /** Include the IEC 7950 µs subsonic pole in the RIAA target. */
  iecPole?: boolean;
  /** Band over which the worst deviation is sought (default 20 Hz–20 kHz, cut to the sweep). */
  band?: { lowHz: number; highHz: number };
}

export interface SweepPoint {
  frequency: number;
  /** Level as read, in dB (volts converted to dBV). */
  levelDb: number;
  /** Response re 1 kHz, dB. */
  relativeDb: number;
  /** Target re 1 kHz, dB (0 for flat). */
  targetDb: number;
  deviationDb: number;
}

export interface SweepAnalysis {
  kind: "sweep";
  /** Level at 1 kHz as read (interpolated), in the file's unit. */
  levelAt1kHz: Figure<"dB" | "V">;
  worstDeviation: { deviation: Figure<"dB">; frequency: Figure<"Hz"> };
  /** Largest rise and largest fall against the target within the band. */
  maxDeviation: Figure<"dB">;
  minDeviation: Figure<"dB">;
  /** Where the response (after removing the target) falls 3 dB below its 1 kHz value; null if not within the sweep. */
  minus3dB: { low: Figure<"Hz"> | null; high: Figure<"Hz"> | null };
  points: SweepPoint[];
  conditions: {
    levelUnit: "dB" | "V";
    reference: "flat" | "riaa";
    iecPole: boolean;
    band: { lowHz: number; highHz: number };
    sweepRange: { lowHz: number; highHz: number };
    referenceFrequency: Figure<"Hz">;
    interpolation: "linear in dB against log frequency";
  };
}

/** Linear interpolation in log frequency. */
function interpAt(f: Float64Array, y: Float64Array, at: number): number {
  let i = 0;
  while (i < f.length - 2 && f[i + 1] < at) i++;
  const u = (Math.log(at) - Math.log(f[i])) / (Math.log(f[i + 1]) - Math.log(f[i]));
  return y[i] + u * (y[i + 1] - y[i]);
}

/** Frequency between points a and b (adjacent) where y crosses `level`, in log frequency. */
function crossAt(f: Float64Array, y: number[], a: number, b: number, level: number): number {
  const u = (level - y[a]) / (y[b] - y[a]);
  return Math.exp(Math.log(f[a]) + u * (Math.log(f[b]) - Math.log(f[a])));
}

export function analyseSweep(frequency: Float64Array, level: Float64Array, c: SweepConditions = {}): SweepAnalysis {
  const levelUnit = c.levelUnit ?? "dB";
  const reference = c.reference ?? "flat";
  const iecPole = c.iecPole ?? false;
  // Sweeps run either way; sort by frequency.
  const order = Array.from(frequency.keys()).sort((a, b) => frequency[a] - frequency[b]);
  const f = Float64Array.from(order, (i) => frequency[i]);
  const raw = Float64Array.from(order, (i) => level[i]);
  for (let i = 0; i < f.length; i++) {
    if (!(f[i] > 0)) throw new CaptureError("sweep_invalid", `Frequencies must be above 0 Hz; found ${f[i]} Hz.`);
    if (i > 0 && f[i] === f[i - 1]) throw new CaptureError("sweep_invalid", `The frequency ${f[i]} Hz appears twice in the sweep.`);
    if (levelUnit === "V" && !(raw[i] > 0))
      throw new CaptureError("sweep_invalid", `Levels in volts must be above 0 V; found ${raw[i]} V at ${f[i]} Hz.`);
  }
  const lo = f[0];
  const hi = f[f.length - 1];
  if (!(lo <= 1000 && hi >= 1000)) {
    throw new CaptureError("sweep_invalid", `The sweep runs from ${lo} Hz to ${hi} Hz; it must include 1 kHz, the reference frequency.`);
  }
  const db = levelUnit === "V" ? raw.map((v) => 20 * Math.log10(v)) : raw;
  const ref = interpAt(f, db, 1000);
  const points: SweepPoint[] = Array.from(f, (fi, i) => {
    const relativeDb = db[i] - ref;
    const targetDb = reference === "riaa" ? riaaPlaybackDb(fi, { iecPole }) : 0;
    return { frequency: fi, levelDb: db[i], relativeDb, targetDb, deviationDb: relativeDb - targetDb };
  });

  const band = { lowHz: Math.max(c.band?.lowHz ?? 20, lo), highHz: Math.min(c.band?.highHz ?? 20_000, hi) };
  const inBand = points.filter((p) => p.frequency >= band.lowHz && p.frequency <= band.highHz);
  const judged = inBand.length > 0 ? inBand : points;
  let worst = judged[0];
  let maxD = -Infinity;
  let minD = Infinity;
  for (const p of judged) {
    if (Math.abs(p.deviationDb) > Math.abs(worst.deviationDb)) worst = p;
    maxD = Math.max(maxD, p.deviationDb);
    minD = Math.min(minD, p.deviationDb);
  }

  // Walk outward from 1 kHz until the deviation first reaches −3 dB.
  const dev = points.map((p) => p.deviationDb);
  let k = 0;
  while (k < f.length - 1 && f[k + 1] <= 1000) k++;
  let low: number | null = null;
  for (let i = k; i > 0; i--) {
    if (dev[i - 1] <= -3 && dev[i] > -3) {
      low = crossAt(f, dev, i - 1, i, -3);
      break;
    }
  }
  let high: number | null = null;
  for (let i = k; i < f.length - 1; i++) {
    if (dev[i + 1] <= -3 && dev[i] > -3) {
      high = crossAt(f, dev, i, i + 1, -3);
      break;
    }
  }

  return {
    kind: "sweep",
    levelAt1kHz: levelUnit === "V" ? fig(10 ** (ref / 20), "V") : fig(ref, "dB"),
    worstDeviation: { deviation: fig(worst.deviationDb, "dB"), frequency: fig(worst.frequency, "Hz") },
    maxDeviation: fig(maxD, "dB"),
    minDeviation: fig(minD, "dB"),
    minus3dB: { low: low === null ? null : fig(low, "Hz"), high: high === null ? null : fig(high, "Hz") },
    points,
    conditions: {
      levelUnit,
      reference,
      iecPole,
      band,
      sweepRange: { lowHz: lo, highHz: hi },
      referenceFrequency: fig(1000, "Hz"),
      interpolation: "linear in dB against log frequency",
    },
  };
}
