// Headline measured figures for listings, and numbers to index for buyers' filters.
// Always the conservative reading: the weaker channel's power, the worse channel's distortion.
import { QUANTITY_INFO, type Category, type Quantity } from "./quantities";
import type { BenchSheet, Conditions, Reading } from "./schema";
import { describeConditions, formatReadingValue } from "./describe";
import { bestRiaaFit } from "./rules/phono";
import { near, weakestChannelBest } from "./rules/match";
import { baseUnit, type Item, type SheetIndex } from "./rules/types";
import { formatValue } from "./format";
import { indexSheet } from "./verdict";

export type KeyFigure = {
  key: FigureKey;
  label: string;
  /** Base units (see `unit`). */
  value: number;
  unit: string;
  /** "66 W", "0.018 %" */
  display: string;
  /** "into 8 Ω, 1 kHz, 0.1 % THD, both channels driven" */
  conditions: string;
  channel?: Reading["channel"];
  fromCapture: boolean;
  /** Path of the reading or sweep, e.g. "readings.4". */
  ref: string;
  /** The reading's quantity (THD or THD+N for `distortion`); absent for figures read off a sweep. */
  quantity?: Quantity;
  /**
   * The conditions the figure stands on, for setting units side by side (see FIGURE_COMPARISON). A
   * figure taken at the unit's own rated power leaves the power out: "at rated power" is its basis.
   */
  basis: Conditions;
};

export type FigureKey =
  | "power8"
  | "power4"
  | "distortion"
  | "thd"
  | "thdN"
  | "snr"
  | "noise"
  | "bandwidthHigh"
  | "bandwidthLow"
  | "dampingFactor"
  | "gain"
  | "riaaDeviation"
  | "sensitivity"
  | "impedanceMinimum"
  | "ratedImpedance"
  | "wowFlutter"
  | "speedError"
  | "rumble";

type Pick = {
  item?: Item;
  value?: number;
  display?: string;
  label?: string;
  ref?: string;
  fromCapture?: boolean;
  conditions?: string;
  basis?: Conditions;
};

const min = (xs: Item[]) => xs.reduce<Item | undefined>((a, b) => (!a || b.value < a.value ? b : a), undefined);
const max = (xs: Item[]) => xs.reduce<Item | undefined>((a, b) => (!a || b.value > a.value ? b : a), undefined);
const maxAbs = (xs: Item[]) => xs.reduce<Item | undefined>((a, b) => (!a || Math.abs(b.value) > Math.abs(a.value) ? b : a), undefined);
const atLoad = (xs: Item[], ohm: number) => xs.filter((x) => x.conditions.loadOhm !== undefined && near(x.conditions.loadOhm, ohm, 0.05));

function one(item: Item | undefined): Pick | undefined {
  return item && { item };
}

/** THD+N (else THD) at the rated power into 8 Ω, or at the highest level measured; the worse channel. */
function distortionAtRatedPower(ix: SheetIndex): Pick | undefined {
  return distortionOf(ix, ix.measured("thd_n").length ? "thd_n" : "thd");
}

/** One distortion measure at the rated power into 8 Ω, or at the highest level measured; the worse channel. */
function distortionOf(ix: SheetIndex, q: Quantity): Pick | undefined {
  const xs = ix.measured(q);
  if (!xs.length) return undefined;
  const rated = ix.rated("output_power").find((r) => r.conditions.loadOhm !== undefined && near(r.conditions.loadOhm, 8, 0.05));
  const atRated = rated ? xs.filter((x) => x.conditions.powerW !== undefined && near(x.conditions.powerW, rated.value, 0.2)) : [];
  if (atRated.length) {
    const { powerW: _rated, ...basis } = max(atRated)!.conditions;
    return { item: max(atRated)!, label: `${QUANTITY_INFO[q].label} at rated power`, basis };
  }
  const top = Math.max(...xs.map((x) => x.conditions.powerW ?? 0));
  return { item: max(xs.filter((x) => (x.conditions.powerW ?? 0) === top))!, label: QUANTITY_INFO[q].label };
}

function riaa(ix: SheetIndex): Pick | undefined {
  let best: Pick | undefined;
  for (const s of ix.sweeps) {
    if (s.kind !== "riaa") continue;
    const fit = bestRiaaFit(s);
    if (!fit || (best && Math.abs(fit.worstDb) <= Math.abs(best.value!))) continue;
    best = {
      value: Math.abs(fit.worstDb),
      display: `±${formatValue(Math.abs(fit.worstDb), "decibel", { sig: 2 })}`,
      label: "RIAA deviation (worst)",
      ref: s.ref,
      fromCapture: s.origin === "capture",
      conditions: `worst at ${formatValue(fit.atHz, "frequency")}, ${formatValue(fit.lowHz, "frequency")}–${formatValue(fit.highHz, "frequency")}`,
      basis: { frequencyRange: { lowHz: fit.lowHz, highHz: fit.highHz } },
    };
  }
  return best ?? one(maxAbs(ix.measured("riaa_deviation")));
}

/** Sensitivity at 2.83 V/1 m; a 1 W figure is converted with the rated impedance (+10·log10(8/Z)). */
function sensitivity(ix: SheetIndex): Pick | undefined {
  const s = min(ix.measured("sensitivity"));
  if (!s) return undefined;
  const v = s.conditions.voltageV;
  const is283 = /2\.83/.test(s.unit) || (v !== undefined && near(v, Math.SQRT2 * 2, 0.01));
  if (is283) return { item: s, label: "Sensitivity (2.83 V, 1 m)" };
  const z = ix.all("nominal_impedance")[0];
  if (!z) return { item: s };
  const value = s.value + 10 * Math.log10(8 / z.value);
  return {
    item: s,
    value,
    display: formatValue(value, "decibel"),
    label: "Sensitivity (2.83 V, 1 m)",
    conditions: `from ${formatReadingValue(s)} at 1 W into ${formatReadingValue(z)}`,
  };
}

const PICKS: Record<FigureKey, (ix: SheetIndex) => Pick | undefined> = {
  power8: (ix) => one(weakestChannelBest(atLoad(ix.measured("output_power"), 8))),
  power4: (ix) => one(weakestChannelBest(atLoad(ix.measured("output_power"), 4))),
  distortion: distortionAtRatedPower,
  thd: (ix) => distortionOf(ix, "thd"),
  thdN: (ix) => distortionOf(ix, "thd_n"),
  snr: (ix) => one(min(ix.measured("snr"))),
  noise: (ix) => one(max(ix.measured("noise"))),
  bandwidthHigh: (ix) => one(min(ix.measured("f3db_high"))),
  bandwidthLow: (ix) => one(max(ix.measured("f3db_low"))),
  dampingFactor: (ix) => one(min(ix.measured("damping_factor"))),
  gain: (ix) => one(min(ix.measured("gain"))),
  riaaDeviation: riaa,
  sensitivity,
  impedanceMinimum: (ix) => one(min(ix.measured("impedance_minimum"))),
  ratedImpedance: (ix) => one(ix.all("nominal_impedance")[0]),
  wowFlutter: (ix) => one(max(ix.measured("wow_flutter"))),
  speedError: (ix) => one(maxAbs(ix.measured("speed_error"))),
  rumble: (ix) => one(min(ix.measured("rumble"))),
};

const LABELS: Partial<Record<FigureKey, string>> = {
  power8: "Power into 8 Ω",
  power4: "Power into 4 Ω",
  bandwidthHigh: "Upper −3 dB point",
  bandwidthLow: "Lower −3 dB point",
};

/**
 * Which way each figure is better, and the conditions two units' figures must share before one is
 * called the stronger: power at 1 % THD is not power at 0.1 %, nor SNR re 1 W the SNR re 100 W.
 * `better: null` where more is not better (gain suits the system, not the unit) or the figure is rated.
 * `sameQuantity`: THD and THD+N are different measures. Distortion at the unit's own rated power is
 * compared as the trade compares it (its basis drops the power, see KeyFigure.basis).
 */
export type FigureDirection = "higher" | "lower" | "nearer_zero";
export interface FigureComparison {
  better: FigureDirection | null;
  sameConditions: readonly (keyof Conditions)[];
  sameQuantity?: boolean;
}
const POWER_BASIS: FigureComparison = {
  better: "higher",
  sameConditions: ["frequencyHz", "frequencyRange", "atDistortion", "channelsDriven"],
};
const DISTORTION_BASIS: (keyof Conditions)[] = ["loadOhm", "frequencyHz", "powerW", "bandwidth"];
const RESPONSE_BASIS: (keyof Conditions)[] = ["loadOhm", "powerW", "voltageV", "tapeSpeedCmS"];
export const FIGURE_COMPARISON: Record<FigureKey, FigureComparison> = {
  power8: POWER_BASIS,
  power4: POWER_BASIS,
  distortion: { better: "lower", sameConditions: DISTORTION_BASIS, sameQuantity: true },
  thd: { better: "lower", sameConditions: DISTORTION_BASIS },
  thdN: { better: "lower", sameConditions: DISTORTION_BASIS },
  noise: { better: "lower", sameConditions: ["weighting", "bandwidth", "loadOhm"] },
  snr: { better: "higher", sameConditions: ["weighting", "powerW", "voltageV", "bandwidth", "tapeSpeedCmS"] },
  bandwidthHigh: { better: "higher", sameConditions: RESPONSE_BASIS },
  bandwidthLow: { better: "lower", sameConditions: RESPONSE_BASIS },
  dampingFactor: { better: "higher", sameConditions: ["loadOhm", "frequencyHz"] },
  gain: { better: null, sameConditions: [] },
  riaaDeviation: { better: "lower", sameConditions: ["frequencyRange"] },
  sensitivity: { better: "higher", sameConditions: ["distanceM"] },
  // A higher minimum is an easier load for the amplifier.
  impedanceMinimum: { better: "higher", sameConditions: [] },
  ratedImpedance: { better: null, sameConditions: [] },
  wowFlutter: { better: "lower", sameConditions: ["weighting", "speedRpm", "tapeSpeedCmS"] },
  speedError: { better: "nearer_zero", sameConditions: ["speedRpm", "tapeSpeedCmS"] },
  // Quoted as dB below the reference level: more is quieter.
  rumble: { better: "higher", sameConditions: ["weighting", "speedRpm"] },
};

const AMP_KEYS: FigureKey[] = ["power8", "power4", "distortion", "snr", "bandwidthHigh", "dampingFactor"];
export const KEY_FIGURES: Record<Category, FigureKey[]> = {
  integrated_amplifier: AMP_KEYS,
  power_amplifier: AMP_KEYS,
  receiver: AMP_KEYS,
  preamplifier: ["gain", "distortion", "snr", "bandwidthHigh"],
  phono_stage: ["gain", "riaaDeviation", "snr", "distortion"],
  loudspeaker: ["sensitivity", "ratedImpedance", "impedanceMinimum", "bandwidthLow"],
  turntable: ["speedError", "wowFlutter", "rumble"],
  tape_deck: ["wowFlutter", "speedError", "snr", "bandwidthHigh"],
};

/** A pick either points at a reading or (sweeps) carries its own value, display, label and ref. */
function toFigure(key: FigureKey, p: Pick): KeyFigure {
  const it = p.item;
  const kind = it ? QUANTITY_INFO[it.quantity].kind : "decibel";
  return {
    key,
    label: p.label ?? LABELS[key] ?? (it ? QUANTITY_INFO[it.quantity].label : key),
    value: p.value ?? it?.value ?? NaN,
    unit: baseUnit(kind),
    display: p.display ?? (it ? formatReadingValue(it) : ""),
    conditions: p.conditions ?? describeConditions(it?.conditions),
    ...(it?.channel ? { channel: it.channel } : {}),
    fromCapture: p.fromCapture ?? it?.origin === "capture",
    ref: p.ref ?? it?.ref ?? "",
    ...(it ? { quantity: it.quantity } : {}),
    basis: p.basis ?? it?.conditions ?? {},
  };
}

/** The headline measured figures for the sheet's category, in listing order; only those the sheet has. */
export function keyFigures(sheet: BenchSheet): KeyFigure[] {
  const ix = indexSheet(sheet);
  const out: KeyFigure[] = [];
  for (const key of KEY_FIGURES[sheet.category]) {
    const p = PICKS[key](ix);
    if (p) out.push(toFigure(key, p));
  }
  return out;
}

/** What compare sets side by side per category: the key figures and the lower −3 dB point, measured only (no rated impedance). */
export const COMPARE_FIGURES: Record<Category, FigureKey[]> = {
  integrated_amplifier: [...AMP_KEYS, "bandwidthLow"],
  power_amplifier: [...AMP_KEYS, "bandwidthLow"],
  receiver: [...AMP_KEYS, "bandwidthLow"],
  preamplifier: [...KEY_FIGURES.preamplifier, "bandwidthLow"],
  phono_stage: KEY_FIGURES.phono_stage,
  loudspeaker: ["sensitivity", "impedanceMinimum", "bandwidthLow"],
  turntable: KEY_FIGURES.turntable,
  tape_deck: [...KEY_FIGURES.tape_deck, "bandwidthLow"],
};

/** The measured figures compare shows for the sheet, in `COMPARE_FIGURES` order; only those the sheet has. */
export function compareFigures(sheet: BenchSheet): KeyFigure[] {
  const ix = indexSheet(sheet);
  const out: KeyFigure[] = [];
  for (const key of COMPARE_FIGURES[sheet.category]) {
    const p = PICKS[key](ix);
    if (p) out.push(toFigure(key, p));
  }
  return out;
}

/** Numbers to index for buyers' filters, in the units their names say; absent when the sheet has no measured figure. */
export type SheetFacets = {
  category: Category;
  powerW8Ohm?: number;
  powerW4Ohm?: number;
  /** THD+N (else THD) at rated power into 8 Ω, worse channel, in %. */
  distortionPct?: number;
  /** THD alone, at rated power into 8 Ω (else the highest level measured), worse channel, in %. */
  thdPct?: number;
  /** THD+N alone, as `thdPct`. */
  thdnPct?: number;
  snrDb?: number;
  /** Output noise, worse channel, in V rms. */
  noiseV?: number;
  bandwidthHighHz?: number;
  bandwidthLowHz?: number;
  dampingFactor?: number;
  gainDb?: number;
  riaaDeviationDb?: number;
  /** At 2.83 V, 1 m. */
  sensitivityDb?: number;
  impedanceMinOhm?: number;
  ratedImpedanceOhm?: number;
  wowFlutterPct?: number;
  /** Absolute, in %. */
  speedErrorPct?: number;
  rumbleDb?: number;
  measuredReadings: number;
  captureFigures: number;
};

const FACET_OF: Record<FigureKey, [Exclude<keyof SheetFacets, "category" | "measuredReadings" | "captureFigures">, (v: number) => number]> =
  {
    power8: ["powerW8Ohm", (v) => v],
    power4: ["powerW4Ohm", (v) => v],
    distortion: ["distortionPct", (v) => v * 100],
    thd: ["thdPct", (v) => v * 100],
    thdN: ["thdnPct", (v) => v * 100],
    snr: ["snrDb", (v) => v],
    noise: ["noiseV", (v) => v],
    bandwidthHigh: ["bandwidthHighHz", (v) => v],
    bandwidthLow: ["bandwidthLowHz", (v) => v],
    dampingFactor: ["dampingFactor", (v) => v],
    gain: ["gainDb", (v) => v],
    riaaDeviation: ["riaaDeviationDb", (v) => Math.abs(v)],
    sensitivity: ["sensitivityDb", (v) => v],
    impedanceMinimum: ["impedanceMinOhm", (v) => v],
    ratedImpedance: ["ratedImpedanceOhm", (v) => v],
    wowFlutter: ["wowFlutterPct", (v) => v * 100],
    speedError: ["speedErrorPct", (v) => Math.abs(v) * 100],
    rumble: ["rumbleDb", (v) => v],
  };

// Beyond the headline figures: both distortion measures apart (buyers filter by either), the lower
// −3 dB point, and a phono stage's output noise.
const DISTORTION_KEYS: FigureKey[] = ["thd", "thdN"];
const FACET_KEYS: Record<Category, FigureKey[]> = {
  ...KEY_FIGURES,
  integrated_amplifier: [...AMP_KEYS, "bandwidthLow", ...DISTORTION_KEYS],
  power_amplifier: [...AMP_KEYS, "bandwidthLow", ...DISTORTION_KEYS],
  receiver: [...AMP_KEYS, "bandwidthLow", ...DISTORTION_KEYS],
  preamplifier: [...KEY_FIGURES.preamplifier, "bandwidthLow", ...DISTORTION_KEYS],
  phono_stage: [...KEY_FIGURES.phono_stage, ...DISTORTION_KEYS, "noise"],
  tape_deck: [...KEY_FIGURES.tape_deck, ...DISTORTION_KEYS],
};

export function sheetFilterFacets(sheet: BenchSheet): SheetFacets {
  const ix = indexSheet(sheet);
  const facets: SheetFacets = {
    category: sheet.category,
    measuredReadings: ix.items.filter((i) => i.basis === "measured").length,
    captureFigures: ix.items.filter((i) => i.origin === "capture").length + ix.sweeps.filter((s) => s.origin === "capture").length,
  };
  for (const key of FACET_KEYS[sheet.category]) {
    const p = PICKS[key](ix);
    if (!p) continue;
    const [name, conv] = FACET_OF[key];
    const v = p.value ?? p.item?.value;
    if (v !== undefined) facets[name] = conv(v);
  }
  return facets;
}
