// Impedance sweeps of lumped electrical models of a loudspeaker, evaluated as complex numbers
// directly from the circuit (never through the bench's analysis), for tests with answers derived by hand.

export type Complex = { re: number; im: number };
const add = (a: Complex, b: Complex): Complex => ({ re: a.re + b.re, im: a.im + b.im });
const inv = (a: Complex): Complex => {
  const m = a.re * a.re + a.im * a.im;
  return { re: a.re / m, im: -a.im / m };
};

/** Parallel R, L, C (a driver's motional impedance): Y = 1/R + 1/(jωL) + jωC. */
export function parallelRlc(f: number, r: number, l: number, c: number): Complex {
  const w = 2 * Math.PI * f;
  return inv({ re: 1 / r, im: w * c - 1 / (w * l) });
}

/** The L and C of a parallel RLC with resistance r, resonance f0 and Q = r·√(C/L). */
export function motional(r: number, f0: number, q: number): { l: number; c: number } {
  const w0 = 2 * Math.PI * f0;
  return { l: r / (q * w0), c: q / (r * w0) };
}

/** Series R, L, C: Z = R + j(ωL − 1/(ωC)). */
export function seriesRlc(f: number, r: number, l: number, c: number): Complex {
  const w = 2 * Math.PI * f;
  return { re: r, im: w * l - 1 / (w * c) };
}

export function sum(...zs: Complex[]): Complex {
  return zs.reduce(add, { re: 0, im: 0 });
}

/** Log-spaced frequencies, `perOctave` per octave, from lo to hi. */
export function logFrequencies(lo: number, hi: number, perOctave: number): number[] {
  const n = Math.floor(Math.log2(hi / lo) * perOctave);
  return Array.from({ length: n + 1 }, (_, i) => lo * 2 ** (i / perOctave));
}

/** A CSV sweep: frequency, modulus (Ω) and, unless left out, phase (degrees). */
export function impedanceCsv(
  freqs: number[],
  z: (f: number) => Complex,
  opts: { phase?: boolean; delimiter?: string; header?: string } = {},
): string {
  const d = opts.delimiter ?? ",";
  const phase = opts.phase ?? true;
  const rows = [opts.header ?? ["frequency (Hz)", "impedance (ohm)", ...(phase ? ["phase (deg)"] : [])].join(d)];
  for (const f of freqs) {
    const v = z(f);
    const cells = [f.toPrecision(7), Math.hypot(v.re, v.im).toPrecision(7)];
    if (phase) cells.push(((Math.atan2(v.im, v.re) * 180) / Math.PI).toPrecision(6));
    rows.push(cells.join(d));
  }
  return rows.join("\n") + "\n";
}
