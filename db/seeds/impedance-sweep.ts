// A loudspeaker's impedance sweep from a lumped driver model (Re + the motional parallel RLC at the
// system resonance + the voice coil's inductance), tuned so that its minimum is a sheet's own figure
// at the sheet's frequency. Pure: the demo seed and the timing script both use it.
import { analyseImpedance } from "@shared/bench/analysis";

const PER_OCTAVE = 48;

export interface Target {
  ratedOhm: number;
  minOhm: number;
  minAtHz: number;
  resonanceHz: number;
}

/** Re + motional parallel RLC + the voice coil's lossy inductance (Le ∥ R2, eddy-current losses). */
function zAt(f: number, re: number, res: number, l: number, c: number, le: number, r2: number): { re: number; im: number } {
  const w = 2 * Math.PI * f;
  const g = 1 / res;
  const b = w * c - 1 / (w * l);
  const m = g * g + b * b;
  // Le ∥ R2: jωLe·R2 / (R2 + jωLe)
  const x = w * le;
  const d = r2 * r2 + x * x;
  return { re: re + g / m + (x * x * r2) / d, im: -b / m + (x * r2 * r2) / d };
}

/** The model's sweep as CSV (frequency, ohms, phase), its minimum moved onto the target. */
export function impedanceSweepCsv(t: Target, perOctave = PER_OCTAVE): string {
  const freqs = Array.from({ length: Math.floor(Math.log2(1000) * perOctave) + 1 }, (_, i) => 20 * 2 ** (i / perOctave));
  const q = 3;
  const res = 3 * t.ratedOhm;
  const w0 = 2 * Math.PI * t.resonanceHz;
  const l = res / (q * w0);
  const c = q / (res * w0);
  let re = t.minOhm;
  let le = 1 / ((2 * Math.PI * t.minAtHz) ** 2 * c);
  const r2 = 3 * t.ratedOhm;
  const sweep = () => freqs.map((f) => zAt(f, re, res, l, c, le, r2));
  for (let i = 0; i < 20; i++) {
    const z = sweep();
    const a = analyseImpedance(
      Float64Array.from(freqs),
      Float64Array.from(z, (v) => Math.hypot(v.re, v.im)),
      null,
    );
    re += t.minOhm - a.minimum.ohms.value;
    le *= (a.minimum.frequency.value / t.minAtHz) ** 2;
  }
  const rows = ["Frequency (Hz),Impedance (ohm),Phase (deg)"];
  sweep().forEach((v, i) =>
    rows.push(`${freqs[i].toFixed(3)},${Math.hypot(v.re, v.im).toFixed(5)},${((Math.atan2(v.im, v.re) * 180) / Math.PI).toFixed(3)}`),
  );
  return rows.join("\n") + "\n";
}
