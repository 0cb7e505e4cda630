// Channel separation from a stereo capture with one side driven: at each driven tone (a single tone, a
// multi-tone or a stepped capture), the undriven side's level relative to the driven side's, in dB.
// Harmonics of a driven tone are left out: the leak is read where the driven side holds a test tone.
import { CaptureError } from "./errors";
import { powerSpectrum, type PowerSpectrum } from "./spectrum";
import { middleStretch, noisePerZone, strongestTone, zoneAt, zonePower } from "./tones";
import { dBPower, fig, peakVoltsPerFullScale, type CaptureScale, type Figure } from "./types";

export const MAX_SEPARATION_TONES = 24;
/** Tones more than this far below the strongest are taken for distortion or hum, not test tones. */
const TONE_RANGE_DB = 40;

export interface SeparationConditions {
  /** The driven side; by default the louder one. */
  driven?: "left" | "right";
  /** The test tones; by default every harmonic-free tone the driven side holds. */
  frequenciesHz?: number[];
  scale?: CaptureScale;
  loadOhms?: number;
}

export interface SeparationPoint {
  frequency: Figure<"Hz">;
  /** Driven side over undriven side, dB (positive: the larger, the better). */
  separation: Figure<"dB">;
  /** The undriven side held only noise there: the separation is at least this. */
  belowNoise: boolean;
  drivenRms: Figure<"V"> | null;
}

export interface SeparationAnalysis {
  kind: "separation";
  driven: "left" | "right";
  undriven: "left" | "right";
  points: SeparationPoint[];
  conditions: { sampleRate: number; secondsAnalysed: number; fftSize: number; loadOhms: number | null; definition: string };
}

export const SEPARATION_DEFINITION =
  "separation = 20·log10(U_driven(f) / U_undriven(f)) at each test tone, both measured in the same window (IEC 60268-3 crosstalk attenuation)";

/** Local maxima of the driven side within TONE_RANGE_DB of its strongest tone and 30 dB above the noise. */
function findTones(spec: PowerSpectrum, nyquist: number): number[] {
  const top = strongestTone(spec, 10, nyquist * 0.95);
  if (!top) return [];
  const noise = noisePerZone(spec, 10, nyquist * 0.95);
  const h = spec.toneHalfWidthBins;
  const p = spec.power;
  const binFloor = Math.max(top.power * 10 ** (-TONE_RANGE_DB / 10), noise * 1000) / (2 * h + 1);
  const found: { hz: number; power: number }[] = [];
  const kLo = Math.max(h + 1, Math.ceil(10 / spec.binHz));
  const kHi = Math.min(p.length - 1 - h, Math.floor((nyquist * 0.95) / spec.binHz));
  for (let k = kLo; k <= kHi; k++) {
    if (p[k] < binFloor) continue;
    let isMax = true;
    for (let j = k - h; j <= k + h && isMax; j++) if (p[j] > p[k]) isMax = false;
    if (!isMax) continue;
    const t = strongestTone(spec, (k - 1) * spec.binHz, (k + 1) * spec.binHz);
    if (t && t.power >= top.power * 10 ** (-TONE_RANGE_DB / 10)) found.push(t);
    k += h;
  }
  // Strongest first, so a harmonic is dropped in favour of the tone it belongs to. A tone at a multiple
  // of another but within 20 dB of it is a test tone of its own (100 Hz, 1 kHz, 10 kHz steps).
  found.sort((a, b) => b.power - a.power);
  const tones: { hz: number; power: number }[] = [];
  const tol = 2 * h * spec.binHz;
  for (const t of found) {
    const harmonic = tones.some(
      (f) => f.hz < t.hz && t.power < f.power / 100 && Math.abs(t.hz - Math.round(t.hz / f.hz) * f.hz) <= tol * Math.round(t.hz / f.hz),
    );
    if (!harmonic) tones.push(t);
    if (tones.length >= MAX_SEPARATION_TONES) break;
  }
  return tones.map((t) => t.hz).sort((a, b) => a - b);
}

export function analyseSeparation(channels: Float64Array[], sampleRate: number, c: SeparationConditions): SeparationAnalysis {
  if (channels.length !== 2) {
    throw new CaptureError(
      "kind_mismatch",
      `Channel separation needs a stereo capture (one side driven, the other loaded and silent); this file has ${channels.length} channel${channels.length === 1 ? "" : "s"}.`,
    );
  }
  const nyquist = sampleRate / 2;
  const [left, right] = channels.map((x) => powerSpectrum(middleStretch(x), sampleRate, "blackman-harris-7"));
  const total = (s: PowerSpectrum) => {
    let sum = 0;
    for (let k = 0; k < s.power.length; k++) sum += s.power[k];
    return sum;
  };
  const driven = c.driven ?? (total(left) >= total(right) ? "left" : "right");
  const [d, u] = driven === "left" ? [left, right] : [right, left];
  const undriven = driven === "left" ? "right" : "left";
  if (total(u) === 0) {
    throw new CaptureError(
      "no_fundamental",
      `The ${undriven} channel is digital silence: record the undriven output too, loaded as in use.`,
    );
  }
  const tones = c.frequenciesHz?.length
    ? c.frequenciesHz.map((f) => {
        const t = strongestTone(d, f * 0.95, f * 1.05);
        if (!t) throw new CaptureError("no_fundamental", `No tone found on the ${driven} channel within ±5 % of ${f} Hz.`, { statedHz: f });
        return t.hz;
      })
    : findTones(d, nyquist);
  if (tones.length === 0) throw new CaptureError("no_fundamental", `No test tone found on the ${driven} channel.`);
  const dNoise = noisePerZone(d, 10, nyquist * 0.95);
  const uNoise = noisePerZone(u, 10, nyquist * 0.95);
  const vpfs = c.scale ? peakVoltsPerFullScale(c.scale) : null;
  const points = tones.map((hz): SeparationPoint => {
    const zone = zoneAt(d, hz);
    const pd = zonePower(d, zone);
    if (!(pd > 1000 * dNoise)) {
      throw new CaptureError(
        "no_fundamental",
        `The ${driven} channel's tone at ${hz.toFixed(0)} Hz does not stand 30 dB clear of the noise.`,
        { hz },
      );
    }
    const pu = zonePower(u, zone);
    // Within 10 dB of the undriven side's own noise the leak cannot be told from it.
    const belowNoise = !(pu > 10 * uNoise);
    const leak = belowNoise ? Math.max(pu, uNoise) : pu;
    return {
      frequency: fig(hz, "Hz"),
      separation: fig(dBPower(pd / leak), "dB"),
      belowNoise,
      drivenRms: vpfs === null ? null : fig(Math.sqrt(pd) * vpfs, "V"),
    };
  });
  const n = d.nWindow;
  return {
    kind: "separation",
    driven,
    undriven,
    points,
    conditions: {
      sampleRate,
      secondsAnalysed: n / sampleRate,
      fftSize: d.nFft,
      loadOhms: c.loadOhms ?? null,
      definition: SEPARATION_DEFINITION,
    },
  };
}
