// Harmonic analysis of a sine captured through the unit: fundamental, harmonics 2–10, THD, THD+N, noise, SNR.
// Tones are measured by summing the power of the bins around them, so a non-integer number of cycles
// in the capture costs no accuracy (the window's main lobe is caught whole).
import { CaptureError } from "./errors";
import { powerSpectrum, MAX_FFT_SIZE, type PowerSpectrum } from "./spectrum";
import { type WindowName } from "./windows";
import { aWeightingPowerTable } from "./weighting";
import { dB, dBPower, fig, peakVoltsPerFullScale, type CaptureScale, type Figure } from "./types";

export const HIGHEST_HARMONIC = 10;

export interface SineConditions {
  scale: CaptureScale;
  /** Load the unit drives, for watts. Leave out for line-level captures. */
  loadOhms?: number;
  /** The stated test frequency; the fundamental is looked for within ±10 % of it. */
  fundamentalHz?: number;
  /** Measurement bandwidth for THD+N, noise and which harmonics count (AES17: 20 Hz–20 kHz). */
  bandwidth?: { lowHz: number; highHz: number };
  /** Weighting applied to the residual (THD+N, noise, SNR). */
  weighting?: "unweighted" | "A";
  window?: WindowName;
  /** Finest frequency resolution asked for; the capture must be at least 1/resolution seconds long. */
  resolutionHz?: number;
}

export const SINE_DEFAULTS = {
  bandwidth: { lowHz: 20, highHz: 20_000 },
  weighting: "unweighted" as const,
  window: "blackman-harris-7" as const,
  resolutionHz: 5,
};

export interface ResolvedSineConditions {
  scale: CaptureScale;
  peakVoltsPerFullScale: number;
  loadOhms: number | null;
  statedFundamentalHz: number | null;
  bandwidth: { lowHz: number; highHz: number };
  weighting: "unweighted" | "A";
  window: WindowName;
  resolutionHz: number;
  sampleRate: number;
  samplesAnalysed: number;
  secondsAnalysed: number;
  fftSize: number;
  binHz: number;
  binsSummedPerTone: number;
  harmonicsUpTo: number;
  thdDefinition: string;
  thdNDefinition: string;
}

export interface HarmonicReading {
  order: number;
  frequency: Figure<"Hz">;
  level: Figure<"V">;
  relativeDb: Figure<"dB">;
  relativePercent: Figure<"%">;
  /** Counted in THD: inside the measurement bandwidth. */
  inBand: boolean;
}

export interface SineChannelAnalysis {
  channel: string;
  fundamental: {
    frequency: Figure<"Hz">;
    rms: Figure<"V">;
    peak: Figure<"V">;
    dBV: Figure<"dBV">;
    dBFS: Figure<"dBFS">;
    /** Fundamental rms² into the stated load; null without a load. */
    power: Figure<"W"> | null;
  };
  /** Harmonics 2–10 below half the sample rate. */
  harmonics: HarmonicReading[];
  /** THD relative to the fundamental (THD_F). */
  thd: { ratio: number; percent: Figure<"%">; db: Figure<"dB"> };
  /** THD relative to the total of fundamental and harmonics (THD_R, IEC 60268 d_t). */
  thdR: { ratio: number; percent: Figure<"%"> };
  /** Everything in band but the fundamental, relative to the fundamental. */
  thdN: { ratio: number; percent: Figure<"%">; db: Figure<"dB">; weighting: "unweighted" | "A" };
  noise: { rms: Figure<"V">; dBV: Figure<"dBV">; density: Figure<"V/√Hz">; weighting: "unweighted" | "A" };
  /** Fundamental over the in-band noise (harmonics excluded). */
  snr: Figure<"dB">;
}

export interface SineAnalysis {
  kind: "sine";
  channels: SineChannelAnalysis[];
  /** Channels of a multi-channel capture that held no fundamental (e.g. the undriven side), and why. */
  skipped: { channel: string; error: string; message: string }[];
  conditions: ResolvedSineConditions;
}

interface Zone {
  lo: number;
  hi: number;
}

function zoneAround(centreBin: number, half: number, last: number): Zone {
  return { lo: Math.max(1, centreBin - half), hi: Math.min(last, centreBin + half) };
}

function sumZone(p: Float64Array, z: Zone): number {
  let s = 0;
  for (let k = z.lo; k <= z.hi; k++) s += p[k];
  return s;
}

/** Pick the analysed stretch: everything, or the middle when the capture is longer than one FFT holds. */
function middleStretch(x: Float64Array): Float64Array {
  if (x.length <= MAX_FFT_SIZE) return x;
  const start = Math.floor((x.length - MAX_FFT_SIZE) / 2);
  return x.subarray(start, start + MAX_FFT_SIZE);
}

export function resolveSineConditions(c: SineConditions, sampleRate: number, samples: number): ResolvedSineConditions {
  const nyquist = sampleRate / 2;
  const bw = c.bandwidth ?? SINE_DEFAULTS.bandwidth;
  const bandwidth = { lowHz: bw.lowHz, highHz: Math.min(bw.highHz, nyquist) };
  const samplesAnalysed = Math.min(samples, MAX_FFT_SIZE);
  let fftSize = 2;
  while (fftSize < samplesAnalysed) fftSize *= 2;
  return {
    scale: c.scale,
    peakVoltsPerFullScale: peakVoltsPerFullScale(c.scale),
    loadOhms: c.loadOhms ?? null,
    statedFundamentalHz: c.fundamentalHz ?? null,
    bandwidth,
    weighting: c.weighting ?? SINE_DEFAULTS.weighting,
    window: c.window ?? SINE_DEFAULTS.window,
    resolutionHz: c.resolutionHz ?? SINE_DEFAULTS.resolutionHz,
    sampleRate,
    samplesAnalysed,
    secondsAnalysed: samplesAnalysed / sampleRate,
    fftSize,
    binHz: sampleRate / fftSize,
    binsSummedPerTone: 0,
    harmonicsUpTo: HIGHEST_HARMONIC,
    thdDefinition: "THD_F = √(Σ U_n², n = 2…10 within the bandwidth) / U_1 (IEC 60268-3, IEEE 1057 style)",
    thdNDefinition: "rms of everything in the bandwidth except the fundamental, divided by the fundamental",
  };
}

/** Analyse one channel of samples scaled to digital full scale (±1.0). */
export function analyseSineChannel(samples: Float64Array, channel: string, rc: ResolvedSineConditions): SineChannelAnalysis {
  const x = middleStretch(samples);
  const fs = rc.sampleRate;
  const minSamples = Math.ceil(fs / rc.resolutionHz);
  if (x.length < minSamples) {
    throw new CaptureError(
      "too_short",
      `The capture holds ${(x.length / fs).toFixed(3)} s (${x.length} samples at ${fs} Hz); a ${rc.resolutionHz} Hz resolution needs at least ${(minSamples / fs).toFixed(3)} s.`,
      { samples: x.length, sampleRate: fs, neededSamples: minSamples },
    );
  }
  const spec = powerSpectrum(x, fs, rc.window);
  return measureSpectrum(spec, channel, rc);
}

function measureSpectrum(spec: PowerSpectrum, channel: string, rc: ResolvedSineConditions): SineChannelAnalysis {
  const { power: p, binHz, toneHalfWidthBins: h } = spec;
  const last = p.length - 1;
  const vpfs = rc.peakVoltsPerFullScale;
  rc.binsSummedPerTone = 2 * h + 1;

  // Find the fundamental: the strongest bin in the search range.
  const lowHz = rc.statedFundamentalHz != null ? rc.statedFundamentalHz * 0.9 : Math.max(10, rc.bandwidth.lowHz);
  const highHz = rc.statedFundamentalHz != null ? rc.statedFundamentalHz * 1.1 : rc.bandwidth.highHz;
  const kLo = Math.max(h + 1, Math.ceil(lowHz / binHz));
  const kHi = Math.min(last - h, Math.floor(highHz / binHz));
  const where =
    rc.statedFundamentalHz != null ? `within ±10 % of the stated ${rc.statedFundamentalHz} Hz` : `between ${lowHz} and ${highHz} Hz`;
  let peak = -1;
  let peakPower = 0;
  for (let k = kLo; k <= kHi; k++) {
    if (p[k] > peakPower) {
      peakPower = p[k];
      peak = k;
    }
  }
  if (peak < 0 || peakPower === 0) {
    throw new CaptureError("no_fundamental", `No fundamental found ${where}: the capture is silent there.`);
  }
  const fz = zoneAround(peak, h, last);
  const p1 = sumZone(p, fz);
  let moment = 0;
  for (let k = fz.lo; k <= fz.hi; k++) moment += k * p[k];
  const f0 = (moment / p1) * binHz;

  const neededBins = 2 * h + 2;
  if (f0 / binHz < neededBins) {
    const needS = (neededBins / f0) * (spec.nWindow / spec.nFft);
    throw new CaptureError(
      "too_short",
      `The capture is too short to separate the harmonics of a ${f0.toFixed(1)} Hz tone: it needs at least ${needS.toFixed(2)} s, it holds ${(spec.nWindow / rc.sampleRate).toFixed(2)} s.`,
      { fundamentalHz: f0, neededSeconds: needS },
    );
  }

  // Harmonics 2..10 that fit below Nyquist with their whole zone.
  const zones: Zone[] = [fz];
  const harmonics: HarmonicReading[] = [];
  const u1 = Math.sqrt(p1);
  let sumInBand = 0;
  for (let n = 2; n <= HIGHEST_HARMONIC; n++) {
    const fn = n * f0;
    const c = Math.round(fn / binHz);
    if (c + h > last) break;
    const z = zoneAround(c, h, last);
    zones.push(z);
    const un = Math.sqrt(sumZone(p, z));
    const inBand = fn >= rc.bandwidth.lowHz && fn <= rc.bandwidth.highHz;
    if (inBand) sumInBand += un * un;
    harmonics.push({
      order: n,
      frequency: fig(fn, "Hz"),
      level: fig(un * vpfs, "V"),
      relativeDb: fig(dB(un / u1), "dB"),
      relativePercent: fig((100 * un) / u1, "%"),
      inBand,
    });
  }

  // Residual and noise within the band; weighting applies to these only.
  const weights = rc.weighting === "A" ? aWeightingPowerTable(spec.nFft, rc.sampleRate) : null;
  const bLo = Math.max(1, Math.ceil(rc.bandwidth.lowHz / binHz));
  const bHi = Math.min(last, Math.floor(rc.bandwidth.highHz / binHz));
  const mask = new Uint8Array(last + 1);
  for (let i = 0; i < zones.length; i++) mask.fill(i === 0 ? 1 : 2, zones[i].lo, zones[i].hi + 1);
  let residual = 0;
  let noise = 0;
  let noiseRaw = 0;
  let noiseBins = 0;
  for (let k = bLo; k <= bHi; k++) {
    const m = mask[k];
    if (m === 1) continue;
    const pk = weights ? p[k] * weights[k] : p[k];
    residual += pk;
    if (m === 0) {
      noise += pk;
      noiseRaw += p[k];
      noiseBins++;
    }
  }
  // Noise is what the band holds outside the fundamental and harmonic zones (the zones are under 1 % of it).
  const noisePower = noise;

  // A tone must stand well clear of the noise in the same number of bins (30 dB).
  const noisePerZone = noiseBins > 0 ? (noiseRaw / noiseBins) * (fz.hi - fz.lo + 1) : 0;
  if (!(p1 > 1000 * noisePerZone) || u1 * Math.SQRT2 < 1e-7) {
    throw new CaptureError(
      "no_fundamental",
      `No fundamental found ${where}: the strongest component (${(peak * binHz).toFixed(1)} Hz, ${dB(u1 * Math.SQRT2).toFixed(1)} dBFS) does not stand 30 dB clear of the noise.`,
      { strongestHz: peak * binHz },
    );
  }

  const thd = Math.sqrt(sumInBand) / u1;
  const thdR = Math.sqrt(sumInBand / (sumInBand + p1));
  const thdN = Math.sqrt(residual) / u1;
  const v1 = u1 * vpfs;
  const noiseV = Math.sqrt(noisePower) * vpfs;
  const bandHz = rc.bandwidth.highHz - rc.bandwidth.lowHz;
  return {
    channel,
    fundamental: {
      frequency: fig(f0, "Hz"),
      rms: fig(v1, "V"),
      peak: fig(v1 * Math.SQRT2, "V"),
      dBV: fig(dB(v1), "dBV"),
      dBFS: fig(dB(u1 * Math.SQRT2), "dBFS"),
      power: rc.loadOhms ? fig((v1 * v1) / rc.loadOhms, "W") : null,
    },
    harmonics,
    thd: { ratio: thd, percent: fig(100 * thd, "%"), db: fig(dB(thd), "dB") },
    thdR: { ratio: thdR, percent: fig(100 * thdR, "%") },
    thdN: { ratio: thdN, percent: fig(100 * thdN, "%"), db: fig(dB(thdN), "dB"), weighting: rc.weighting },
    noise: {
      rms: fig(noiseV, "V"),
      dBV: fig(dB(noiseV), "dBV"),
      density: fig(noiseV / Math.sqrt(bandHz), "V/√Hz"),
      weighting: rc.weighting,
    },
    snr: fig(dBPower(p1 / noisePower), "dB"),
  };
}

/** Analyse every channel of a capture (samples scaled to ±1.0 full scale). */
export function analyseSine(channels: Float64Array[], sampleRate: number, conditions: SineConditions, labels?: string[]): SineAnalysis {
  if (channels.length === 0) throw new CaptureError("no_fundamental", "The capture has no channels.");
  const rc = resolveSineConditions(conditions, sampleRate, channels[0].length);
  const names =
    labels ?? (channels.length === 1 ? ["mono"] : channels.length === 2 ? ["left", "right"] : channels.map((_, i) => `ch${i + 1}`));
  const out: SineChannelAnalysis[] = [];
  const skipped: SineAnalysis["skipped"] = [];
  let firstError: CaptureError | null = null;
  for (const [i, ch] of channels.entries()) {
    try {
      out.push(analyseSineChannel(ch, names[i], rc));
    } catch (e) {
      // One side of a stereo file may be empty; the capture stands if another side has the tone.
      if (!(e instanceof CaptureError) || e.code !== "no_fundamental" || channels.length === 1) throw e;
      firstError ??= e;
      skipped.push({ channel: names[i], error: e.code, message: e.message });
    }
  }
  if (out.length === 0 && firstError) throw firstError;
  return { kind: "sine", channels: out, skipped, conditions: rc };
}
