import type { Category } from "./catalogue";
import { parseValue, type Kind } from "./bench/units";

// The market's filters on measured figures: one entry per URL parameter, read the way the trade types
// values ("80 W", "0.05 %", "−80 dB", "20 Hz") with the bench's own units, compared with a facet column
// of `listings` (shared/listing-facets.ts fills them from measured readings only, never rated ones).

export type MeasuredFilterKey =
  | "power8"
  | "power4"
  | "thd"
  | "thdn"
  | "snr"
  | "f3Low"
  | "f3High"
  | "damping"
  | "riaa"
  | "gainMin"
  | "gainMax"
  | "noise"
  | "sensitivity"
  | "impedanceMin"
  | "speedError"
  | "wowFlutter";

export interface MeasuredFilter {
  key: MeasuredFilterKey;
  /** The URL / API parameter. */
  param: string;
  label: string;
  /** Where the panel offers it; the filter itself works in any category (other rows lack the figure). */
  categories: readonly Category[];
  /** What `parseValue` reads the typed value as. */
  kind: Kind;
  /** "min": the figure must be at least the value; "max": at most. */
  bound: "min" | "max";
  /** The facet column compared, in the units `unit` names. */
  column: string;
  better: "higher" | "lower";
  placeholder: string;
  /** The column's unit as a person reads it ("W", "%", "µV", "Ω"; "" for a plain number). */
  unit: string;
  /** The same unit in ASCII, for canonical URLs ("uV", "ohm"). */
  paramUnit: string;
  /** Column units per base unit of `kind` (a ratio is stored in %, a noise voltage in µV). */
  scale: number;
}

const AMPS: Category[] = ["integrated_amplifier", "power_amplifier", "receiver"];
const LINE: Category[] = [...AMPS, "preamplifier"];
const TRANSPORTS: Category[] = ["turntable", "tape_deck"];

type Unit = Pick<MeasuredFilter, "kind" | "unit" | "paramUnit" | "scale">;
const W: Unit = { kind: "power", unit: "W", paramUnit: "W", scale: 1 };
const PCT: Unit = { kind: "ratio", unit: "%", paramUnit: "%", scale: 100 };
const DB: Unit = { kind: "decibel", unit: "dB", paramUnit: "dB", scale: 1 };
const HZ: Unit = { kind: "frequency", unit: "Hz", paramUnit: "Hz", scale: 1 };
const UV: Unit = { kind: "voltage", unit: "µV", paramUnit: "uV", scale: 1e6 };
const OHM: Unit = { kind: "resistance", unit: "Ω", paramUnit: "ohm", scale: 1 };
const PLAIN: Unit = { kind: "number", unit: "", paramUnit: "", scale: 1 };

/** The one list of measured-figure filters, in the order the panel shows them. */
export const MEASURED_FILTERS: readonly MeasuredFilter[] = [
  {
    key: "power8",
    param: "power8Min",
    label: "Power into 8 Ω, at least",
    categories: AMPS,
    bound: "min",
    column: "power_8ohm_w",
    better: "higher",
    placeholder: "80 W",
    ...W,
  },
  {
    key: "power4",
    param: "power4Min",
    label: "Power into 4 Ω, at least",
    categories: AMPS,
    bound: "min",
    column: "power_4ohm_w",
    better: "higher",
    placeholder: "120 W",
    ...W,
  },
  {
    key: "thd",
    param: "thdMax",
    label: "THD, at most",
    categories: [...LINE, "phono_stage", "tape_deck"],
    bound: "max",
    column: "thd_pct",
    better: "lower",
    placeholder: "0.05 %",
    ...PCT,
  },
  {
    key: "thdn",
    param: "thdnMax",
    label: "THD+N, at most",
    categories: [...LINE, "phono_stage", "tape_deck"],
    bound: "max",
    column: "thdn_pct",
    better: "lower",
    placeholder: "0.05 %",
    ...PCT,
  },
  {
    key: "snr",
    param: "snrMin",
    label: "Signal-to-noise ratio, at least",
    categories: [...LINE, "phono_stage", "tape_deck"],
    bound: "min",
    column: "snr_db",
    better: "higher",
    placeholder: "90 dB",
    ...DB,
  },
  {
    key: "f3Low",
    param: "f3LowMax",
    label: "Lower −3 dB point, at most",
    categories: [...LINE, "loudspeaker"],
    bound: "max",
    column: "f3_low_hz",
    better: "lower",
    placeholder: "20 Hz",
    ...HZ,
  },
  {
    key: "f3High",
    param: "f3HighMin",
    label: "Upper −3 dB point, at least",
    categories: [...LINE, "tape_deck"],
    bound: "min",
    column: "f3_high_hz",
    better: "higher",
    placeholder: "20 kHz",
    ...HZ,
  },
  {
    key: "damping",
    param: "dampingMin",
    label: "Damping factor, at least",
    categories: AMPS,
    bound: "min",
    column: "damping_factor",
    better: "higher",
    placeholder: "100",
    ...PLAIN,
  },
  {
    key: "riaa",
    param: "riaaMax",
    label: "RIAA deviation, at most ±",
    categories: ["phono_stage"],
    bound: "max",
    column: "riaa_deviation_db",
    better: "lower",
    placeholder: "0.2 dB",
    ...DB,
  },
  {
    key: "gainMin",
    param: "gainMin",
    label: "Gain, at least",
    categories: ["phono_stage", "preamplifier"],
    bound: "min",
    column: "gain_db",
    better: "higher",
    placeholder: "40 dB",
    ...DB,
  },
  {
    key: "gainMax",
    param: "gainMax",
    label: "Gain, at most",
    categories: ["phono_stage", "preamplifier"],
    bound: "max",
    column: "gain_db",
    better: "lower",
    placeholder: "60 dB",
    ...DB,
  },
  {
    key: "noise",
    param: "noiseMax",
    label: "Output noise, at most",
    categories: ["phono_stage"],
    bound: "max",
    column: "noise_uv",
    better: "lower",
    placeholder: "200 µV",
    ...UV,
  },
  {
    key: "sensitivity",
    param: "sensitivityMin",
    label: "Sensitivity (2.83 V, 1 m), at least",
    categories: ["loudspeaker"],
    bound: "min",
    column: "sensitivity_db",
    better: "higher",
    placeholder: "88 dB",
    ...DB,
  },
  {
    key: "impedanceMin",
    param: "impedanceMinMin",
    label: "Impedance minimum, at least",
    categories: ["loudspeaker"],
    bound: "min",
    column: "impedance_min_ohm",
    better: "higher",
    placeholder: "4 Ω",
    ...OHM,
  },
  {
    key: "speedError",
    param: "speedErrorMax",
    label: "Speed error, at most ±",
    categories: TRANSPORTS,
    bound: "max",
    column: "speed_error_pct",
    better: "lower",
    placeholder: "0.1 %",
    ...PCT,
  },
  {
    key: "wowFlutter",
    param: "wowFlutterMax",
    label: "Wow & flutter, at most",
    categories: TRANSPORTS,
    bound: "max",
    column: "wow_flutter_pct",
    better: "lower",
    placeholder: "0.05 %",
    ...PCT,
  },
];

export const MEASURED_FILTER_BY_PARAM: ReadonlyMap<string, MeasuredFilter> = new Map(MEASURED_FILTERS.map((f) => [f.param, f]));

/** The filters the panel offers for a category (all of them when no category is chosen). */
export function measuredFiltersFor(category: Category | null): MeasuredFilter[] {
  return MEASURED_FILTERS.filter((f) => !category || f.categories.includes(category));
}

/** Values are kept to 12 significant digits so a value survives the trip through a URL unchanged. */
export function normaliseFigure(value: number): number {
  return Number(value.toPrecision(12));
}

/** A typed value to the filter's column units: "80 W" → 80, "−80 dB" (THD) → 0.01, "0.2 mV" (noise) → 200. A bare number is in the column's unit. */
export function parseMeasured(filter: MeasuredFilter, text: string): { ok: true; value: number } | { ok: false; message: string } {
  let parsed = parseValue(text, { kind: filter.kind });
  if (!parsed.ok && parsed.code === "no_unit" && filter.paramUnit)
    parsed = parseValue(`${text} ${filter.paramUnit}`, { kind: filter.kind });
  if (!parsed.ok) return { ok: false, message: parsed.error };
  const value = normaliseFigure(parsed.value * filter.scale);
  if (!Number.isFinite(value) || Math.abs(value) > 1e9) return { ok: false, message: `"${text}" is out of range.` };
  return { ok: true, value };
}

/** The canonical URL spelling of a value: "80 W", "0.05 %", "200 uV", "4 ohm", "150". */
export function measuredParam(filter: MeasuredFilter, value: number): string {
  return filter.paramUnit ? `${value} ${filter.paramUnit}` : String(value);
}

/** The value as a person reads it: "80 W", "0.05 %", "−3 dB", "200 µV", "4 Ω". */
export function formatMeasured(filter: MeasuredFilter, value: number): string {
  const n = String(value).replace(/^-/, "−");
  return filter.unit ? `${n} ${filter.unit}` : n;
}
