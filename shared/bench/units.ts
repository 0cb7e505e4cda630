// Values as the trade types them ("28.3 Vrms", "-80 dB", "4R7", "17.5 us") to numbers in base units and back.
// Base units: W, V (rms for AC; sine assumed for peak and peak-to-peak), ratio as a fraction (0.0001 = 0.01 %),
// dB, Hz, s, Ω, V/s, plain number.

export type Kind = "power" | "voltage" | "ratio" | "decibel" | "frequency" | "time" | "resistance" | "slewRate" | "number";

export type VoltageForm = "rms" | "peak" | "pp" | "dc";

export type ParsedValue = {
  ok: true;
  kind: Kind;
  /** In base units (see the file comment). */
  value: number;
  /** The unit in its display spelling, e.g. "Vpp", "µs", "Ω", "%", "dB(A)". */
  unit: string;
  /** The number as typed, in `unit`. */
  number: number;
  form?: VoltageForm;
  weighting?: "A";
  sensitivityRef?: "2.83V" | "1W";
  plusMinus?: boolean;
  /** "2 × 66 W" → 2 */
  channels?: number;
};

export type ParseErrorCode = "empty" | "no_number" | "no_unit" | "unknown_unit" | "wrong_kind" | "out_of_range";
export type ParseError = { ok: false; code: ParseErrorCode; error: string };
export type ParseResult = ParsedValue | ParseError;

export type ParseOptions = {
  /** The kind the field expects; resolves "dB" (ratio or level), bare "k" and the meaning of plain "V". */
  kind?: Kind;
  /** What a plain "V" means; "rms" unless told (rails and DC offset are "dc"). */
  voltageForm?: "rms" | "dc";
};

export const SQRT2 = Math.SQRT2;
/** 0 dBu = √(1 mW · 600 Ω) */
export const DBU_REF_V = Math.sqrt(0.6);

type UnitDef = {
  kind: Kind;
  unit: string;
  /** base = typed × factor, unless log is set */
  factor?: number;
  log?: { ref: number; per: 10 | 20 };
  form?: VoltageForm;
  weighting?: "A";
  sensitivityRef?: "2.83V" | "1W";
};

const KIND_NAMES: Record<Kind, string> = {
  power: "a power (W, mW, µW, nW, pW, dBW, dBm)",
  voltage: "a voltage (V, mV, µV, nV, Vrms, Vpk, Vpp, dBV, dBu)",
  ratio: "a ratio (%, ppm or dB)",
  decibel: "a level in dB",
  frequency: "a frequency (Hz, kHz)",
  time: "a time (s, ms, µs, ns, ps)",
  resistance: "a resistance (Ω, ohm, R, kΩ)",
  slewRate: "a slew rate (V/µs, V/ns)",
  number: "a plain number",
};

export function kindName(kind: Kind): string {
  return KIND_NAMES[kind];
}

// SI prefixes as bench meters show them (SI Brochure, 9th ed. 2019, Table 7). "u" stands in for "µ".
// Each kind takes the prefixes its instruments display; the prefix letter is case-sensitive (mW ≠ MW).
const PREFIX: Record<string, number> = { p: 1e-12, n: 1e-9, µ: 1e-6, u: 1e-6, m: 1e-3, "": 1, k: 1e3, M: 1e6, G: 1e9 };
const PREFIXES_OF: Record<"power" | "voltage" | "time" | "frequency" | "resistance", string[]> = {
  power: ["p", "n", "µ", "u", "m", "", "k"],
  voltage: ["p", "n", "µ", "u", "m", "", "k"],
  time: ["p", "n", "µ", "u", "m", ""],
  frequency: ["m", "", "k", "M", "G"],
  resistance: ["µ", "u", "m", "", "k", "M", "G"],
};
const shown = (prefix: string) => (prefix === "u" ? "µ" : prefix);
const FORM_SPELLINGS: [VoltageForm | undefined, string[], string][] = [
  [undefined, [""], ""],
  ["rms", ["rms", "ac", "acrms"], "rms"],
  ["peak", ["pk", "p", "peak", "0-p", "0-pk"], "pk"],
  ["pp", ["pp", "p-p", "pk-pk", "ptp", "peak-peak", "peak-to-peak"], "pp"],
  ["dc", ["dc"], " DC"],
];

// Two maps: EXACT keeps the case a prefix needs (mHz vs MHz, mΩ vs MΩ) and is tried first; TABLE is
// lowercase for the spellings whose case does not matter ("WATTS", "khz", "Vrms"). Spaces are removed.
const TABLE = new Map<string, UnitDef>();
const EXACT = new Map<string, UnitDef>();

function add(keys: string[], def: UnitDef) {
  for (const k of keys) TABLE.set(k.toLowerCase(), def);
}
function exact(keys: string[], def: UnitDef) {
  for (const k of keys) EXACT.set(k, def);
}
/** A prefixed unit: exact spelling always; lowercase too unless it would clash (m/M: the milli reading wins for W and V, as today). */
function prefixed(prefix: string, symbols: string[], def: UnitDef) {
  exact(
    symbols.map((s) => prefix + s),
    def,
  );
  const clash = prefix === "M" || prefix === "G" || (prefix === "m" && (def.kind === "frequency" || def.kind === "resistance"));
  if (!clash)
    add(
      symbols.map((s) => prefix + s),
      def,
    );
}

add(["W", "watt", "watts"], { kind: "power", unit: "W", factor: 1 });
for (const p of PREFIXES_OF.power) if (p) prefixed(p, ["W"], { kind: "power", unit: `${shown(p)}W`, factor: PREFIX[p] });
add(["dBW"], { kind: "power", unit: "dBW", log: { ref: 1, per: 10 } });
// dBm: decibels re 1 mW, 10·log10(P / 1 mW) (ITU-T V.574 / IEC 60027-3 level notation).
add(["dBm"], { kind: "power", unit: "dBm", log: { ref: 1e-3, per: 10 } });

for (const prefix of PREFIXES_OF.voltage) {
  for (const [form, spellings, suffix] of FORM_SPELLINGS) {
    const unit = `${shown(prefix)}V${suffix}`;
    const def: UnitDef = { kind: "voltage", unit, factor: PREFIX[prefix], form };
    add(
      spellings.map((s) => `${prefix}V${s}`),
      def,
    );
  }
}
add(["dBV"], { kind: "voltage", unit: "dBV", log: { ref: 1, per: 20 }, form: "rms" });
add(["dBu"], { kind: "voltage", unit: "dBu", log: { ref: DBU_REF_V, per: 20 }, form: "rms" });
// A voltage in dBm is the telephone trade's level across 600 Ω: 0 dBm = √(1 mW · 600 Ω) = 0.775 V, the same
// reference as dBu (IEC 60268-2, 600 Ω reference impedance). Only where a voltage is expected.
const DBM_600: UnitDef = { kind: "voltage", unit: "dBm (600 Ω)", log: { ref: DBU_REF_V, per: 20 }, form: "rms" };
exact(["dBm(600Ω)", "dBm600", "dBm/600Ω"], DBM_600);

add(["%", "percent"], { kind: "ratio", unit: "%", factor: 1e-2 });
add(["ppm"], { kind: "ratio", unit: "ppm", factor: 1e-6 });
// A distortion analyser's dBc (re the carrier, the test tone): 20·log10 of the ratio.
add(["dBc"], { kind: "ratio", unit: "dBc", log: { ref: 1, per: 20 } });

add(["dB"], { kind: "decibel", unit: "dB", factor: 1 });
add(["dBA", "dB(A)", "dBA-wtd", "dB,A", "dBAwtd"], { kind: "decibel", unit: "dB(A)", factor: 1, weighting: "A" });
add(["dBSPL", "dB(SPL)"], { kind: "decibel", unit: "dB SPL", factor: 1 });
for (const k of ["dB/2.83V", "dB/2.83V/m", "dB/2.83V/1m", "dB@2.83V", "dB@2.83V/1m", "dBSPL/2.83V", "dBSPL/2.83V/1m"])
  add([k], { kind: "decibel", unit: "dB/2.83 V/1 m", factor: 1, sensitivityRef: "2.83V" });
for (const k of ["dB/W", "dB/W/m", "dB/1W", "dB/1W/m", "dB/1W/1m", "dB/W/1m", "dB@1W", "dB@1W/1m", "dBSPL/W", "dBSPL/1W/1m"])
  add([k], { kind: "decibel", unit: "dB/1 W/1 m", factor: 1, sensitivityRef: "1W" });

add(["Hz"], { kind: "frequency", unit: "Hz", factor: 1 });
for (const p of PREFIXES_OF.frequency) if (p) prefixed(p, ["Hz"], { kind: "frequency", unit: `${p}Hz`, factor: PREFIX[p] });
// "MHZ", "mhz": megahertz, as sellers mean it (millihertz only spelt exactly "mHz").
add(["MHz"], { kind: "frequency", unit: "MHz", factor: 1e6 });

add(["s", "sec"], { kind: "time", unit: "s", factor: 1 });
for (const p of PREFIXES_OF.time) if (p) prefixed(p, ["s"], { kind: "time", unit: `${shown(p)}s`, factor: PREFIX[p] });

add(["Ω", "ohm", "ohms", "R"], { kind: "resistance", unit: "Ω", factor: 1 });
for (const p of PREFIXES_OF.resistance)
  if (p) prefixed(p, ["Ω", "ohm", "ohms", "Ohm", "Ohms"], { kind: "resistance", unit: `${shown(p)}Ω`, factor: PREFIX[p] });
exact(["MOhm", "MOhms"], { kind: "resistance", unit: "MΩ", factor: 1e6 });

add(["V/ns"], { kind: "slewRate", unit: "V/ns", factor: 1e9 });
add(["V/µs", "V/us"], { kind: "slewRate", unit: "V/µs", factor: 1e6 });
add(["V/ms"], { kind: "slewRate", unit: "V/ms", factor: 1e3 });
add(["V/s"], { kind: "slewRate", unit: "V/s", factor: 1 });

add(["", "x", "×", "times"], { kind: "number", unit: "", factor: 1 });

/** Typographic variants folded to one spelling. */
function fold(text: string): string {
  return text
    .normalize("NFC")
    .replace(/[\u00a0\u2009\u202f\u2007]/g, " ")
    .replace(/[\u2212\u2013\u2012]/g, "-")
    .replace(/\u03bc/g, "µ")
    .replace(/\u2126/g, "Ω")
    .replace(/\u00b1|\+\/-|\+-/g, "±")
    .trim();
}

// Sheets repeat a handful of spellings; the verdict formats hundreds of values, so lookups are memoised.
const LOOKUP_CACHE = new Map<string, UnitDef | null>();

function lookupUnit(raw: string, kind: Kind | undefined): UnitDef | undefined {
  const cacheKey = `${kind ?? ""}|${raw}`;
  const hit = LOOKUP_CACHE.get(cacheKey);
  if (hit !== undefined) return hit ?? undefined;
  const def = lookupUncached(raw, kind);
  if (LOOKUP_CACHE.size < 2000) LOOKUP_CACHE.set(cacheKey, def ?? null);
  return def;
}

function lookupUncached(raw: string, kind: Kind | undefined): UnitDef | undefined {
  const key = fold(raw).replace(/\s+/g, "");
  const exact = EXACT.get(key);
  if (exact) return exact;
  const lower = key.toLowerCase();
  if (lower === "k" || lower === "m") {
    // "47k" for an input impedance, "20k" for a bandwidth: only with an expected kind.
    if (kind === "resistance") return { kind, unit: lower === "k" ? "kΩ" : "MΩ", factor: lower === "k" ? 1e3 : 1e6 };
    if (kind === "frequency" && lower === "k") return { kind, unit: "kHz", factor: 1e3 };
    return undefined;
  }
  const def = TABLE.get(lower);
  if (def?.kind === "decibel" && def.unit === "dB" && kind === "ratio") return { kind: "ratio", unit: "dB", log: { ref: 1, per: 20 } };
  if (def?.unit === "dBm" && kind === "voltage") return DBM_600;
  return def;
}

/** "1,5" and "0,010" are decimal commas; "1,000" (three digits after a non-zero integer) is a thousands separator. */
function parseNumber(s: string): number {
  let t = s;
  if (t.includes(",") && !t.includes(".")) {
    const m = /^(\d+),(\d+)$/.exec(t);
    if (m && m[2].length === 3 && m[1] !== "0") t = m[1] + m[2];
    else t = t.replace(",", ".");
  } else t = t.replace(/,/g, "");
  return Number(t);
}

const NUMBER_RE = /^(±|\+|-)?\s*((?:\d[\d,]*(?:\.\d*)?|\.\d+)(?:e[+-]?\d+)?)\s*(.*)$/i;
const RKM_RE = /^(\d+)([RKM])(\d*)$/; // 4R7 = 4.7 Ω, 0R05 = 0.05 Ω, 4K7 = 4.7 kΩ
const RKM_UNITS: Record<string, { factor: number; unit: string }> = {
  R: { factor: 1, unit: "Ω" },
  K: { factor: 1e3, unit: "kΩ" },
  M: { factor: 1e6, unit: "MΩ" },
};
const CHANNELS_RE = /^([1-9])\s*[x×]\s*(?=[\d.])/i;

function fail(code: ParseErrorCode, error: string): ParseError {
  return { ok: false, code, error };
}

/** Parse one value as typed, e.g. "28.3 Vrms", "80 Vpp", "+4 dBu", "-80 dB" (with kind "ratio"), "4R7", "2 × 66 W". */
export function parseValue(input: string, opts: ParseOptions = {}): ParseResult {
  let text = fold(input ?? "");
  if (!text) return fail("empty", "Enter a value with its unit.");
  let channels: number | undefined;
  const ch = CHANNELS_RE.exec(text);
  if (ch) {
    channels = Number(ch[1]);
    text = text.slice(ch[0].length);
  }
  const rkm = RKM_RE.exec(text);
  if (rkm) {
    const { factor, unit } = RKM_UNITS[rkm[2]] ?? RKM_UNITS.R;
    const n = Number(`${rkm[1]}.${rkm[3] || "0"}`);
    return finish({ kind: "resistance", unit, factor }, n, false, opts, channels);
  }
  const m = NUMBER_RE.exec(text);
  if (!m) return fail("no_number", `"${input}" does not start with a number.`);
  const sign = m[1];
  let n = parseNumber(m[2]);
  if (!Number.isFinite(n)) return fail("no_number", `"${m[2]}" is not a number.`);
  if (sign === "-") n = -n;
  const unitText = m[3].trim();
  const def = lookupUnit(unitText, opts.kind);
  if (!def) {
    if (!unitText) return fail("no_unit", `Add a unit: ${opts.kind ? kindName(opts.kind) : "e.g. W, V, %, Hz, Ω"}.`);
    return fail("unknown_unit", `"${unitText}" is not a unit the bench knows${opts.kind ? `; expected ${kindName(opts.kind)}` : ""}.`);
  }
  if (def.kind === "number" && opts.kind && opts.kind !== "number") return fail("no_unit", `Add a unit: ${kindName(opts.kind)}.`);
  return finish(def, n, sign === "±", opts, channels);
}

function finish(def: UnitDef, n: number, plusMinus: boolean, opts: ParseOptions, channels?: number): ParseResult {
  if (opts.kind && def.kind !== opts.kind)
    return fail("wrong_kind", `"${def.unit || "no unit"}" is ${kindName(def.kind)}; this field needs ${kindName(opts.kind)}.`);
  if (def.kind === "ratio" && def.log && n > 0) return fail("out_of_range", "A ratio in dB is negative here (e.g. −80 dB = 0.01 %).");
  const form: VoltageForm | undefined = def.kind === "voltage" ? (def.form ?? (opts.voltageForm === "dc" ? "dc" : "rms")) : undefined;
  let value = def.log ? def.log.ref * 10 ** (n / def.log.per) : n * (def.factor ?? 1);
  if (form === "peak") value /= SQRT2;
  else if (form === "pp") value /= 2 * SQRT2;
  const out: ParsedValue = { ok: true, kind: def.kind, value, unit: def.unit, number: n };
  if (form) out.form = form;
  if (def.weighting) out.weighting = def.weighting;
  if (def.sensitivityRef) out.sensitivityRef = def.sensitivityRef;
  if (plusMinus) out.plusMinus = true;
  if (channels) out.channels = channels;
  return out;
}

/** Parse a range such as "20 Hz – 20 kHz", "20-20k Hz" or "20 Hz to 100 kHz"; a bare first number takes the second's unit. */
export function parseRange(input: string, opts: ParseOptions = {}): { ok: true; low: ParsedValue; high: ParsedValue } | ParseError {
  const text = fold(input ?? "");
  const parts = text.split(/\s*(?:\bto\b|\.\.|-(?=\s*[\d.]))\s*/i).filter((p) => p !== "");
  if (parts.length !== 2) return fail("no_number", `"${input}" is not a range like "20 Hz – 20 kHz".`);
  const high = parseValue(parts[1], opts);
  if (!high.ok) return high;
  let low = parseValue(parts[0], { ...opts, kind: opts.kind ?? high.kind });
  if (!low.ok && low.code === "no_unit") {
    // "20–20k Hz": the first number shares the second's base unit, not its prefix ("20-20 kHz" is 20 kHz to 20 kHz).
    const bare = unitOf(high.unit);
    low = parseValue(`${parts[0]} ${bare}`, { ...opts, kind: high.kind });
  }
  if (!low.ok) return low;
  if (!(low.value < high.value)) return fail("out_of_range", "The low end of a range must be below the high end.");
  return { ok: true, low, high };
}

function unitOf(unit: string): string {
  return /Hz$/.test(unit) ? "Hz" : unit;
}

/** Convert a base-unit value into the given typed unit (the inverse of parsing). */
export function toUnit(base: number, unit: string, kind?: Kind): number {
  const def = lookupUnit(unit, kind);
  if (!def) throw new RangeError(`unknown unit "${unit}"`);
  let v = base;
  if (def.form === "peak") v *= SQRT2;
  else if (def.form === "pp") v *= 2 * SQRT2;
  if (def.log) return def.log.per * Math.log10(v / def.log.ref);
  return v / (def.factor ?? 1);
}

/** Whether a unit spelling is known, and its kind (used by the schema to check a reading's unit). */
export function unitKind(unit: string, expected?: Kind): Kind | undefined {
  return lookupUnit(unit, expected)?.kind;
}

/** A ratio as dB (20·log10), e.g. 0.0001 → −80. */
export function ratioToDb(ratio: number): number {
  return 20 * Math.log10(ratio);
}
export function dbToRatio(db: number): number {
  return 10 ** (db / 20);
}

/** Sine relations: P = Vrms²/R; Vpk = √2·Vrms; Vpp = 2√2·Vrms. */
export function powerFromVrms(vrms: number, ohms: number): number {
  return (vrms * vrms) / ohms;
}
export function vrmsFromPower(watts: number, ohms: number): number {
  return Math.sqrt(watts * ohms);
}
export function vpkFromPower(watts: number, ohms: number): number {
  return Math.sqrt(2 * watts * ohms);
}

// Display lives in format.ts; re-exported so "./units" stays the one import for values.
export { formatNumber, formatValue, type FormatOptions } from "./format";
