// One-sided power spectrum through fft.js, scaled so that summing bins gives mean-square volts.
import FFT from "fft.js";
import { getWindow, windowProperties, type WindowName } from "./windows";

export const MAX_FFT_SIZE = 1 << 20;

export interface PowerSpectrum {
  /** Mean-square contribution of each bin 0 … nFft/2 (units² of the input). */
  power: Float64Array;
  binHz: number;
  nFft: number;
  /** Samples actually windowed (the rest of nFft is zero padding). */
  nWindow: number;
  window: WindowName;
  /** Bins either side of a tone to sum: the main lobe plus a margin (±8 unpadded bins for BH4), in padded bins. */
  toneHalfWidthBins: number;
}

interface FftKit {
  fft: FFT;
  input: Float64Array;
  out: Float64Array;
}
const kits = new Map<number, FftKit>();

function kitFor(n: number): FftKit {
  let k = kits.get(n);
  if (!k) {
    if (kits.size >= 3) kits.delete(kits.keys().next().value!);
    k = { fft: new FFT(n), input: new Float64Array(n), out: new Float64Array(2 * n) };
    kits.set(n, k);
  }
  return k;
}

export function nextPowerOfTwo(n: number): number {
  let p = 2;
  while (p < n) p *= 2;
  return p;
}

/** Raw fft.js real transform of `x` zero-padded to a power of two; returns the interleaved half spectrum. */
export function bareFft(x: Float64Array): Float64Array {
  const nFft = nextPowerOfTwo(x.length);
  const kit = kitFor(nFft);
  kit.input.set(x);
  kit.input.fill(0, x.length);
  kit.fft.realTransform(kit.out, kit.input);
  return kit.out;
}

/**
 * Windowed, mean-removed power spectrum. The scaling 2|X_k|² / (nFft · Σw²) makes
 * Σ_k P_k over a band equal the mean-square value of what lies in that band (Parseval),
 * whatever the window and the zero padding, so tones can be measured by power-summing.
 */
export function powerSpectrum(x: Float64Array, sampleRate: number, window: WindowName): PowerSpectrum {
  const nWindow = x.length;
  const nFft = nextPowerOfTwo(nWindow);
  if (nFft > MAX_FFT_SIZE) throw new RangeError(`at most ${MAX_FFT_SIZE} samples per spectrum, got ${nWindow}`);
  const w = getWindow(window, nWindow);
  const kit = kitFor(nFft);
  const input = kit.input;
  let mean = 0;
  for (let i = 0; i < nWindow; i++) mean += x[i];
  mean /= nWindow;
  let sumW2 = 0;
  for (let i = 0; i < nWindow; i++) {
    const wi = w[i];
    input[i] = (x[i] - mean) * wi;
    sumW2 += wi * wi;
  }
  input.fill(0, nWindow);
  const out = kit.out;
  kit.fft.realTransform(out, input);
  const half = nFft / 2;
  const power = new Float64Array(half + 1);
  const scale = 2 / (nFft * sumW2);
  for (let k = 0; k <= half; k++) {
    const re = out[2 * k];
    const im = out[2 * k + 1];
    power[k] = (re * re + im * im) * scale;
  }
  // DC and Nyquist have no mirror image.
  power[0] /= 2;
  power[half] /= 2;
  const pad = nFft / nWindow;
  const props = windowProperties(window);
  return {
    power,
    binHz: sampleRate / nFft,
    nFft,
    nWindow,
    window,
    toneHalfWidthBins: Math.ceil(Math.max(8, props.mainLobeHalfWidthBins + 4) * pad),
  };
}
