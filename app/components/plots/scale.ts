// Scales, ticks and paths for the plots: pure, so the same numbers come out on the server and in the
// browser (the SVG is drawn on the server; hydration must find identical markup) and in tests.

/** Where a value sits along an axis, 0 at the start of the domain and 1 at its end. */
export type Scale = (value: number) => number;

export function linearScale([lo, hi]: readonly [number, number]): Scale {
  const span = hi - lo || 1;
  return (v) => (v - lo) / span;
}

/** Frequency axes are logarithmic: an octave is the same width anywhere along them. */
export function logScale([lo, hi]: readonly [number, number]): Scale {
  const l0 = Math.log10(lo);
  const span = Math.log10(hi) - l0 || 1;
  return (v) => (Math.log10(v) - l0) / span;
}

export interface Tick {
  value: number;
  label: string;
  /** Left unlabelled where the plot is phone-narrow, so labels never collide. */
  minor?: boolean;
}

const STEPS_125 = [1, 2, 5];

/** The 1-2-5 value at or below `x` (at or above with `up`): the steps the trade's graph paper uses. */
export function round125(x: number, up = false): number {
  const p = 10 ** Math.floor(Math.log10(x) + 1e-9);
  const candidates = [...STEPS_125, 10].map((m) => m * p);
  if (up) return candidates.find((c) => c >= x * (1 - 1e-9)) ?? 10 * p;
  return [...candidates].reverse().find((c) => c <= x * (1 + 1e-9)) ?? p;
}

/** A frequency range that holds the points, widened to 1-2-5 values (20 Hz–20 kHz stays as it is). */
export function hzDomain(frequencies: number[]): [number, number] {
  const f = frequencies.filter((x) => Number.isFinite(x) && x > 0);
  if (f.length === 0) return [20, 20_000];
  const lo = round125(Math.min(...f));
  const hi = round125(Math.max(...f), true);
  return hi > lo ? [lo, hi] : [lo, lo * 10];
}

/** "20", "500", "1k", "20k", "1M": tick labels on a frequency axis whose title carries the unit. */
export function hzTick(f: number): string {
  if (f >= 1e6) return `${trim(f / 1e6)}M`;
  if (f >= 1000) return `${trim(f / 1000)}k`;
  return trim(f);
}

/** "1 kHz", "500 Hz": frequencies in prose. */
export function hzWords(f: number): string {
  if (f >= 1e6) return `${trim(f / 1e6)} MHz`;
  if (f >= 1000) return `${trim(f / 1000)} kHz`;
  return `${trim(f)} Hz`;
}

/** "+0.20 dB", "−3.00 dB" (a true minus sign), "0.00 dB". */
export function dbWords(db: number, digits = 2): string {
  const s = Math.abs(db).toFixed(digits);
  if (Number(s) === 0) return `${s} dB`;
  return `${db > 0 ? "+" : "−"}${s} dB`;
}

function trim(x: number): string {
  return String(Number(x.toPrecision(3)));
}

/**
 * Ticks on a log-frequency axis: every 1, 2 and 5 × 10ⁿ inside the domain, the decades labelled always
 * and the 2s and 5s marked minor. The domain's own ends are ticks as well (20 Hz and 20 kHz are where
 * the audio band starts and stops).
 */
export function logTicks([lo, hi]: readonly [number, number]): Tick[] {
  const out: Tick[] = [];
  for (let p = Math.floor(Math.log10(lo)); 10 ** p <= hi * (1 + 1e-9); p++) {
    for (const m of STEPS_125) {
      const v = m * 10 ** p;
      if (v < lo * (1 - 1e-9) || v > hi * (1 + 1e-9)) continue;
      const end = Math.abs(v - lo) < lo * 1e-9 || Math.abs(v - hi) < hi * 1e-9;
      out.push({ value: v, label: hzTick(v), ...(m === 1 || end ? {} : { minor: true }) });
    }
  }
  // A decade label too near an end's label ("100k" beside "200k") would overprint it on a phone.
  const at = logScale([lo, hi]);
  for (const t of out) {
    if (t.minor || t.value === lo || t.value === hi) continue;
    if (at(t.value) < END_LABEL_ROOM || 1 - at(t.value) < END_LABEL_ROOM) t.minor = true;
  }
  return out;
}

/** The share of a log axis that two labels need between their centres on a phone-narrow plot. */
const END_LABEL_ROOM = 0.09;

/** The faint lines between ticks on a log axis: 2…9 × 10ⁿ, the graph paper of a response plot. */
export function logGrid([lo, hi]: readonly [number, number]): number[] {
  const out: number[] = [];
  for (let p = Math.floor(Math.log10(lo)); 10 ** p <= hi; p++) {
    for (let m = 1; m <= 9; m++) {
      const v = m * 10 ** p;
      if (v >= lo * (1 - 1e-9) && v <= hi * (1 + 1e-9)) out.push(v);
    }
  }
  return out;
}

/** A 1-2-5 step that cuts `span` into at most `maxTicks - 1` parts. */
export function niceStep(span: number, maxTicks = 7): number {
  const raw = span / Math.max(1, maxTicks - 1);
  return round125(raw, true);
}

/** Every `step` from lo to hi, on whole multiples of it. */
export function linearTicks([lo, hi]: readonly [number, number], step: number, format: (v: number) => string = plain): Tick[] {
  const out: Tick[] = [];
  const first = Math.ceil(lo / step - 1e-9);
  for (let i = first; i * step <= hi + step * 1e-9; i++) {
    const v = Number((i * step).toPrecision(12));
    out.push({ value: v, label: format(v) });
  }
  return out;
}

/** "−3", "0", "0.5": the minus sign typeset. */
export function plain(v: number): string {
  return String(Number(v.toPrecision(6))).replace(/^-/, "−");
}

/** A linear range that holds the values with some air, on whole steps, at least `minSpan` wide. */
export function niceDomain(values: number[], minSpan: number, maxTicks = 7): { domain: [number, number]; step: number } {
  const finite = values.filter(Number.isFinite);
  const min = finite.length ? Math.min(...finite) : -minSpan / 2;
  const max = finite.length ? Math.max(...finite) : minSpan / 2;
  const mid = (min + max) / 2;
  // A flat trace still gets an axis: some span around its value.
  const span = Math.max(max - min, minSpan, Math.abs(mid) * 0.1, 1e-9) || 1;
  const step = niceStep(span * 1.1, maxTicks);
  // A trace that reaches a whole step does not run along the frame: a little air each side.
  const air = span * 0.02;
  const lo = Math.floor(Math.min(min - air, mid - span / 2) / step) * step;
  const hi = Math.ceil(Math.max(max + air, mid + span / 2) / step) * step;
  return { domain: [Number(lo.toPrecision(12)), Number(hi.toPrecision(12))], step };
}

/** Plot coordinates: x and y run 0…1000 in the drawing, y downwards. */
export const SIZE = 1000;

const coord = (x: number) => String(Math.round(x * SIZE * 10) / 10);

/**
 * One SVG path through the points, in plot coordinates. A point that cannot be placed (a missing level,
 * a frequency of 0 on a log axis) breaks the line rather than joining across the gap.
 */
export function linePath(points: readonly { x: number; y: number }[], sx: Scale, sy: Scale): string {
  const parts: string[] = [];
  let pen = false;
  for (const p of points) {
    const x = sx(p.x);
    const y = 1 - sy(p.y);
    if (!Number.isFinite(x) || !Number.isFinite(y)) {
      pen = false;
      continue;
    }
    parts.push(`${pen ? "L" : "M"}${coord(x)} ${coord(y)}`);
    pen = true;
  }
  return parts.join("");
}

/** Grid lines across the plot at the given fractions, as one path (one DOM node for all of them). */
export function gridPath(vertical: readonly number[], horizontal: readonly number[]): string {
  return [
    ...vertical.filter((f) => f >= 0 && f <= 1).map((f) => `M${coord(f)} 0V${SIZE}`),
    ...horizontal.filter((f) => f >= 0 && f <= 1).map((f) => `M0 ${coord(1 - f)}H${SIZE}`),
  ].join("");
}

/** Level at `hz` by straight lines between points in log frequency; undefined outside the sweep. */
export function levelAtHz(points: readonly { hz: number; db: number }[], hz: number): number | undefined {
  for (let i = 0; i < points.length; i++) {
    const a = points[i];
    if (Math.abs(a.hz - hz) <= hz * 1e-9) return a.db;
    const b = points[i + 1];
    if (!b) break;
    if (a.hz < hz && hz < b.hz) {
      const t = (Math.log(hz) - Math.log(a.hz)) / (Math.log(b.hz) - Math.log(a.hz));
      return a.db + t * (b.db - a.db);
    }
  }
  return undefined;
}
