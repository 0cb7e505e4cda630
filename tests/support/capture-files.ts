import wavefile from "wavefile";

// Capture files for the bench tests, synthesised in the test itself with wavefile.

const { WaveFile } = wavefile as unknown as {
  WaveFile: new () => {
    fromScratch(channels: number, sampleRate: number, bitDepth: string, samples: ArrayLike<number>[] | ArrayLike<number>): void;
    toBuffer(): Uint8Array;
    toALaw(): void;
  };
};

export type WavBits = "8" | "16" | "24" | "32" | "32f";

/** Deterministic noise source (mulberry32), so a failing test fails the same way twice. */
export function prng(seed: number): () => number {
  let a = seed >>> 0;
  return () => {
    a = (a + 0x6d2b79f5) >>> 0;
    let t = a;
    t = Math.imul(t ^ (t >>> 15), t | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
}

export interface ToneSpec {
  sampleRate: number;
  seconds: number;
  /** Fundamental, Hz. */
  f0: number;
  /** Amplitudes of harmonics 1, 2, 3 … relative to the fundamental (1 first). */
  harmonics?: number[];
  /** Other tones: [frequency Hz, amplitude relative to the fundamental]. */
  extra?: [number, number][];
  /** Fundamental peak as a fraction of full scale. */
  peak: number;
  /** Second channel's level relative to the first (stereo only). */
  rightGain?: number;
  /** White noise, rms as a fraction of full scale (seeded, so repeatable). */
  noiseRms?: number;
}

/** The tone as samples scaled to full scale ±1. */
export function toneSamples(s: ToneSpec): Float64Array {
  const n = Math.round(s.sampleRate * s.seconds);
  const x = new Float64Array(n);
  const h = s.harmonics ?? [1];
  const w = (2 * Math.PI) / s.sampleRate;
  for (let i = 0; i < n; i++) {
    let v = 0;
    for (let k = 0; k < h.length; k++) if (h[k]) v += h[k] * Math.sin(w * (k + 1) * s.f0 * i + 0.7 * k);
    for (const [f, a] of s.extra ?? []) v += a * Math.sin(w * f * i + 0.3);
    x[i] = v * s.peak;
  }
  if (s.noiseRms) {
    const r = prng(77);
    const k = s.noiseRms * Math.sqrt(12);
    for (let i = 0; i < n; i++) x[i] += (r() - 0.5) * k;
  }
  return x;
}

/** Full-scale samples to the integer codes (or floats) of a bit depth, with TPDF dither on integers. */
export function toCodes(x: Float64Array, bits: WavBits, seed = 1): ArrayLike<number> {
  if (bits === "32f") return Float32Array.from(x);
  const b = Number(bits);
  const scale = 2 ** (b - 1);
  const rnd = prng(seed);
  const out = new Float64Array(x.length);
  for (let i = 0; i < x.length; i++) {
    const dither = b < 32 ? rnd() - rnd() : 0;
    const v = Math.round(x[i] * scale + dither);
    out[i] = Math.max(-scale, Math.min(scale - 1, v)) + (b === 8 ? 128 : 0);
  }
  return out;
}

export function wavFromSamples(channels: Float64Array[], sampleRate: number, bits: WavBits, seed = 1): Uint8Array {
  const w = new WaveFile();
  const codes = channels.map((c, i) => toCodes(c, bits, seed + i));
  w.fromScratch(channels.length, sampleRate, bits, channels.length === 1 ? codes[0] : codes);
  return w.toBuffer();
}

export function toneWav(spec: ToneSpec & { bits: WavBits; channels: 1 | 2; seed?: number }): Uint8Array {
  const left = toneSamples(spec);
  const chans = spec.channels === 1 ? [left] : [left, left.map((v) => v * (spec.rightGain ?? 1))];
  return wavFromSamples(chans, spec.sampleRate, spec.bits, spec.seed);
}

/**
 * A 16-bit mono WAV lasting `seconds`, made by lengthening a short wavefile WAV with silence and
 * rewriting the RIFF and data sizes (wavefile alone takes seconds to pack a minute of audio).
 */
export function longSilentWav(seconds: number, sampleRate = 44_100): Uint8Array {
  const head = wavFromSamples([new Float64Array(16)], sampleRate, "16");
  const dataBytes = Math.round(seconds * sampleRate) * 2;
  const out = new Uint8Array(44 + dataBytes);
  out.set(head.subarray(0, 44));
  const v = new DataView(out.buffer);
  v.setUint32(4, 36 + dataBytes, true); // RIFF size
  v.setUint32(40, dataBytes, true); // data size (wavefile writes a plain 44-byte header)
  return out;
}

/** An A-law WAV (format code 6) of a 1 kHz tone. */
export function aLawWav(): Uint8Array {
  const w = new WaveFile();
  w.fromScratch(1, 48_000, "16", toCodes(toneSamples({ sampleRate: 48_000, seconds: 0.5, f0: 1000, peak: 0.5 }), "16"));
  w.toALaw();
  return w.toBuffer();
}

/** A valid 16-bit WAV whose format code is rewritten, e.g. 0x55 for MP3 inside a WAV container. */
export function wavWithFormatCode(code: number): Uint8Array {
  const bytes = toneWav({ sampleRate: 48_000, seconds: 0.5, f0: 1000, peak: 0.5, bits: "16", channels: 1 });
  const out = Uint8Array.from(bytes);
  // RIFF header (12 bytes), then "fmt " id and size (8 bytes): the format code is at byte 20.
  new DataView(out.buffer).setUint16(20, code, true);
  return out;
}

/** The first bytes of an MP3 file: an ID3v2 tag, then an MPEG-1 Layer III frame header. */
export function mp3Bytes(): Uint8Array {
  const id3 = [0x49, 0x44, 0x33, 0x04, 0x00, 0x00, 0x00, 0x00, 0x00, 0x00];
  const frame = [0xff, 0xfb, 0x90, 0x64];
  const out = new Uint8Array(4096);
  out.set(id3, 0);
  out.set(frame, id3.length);
  return out;
}

/** A bare MPEG frame sync with no ID3 tag. */
export function mp3FrameOnly(): Uint8Array {
  const out = new Uint8Array(2048);
  out.set([0xff, 0xfb, 0x90, 0x64], 0);
  return out;
}

/** `time,volts` rows of a single-pole (RC) response to a square wave, sampled exactly. */
export function singlePoleSquareCsv({
  f3dB,
  period,
  dt,
  cycles = 2,
  low = -1,
  high = 1,
}: {
  f3dB: number;
  period: number;
  dt: number;
  cycles?: number;
  low?: number;
  high?: number;
}): string {
  const tau = 1 / (2 * Math.PI * f3dB);
  const n = Math.round((cycles * period) / dt);
  const a = Math.exp(-dt / tau);
  const rows = ["time,volts"];
  let y = low;
  for (let i = 0; i < n; i++) {
    const t = i * dt;
    const target = Math.floor(t / (period / 2)) % 2 === 0 ? high : low;
    if (i > 0) y = target + (y - target) * a;
    rows.push(`${t.toExponential(9)},${y.toPrecision(12)}`);
  }
  return rows.join("\n");
}
