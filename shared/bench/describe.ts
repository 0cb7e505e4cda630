// Readings and conditions in words, as listings and verdicts show them:
// "66 W into 8 Ω, 1 kHz, 0.1 % THD, both channels driven".
import { QUANTITY_INFO } from "./quantities";
import { WEIGHTING_LABELS, type Conditions, type Reading } from "./schema";
import { unitKind } from "./units";
import { formatValue } from "./format";

/** The reading's value in the unit it was typed in ("80 Vpp", "-80 dB", "0.010 %"), falling back to a chosen unit. */
export function formatReadingValue(r: Pick<Reading, "quantity" | "value" | "unit">): string {
  const info = QUANTITY_INFO[r.quantity];
  if (r.unit && unitKind(r.unit, info.kind) === info.kind) {
    const signed = info.signed && info.kind !== "voltage";
    return formatValue(r.value, info.kind, { unit: r.unit, signed });
  }
  return formatValue(r.value, info.kind, { form: info.dc ? "dc" : undefined, signed: info.signed });
}

const hz = (f: number) => formatValue(f, "frequency");
const range = (r: { lowHz: number; highHz: number }) => `${hz(r.lowHz)}–${hz(r.highHz)}`;

/** Conditions in the trade's order: load, frequency, level, distortion limit, bandwidth, weighting, channels, tone, speed, mains, warm-up. */
export function describeConditions(c: Conditions | undefined): string {
  if (!c) return "";
  const parts: string[] = [];
  if (c.loadOhm !== undefined) parts.push(`into ${formatValue(c.loadOhm, "resistance")}`);
  if (c.frequencyHz !== undefined) parts.push(hz(c.frequencyHz));
  if (c.frequencyRange) parts.push(range(c.frequencyRange));
  if (c.powerW !== undefined) parts.push(`at ${formatValue(c.powerW, "power")}`);
  if (c.voltageV !== undefined) parts.push(`at ${formatValue(c.voltageV, "voltage")}`);
  if (c.atDistortion)
    parts.push(`${formatValue(c.atDistortion.ratio, "ratio", { trimZeros: true })} ${c.atDistortion.measure === "thd" ? "THD" : "THD+N"}`);
  if (c.bandwidth) parts.push(`${range(c.bandwidth)} bandwidth`);
  if (c.weighting) parts.push(WEIGHTING_LABELS[c.weighting]);
  if (c.channelsDriven) parts.push(c.channelsDriven === "one" ? "one channel driven" : `${c.channelsDriven} channels driven`);
  if (c.testToneHz !== undefined) parts.push(`${hz(c.testToneHz)} test tone`);
  if (c.distanceM !== undefined) parts.push(`at ${formatNumberPlain(c.distanceM)} m`);
  if (c.speedRpm !== undefined) parts.push(`${formatNumberPlain(c.speedRpm)} rpm`);
  if (c.tapeSpeedCmS !== undefined) parts.push(`${formatNumberPlain(c.tapeSpeedCmS)} cm/s`);
  if (c.supply === "single") parts.push("single supply");
  if (c.sourceOhm !== undefined) parts.push(`${formatValue(c.sourceOhm, "resistance")} source`);
  if (c.temperatureC !== undefined) parts.push(`${formatNumberPlain(c.temperatureC)} °C`);
  if (c.mainsV !== undefined) parts.push(`${formatNumberPlain(c.mainsV)} V mains`);
  if (c.warmUpS !== undefined) parts.push(`after ${formatValue(c.warmUpS / 60, "number")} min warm-up`);
  return parts.join(", ");
}

function formatNumberPlain(n: number): string {
  return formatValue(n, "number");
}

export function channelLabel(ch: Reading["channel"]): string {
  return ch === "left" ? "left" : ch === "right" ? "right" : ch === "both" ? "both channels" : ch === "mono" ? "mono" : "";
}

/** "Output power, left: 66 W into 8 Ω, 1 kHz, 0.1 % THD, both channels driven (measured)". */
export function describeReading(r: Reading): string {
  const head = QUANTITY_INFO[r.quantity].label + (r.channel ? `, ${channelLabel(r.channel)}` : "");
  const cond = describeConditions(r.conditions);
  const from = r.origin === "capture" ? "measured, from a capture" : r.basis;
  const join = /^(into|at) /.test(cond) ? " " : ", ";
  return `${head}: ${formatReadingValue(r)}${cond ? join + cond : ""} (${from})`;
}
