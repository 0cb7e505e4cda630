// Pairing readings taken under the same conditions. A condition stated on one side only does not block a pair:
// sellers rarely repeat every condition on every row.
import type { Conditions, Reading } from "../schema";
import { QUANTITY_INFO } from "../quantities";
import { formatReadingValue, channelLabel } from "../describe";
import type { Item } from "./types";

/** Relative closeness: |a − b| ≤ tol · max(|a|, |b|). */
export function near(a: number, b: number, tol = 0.02): boolean {
  return Math.abs(a - b) <= tol * Math.max(Math.abs(a), Math.abs(b));
}

function compat(a: number | undefined, b: number | undefined, tol = 0.02): boolean {
  return a === undefined || b === undefined || near(a, b, tol);
}

export function channelsCompatible(a: Reading["channel"], b: Reading["channel"]): boolean {
  return a === b || a === undefined || b === undefined || a === "both" || b === "both";
}

type Key = "loadOhm" | "frequencyHz" | "powerW" | "voltageV" | "distortion" | "channelsDriven" | "weighting" | "speedRpm" | "testToneHz";

export function conditionsCompatible(a: Conditions | undefined, b: Conditions | undefined, keys: Key[]): boolean {
  const x = a ?? {};
  const y = b ?? {};
  for (const k of keys) {
    switch (k) {
      case "distortion":
        if (!compat(x.atDistortion?.ratio, y.atDistortion?.ratio, 0.05)) return false;
        break;
      case "channelsDriven":
      case "weighting":
        if (x[k] !== undefined && y[k] !== undefined && x[k] !== y[k]) return false;
        break;
      default:
        if (!compat(x[k], y[k], k === "powerW" || k === "voltageV" ? 0.05 : 0.02)) return false;
    }
  }
  return true;
}

export const ALL_KEYS: Key[] = [
  "loadOhm",
  "frequencyHz",
  "powerW",
  "voltageV",
  "distortion",
  "channelsDriven",
  "weighting",
  "speedRpm",
  "testToneHz",
];

/** "left output power 66 W" — short name for a reading inside a sentence. */
export function nameOf(r: Item): string {
  const ch = r.channel && r.channel !== "both" ? `${channelLabel(r.channel)} ` : "";
  return `${ch}${lowerFirst(QUANTITY_INFO[r.quantity].label)} ${formatReadingValue(r)}`;
}

export function pct(x: number, digits = 1): string {
  return `${Math.abs(x) >= 10 ? x.toFixed(0) : x.toFixed(digits)} %`;
}

/** "Output power" → "output power", but "THD+N" stays. */
export function lowerFirst(label: string): string {
  return /^[A-Z][a-z]/.test(label) ? label[0].toLowerCase() + label.slice(1) : label;
}

/** Groups by channel and keeps each channel's highest value; returns the weakest channel's best reading. */
export function weakestChannelBest(items: Item[]): Item | undefined {
  const best = new Map<string, Item>();
  for (const it of items) {
    const k = it.channel ?? "";
    const cur = best.get(k);
    if (!cur || it.value > cur.value) best.set(k, it);
  }
  let weakest: Item | undefined;
  for (const it of best.values()) if (!weakest || it.value < weakest.value) weakest = it;
  return weakest;
}
