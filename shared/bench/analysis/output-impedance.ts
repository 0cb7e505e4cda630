// Output impedance and damping factor from one capture of a steady tone played first with the output
// open (or lightly loaded) and then into a known load, in either order. The output is a Thévenin source
// (V_open behind Z_out), so the load divides it: V_loaded = V_open · R / (R + Z_out), hence
//   Z_out = R · (V_open / V_loaded − 1),
// and the damping factor is the nominal load over the output impedance, DF = R_nominal / Z_out.
import { CaptureError } from "./errors";
import { powerSpectrum } from "./spectrum";
import { middleStretch, strongestTone } from "./tones";
import { fig, peakVoltsPerFullScale, type CaptureScale, type Figure } from "./types";

export interface OutputImpedanceConditions {
  /** The load the second level was read into, Ω. */
  loadOhms: number;
  /** The load a damping factor is quoted into (8 Ω for a loudspeaker output); none for a line output. */
  nominalLoadOhms?: number;
  /** The test tone; by default the strongest tone in the capture. */
  frequencyHz?: number;
  scale?: CaptureScale;
}

export interface OutputImpedanceChannel {
  channel: string;
  frequency: Figure<"Hz">;
  /** Tone amplitudes in full-scale units (rms) and, with a scale, volts. */
  openRmsFs: number;
  loadedRmsFs: number;
  openRms: Figure<"V"> | null;
  loadedRms: Figure<"V"> | null;
  /** Seconds of steady tone each level was read over. */
  openSeconds: number;
  loadedSeconds: number;
  /** Block-by-block levels for the plot: start time and rms in full-scale units. */
  levels: { t: number; rmsFs: number; part: "open" | "loaded" | "between" }[];
  outputImpedance: Figure<"Ω">;
  dampingFactor: number | null;
}

export interface OutputImpedanceAnalysis {
  kind: "output_impedance";
  channels: OutputImpedanceChannel[];
  skipped: { channel: string; error: string; message: string }[];
  conditions: { sampleRate: number; loadOhms: number; nominalLoadOhms: number | null; blockSeconds: number; definition: string };
}

export const OUTPUT_IMPEDANCE_DEFINITION =
  "Z_out = R_load · (V_open / V_loaded − 1) (Thévenin source and load as a voltage divider); DF = R_nominal / Z_out";

const MAX_LEVELS = 600;

/** Amplitude (rms) of the tone at `hz` in x[start, start+n), through a Hann window so other tones and the image leak nothing. */
function blockRms(x: Float64Array, start: number, hann: Float64Array, hz: number, fs: number): number {
  const n = hann.length;
  const w = (2 * Math.PI * hz) / fs;
  let re = 0;
  let im = 0;
  let sw = 0;
  // Rotating phasor: one complex multiply per sample instead of a sin and a cos.
  let c = 1;
  let s = 0;
  const cw = Math.cos(w);
  const sn = Math.sin(w);
  for (let i = 0; i < n; i++) {
    const win = hann[i];
    const v = x[start + i] * win;
    re += v * c;
    im -= v * s;
    sw += win;
    const c2 = c * cw - s * sn;
    s = s * cw + c * sn;
    c = c2;
  }
  return (2 * Math.hypot(re, im)) / sw / Math.SQRT2;
}

function median(xs: number[]): number {
  const s = [...xs].sort((a, b) => a - b);
  const m = s.length >> 1;
  return s.length % 2 ? s[m] : (s[m - 1] + s[m]) / 2;
}

export function analyseOutputImpedanceChannel(
  x: Float64Array,
  sampleRate: number,
  channel: string,
  c: OutputImpedanceConditions,
): OutputImpedanceChannel {
  const spec = powerSpectrum(middleStretch(x), sampleRate, "blackman-harris-7");
  const nyquist = sampleRate / 2;
  const tone = c.frequencyHz ? strongestTone(spec, c.frequencyHz * 0.9, c.frequencyHz * 1.1) : strongestTone(spec, 10, nyquist * 0.9);
  if (!tone || tone.power < 1e-14) throw new CaptureError("no_fundamental", "No test tone found: the capture is silent.");
  const hz = tone.hz;
  // Blocks of at least 50 ms and 8 cycles: long enough for a steady reading, short enough to find the switch.
  const n = Math.max(Math.round(0.05 * sampleRate), Math.round((8 * sampleRate) / hz));
  const count = Math.floor(x.length / n);
  if (count < 8) {
    throw new CaptureError(
      "too_short",
      `The capture holds ${(x.length / sampleRate).toFixed(2)} s; an open and a loaded reading need at least ${((8 * n) / sampleRate).toFixed(2)} s together.`,
    );
  }
  const hann = new Float64Array(n);
  for (let i = 0; i < n; i++) hann[i] = 0.5 - 0.5 * Math.cos((2 * Math.PI * i) / n);
  const amps = Array.from({ length: count }, (_, b) => blockRms(x, b * n, hann, hz, sampleRate));
  const loud = Math.max(...amps);
  // Blocks well below the loudest are the pause while the load is switched in.
  const live = amps.map((a) => a > 0.2 * loud);
  // Two levels: split at the midpoint and refine (two-means in one dimension).
  let lo = Math.min(...amps.filter((_, i) => live[i]));
  let hi = loud;
  let upper: boolean[] = [];
  for (let it = 0; it < 20; it++) {
    const mid = (lo + hi) / 2;
    upper = amps.map((a) => a >= mid);
    const ups = amps.filter((a, i) => live[i] && upper[i]);
    const downs = amps.filter((a, i) => live[i] && !upper[i]);
    if (!downs.length || !ups.length) break;
    hi = ups.reduce((a, b) => a + b, 0) / ups.length;
    lo = downs.reduce((a, b) => a + b, 0) / downs.length;
  }
  // A block beside a switch (or a pause) may hold both levels: only blocks between like neighbours count.
  const steady = (i: number) =>
    live[i] && i > 0 && i < count - 1 && live[i - 1] && live[i + 1] && upper[i - 1] === upper[i] && upper[i + 1] === upper[i];
  const open = amps.filter((_, i) => steady(i) && upper[i]);
  const loaded = amps.filter((_, i) => steady(i) && !upper[i]);
  const spread = (xs: number[], m: number) => Math.sqrt(xs.reduce((a, v) => a + (v - m) ** 2, 0) / Math.max(1, xs.length - 1));
  const vOpen = open.length ? median(open) : 0;
  const vLoaded = loaded.length ? median(loaded) : 0;
  const noise = Math.max(open.length > 1 ? spread(open, vOpen) : 0, loaded.length > 1 ? spread(loaded, vLoaded) : 0);
  // Two levels must each last three steady blocks and differ by far more than either wanders.
  if (open.length < 3 || loaded.length < 3 || !(vOpen - vLoaded > 8 * noise)) {
    throw new CaptureError(
      "no_fundamental",
      `The ${hz.toFixed(0)} Hz tone holds one steady level; play it with the output open, then into the load (at least 0.2 s each).`,
      { hz },
    );
  }
  const ratio = vOpen / vLoaded;
  const zOut = c.loadOhms * (ratio - 1);
  const vpfs = c.scale ? peakVoltsPerFullScale(c.scale) : null;
  const step = Math.max(1, Math.ceil(count / MAX_LEVELS));
  const levels: OutputImpedanceChannel["levels"] = [];
  for (let i = 0; i < count; i += step)
    levels.push({ t: (i * n) / sampleRate, rmsFs: amps[i], part: steady(i) ? (upper[i] ? "open" : "loaded") : "between" });
  return {
    channel,
    frequency: fig(hz, "Hz"),
    openRmsFs: vOpen,
    loadedRmsFs: vLoaded,
    openRms: vpfs === null ? null : fig(vOpen * vpfs, "V"),
    loadedRms: vpfs === null ? null : fig(vLoaded * vpfs, "V"),
    openSeconds: (open.length * n) / sampleRate,
    loadedSeconds: (loaded.length * n) / sampleRate,
    levels,
    outputImpedance: fig(zOut, "Ω"),
    dampingFactor: c.nominalLoadOhms ? c.nominalLoadOhms / zOut : null,
  };
}

export function analyseOutputImpedance(
  channels: Float64Array[],
  sampleRate: number,
  c: OutputImpedanceConditions,
  labels?: string[],
): OutputImpedanceAnalysis {
  const names = labels ?? (channels.length === 1 ? ["mono"] : ["left", "right"]);
  const out: OutputImpedanceChannel[] = [];
  const skipped: OutputImpedanceAnalysis["skipped"] = [];
  let first: CaptureError | null = null;
  for (const [i, x] of channels.entries()) {
    try {
      out.push(analyseOutputImpedanceChannel(x, sampleRate, names[i] ?? `ch${i + 1}`, c));
    } catch (e) {
      if (!(e instanceof CaptureError) || e.code !== "no_fundamental" || channels.length === 1) throw e;
      first ??= e;
      skipped.push({ channel: names[i], error: e.code, message: e.message });
    }
  }
  if (out.length === 0) throw first ?? new CaptureError("no_fundamental", "The capture has no channels.");
  const n = Math.max(Math.round(0.05 * sampleRate), 1);
  return {
    kind: "output_impedance",
    channels: out,
    skipped,
    conditions: {
      sampleRate,
      loadOhms: c.loadOhms,
      nominalLoadOhms: c.nominalLoadOhms ?? null,
      blockSeconds: n / sampleRate,
      definition: OUTPUT_IMPEDANCE_DEFINITION,
    },
  };
}
