// Square-wave response from an oscilloscope export: 10–90 % rise time, overshoot, implied bandwidth.
import { CaptureError } from "./errors";
import { fig, type Figure } from "./types";

/** Trade rounding of ln 9 / 2π = 0.3497, the single-pole 10–90 % rise-time × bandwidth product. */
export const RISE_TIME_BANDWIDTH = 0.35;
export const RISE_TIME_BANDWIDTH_EXACT = Math.log(9) / (2 * Math.PI);

export interface SquareAnalysis {
  kind: "square";
  riseTime: Figure<"s">;
  fallTime: Figure<"s"> | null;
  overshoot: Figure<"%">;
  /** 0.35 / rise time: what a single-pole response with this rise time would have as its −3 dB point. */
  impliedBandwidth: Figure<"Hz">;
  lowLevel: Figure<"V">;
  highLevel: Figure<"V">;
  amplitude: Figure<"V">;
  risingEdges: number;
  /** True when the rise spans fewer than 4 sample intervals: the real edge may be faster. */
  resolutionLimited: boolean;
  conditions: {
    samples: number;
    sampleInterval: Figure<"s">;
    thresholds: "10 % and 90 % of the step between the settled low and high levels";
    levels: "histogram modes of the lower and upper halves (IEEE 181 style)";
    bandwidthRelation: "f−3dB = 0.35 / t_rise (single-pole)";
  };
}

/** Mode of the values in [lo, hi]: a 100-bin histogram, narrowed around its peak until the bins are fine. */
function histogramMode(v: Float64Array, lo: number, hi: number): number {
  const bins = 100;
  const counts = new Uint32Array(bins);
  const sums = new Float64Array(bins);
  let mode = (lo + hi) / 2;
  for (let pass = 0; pass < 4; pass++) {
    counts.fill(0);
    sums.fill(0);
    const span = hi - lo || 1;
    for (let i = 0; i < v.length; i++) {
      const x = v[i];
      if (x < lo || x > hi) continue;
      const b = Math.min(bins - 1, Math.floor(((x - lo) / span) * bins));
      counts[b]++;
      sums[b] += x;
    }
    let best = 0;
    for (let b = 1; b < bins; b++) if (counts[b] > counts[best]) best = b;
    if (counts[best] === 0) break;
    mode = sums[best] / counts[best];
    const width = span / bins;
    lo = mode - 2 * width;
    hi = mode + 2 * width;
  }
  return mode;
}

const cross = (t: Float64Array, v: Float64Array, i: number, level: number): number =>
  t[i] + ((level - v[i]) / (v[i + 1] - v[i])) * (t[i + 1] - t[i]);

function median(a: number[]): number {
  const s = [...a].sort((p, q) => p - q);
  const m = s.length >> 1;
  return s.length % 2 ? s[m] : (s[m - 1] + s[m]) / 2;
}

interface Edge {
  duration: number;
  excursion: number;
}

/** Edges in one direction; `sign` = +1 for rising, −1 for falling (the trace is flipped). */
function edges(t: Float64Array, v: Float64Array, low: number, high: number, sign: 1 | -1): Edge[] {
  const amp = high - low;
  const s = (i: number) => (sign === 1 ? v[i] - low : high - v[i]) / amp; // 0 at start level, 1 at end level
  const out: Edge[] = [];
  const n = v.length;
  let i = 0;
  while (i < n - 1) {
    // Next 50 % crossing in this direction.
    while (i < n - 1 && !(s(i) < 0.5 && s(i + 1) >= 0.5)) i++;
    if (i >= n - 1) break;
    const mid = i;
    let a = mid;
    while (a >= 0 && s(a) > 0.1) a--;
    let b = mid + 1;
    while (b < n && s(b) < 0.9) b++;
    if (a >= 0 && b < n && a + 1 < n && b >= 1) {
      const t10 = cross(t, v, a, sign === 1 ? low + 0.1 * amp : high - 0.1 * amp);
      const t90 = cross(t, v, b - 1, sign === 1 ? low + 0.9 * amp : high - 0.9 * amp);
      // Largest excursion past the end level before the trace heads back through 50 %.
      let peak = 1;
      let j = b;
      while (j < n && s(j) >= 0.5) {
        peak = Math.max(peak, s(j));
        j++;
      }
      out.push({ duration: t90 - t10, excursion: peak - 1 });
      i = j;
    } else {
      i = b;
    }
  }
  return out;
}

export function analyseSquare(time: Float64Array, volts: Float64Array): SquareAnalysis {
  const n = time.length;
  for (let i = 1; i < n; i++) {
    if (!(time[i] > time[i - 1])) {
      throw new CaptureError(
        "csv_not_increasing",
        `The time column must rise from row to row; data row ${i + 1} (${time[i]} s) does not follow ${time[i - 1]} s.`,
        { row: i + 1 },
      );
    }
  }
  let min = Infinity;
  let max = -Infinity;
  for (let i = 0; i < n; i++) {
    min = Math.min(min, volts[i]);
    max = Math.max(max, volts[i]);
  }
  if (!(max > min)) throw new CaptureError("square_no_edge", "The trace is flat: no edge to measure.");
  const midpoint = (min + max) / 2;
  const low = histogramMode(volts, min, midpoint);
  const high = histogramMode(volts, midpoint, max);
  const rising = edges(time, volts, low, high, 1);
  if (rising.length === 0) {
    throw new CaptureError("square_no_edge", "No complete rising edge (from below 10 % to above 90 % of the step) was found in the trace.");
  }
  const falling = edges(time, volts, low, high, -1);
  const rise = median(rising.map((e) => e.duration));
  const dt = (time[n - 1] - time[0]) / (n - 1);
  return {
    kind: "square",
    riseTime: fig(rise, "s"),
    fallTime: falling.length ? fig(median(falling.map((e) => e.duration)), "s") : null,
    overshoot: fig(100 * Math.max(0, median(rising.map((e) => e.excursion))), "%"),
    impliedBandwidth: fig(RISE_TIME_BANDWIDTH / rise, "Hz"),
    lowLevel: fig(low, "V"),
    highLevel: fig(high, "V"),
    amplitude: fig(high - low, "V"),
    risingEdges: rising.length,
    resolutionLimited: rise < 4 * dt,
    conditions: {
      samples: n,
      sampleInterval: fig(dt, "s"),
      thresholds: "10 % and 90 % of the step between the settled low and high levels",
      levels: "histogram modes of the lower and upper halves (IEEE 181 style)",
      bandwidthRelation: "f−3dB = 0.35 / t_rise (single-pole)",
    },
  };
}
