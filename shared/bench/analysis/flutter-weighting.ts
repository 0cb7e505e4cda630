// The wow & flutter weighting filter of IEC 60386 (identical in AES6-2008, DIN 45507, CCIR 409): a
// band-pass on the speed deviation peaking at 4 Hz, about 6 dB/octave either side, with an extra drop
// below 0.5 Hz. The standard gives a toleranced table, not poles and zeros; this is our own analogue
// prototype fitted to that table (least worst-case error: within 0.5 dB at every tabulated point) (checked point by point in tests/reference/bench-wow-flutter.test.ts),
// made digital with the bilinear transform so it runs causally, as a meter's filter does.

/** Analogue prototype: a 2nd-order high-pass, a 1st-order high-pass, and a 1st-order shelf (pole then zero), Hz. */
export const FLUTTER_WEIGHTING_PROTOTYPE = {
  highPass2: { hz: 0.488, q: 0.551 },
  highPass1: { hz: 1.076 },
  shelf: { poleHz: 11.0, zeroHz: 282 },
} as const;

/** One biquad in direct form II transposed: y = (b0 + b1 z⁻¹ + b2 z⁻²) / (1 + a1 z⁻¹ + a2 z⁻²). */
export interface Biquad {
  b0: number;
  b1: number;
  b2: number;
  a1: number;
  a2: number;
}

export interface FlutterWeighting {
  sampleRate: number;
  sections: Biquad[];
  /** Overall gain that makes the response 0 dB at 4 Hz. */
  gain: number;
}

function highPass2(w: number, q: number, k: number): Biquad {
  const a0 = k * k + (w / q) * k + w * w;
  return {
    b0: (k * k) / a0,
    b1: (-2 * k * k) / a0,
    b2: (k * k) / a0,
    a1: (2 * w * w - 2 * k * k) / a0,
    a2: (k * k - (w / q) * k + w * w) / a0,
  };
}

function highPass1(w: number, k: number): Biquad {
  return { b0: k / (k + w), b1: -k / (k + w), b2: 0, a1: (w - k) / (k + w), a2: 0 };
}

/** (1 + s/wz) / (1 + s/wp): unity at DC, falling 6 dB/octave above wp, flattening again above wz. */
function shelf(wp: number, wz: number, k: number): Biquad {
  const g = wp / wz / (k + wp);
  return { b0: (k + wz) * g, b1: (wz - k) * g, b2: 0, a1: (wp - k) / (k + wp), a2: 0 };
}

function sectionResponse(s: Biquad, w: number): { re: number; im: number } {
  // H(e^{jw}) = (b0 + b1 e^{-jw} + b2 e^{-2jw}) / (1 + a1 e^{-jw} + a2 e^{-2jw})
  const c1 = Math.cos(w);
  const s1 = Math.sin(w);
  const c2 = Math.cos(2 * w);
  const s2 = Math.sin(2 * w);
  const nr = s.b0 + s.b1 * c1 + s.b2 * c2;
  const ni = -(s.b1 * s1 + s.b2 * s2);
  const dr = 1 + s.a1 * c1 + s.a2 * c2;
  const di = -(s.a1 * s1 + s.a2 * s2);
  const d = dr * dr + di * di;
  return { re: (nr * dr + ni * di) / d, im: (ni * dr - nr * di) / d };
}

function magnitude(sections: Biquad[], hz: number, sampleRate: number): number {
  const w = (2 * Math.PI * hz) / sampleRate;
  let m = 1;
  for (const s of sections) {
    const h = sectionResponse(s, w);
    m *= Math.hypot(h.re, h.im);
  }
  return m;
}

/** The weighting filter for a deviation signal sampled at `sampleRate` (the demodulator's output rate). */
export function flutterWeighting(sampleRate: number): FlutterWeighting {
  const k = 2 * sampleRate;
  const p = FLUTTER_WEIGHTING_PROTOTYPE;
  const w = (hz: number) => 2 * Math.PI * hz;
  const sections = [
    highPass2(w(p.highPass2.hz), p.highPass2.q, k),
    highPass1(w(p.highPass1.hz), k),
    shelf(w(p.shelf.poleHz), w(p.shelf.zeroHz), k),
  ];
  return { sampleRate, sections, gain: 1 / magnitude(sections, 4, sampleRate) };
}

/** Gain of the digital filter at `hz`, dB re its gain at 4 Hz. */
export function flutterWeightingDb(weighting: FlutterWeighting, hz: number): number {
  return 20 * Math.log10(weighting.gain * magnitude(weighting.sections, hz, weighting.sampleRate));
}

/**
 * Filter `x` through the weighting. The high-pass poles near 0.6 Hz ring for seconds, so the filter is
 * first run over the opening `preRollS` seconds played backwards (a mirror image joins the record
 * without a jump) and the record proper starts from that settled state.
 */
export function applyFlutterWeighting(weighting: FlutterWeighting, x: Float64Array, preRollS = 3): Float64Array {
  const pre = Math.min(x.length - 1, Math.round(preRollS * weighting.sampleRate));
  const state = weighting.sections.map(() => ({ z1: 0, z2: 0 }));
  const step = (v: number): number => {
    let y = v * weighting.gain;
    weighting.sections.forEach((s, i) => {
      const st = state[i];
      const out = s.b0 * y + st.z1;
      st.z1 = s.b1 * y - s.a1 * out + st.z2;
      st.z2 = s.b2 * y - s.a2 * out;
      y = out;
    });
    return y;
  };
  for (let i = pre; i >= 1; i--) step(x[i]);
  const out = new Float64Array(x.length);
  for (let i = 0; i < x.length; i++) out[i] = step(x[i]);
  return out;
}
