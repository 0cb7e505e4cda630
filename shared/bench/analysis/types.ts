// Every figure carries its unit; every analysis carries the conditions it ran under.

export interface Figure<U extends string = string> {
  value: number;
  unit: U;
}

export const fig = <U extends string>(value: number, unit: U): Figure<U> => ({ value, unit });

/**
 * How a sample value maps to volts at the unit's output.
 * - "volts-per-full-scale": a digital full-scale sample (±1.0) stands for `volts` at the unit's output,
 *   read as the peak, or as the rms of a sine that just reaches full scale.
 * - "analyser": the analyser's own full scale (`fullScaleVolts`, peak or rms of a full-scale sine) at its
 *   input, behind an attenuator or probe of ratio `attenuation` (unit output ÷ analyser input; 1 = direct,
 *   10 = a 10:1 divider).
 */
export type CaptureScale =
  | { kind: "volts-per-full-scale"; volts: number; basis: "peak" | "rms" }
  | { kind: "analyser"; fullScaleVolts: number; basis: "peak" | "rms"; attenuation: number };

/** Peak volts at the unit's output that a full-scale sample stands for. */
export function peakVoltsPerFullScale(scale: CaptureScale): number {
  const rmsToPeak = scale.basis === "rms" ? Math.SQRT2 : 1;
  return scale.kind === "volts-per-full-scale" ? scale.volts * rmsToPeak : scale.fullScaleVolts * rmsToPeak * scale.attenuation;
}

export const dB = (ratio: number): number => 20 * Math.log10(ratio);
export const dBPower = (ratio: number): number => 10 * Math.log10(ratio);
