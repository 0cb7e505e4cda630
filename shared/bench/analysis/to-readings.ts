// Capture analyses as bench-sheet readings (origin "capture"), so the checks can weigh them above typed figures.
import { CHANNELS, type Conditions, type Reading, type Sweep } from "../schema";
import { isOneOf } from "../../one-of";
import type { SineAnalysis } from "./sine";
import type { SquareAnalysis } from "./square";
import type { SweepAnalysis } from "./sweep";
import type { SineCaptureConditions, SquareCaptureConditions, SweepCaptureConditions, WowFlutterCaptureConditions } from "./conditions";
import type { WowFlutterAnalysis } from "./wow-flutter";

type Channel = NonNullable<Reading["channel"]>;
const MAX_SWEEP_POINTS = 4000;

/** Drop undefined keys: the sheet schema is strict about what it is given. */
function clean<T extends object>(o: T): T {
  return Object.fromEntries(Object.entries(o).filter(([, v]) => v !== undefined)) as T;
}

function reading(captureId: string, r: Omit<Reading, "basis" | "origin" | "captureId">): Reading {
  return { ...r, conditions: clean(r.conditions ?? {}), basis: "measured", origin: "capture", captureId };
}

/** A display unit for small voltages, so 23 µV does not read as 0.000023 V. */
function voltUnit(v: number): string {
  return v < 1e-3 ? "µV" : v < 1 ? "mV" : "V";
}

export function sineToReadings(a: SineAnalysis, c: SineCaptureConditions, captureId: string): Reading[] {
  const out: Reading[] = [];
  const load = c.loadOhm;
  const bw = a.conditions.bandwidth;
  const weighting = c.weighting === "A" ? "A" : "unweighted";
  for (const ch of a.channels) {
    const channel: Channel = ch.channel === "mono" || !isOneOf(CHANNELS, ch.channel) ? (c.channel ?? "mono") : ch.channel;
    const f = Math.round(ch.fundamental.frequency.value * 100) / 100;
    const vrms = ch.fundamental.rms.value;
    const watts = ch.fundamental.power?.value;
    const common = { loadOhm: load, frequencyHz: f, channelsDriven: c.channelsDriven, mainsV: c.mainsV, warmUpS: c.warmUpS };
    const level = watts !== undefined ? { powerW: watts } : { voltageV: vrms };
    const thdN = ch.thdN.ratio;
    out.push(reading(captureId, { quantity: "output_voltage", value: vrms, unit: "V", channel, conditions: common }));
    if (watts !== undefined) {
      const atDistortion = thdN > 0 && thdN <= 1 ? { ratio: thdN, measure: "thd_n" as const } : undefined;
      out.push(reading(captureId, { quantity: "output_power", value: watts, unit: "W", channel, conditions: { ...common, atDistortion } }));
    }
    out.push(
      reading(captureId, {
        quantity: "thd",
        value: ch.thd.ratio,
        unit: "%",
        channel,
        conditions: { ...common, ...level, bandwidth: bw },
        note: `harmonics 2–${a.conditions.harmonicsUpTo} within ${bw.lowHz}–${bw.highHz} Hz, relative to the fundamental`,
      }),
    );
    out.push(
      reading(captureId, {
        quantity: "thd_n",
        value: thdN,
        unit: "%",
        channel,
        conditions: { ...common, ...level, bandwidth: bw, weighting },
      }),
    );
    const noiseNote = `noise beside a ${vrms.toPrecision(3)} V test tone, harmonics excluded`;
    out.push(
      reading(captureId, {
        quantity: "noise",
        value: ch.noise.rms.value,
        unit: voltUnit(ch.noise.rms.value),
        channel,
        conditions: { loadOhm: load, bandwidth: bw, weighting },
        note: noiseNote,
      }),
    );
    out.push(
      reading(captureId, {
        quantity: "snr",
        value: ch.snr.value,
        unit: "dB",
        channel,
        conditions: { ...common, ...level, bandwidth: bw, weighting },
        note: `relative to the test tone; ${noiseNote}`,
      }),
    );
  }
  return out;
}

export function squareToReadings(a: SquareAnalysis, c: SquareCaptureConditions, captureId: string): Reading[] {
  const conditions: Conditions = { loadOhm: c.loadOhm, frequencyHz: c.frequencyHz };
  const bwKHz = a.impliedBandwidth.value / 1000;
  return [
    reading(captureId, {
      quantity: "rise_time",
      value: a.riseTime.value,
      unit: a.riseTime.value < 1e-6 ? "ns" : "µs",
      channel: c.channel,
      conditions,
      note:
        `10–90 %, median of ${a.risingEdges} rising edge${a.risingEdges === 1 ? "" : "s"}; overshoot ${a.overshoot.value.toFixed(1)} %; ` +
        `implies about ${bwKHz.toPrecision(3)} kHz single-pole bandwidth` +
        (a.resolutionLimited ? "; the edge spans fewer than 4 samples, so the true rise may be faster" : ""),
    }),
  ];
}

/** Keep at most MAX_SWEEP_POINTS, evenly spread, first and last kept. */
function thin<T>(points: T[]): T[] {
  if (points.length <= MAX_SWEEP_POINTS) return points;
  const step = (points.length - 1) / (MAX_SWEEP_POINTS - 1);
  return Array.from({ length: MAX_SWEEP_POINTS }, (_, i) => points[Math.round(i * step)]);
}

export function sweepToSheet(a: SweepAnalysis, c: SweepCaptureConditions, captureId: string): { sweep: Sweep; readings: Reading[] } {
  const riaa = a.conditions.reference === "riaa";
  const range = a.conditions.sweepRange;
  const sweep: Sweep = {
    kind: riaa ? "riaa" : "flat",
    ...(riaa ? { variant: c.iecPole ? "riaa_iec" : "riaa" } : {}),
    ...(c.channel ? { channel: c.channel } : {}),
    origin: "capture",
    captureId,
    conditions: clean({ loadOhm: c.loadOhm, frequencyRange: { lowHz: range.lowHz, highHz: range.highHz } }),
    points: thin(a.points.map((p) => ({ frequencyHz: p.frequency, levelDb: p.levelDb }))),
  };
  const band = a.conditions.band;
  const readings: Reading[] = [
    reading(captureId, {
      quantity: riaa ? "riaa_deviation" : "response_deviation",
      value: Math.abs(a.worstDeviation.deviation.value),
      unit: "dB",
      channel: c.channel,
      conditions: { loadOhm: c.loadOhm, frequencyRange: { lowHz: band.lowHz, highHz: band.highHz } },
      note: `worst ${a.worstDeviation.deviation.value >= 0 ? "+" : ""}${a.worstDeviation.deviation.value.toFixed(2)} dB at ${a.worstDeviation.frequency.value} Hz, re 1 kHz`,
    }),
  ];
  if (a.minus3dB.low)
    readings.push(
      reading(captureId, {
        quantity: "f3db_low",
        value: a.minus3dB.low.value,
        unit: "Hz",
        channel: c.channel,
        conditions: { loadOhm: c.loadOhm },
      }),
    );
  if (a.minus3dB.high)
    readings.push(
      reading(captureId, {
        quantity: "f3db_high",
        value: a.minus3dB.high.value,
        unit: "Hz",
        channel: c.channel,
        conditions: { loadOhm: c.loadOhm },
      }),
    );
  return { sweep, readings };
}

/** Percent to a thousandth, for notes ("0.050 %"). */
const pct2 = (ratio: number) => `${(ratio * 100).toFixed(3)} %`;

/**
 * A wow & flutter capture gives the speed error and one wow & flutter figure in the stated convention:
 * the two-sigma weighted peak (IEC 60386 / AES6-2008, 3150 Hz) or the weighted rms (WRMS, 3000 Hz).
 */
export function wowFlutterToReadings(a: WowFlutterAnalysis, c: WowFlutterCaptureConditions, captureId: string): Reading[] {
  const wrms = a.conditions.convention === "WRMS";
  const conditions: Conditions = { testToneHz: c.testToneHz, speedRpm: c.speedRpm, tapeSpeedCmS: c.tapeSpeedCmS };
  const over = `over ${a.conditions.analysedS.toFixed(1)} s`;
  return [
    reading(captureId, {
      quantity: "speed_error",
      value: a.speedError.value,
      unit: "%",
      conditions,
      note: `mean tone ${a.meanFrequency.value.toFixed(2)} Hz against ${c.testToneHz} Hz, ${over}; drift ${pct2(a.drift.value)} (largest minus smallest 1 s average)`,
    }),
    reading(captureId, {
      quantity: "wow_flutter",
      value: wrms ? a.weightedRms.value : a.weightedPeak.value,
      unit: "%",
      conditions: { ...conditions, weighting: wrms ? "WRMS" : "IEC-60386-peak" },
      note: wrms
        ? `weighted rms ${over}; two-sigma weighted peak ${pct2(a.weightedPeak.value)}; unweighted ${pct2(a.unweightedPeak.value)}`
        : `two-sigma weighted peak (AES6-2008) ${over}; WRMS ${pct2(a.weightedRms.value)}; unweighted ${pct2(a.unweightedPeak.value)}`,
    }),
  ];
}
