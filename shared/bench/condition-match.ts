import type { Conditions } from "./schema";

// How two figures' conditions are told the same or apart, for the compare view (listing against
// listing) and the buyer's re-measurement (a reading against the listed one): one list of names
// and one matching rule, each with the tolerance its use calls for.

/** Each condition as a sentence names it ("the figures differ in load"). */
export const CONDITION_NAMES: Record<keyof Conditions, string> = {
  loadOhm: "load",
  frequencyHz: "test frequency",
  frequencyRange: "frequency range",
  powerW: "output level",
  voltageV: "signal level",
  atDistortion: "distortion limit",
  bandwidth: "measurement bandwidth",
  weighting: "weighting",
  channelsDriven: "channels driven",
  mainsV: "mains voltage",
  warmUpS: "warm-up",
  testToneHz: "test tone",
  distanceM: "measuring distance",
  speedRpm: "platter speed",
  tapeSpeedCmS: "tape speed",
  supply: "supply",
  sourceOhm: "source impedance",
  temperatureC: "temperature",
};

/**
 * Whether two values of one condition are the same: numbers within `relative` of the larger, objects
 * key by key, anything else exactly. A stated condition never matches an unstated one.
 */
export function sameConditionValue(a: unknown, b: unknown, relative: number): boolean {
  if (a === undefined || b === undefined) return a === b;
  if (typeof a === "number" && typeof b === "number") return Math.abs(a - b) <= relative * Math.max(Math.abs(a), Math.abs(b));
  if (typeof a === "object" && typeof b === "object" && a !== null && b !== null) {
    const keys = new Set([...Object.keys(a), ...Object.keys(b)]);
    return [...keys].every((k) => sameConditionValue(Reflect.get(a, k), Reflect.get(b, k), relative));
  }
  return a === b;
}
