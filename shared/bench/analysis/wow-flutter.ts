// Wow & flutter and speed from a recorded test tone (3150 Hz per IEC 60386 / AES6-2008, or 3000 Hz for
// the WRMS convention), played from a test record or tape.
//
// Demodulation: the tone is mixed down to 0 Hz with a complex oscillator at its own mean frequency,
// low-passed (windowed-sinc FIR, computed only at the output instants) and decimated to about 2 kHz;
// the instantaneous frequency is the phase advance between output samples. Why this and not counting
// zero crossings: hum, rumble, harmonics and broadband noise away from the tone are filtered out before
// the phase is read, whereas each of them shifts zero crossings directly; and unlike an analytic signal
// of the whole file (a Hilbert transform by FFT) it runs in one pass with no large transform.
//
// Readings (all relative to the nominal tone, so a speed error shows as a ratio):
// - speed error: (mean frequency − nominal) / nominal, the mean taken from the total phase advance;
// - weighted peak: the IEC 60386 weighting applied to the speed deviation, then AES6-2008's two-sigma
//   statistical reading taken as the level that |weighted deviation| stays below 95 % of the time
//   (the two-sigma point of a normal distribution). For a steady sinusoidal modulation this reads
//   sin(0.95·π/2) = 0.997 of its peak, i.e. the "± x %" peak figure the standard's meter shows;
// - weighted rms (WRMS): rms of the same weighted deviation;
// - unweighted peak: the same 95 % point of the unweighted deviation about its mean;
// - drift: the largest minus the smallest 1 s average of the speed over the capture, unweighted.
import { CaptureError } from "./errors";
import { fig, type Figure } from "./types";
import { applyFlutterWeighting, flutterWeighting } from "./flutter-weighting";

export const WOW_FLUTTER_CONVENTIONS = ["IEC-60386-peak", "WRMS"] as const;
export type WowFlutterConvention = (typeof WOW_FLUTTER_CONVENTIONS)[number];

export const WOW_FLUTTER_LIMITS = {
  /** AES6-2008 reads over at least 5 s. */
  minSeconds: 5,
  /** How far the tone may sit from the stated one and still be read as it (a semitone is about 6 %). */
  maxOffset: 0.1,
  /** Decimated rate of the deviation signal, Hz (approximately: a whole number of input samples per output). */
  demodRateHz: 2000,
  /** Low-pass corner before decimation: passes the 200 Hz top of the weighting with the deviation on top. */
  lowPassHz: 500,
  /** Points kept for the speed-drift plot. */
  tracePoints: 600,
} as const;

export interface WowFlutterAnalysis {
  kind: "wow_flutter";
  conditions: {
    sampleRate: number;
    nominalHz: number;
    convention: WowFlutterConvention;
    /** Seconds of deviation the readings are taken over. */
    analysedS: number;
    demodRateHz: number;
    channel: string;
  };
  meanFrequency: Figure<"Hz">;
  /** (mean − nominal) / nominal; +0.005 = 0.5 % fast. */
  speedError: Figure<"ratio">;
  weightedPeak: Figure<"ratio">;
  weightedRms: Figure<"ratio">;
  unweightedPeak: Figure<"ratio">;
  drift: Figure<"ratio">;
  /** Instantaneous speed re nominal, %, at most `tracePoints` bucket means; t in s. */
  trace: { t: number; percent: number }[];
}

/** Mean frequency from rising zero crossings (linear interpolation), with hysteresis against noise. */
export function zeroCrossingFrequency(x: Float64Array, sampleRate: number): number | null {
  let sum = 0;
  for (let i = 0; i < x.length; i++) sum += x[i] * x[i];
  const rms = Math.sqrt(sum / x.length);
  if (rms < 1e-6) return null;
  const arm = -0.3 * rms;
  let armed = false;
  let first = -1;
  let last = -1;
  let count = 0;
  for (let i = 1; i < x.length; i++) {
    if (x[i] < arm) armed = true;
    if (armed && x[i - 1] < 0 && x[i] >= 0) {
      const t = i - 1 + -x[i - 1] / (x[i] - x[i - 1]);
      if (first < 0) first = t;
      last = t;
      count++;
      armed = false;
    }
  }
  if (count < 3) return null;
  return ((count - 1) * sampleRate) / (last - first);
}

/** Blackman-windowed sinc low-pass, unity gain at DC. */
function lowPassTaps(cutoffHz: number, sampleRate: number, transitionHz: number): Float64Array {
  let n = Math.ceil((5.5 * sampleRate) / transitionHz);
  if (n % 2 === 0) n++;
  const h = new Float64Array(n);
  const m = (n - 1) / 2;
  const fc = cutoffHz / sampleRate;
  let sum = 0;
  for (let i = 0; i < n; i++) {
    const k = i - m;
    const sinc = k === 0 ? 2 * fc : Math.sin(2 * Math.PI * fc * k) / (Math.PI * k);
    const w = 0.42 - 0.5 * Math.cos((2 * Math.PI * i) / (n - 1)) + 0.08 * Math.cos((4 * Math.PI * i) / (n - 1));
    h[i] = sinc * w;
    sum += h[i];
  }
  for (let i = 0; i < n; i++) h[i] /= sum;
  return h;
}

/**
 * Instantaneous frequency of a tone near `carrierHz`, Hz, at rate `sampleRate / decimation`. Sample j
 * stands for the interval between two decimated outputs, so its time is the interval's midpoint.
 */
export function demodulate(x: Float64Array, sampleRate: number, carrierHz: number): { frequency: Float64Array; rate: number; t0: number } {
  const L = WOW_FLUTTER_LIMITS;
  const decimation = Math.max(1, Math.round(sampleRate / L.demodRateHz));
  const rate = sampleRate / decimation;
  const taps = lowPassTaps(L.lowPassHz, sampleRate, rate - 2 * L.lowPassHz);
  const n = taps.length;
  // Mix once; the oscillator is advanced by rotation, re-anchored every block against drift.
  const re = new Float64Array(x.length);
  const im = new Float64Array(x.length);
  const w = (2 * Math.PI * carrierHz) / sampleRate;
  const cw = Math.cos(w);
  const sw = Math.sin(w);
  let c = 1;
  let s = 0;
  for (let i = 0; i < x.length; i++) {
    if (i % 4096 === 0) {
      c = Math.cos(w * i);
      s = Math.sin(w * i);
    }
    re[i] = x[i] * c;
    im[i] = -x[i] * s;
    const c2 = c * cw - s * sw;
    s = s * cw + c * sw;
    c = c2;
  }
  const outputs = Math.floor((x.length - n) / decimation) + 1;
  if (outputs < 3) return { frequency: new Float64Array(0), rate, t0: 0 };
  const phase = new Float64Array(outputs);
  let prev = 0;
  let turns = 0;
  for (let j = 0; j < outputs; j++) {
    const start = j * decimation;
    let a = 0;
    let b = 0;
    for (let k = 0; k < n; k++) {
      a += taps[k] * re[start + k];
      b += taps[k] * im[start + k];
    }
    const p = Math.atan2(b, a);
    if (j > 0) {
      const d = p - prev;
      if (d > Math.PI) turns -= 2 * Math.PI;
      else if (d < -Math.PI) turns += 2 * Math.PI;
    }
    prev = p;
    phase[j] = p + turns;
  }
  const frequency = new Float64Array(outputs - 1);
  for (let j = 0; j < outputs - 1; j++) frequency[j] = carrierHz + ((phase[j + 1] - phase[j]) * rate) / (2 * Math.PI);
  // Output j is centred on input sample j·decimation + (n−1)/2; the difference sits half a step later.
  const t0 = ((n - 1) / 2 + decimation / 2) / sampleRate;
  return { frequency, rate, t0 };
}

/** The level |x| stays below for `fraction` of the samples. */
function percentileAbs(x: Float64Array, fraction: number): number {
  const a = Float64Array.from(x, Math.abs).sort();
  return a[Math.min(a.length - 1, Math.floor(fraction * a.length))];
}

export function analyseWowFlutter(
  x: Float64Array,
  sampleRate: number,
  opts: { nominalHz: number; convention: WowFlutterConvention; channel?: string },
): WowFlutterAnalysis {
  const L = WOW_FLUTTER_LIMITS;
  const seconds = x.length / sampleRate;
  if (seconds < L.minSeconds + 0.5) {
    throw new CaptureError(
      "too_short",
      `The capture holds ${seconds.toFixed(1)} s; wow & flutter is read over at least ${L.minSeconds} s of tone (AES6-2008).`,
      { seconds, neededSeconds: L.minSeconds + 0.5 },
    );
  }
  const rough = zeroCrossingFrequency(x, sampleRate);
  if (rough === null) throw new CaptureError("no_fundamental", "No test tone found: the capture is silent or holds no steady tone.");
  if (Math.abs(rough / opts.nominalHz - 1) > L.maxOffset) {
    throw new CaptureError(
      "wrong_test_tone",
      `The tone reads ${rough.toFixed(0)} Hz, more than ${L.maxOffset * 100} % from the stated ${opts.nominalHz} Hz: check the test record or tape and the tone you stated.`,
      { foundHz: rough, nominalHz: opts.nominalHz },
    );
  }
  const { frequency, rate, t0 } = demodulate(x, sampleRate, rough);
  const m = frequency.length;
  let sum = 0;
  for (let i = 0; i < m; i++) sum += frequency[i];
  const mean = sum / m;
  // Deviation about the mean, as a fraction of the nominal speed.
  const dev = Float64Array.from(frequency, (f) => (f - mean) / opts.nominalHz);
  const weighted = applyFlutterWeighting(flutterWeighting(rate), dev);
  let sq = 0;
  for (let i = 0; i < m; i++) sq += weighted[i] * weighted[i];
  const second = Math.max(1, Math.round(rate));
  let lo = Infinity;
  let hi = -Infinity;
  let run = 0;
  for (let i = 0; i < m; i++) {
    run += dev[i];
    if (i >= second) run -= dev[i - second];
    if (i >= second - 1) {
      lo = Math.min(lo, run / second);
      hi = Math.max(hi, run / second);
    }
  }
  return {
    kind: "wow_flutter",
    conditions: {
      sampleRate,
      nominalHz: opts.nominalHz,
      convention: opts.convention,
      analysedS: m / rate,
      demodRateHz: rate,
      channel: opts.channel ?? "mono",
    },
    meanFrequency: fig(mean, "Hz"),
    speedError: fig(mean / opts.nominalHz - 1, "ratio"),
    weightedPeak: fig(percentileAbs(weighted, 0.95), "ratio"),
    weightedRms: fig(Math.sqrt(sq / m), "ratio"),
    unweightedPeak: fig(percentileAbs(dev, 0.95), "ratio"),
    drift: fig(Number.isFinite(hi - lo) ? hi - lo : 0, "ratio"),
    trace: speedTrace(frequency, rate, t0, opts.nominalHz),
  };
}

/** Bucket means of the speed re nominal, %, for the plot. */
function speedTrace(frequency: Float64Array, rate: number, t0: number, nominalHz: number): { t: number; percent: number }[] {
  const buckets = Math.min(WOW_FLUTTER_LIMITS.tracePoints, frequency.length);
  const size = frequency.length / buckets;
  const out: { t: number; percent: number }[] = [];
  for (let b = 0; b < buckets; b++) {
    const lo = Math.floor(b * size);
    const hi = Math.max(lo + 1, Math.floor((b + 1) * size));
    let s = 0;
    for (let i = lo; i < hi; i++) s += frequency[i];
    const f = s / (hi - lo);
    const t = t0 + (lo + hi - 1) / 2 / rate;
    out.push({ t: Math.round(t * 1000) / 1000, percent: Math.round((f / nominalHz - 1) * 100 * 1e5) / 1e5 });
  }
  return out;
}
