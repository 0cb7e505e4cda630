// How far a buyer's re-measurement may sit from the listing's bench sheet and still be "the same figure",
// and which conditions both must share before they are compared at all. Published figures where the
// trade has them; the rest is common practice, and says why (docs/remeasurement.md has the table).
import type { Quantity } from "./quantities";
import type { Conditions } from "./schema";

/**
 * - `db`: the two values may differ by this many dB (power as 10·log10, voltages and other linear
 *   amplitudes as 20·log10, figures already in dB by plain subtraction).
 * - `factor`: the larger may be at most this many times the smaller (distortion varies by multiples).
 * - `points`: plain difference in base units (speed error 0.003 = 0.3 percentage points; dB figures).
 * - `relative`: plain difference as a fraction of the listed value.
 * - `none`: not a figure a buyer re-measures (a rating such as power handling).
 */
export type Tolerance =
  | { kind: "db"; db: number; scale: 10 | 20 }
  | { kind: "factor"; factor: number }
  | { kind: "points"; amount: number }
  | { kind: "relative"; fraction: number }
  | { kind: "none" };

export interface RemeasureRule {
  tolerance: Tolerance;
  /** The tolerance in words, e.g. "±0.5 dB (about ±12 %)". */
  toleranceText: string;
  /** The standard the tolerance rests on, or "Common practice: <why>". */
  source: string;
  /** Conditions both readings must state alike; a condition stated on one side only keeps them apart. */
  conditions: readonly (keyof Conditions)[];
  /** Which way is better for the buyer; null where neither is (gain, balance). Rated figures are limits in this direction. */
  better: "higher" | "lower" | "nearer_zero" | null;
}

// Conditions a power claim must state (US FTC amplifier rule, 16 CFR 432.2: load, power band, distortion, channels driven).
const POWER_CONDITIONS: (keyof Conditions)[] = ["loadOhm", "frequencyHz", "frequencyRange", "atDistortion", "channelsDriven"];
const DISTORTION_CONDITIONS: (keyof Conditions)[] = ["loadOhm", "frequencyHz", "powerW", "voltageV", "bandwidth"];
const NOISE_CONDITIONS: (keyof Conditions)[] = ["weighting", "bandwidth", "powerW", "voltageV", "loadOhm", "tapeSpeedCmS"];
const RESPONSE_CONDITIONS: (keyof Conditions)[] = ["loadOhm", "powerW", "voltageV", "tapeSpeedCmS"];
const TRANSPORT_CONDITIONS: (keyof Conditions)[] = ["weighting", "speedRpm", "tapeSpeedCmS", "testToneHz"];

const MAINS_AND_LOAD =
  "Common practice: the supply rails follow the mains, which may sit a few percent off nominal at the buyer's socket (power goes with the square of the rail), and dummy loads and meters add a few percent each";
const DISTORTION_SPREAD =
  "Common practice: distortion readings vary by multiples between analysers, with mains harmonics, earth loops and the analyser's own residual, so a factor and not a percentage";
const NOISE_SPREAD =
  "Common practice: hum and noise move with earthing, cable routing and the analyser's own floor, even at the same weighting and bandwidth";
const CORNER_SPREAD =
  "Common practice: near a −3 dB point the response falls about 3 dB per octave, so a 0.5 dB level error moves the reading by a sixth of an octave; a third of an octave allows for that and for generator flatness";
const SMALL_LEVEL =
  "Common practice: two calibrated level measurements of one unit agree to a few tenths of a dB when load and level match";
const METER_SPREAD =
  "Common practice: resistance and impedance meters and test leads agree to about a tenth on loudspeaker and input impedances";
const TINY_RESISTANCE =
  "Common practice: output impedances of a few tens of milliohms are small differences of large voltages, and cables and contacts add as much again";
const TRANSPORT_SPREAD =
  "Common practice: test records and tapes carry their own speed and eccentricity errors of about 0.1 %, and synchronous motors follow the mains frequency";
const WOW_SPREAD =
  "Common practice: wow & flutter moves with the test record's eccentricity, the belt's warm-up and the meter's detector, even at the same weighting (IEC 60386 weighted peak and WRMS are not the same reading)";

const DB = (db: number, scale: 10 | 20): Tolerance => ({ kind: "db", db, scale });

export const REMEASURE_RULES: Record<Quantity, RemeasureRule> = {
  output_power: {
    tolerance: DB(0.5, 10),
    toleranceText: "±0.5 dB (about −11 % / +12 %)",
    source: MAINS_AND_LOAD,
    conditions: POWER_CONDITIONS,
    better: "higher",
  },
  output_voltage: {
    tolerance: DB(0.25, 20),
    toleranceText: "±0.25 dB (about ±3 %), the voltage behind ±0.5 dB of power",
    source: MAINS_AND_LOAD,
    conditions: POWER_CONDITIONS,
    better: "higher",
  },
  thd: {
    tolerance: { kind: "factor", factor: 2 },
    toleranceText: "a factor of 2",
    source: DISTORTION_SPREAD,
    conditions: DISTORTION_CONDITIONS,
    better: "lower",
  },
  thd_n: {
    tolerance: { kind: "factor", factor: 2 },
    toleranceText: "a factor of 2",
    source: DISTORTION_SPREAD,
    conditions: DISTORTION_CONDITIONS,
    better: "lower",
  },
  imd: {
    tolerance: { kind: "factor", factor: 2 },
    toleranceText: "a factor of 2",
    source: DISTORTION_SPREAD,
    conditions: DISTORTION_CONDITIONS,
    better: "lower",
  },
  snr: {
    tolerance: { kind: "points", amount: 3 },
    toleranceText: "±3 dB",
    source: NOISE_SPREAD,
    conditions: NOISE_CONDITIONS,
    better: "higher",
  },
  noise: { tolerance: DB(3, 20), toleranceText: "±3 dB", source: NOISE_SPREAD, conditions: NOISE_CONDITIONS, better: "lower" },
  response_deviation: {
    tolerance: { kind: "points", amount: 0.5 },
    toleranceText: "±0.5 dB",
    source: SMALL_LEVEL,
    conditions: ["frequencyRange", ...RESPONSE_CONDITIONS],
    better: "lower",
  },
  f3db_low: {
    tolerance: { kind: "factor", factor: 2 ** (1 / 3) },
    toleranceText: "a third of an octave (×1.26)",
    source: CORNER_SPREAD,
    conditions: RESPONSE_CONDITIONS,
    better: "lower",
  },
  f3db_high: {
    tolerance: { kind: "factor", factor: 2 ** (1 / 3) },
    toleranceText: "a third of an octave (×1.26)",
    source: CORNER_SPREAD,
    conditions: RESPONSE_CONDITIONS,
    better: "higher",
  },
  power_bandwidth: {
    tolerance: { kind: "factor", factor: 2 ** (1 / 3) },
    toleranceText: "a third of an octave (×1.26)",
    source: CORNER_SPREAD,
    conditions: ["loadOhm", "atDistortion", "powerW"],
    better: "higher",
  },
  rise_time: {
    tolerance: { kind: "factor", factor: 1.25 },
    toleranceText: "a factor of 1.25",
    source:
      "Common practice: the oscilloscope's own rise time and the generator's edge add to the reading (they add roughly as root-sum-of-squares)",
    conditions: ["loadOhm", "voltageV"],
    better: "lower",
  },
  slew_rate: {
    tolerance: { kind: "factor", factor: 1.25 },
    toleranceText: "a factor of 1.25",
    source: "Common practice: read off an oscilloscope trace by eye; the edge's straight part is a judgement",
    conditions: ["loadOhm"],
    better: "higher",
  },
  damping_factor: {
    tolerance: { kind: "factor", factor: 1.5 },
    toleranceText: "a factor of 1.5",
    source: TINY_RESISTANCE,
    conditions: ["loadOhm", "frequencyHz"],
    better: "higher",
  },
  output_impedance: {
    tolerance: { kind: "factor", factor: 1.5 },
    toleranceText: "a factor of 1.5",
    source: TINY_RESISTANCE,
    conditions: ["frequencyHz"],
    better: "lower",
  },
  input_impedance: {
    tolerance: { kind: "relative", fraction: 0.1 },
    toleranceText: "±10 %",
    source: METER_SPREAD,
    conditions: ["frequencyHz"],
    better: null,
  },
  input_sensitivity: {
    tolerance: DB(0.5, 20),
    toleranceText: "±0.5 dB",
    source: SMALL_LEVEL,
    conditions: ["loadOhm", "powerW", "voltageV", "frequencyHz"],
    better: null,
  },
  gain: {
    tolerance: { kind: "points", amount: 0.5 },
    toleranceText: "±0.5 dB",
    source: SMALL_LEVEL,
    conditions: ["loadOhm", "frequencyHz"],
    better: null,
  },
  channel_balance: {
    tolerance: { kind: "points", amount: 0.5 },
    toleranceText: "±0.5 dB",
    source: SMALL_LEVEL,
    conditions: ["frequencyHz", "voltageV", "powerW"],
    better: "nearer_zero",
  },
  crosstalk: {
    tolerance: { kind: "points", amount: 3 },
    toleranceText: "±3 dB",
    source: NOISE_SPREAD,
    conditions: ["frequencyHz", "loadOhm"],
    better: "higher",
  },
  rail_voltage: {
    tolerance: { kind: "relative", fraction: 0.05 },
    toleranceText: "±5 %",
    source: "Common practice: unregulated rails follow the mains at the buyer's socket",
    conditions: ["supply"],
    better: null,
  },
  dc_offset: {
    tolerance: { kind: "points", amount: 0.01 },
    toleranceText: "±10 mV",
    source: "Common practice: output offset drifts by millivolts as the unit warms up",
    conditions: [],
    better: "nearer_zero",
  },
  oscillation: {
    tolerance: { kind: "relative", fraction: 0.2 },
    toleranceText: "±20 %",
    source: "Common practice: a parasitic oscillation moves with the load, the cable and the unit's temperature",
    conditions: ["loadOhm"],
    better: null,
  },
  riaa_deviation: {
    tolerance: { kind: "points", amount: 0.5 },
    toleranceText: "±0.5 dB",
    source: `${SMALL_LEVEL}; the RIAA curve itself is exact (IEC 60098 time constants 3180, 318 and 75 µs)`,
    conditions: ["frequencyRange"],
    better: "lower",
  },
  overload_margin: {
    tolerance: { kind: "points", amount: 1 },
    toleranceText: "±1 dB",
    source: "Common practice: the clipping point is read by eye on a trace or by a distortion threshold",
    conditions: ["frequencyHz"],
    better: "higher",
  },
  nominal_impedance: {
    tolerance: { kind: "none" },
    toleranceText: "—",
    source: "A rating, not a measurement: compare the impedance minimum instead",
    conditions: [],
    better: null,
  },
  impedance_minimum: {
    tolerance: { kind: "relative", fraction: 0.1 },
    toleranceText: "±10 %",
    source: METER_SPREAD,
    conditions: [],
    better: "higher",
  },
  sensitivity: {
    tolerance: { kind: "points", amount: 1.4 },
    toleranceText: "±1.4 dB",
    source:
      "IEC 61672-1:2013 Table 3: a class 1 sound level meter may read ±0.7 dB off at 1 kHz; two meters (the workshop's and the buyer's) may differ by twice that",
    conditions: ["distanceM", "voltageV", "powerW"],
    better: "higher",
  },
  power_handling: {
    tolerance: { kind: "none" },
    toleranceText: "—",
    source: "A rating, not a figure a buyer re-measures",
    conditions: [],
    better: null,
  },
  speed_error: {
    tolerance: { kind: "points", amount: 0.003 },
    toleranceText: "±0.3 percentage points",
    source: TRANSPORT_SPREAD,
    conditions: TRANSPORT_CONDITIONS,
    better: "nearer_zero",
  },
  wow_flutter: {
    tolerance: { kind: "factor", factor: 1.5 },
    toleranceText: "a factor of 1.5",
    source: WOW_SPREAD,
    conditions: TRANSPORT_CONDITIONS,
    better: "lower",
  },
  rumble: {
    tolerance: { kind: "points", amount: 3 },
    toleranceText: "±3 dB",
    source: NOISE_SPREAD,
    conditions: ["weighting", "speedRpm"],
    better: "higher",
  },
  resonance_frequency: {
    tolerance: { kind: "relative", fraction: 0.15 },
    toleranceText: "±15 %",
    source: "Common practice: a driver's resonance moves with its suspension's temperature and recent exercise by up to a tenth or more",
    conditions: [],
    better: null,
  },
};
