// Tone measurement on a power spectrum, shared by the two-tone, separation and output-impedance analyses:
// a tone's power is the sum of the bins of its window's main lobe (plus a margin), so a tone between
// bins costs no accuracy, exactly as the sine analysis measures its fundamental and harmonics.
import { CaptureError } from "./errors";
import { MAX_FFT_SIZE, type PowerSpectrum } from "./spectrum";

export interface ToneZone {
  lo: number;
  hi: number;
}

/** The bins summed for a tone centred near `hz`. */
export function zoneAt(spec: PowerSpectrum, hz: number): ToneZone {
  const c = Math.round(hz / spec.binHz);
  const last = spec.power.length - 1;
  return { lo: Math.max(1, c - spec.toneHalfWidthBins), hi: Math.min(last, c + spec.toneHalfWidthBins) };
}

export function zonePower(spec: PowerSpectrum, z: ToneZone): number {
  let s = 0;
  for (let k = z.lo; k <= z.hi; k++) s += spec.power[k];
  return s;
}

/** Rms (in full-scale units) of what lies around `hz`. */
export function toneRms(spec: PowerSpectrum, hz: number): number {
  return Math.sqrt(zonePower(spec, zoneAt(spec, hz)));
}

/** Half the width of a tone's zone, Hz: tones closer than twice this cannot be told apart. */
export function zoneHalfWidthHz(spec: PowerSpectrum): number {
  return spec.toneHalfWidthBins * spec.binHz;
}

/**
 * The strongest tone between `lowHz` and `highHz`, its frequency refined to the power-weighted centre
 * of its zone. Null when the range is silent.
 */
export function strongestTone(spec: PowerSpectrum, lowHz: number, highHz: number): { hz: number; power: number } | null {
  const p = spec.power;
  const h = spec.toneHalfWidthBins;
  const kLo = Math.max(h + 1, Math.ceil(lowHz / spec.binHz));
  const kHi = Math.min(p.length - 1 - h, Math.floor(highHz / spec.binHz));
  let peak = -1;
  let best = 0;
  for (let k = kLo; k <= kHi; k++) {
    if (p[k] > best) {
      best = p[k];
      peak = k;
    }
  }
  if (peak < 0) return null;
  let sum = 0;
  let moment = 0;
  for (let k = peak - h; k <= peak + h; k++) {
    sum += p[k];
    moment += k * p[k];
  }
  return { hz: (moment / sum) * spec.binHz, power: sum };
}

/**
 * Noise power a tone's zone would hold if it held only noise: the mean noise bin between `lowHz` and
 * `highHz` (from the median, which ignores the tones themselves) times the zone's width.
 */
export function noisePerZone(spec: PowerSpectrum, lowHz: number, highHz: number): number {
  const kLo = Math.max(1, Math.ceil(lowHz / spec.binHz));
  const kHi = Math.min(spec.power.length - 1, Math.floor(highHz / spec.binHz));
  if (kHi <= kLo) return 0;
  // A strided sample of the band is enough for a median and keeps this far below the FFT's cost.
  const stride = Math.max(1, Math.floor((kHi - kLo) / 4096));
  const bins: number[] = [];
  for (let k = kLo; k <= kHi; k += stride) bins.push(spec.power[k]);
  bins.sort((a, b) => a - b);
  // A noise bin's power is exponentially distributed (χ² with two degrees of freedom): mean = median / ln 2.
  return (bins[Math.floor(bins.length / 2)] / Math.LN2) * (2 * spec.toneHalfWidthBins + 1);
}

/** The middle of a capture longer than one FFT holds. */
export function middleStretch(x: Float64Array): Float64Array {
  if (x.length <= MAX_FFT_SIZE) return x;
  const start = Math.floor((x.length - MAX_FFT_SIZE) / 2);
  return x.subarray(start, start + MAX_FFT_SIZE);
}

/** Refuse a capture whose tone zones `spacingHz` apart would overlap. */
export function needSpacing(spec: PowerSpectrum, spacingHz: number, what: string): void {
  const half = zoneHalfWidthHz(spec);
  if (2 * half < spacingHz) return;
  const seconds = spec.nWindow / (spec.binHz * spec.nFft);
  const needS = (seconds * 2 * half) / spacingHz;
  throw new CaptureError(
    "too_short",
    `The capture is too short to tell ${what} apart (${spacingHz.toFixed(0)} Hz apart): it needs at least ${needS.toFixed(2)} s, it holds ${seconds.toFixed(2)} s.`,
    { neededSeconds: needS, seconds },
  );
}
