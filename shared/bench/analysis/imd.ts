// Intermodulation distortion from a two-tone capture, by the two methods of IEC 60268-3:
// - "smpte", the modulation method (SMPTE RP120; IEC 60268-3 modulation distortion): a strong low tone
//   f1 (60 Hz) and a weak high tone f2 (7 kHz) at 4:1. Each order's pair of sidebands around f2 is
//   summed in amplitude (the pair is one amplitude modulation), the orders are combined as rms:
//     d_m2 = (U(f2−f1) + U(f2+f1)) / U(f2),  d_m3 = (U(f2−2f1) + U(f2+2f1)) / U(f2),
//     d_m  = √(d_m2² + d_m3²).
//   An AM of depth m puts m/2 in each first sideband, so it reads d_m = m.
// - "dfd", the difference-frequency method (IEC 60268-3 difference-frequency distortion): two equal
//   tones f1 < f2 (19 + 20 kHz), each product referred to twice the amplitude of f2:
//     d_2 = U(f2−f1) / (2·U(f2)),  d_3 = (U(2f1−f2) + U(2f2−f1)) / (2·U(f2)).
import { CaptureError } from "./errors";
import { powerSpectrum, type PowerSpectrum } from "./spectrum";
import { middleStretch, needSpacing, noisePerZone, strongestTone, toneRms } from "./tones";
import { dB, fig, peakVoltsPerFullScale, type CaptureScale, type Figure } from "./types";

export type ImdMethod = "smpte" | "dfd";

export const IMD_TONES: Record<ImdMethod, { lowHz: number; highHz: number; ratio: number }> = {
  smpte: { lowHz: 60, highHz: 7000, ratio: 4 },
  dfd: { lowHz: 19_000, highHz: 20_000, ratio: 1 },
};

/** Sideband pairs kept in the analysis for the plot; the figure uses the orders its definition names. */
const SMPTE_PAIRS = 4;

export interface ImdConditions {
  method: ImdMethod;
  lowToneHz?: number;
  highToneHz?: number;
  /** For levels in volts; without it the analysis gives ratios only. */
  scale?: CaptureScale;
  loadOhms?: number;
}

export interface ImdProduct {
  /** Order of the product (2: f2±f1 or f2−f1; 3: f2±2f1 or 2f1−f2, 2f2−f1). */
  order: number;
  frequency: Figure<"Hz">;
  /** Relative to the high tone's amplitude, dB. */
  relativeDb: Figure<"dB">;
}

export interface ImdChannelAnalysis {
  channel: string;
  lowTone: { frequency: Figure<"Hz">; rmsFs: number };
  highTone: { frequency: Figure<"Hz">; rmsFs: number };
  /** Measured amplitude ratio low : high (4 for SMPTE, 1 for DFD). */
  amplitudeRatio: number;
  products: ImdProduct[];
  /** d_m2 / d_2 and d_m3 / d_3 as ratios. */
  second: number;
  third: number;
  /** The figure the method reports: d_m for SMPTE, d_2 for DFD. */
  imd: { ratio: number; percent: Figure<"%">; db: Figure<"dB"> };
  /** Rms volts of a sine with the same peak as the two tones together (the level IEC 60268-3 states); null without a scale. */
  equivalentSineRms: Figure<"V"> | null;
  power: Figure<"W"> | null;
}

export interface ImdAnalysis {
  kind: "imd";
  channels: ImdChannelAnalysis[];
  skipped: { channel: string; error: string; message: string }[];
  conditions: {
    method: ImdMethod;
    lowToneHz: number;
    highToneHz: number;
    sampleRate: number;
    secondsAnalysed: number;
    fftSize: number;
    loadOhms: number | null;
    definition: string;
  };
}

export const IMD_DEFINITIONS: Record<ImdMethod, string> = {
  smpte: "IEC 60268-3 modulation distortion (SMPTE RP120): d_m = √(d_m2² + d_m3²), each order's sideband pair summed, relative to U(f2)",
  dfd: "IEC 60268-3 difference-frequency distortion: d_2 = U(f2−f1) / (2·U(f2)); d_3 = (U(2f1−f2) + U(2f2−f1)) / (2·U(f2))",
};

function findTone(spec: PowerSpectrum, statedHz: number, which: string, noise: number): number {
  // ±2 %: the DFD tones are only 5 % apart.
  const t = strongestTone(spec, statedHz * 0.98, statedHz * 1.02);
  if (!t || !(t.power > 1000 * noise) || t.power < 1e-14) {
    throw new CaptureError("no_fundamental", `No ${which} tone found within ±2 % of ${statedHz} Hz standing 30 dB clear of the noise.`, {
      statedHz,
    });
  }
  return t.hz;
}

export function analyseImdChannel(samples: Float64Array, sampleRate: number, channel: string, c: ImdConditions): ImdChannelAnalysis {
  const defaults = IMD_TONES[c.method];
  const statedLow = c.lowToneHz ?? defaults.lowHz;
  const statedHigh = c.highToneHz ?? defaults.highHz;
  const nyquist = sampleRate / 2;
  const top = c.method === "smpte" ? statedHigh + 2 * statedLow : 2 * statedHigh - statedLow;
  if (top * 1.02 >= nyquist) {
    throw new CaptureError(
      "unsupported_format",
      `A ${sampleRate} Hz capture cannot hold the ${top.toFixed(0)} Hz product this test reads; capture at a higher rate.`,
      {
        sampleRate,
      },
    );
  }
  const spec = powerSpectrum(middleStretch(samples), sampleRate, "blackman-harris-7");
  needSpacing(spec, Math.min(statedLow, statedHigh - statedLow), "the tone and its intermodulation products");
  const noise = noisePerZone(spec, 20, Math.min(nyquist, 2 * statedHigh));
  const f1 = findTone(spec, statedLow, "low", noise);
  const f2 = findTone(spec, statedHigh, "high", noise);
  const u1 = toneRms(spec, f1);
  const u2 = toneRms(spec, f2);
  const rel = (u: number) => fig(dB(u / u2), "dB");
  const products: ImdProduct[] = [];
  let second = 0;
  let third = 0;
  if (c.method === "smpte") {
    for (let n = 1; n <= SMPTE_PAIRS; n++) {
      const below = f2 - n * f1;
      const above = f2 + n * f1;
      const ub = below > 0 ? toneRms(spec, below) : 0;
      const ua = above < nyquist * 0.98 ? toneRms(spec, above) : 0;
      products.push(
        { order: n + 1, frequency: fig(below, "Hz"), relativeDb: rel(ub) },
        { order: n + 1, frequency: fig(above, "Hz"), relativeDb: rel(ua) },
      );
      if (n === 1) second = (ub + ua) / u2;
      if (n === 2) third = (ub + ua) / u2;
    }
  } else {
    const d = f2 - f1;
    const ud = toneRms(spec, d);
    const u3lo = toneRms(spec, 2 * f1 - f2);
    const u3hi = toneRms(spec, 2 * f2 - f1);
    products.push(
      { order: 2, frequency: fig(d, "Hz"), relativeDb: rel(ud) },
      { order: 3, frequency: fig(2 * f1 - f2, "Hz"), relativeDb: rel(u3lo) },
      { order: 3, frequency: fig(2 * f2 - f1, "Hz"), relativeDb: rel(u3hi) },
    );
    second = ud / (2 * u2);
    third = (u3lo + u3hi) / (2 * u2);
  }
  const ratio = c.method === "smpte" ? Math.hypot(second, third) : second;
  // The two tones' peaks coincide now and then: the composite's peak is the sum of their amplitudes.
  const peakFs = (u1 + u2) * Math.SQRT2;
  const vrms = c.scale ? (peakFs * peakVoltsPerFullScale(c.scale)) / Math.SQRT2 : null;
  return {
    channel,
    lowTone: { frequency: fig(f1, "Hz"), rmsFs: u1 },
    highTone: { frequency: fig(f2, "Hz"), rmsFs: u2 },
    amplitudeRatio: u1 / u2,
    products,
    second,
    third,
    imd: { ratio, percent: fig(100 * ratio, "%"), db: fig(dB(ratio), "dB") },
    equivalentSineRms: vrms === null ? null : fig(vrms, "V"),
    power: vrms !== null && c.loadOhms ? fig((vrms * vrms) / c.loadOhms, "W") : null,
  };
}

/** Every channel that holds both tones; a silent side of a stereo file is skipped, as the sine analysis does. */
export function analyseImd(channels: Float64Array[], sampleRate: number, c: ImdConditions, labels?: string[]): ImdAnalysis {
  const names = labels ?? (channels.length === 1 ? ["mono"] : ["left", "right"]);
  const out: ImdChannelAnalysis[] = [];
  const skipped: ImdAnalysis["skipped"] = [];
  let first: CaptureError | null = null;
  for (const [i, x] of channels.entries()) {
    try {
      out.push(analyseImdChannel(x, sampleRate, names[i] ?? `ch${i + 1}`, c));
    } catch (e) {
      if (!(e instanceof CaptureError) || e.code !== "no_fundamental" || channels.length === 1) throw e;
      first ??= e;
      skipped.push({ channel: names[i], error: e.code, message: e.message });
    }
  }
  if (out.length === 0) throw first ?? new CaptureError("no_fundamental", "The capture has no channels.");
  const n = Math.min(channels[0].length, 1 << 20);
  let fftSize = 2;
  while (fftSize < n) fftSize *= 2;
  const t = IMD_TONES[c.method];
  return {
    kind: "imd",
    channels: out,
    skipped,
    conditions: {
      method: c.method,
      lowToneHz: c.lowToneHz ?? t.lowHz,
      highToneHz: c.highToneHz ?? t.highHz,
      sampleRate,
      secondsAnalysed: n / sampleRate,
      fftSize,
      loadOhms: c.loadOhms ?? null,
      definition: IMD_DEFINITIONS[c.method],
    },
  };
}
