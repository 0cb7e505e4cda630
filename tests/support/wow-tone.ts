import { prng } from "./capture-files";

// Test tones for wow & flutter: a carrier frequency-modulated by a sine, with an optional speed offset,
// a linear speed ramp, mains hum and white noise. The phase is written in closed form, so the tone's
// instantaneous frequency is exactly what the spec says:
// f(t) = carrier · (1 + offset + ramp · t / seconds) + deviationHz · sin(2π · rateHz · t).
export interface WowToneSpec {
  sampleRate?: number;
  seconds?: number;
  carrierHz: number;
  /** Peak frequency deviation, Hz. */
  deviationHz?: number;
  /** Modulation rate, Hz. */
  rateHz?: number;
  /** Speed offset as a fraction: 0.005 = 0.5 % fast. */
  offset?: number;
  /** Speed change over the whole tone as a fraction. */
  ramp?: number;
  amplitude?: number;
  /** 50 Hz hum amplitude re the tone. */
  hum?: number;
  /** White noise peak amplitude re the tone. */
  noise?: number;
}

export function wowToneSamples(s: WowToneSpec): Float64Array {
  const fs = s.sampleRate ?? 48_000;
  const seconds = s.seconds ?? 10;
  const n = Math.round(fs * seconds);
  const a = s.amplitude ?? 0.5;
  const fc = s.carrierHz * (1 + (s.offset ?? 0));
  const dev = s.deviationHz ?? 0;
  const fm = s.rateHz ?? 4;
  const ramp = (s.carrierHz * (s.ramp ?? 0)) / seconds;
  const rnd = prng(7);
  const x = new Float64Array(n);
  for (let i = 0; i < n; i++) {
    const t = i / fs;
    // Cycles so far, ∫ f dt: carrier, ramp · t² / 2, and Δ / (2π fm) · (1 − cos 2π fm t) for the sine.
    const cycles = fc * t + (ramp * t * t) / 2 + (dev / (2 * Math.PI * fm)) * (1 - Math.cos(2 * Math.PI * fm * t));
    let v = Math.sin(2 * Math.PI * cycles);
    if (s.hum) v += s.hum * Math.sin(2 * Math.PI * 50 * t);
    if (s.noise) v += s.noise * 2 * (rnd() - 0.5);
    x[i] = a * v;
  }
  return x;
}
