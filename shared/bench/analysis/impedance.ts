// A loudspeaker's impedance sweep (frequency, modulus in ohms, optionally phase in degrees): the
// minimum within the rated frequency range and where it falls, the first (bass) resonance, and the
// minimum held against 80 % of the rated impedance (IEC 60268-5:2003 §16.1, rated impedance).
import { CaptureError } from "./errors";
import { fig, type Figure } from "./types";

/** IEC 60268-5 §16.1: the modulus within the rated frequency range stays at or above 80 % of the rating. */
export const IMPEDANCE_RATED_FLOOR = 0.8;
/**
 * A local maximum counts as a resonance when it stands this many times above the lowest point between
 * it and the next higher point (or the end of the sweep). Our threshold: a driver's resonance stands
 * 2–8× above its voice-coil resistance, a sweep's ripple a few per cent.
 */
export const RESONANCE_PROMINENCE = 1.25;
const MAX_POINTS = 2000;

export interface ImpedanceConditions {
  /** The rated (nominal) impedance, for the 80 % check. */
  ratedOhm?: number;
  /** The rated frequency range, within which the minimum is sought (default 20 Hz–20 kHz, cut to the sweep). */
  band?: { lowHz: number; highHz: number };
}

export interface ImpedancePoint {
  frequency: number;
  ohms: number;
  phaseDeg?: number;
}

export interface ImpedanceAnalysis {
  kind: "impedance";
  minimum: { ohms: Figure<"Ω">; frequency: Figure<"Hz"> };
  maximum: { ohms: Figure<"Ω">; frequency: Figure<"Hz"> };
  /** The first impedance peak from the low end; null when the sweep shows none. */
  resonance: {
    frequency: Figure<"Hz">;
    peak: Figure<"Ω">;
    method: "phase zero crossing" | "peak of the modulus";
  } | null;
  /** The minimum against 80 % of the rated impedance, when a rating was given. */
  rated: { rated: Figure<"Ω">; floor: Figure<"Ω">; meets: boolean } | null;
  points: ImpedancePoint[];
  conditions: {
    band: { lowHz: number; highHz: number };
    sweepRange: { lowHz: number; highHz: number };
    pointsInBand: number;
    hasPhase: boolean;
    ratedOhm: number | null;
    floorFraction: number;
    interpolation: "parabolic in log frequency at the extremes; linear in log frequency at the phase crossing";
  };
}

/** Vertex of the parabola through three points (x in log frequency); null when they are not curved. */
function vertex(x: number[], y: number[]): { x: number; y: number } | null {
  const [x0, x1, x2] = x;
  const [y0, y1, y2] = y;
  const d = (x0 - x1) * (x0 - x2) * (x1 - x2);
  const a = (x2 * (y1 - y0) + x1 * (y0 - y2) + x0 * (y2 - y1)) / d;
  const b = (x2 * x2 * (y0 - y1) + x1 * x1 * (y2 - y0) + x0 * x0 * (y1 - y2)) / d;
  if (!(Math.abs(a) > 0) || !Number.isFinite(a)) return null;
  const xv = -b / (2 * a);
  if (!(xv >= x0 && xv <= x2)) return null;
  const c = y1 - a * x1 * x1 - b * x1;
  return { x: xv, y: a * xv * xv + b * xv + c };
}

/** An extreme at sample i, refined between its neighbours. */
function refine(lf: Float64Array, z: Float64Array, i: number, lo: number, hi: number): { f: number; z: number } {
  if (i > lo && i < hi) {
    const v = vertex([lf[i - 1], lf[i], lf[i + 1]], [z[i - 1], z[i], z[i + 1]]);
    if (v) return { f: Math.exp(v.x), z: v.y };
  }
  return { f: Math.exp(lf[i]), z: z[i] };
}

/** The first peak from the low end that stands clear of the dip after it. */
function firstResonance(z: Float64Array): number | null {
  for (let i = 1; i < z.length - 1; i++) {
    if (!(z[i] >= z[i - 1] && z[i] > z[i + 1])) continue;
    let saddle = z[i];
    for (let k = i + 1; k < z.length && z[k] <= z[i]; k++) saddle = Math.min(saddle, z[k]);
    if (z[i] >= RESONANCE_PROMINENCE * saddle) return i;
  }
  return null;
}

/** Where the phase falls through zero near the peak at i (inductive below resonance, capacitive above). */
function phaseCrossing(lf: Float64Array, phase: Float64Array, z: Float64Array, i: number): number | null {
  // Search the peak's upper half: the points either side of it above half its height over its dip.
  let a = i;
  let b = i;
  const half = z[i] / Math.SQRT2;
  while (a > 0 && z[a - 1] >= half) a--;
  while (b < z.length - 1 && z[b + 1] >= half) b++;
  let best: number | null = null;
  for (let k = Math.max(a - 1, 0); k < Math.min(b + 1, z.length - 1); k++) {
    if (phase[k] >= 0 && phase[k + 1] < 0) {
      const u = phase[k] / (phase[k] - phase[k + 1]);
      const at = lf[k] + u * (lf[k + 1] - lf[k]);
      if (best === null || Math.abs(at - lf[i]) < Math.abs(best - lf[i])) best = at;
    }
  }
  return best === null ? null : Math.exp(best);
}

/** At most MAX_POINTS indices, evenly spread, first and last kept. */
function thinIndices(n: number): number[] {
  if (n <= MAX_POINTS) return Array.from({ length: n }, (_, i) => i);
  const step = (n - 1) / (MAX_POINTS - 1);
  return Array.from({ length: MAX_POINTS }, (_, i) => Math.round(i * step));
}

export function analyseImpedance(
  frequency: Float64Array,
  ohms: Float64Array,
  phaseDeg: Float64Array | null,
  c: ImpedanceConditions = {},
): ImpedanceAnalysis {
  // Sweeps run either way; sort by frequency (an analyser's rising sweep needs no sort).
  let rising = true;
  for (let i = 1; i < frequency.length && rising; i++) rising = frequency[i] >= frequency[i - 1];
  const order = rising ? null : Array.from(frequency.keys()).sort((a, b) => frequency[a] - frequency[b]);
  const sorted = (x: Float64Array) => (order ? Float64Array.from(order, (i) => x[i]) : x.slice());
  const f = sorted(frequency);
  const z = sorted(ohms);
  const ph = phaseDeg ? sorted(phaseDeg) : null;
  for (let i = 0; i < f.length; i++) {
    if (!(f[i] > 0)) throw new CaptureError("sweep_invalid", `Frequencies must be above 0 Hz; found ${f[i]} Hz.`);
    if (i > 0 && f[i] === f[i - 1]) throw new CaptureError("sweep_invalid", `The frequency ${f[i]} Hz appears twice in the sweep.`);
    if (!(z[i] > 0)) throw new CaptureError("sweep_invalid", `Impedance must be above 0 Ω; found ${z[i]} Ω at ${f[i]} Hz.`);
    if (ph && !(Math.abs(ph[i]) <= 180))
      throw new CaptureError("sweep_invalid", `Phase must lie within ±180°; found ${ph[i]}° at ${f[i]} Hz.`);
  }
  const lf = f.map(Math.log);
  const lo = f[0];
  const hi = f[f.length - 1];
  const band = { lowHz: Math.max(c.band?.lowHz ?? 20, lo), highHz: Math.min(c.band?.highHz ?? 20_000, hi) };
  const first = f.findIndex((x) => x >= band.lowHz);
  const last = f.findLastIndex((x) => x <= band.highHz);
  if (first < 0 || last < first) {
    throw new CaptureError(
      "sweep_invalid",
      `The sweep runs from ${lo} Hz to ${hi} Hz and has no point within the rated range ${band.lowHz}–${band.highHz} Hz.`,
    );
  }

  let iMin = first;
  let iMax = first;
  for (let i = first; i <= last; i++) {
    if (z[i] < z[iMin]) iMin = i;
    if (z[i] > z[iMax]) iMax = i;
  }
  // Refined only between in-band neighbours: the minimum is the rated range's, not the sweep's.
  const min = refine(lf, z, iMin, first, last);
  const max = refine(lf, z, iMax, first, last);

  const r = firstResonance(z);
  let resonance: ImpedanceAnalysis["resonance"] = null;
  if (r !== null) {
    const peak = refine(lf, z, r, 0, z.length - 1);
    const crossing = ph ? phaseCrossing(lf, ph, z, r) : null;
    resonance = {
      frequency: fig(crossing ?? peak.f, "Hz"),
      peak: fig(peak.z, "Ω"),
      method: crossing !== null ? "phase zero crossing" : "peak of the modulus",
    };
  }

  const floor = c.ratedOhm !== undefined ? c.ratedOhm * IMPEDANCE_RATED_FLOOR : null;
  return {
    kind: "impedance",
    minimum: { ohms: fig(min.z, "Ω"), frequency: fig(min.f, "Hz") },
    maximum: { ohms: fig(max.z, "Ω"), frequency: fig(max.f, "Hz") },
    resonance,
    rated:
      c.ratedOhm !== undefined && floor !== null
        ? { rated: fig(c.ratedOhm, "Ω"), floor: fig(floor, "Ω"), meets: min.z >= floor - 1e-9 }
        : null,
    points: thinIndices(f.length).map((i) => (ph ? { frequency: f[i], ohms: z[i], phaseDeg: ph[i] } : { frequency: f[i], ohms: z[i] })),
    conditions: {
      band,
      sweepRange: { lowHz: lo, highHz: hi },
      pointsInBand: last - first + 1,
      hasPhase: ph !== null,
      ratedOhm: c.ratedOhm ?? null,
      floorFraction: IMPEDANCE_RATED_FLOOR,
      interpolation: "parabolic in log frequency at the extremes; linear in log frequency at the phase crossing",
    },
  };
}
