// Reference response curves used by the bench checks and the capture analysis.
// Pure functions, no platform imports: they run in the browser and on the server.

/** RIAA time constants (IEC 60098), seconds. */
export const RIAA_T1 = 3180e-6;
export const RIAA_T2 = 318e-6;
export const RIAA_T3 = 75e-6;
/** Optional subsonic pole of the IEC amendment (playback only), seconds. */
export const RIAA_T4_IEC = 7950e-6;

/** |H(f)|² of the playback network, un-normalised. */
function riaaPowerGain(fHz: number, iecPole: boolean): number {
  const w = 2 * Math.PI * fHz;
  const a1 = (w * RIAA_T1) ** 2;
  const a2 = (w * RIAA_T2) ** 2;
  const a3 = (w * RIAA_T3) ** 2;
  let g = (1 + a2) / ((1 + a1) * (1 + a3));
  if (iecPole) {
    const a4 = (w * RIAA_T4_IEC) ** 2;
    g *= a4 / (1 + a4);
  }
  return g;
}

/**
 * RIAA playback (de-emphasis) response in dB relative to 1 kHz:
 * H(s) = (1 + sT2) / ((1 + sT1)(1 + sT3)), optionally times sT4/(1 + sT4) for the IEC pole.
 * The recording curve is the negative of this one.
 */
export function riaaPlaybackDb(fHz: number, opts?: { iecPole?: boolean }): number {
  if (!(fHz > 0) || !Number.isFinite(fHz)) throw new RangeError(`frequency must be a positive number of Hz, got ${fHz}`);
  const iec = opts?.iecPole ?? false;
  return 10 * Math.log10(riaaPowerGain(fHz, iec) / riaaPowerGain(1000, iec));
}

/** A-weighting pole frequencies (IEC 61672-1 Annex E, rounded as printed), Hz. */
export const A_WEIGHT_F1 = 20.6;
export const A_WEIGHT_F2 = 107.7;
export const A_WEIGHT_F3 = 737.9;
export const A_WEIGHT_F4 = 12194;
/** Normalisation constant A1000: the formula reads −2.00 dB at 1 kHz before it. */
export const A_WEIGHT_A1000 = -2.0;

/** A-weighting in dB (IEC 61672-1 analytic form): about 0 dB at 1 kHz, −∞ at DC. */
export function aWeightingDb(fHz: number): number {
  if (!(fHz >= 0) || !Number.isFinite(fHz)) throw new RangeError(`frequency must be a non-negative number of Hz, got ${fHz}`);
  if (fHz === 0) return -Infinity;
  const f2 = fHz * fHz;
  const num = A_WEIGHT_F4 ** 2 * f2 * f2;
  const den = (f2 + A_WEIGHT_F1 ** 2) * Math.sqrt(f2 + A_WEIGHT_F2 ** 2) * Math.sqrt(f2 + A_WEIGHT_F3 ** 2) * (f2 + A_WEIGHT_F4 ** 2);
  return 20 * Math.log10(num / den) - A_WEIGHT_A1000;
}

/** A-weighting as a linear amplitude factor (for weighting spectra bin by bin). */
export function aWeightingGain(fHz: number): number {
  if (fHz === 0) return 0;
  return 10 ** (aWeightingDb(fHz) / 20);
}
