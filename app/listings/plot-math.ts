import { riaaPlaybackDb } from "@shared/bench/curves";
import { bestRiaaFit, levelAt, type Sweep } from "@shared/bench";

// Numbers behind the listing page's plots: pure, so they are tested without a browser.

/**
 * At most `buckets` × 2 points from a long trace: each bucket keeps its lowest and highest sample in
 * time order, so square-wave edges and overshoot survive the thinning (a plain stride would skip them).
 */
export function decimateMinMax(x: ArrayLike<number>, y: ArrayLike<number>, buckets: number): { x: number; y: number }[] {
  const n = Math.min(x.length, y.length);
  if (n <= buckets * 2) return Array.from({ length: n }, (_, i) => ({ x: x[i], y: y[i] }));
  const out: { x: number; y: number }[] = [];
  const size = n / buckets;
  for (let b = 0; b < buckets; b++) {
    const lo = Math.floor(b * size);
    const hi = Math.min(n, Math.floor((b + 1) * size));
    let iMin = lo;
    let iMax = lo;
    for (let i = lo + 1; i < hi; i++) {
      if (y[i] < y[iMin]) iMin = i;
      if (y[i] > y[iMax]) iMax = i;
    }
    const [a, c] = iMin <= iMax ? [iMin, iMax] : [iMax, iMin];
    out.push({ x: x[a], y: y[a] });
    if (c !== a) out.push({ x: x[c], y: y[c] });
  }
  return out;
}

/** Evenly spread subset of at most `max` items, first and last kept. */
export function thinEvenly<T>(items: T[], max: number): T[] {
  if (items.length <= max) return items;
  const step = (items.length - 1) / (max - 1);
  return Array.from({ length: max }, (_, i) => items[Math.round(i * step)]);
}

/** Level at 1 kHz, or at the point nearest 1 kHz in log frequency when the sweep does not span it. */
export function referenceLevel(points: Sweep["points"]): { levelDb: number; atHz: number } {
  const at1k = levelAt(points, 1000);
  if (at1k !== undefined) return { levelDb: at1k, atHz: 1000 };
  const nearest = points.reduce((a, b) => (Math.abs(Math.log(b.frequencyHz / 1000)) < Math.abs(Math.log(a.frequencyHz / 1000)) ? b : a));
  return { levelDb: nearest.levelDb, atHz: nearest.frequencyHz };
}

export interface ResponseSeries {
  points: { f: number; level: number; target?: number; deviation?: number }[];
  referenceHz: number;
  riaa: { variant: "riaa" | "riaa_iec"; worstDb: number; atHz: number } | null;
}

/**
 * A sweep as the page plots it: level re 1 kHz; for an RIAA sweep also the playback curve (IEC 60098,
 * with the 7950 µs pole when that variant fits) and the deviation from it, both re 1 kHz.
 */
export function responseSeries(sweep: Sweep, maxPoints = 400): ResponseSeries {
  const ref = referenceLevel(sweep.points);
  const fit = sweep.kind === "riaa" ? bestRiaaFit(sweep) : undefined;
  const iecPole = fit?.variant === "riaa_iec";
  const points = thinEvenly(sweep.points, maxPoints).map((p) => {
    const level = round3(p.levelDb - ref.levelDb);
    if (sweep.kind !== "riaa") return { f: p.frequencyHz, level };
    const target = round3(riaaPlaybackDb(p.frequencyHz, { iecPole }));
    return { f: p.frequencyHz, level, target, deviation: round3(level - target) };
  });
  return {
    points,
    referenceHz: ref.atHz,
    riaa: fit ? { variant: fit.variant, worstDb: fit.worstDb, atHz: fit.atHz } : null,
  };
}

/** A dB axis range that holds the values with some air, on whole multiples of `step`. */
export function dbDomain(values: number[], step: number, minSpan: number): [number, number] {
  const finite = values.filter(Number.isFinite);
  if (finite.length === 0) return [-minSpan / 2, minSpan / 2];
  let lo = Math.floor((Math.min(...finite) - step * 0.25) / step) * step;
  let hi = Math.ceil((Math.max(...finite) + step * 0.25) / step) * step;
  while (hi - lo < minSpan) {
    lo -= step;
    if (hi - lo < minSpan) hi += step;
  }
  return [lo, hi];
}

function round3(x: number): number {
  return Math.round(x * 1000) / 1000;
}
