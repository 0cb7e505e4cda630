// Frequency-domain A-weighting: the IEC 61672-1 curve as a power gain per FFT bin.
import { aWeightingGain } from "../curves";

const tables = new Map<string, Float64Array>();

/** |A(f)|² for bins 0 … nFft/2 at the given sample rate (cached: a worker sees the same sizes again). */
export function aWeightingPowerTable(nFft: number, sampleRate: number): Float64Array {
  const key = `${nFft}:${sampleRate}`;
  let t = tables.get(key);
  if (!t) {
    const half = nFft / 2;
    t = new Float64Array(half + 1);
    const binHz = sampleRate / nFft;
    for (let k = 0; k <= half; k++) {
      const g = aWeightingGain(k * binHz);
      t[k] = g * g;
    }
    if (tables.size >= 4) tables.delete(tables.keys().next().value!);
    tables.set(key, t);
  }
  return t;
}
