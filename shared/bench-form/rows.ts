// One row of the bench sheet form: what the seller types ("112 W", "8 Ω", "0.1 % THD") read into a
// reading with its conditions, with a message per field and the parsed value to show beside it.
import { QUANTITY_INFO, type Quantity } from "../bench/quantities";
import { CHANNELS, CHANNELS_DRIVEN, WEIGHTINGS, type Conditions, type Reading } from "../bench/schema";
import { formatNumber, formatValue, parseRange, parseValue, ratioToDb, type Kind, type ParsedValue } from "../bench/units";
import { isOneOf } from "../one-of";

export const ROW_FIELDS = [
  "load",
  "frequency",
  "range",
  "level",
  "limit",
  "bandwidth",
  "weighting",
  "driven",
  "tone",
  "speed",
  "supply",
  "distance",
] as const;
export type ConditionField = (typeof ROW_FIELDS)[number];
export type Channel = (typeof CHANNELS)[number];

export type SheetRow = {
  /** Stable key for the browser's list; not stored. */
  key: string;
  quantity: Quantity | "";
  basis: "measured" | "rated";
  channel: Channel | "";
  value: string;
  note: string;
  /** A reading the bench derived from a capture: shown, never re-typed. */
  capture?: Reading;
  /** Conditions the form has no field for on this row (mains voltage, warm-up …), kept as they were. */
  keep?: Conditions;
} & Record<ConditionField, string>;

/** The conditions that give each quantity its meaning, in the order the form asks for them. */
export const CONDITION_FIELDS: Record<Quantity, ConditionField[]> = {
  output_power: ["load", "frequency", "range", "limit", "driven"],
  output_voltage: ["load", "frequency", "limit"],
  thd: ["level", "load", "frequency", "bandwidth"],
  thd_n: ["level", "load", "frequency", "bandwidth", "weighting"],
  imd: ["level", "load"],
  snr: ["level", "load", "weighting", "bandwidth"],
  noise: ["load", "weighting", "bandwidth"],
  response_deviation: ["range", "level", "load"],
  f3db_low: ["level", "load"],
  f3db_high: ["level", "load"],
  power_bandwidth: ["load", "limit"],
  rise_time: ["frequency", "level", "load"],
  slew_rate: ["load"],
  damping_factor: ["load", "frequency"],
  output_impedance: ["frequency"],
  input_impedance: ["frequency"],
  input_sensitivity: ["level", "load"],
  gain: ["frequency", "load"],
  channel_balance: ["frequency", "level"],
  crosstalk: ["frequency", "level", "load"],
  rail_voltage: ["supply"],
  dc_offset: [],
  riaa_deviation: ["range"],
  overload_margin: ["frequency"],
  nominal_impedance: [],
  impedance_minimum: ["frequency"],
  sensitivity: ["level", "distance"],
  power_handling: [],
  speed_error: ["speed", "tone"],
  wow_flutter: ["weighting", "tone", "speed"],
  rumble: ["weighting", "speed"],
  oscillation: ["load"],
  resonance_frequency: [],
};

export const FIELD_LABELS: Record<ConditionField, { label: string; placeholder: string }> = {
  load: { label: "Load", placeholder: "8 Ω" },
  frequency: { label: "Frequency", placeholder: "1 kHz" },
  range: { label: "Frequency range", placeholder: "20 Hz – 20 kHz" },
  level: { label: "Level", placeholder: "1 W or 2.83 V" },
  limit: { label: "Distortion limit", placeholder: "0.1 % THD" },
  bandwidth: { label: "Measurement bandwidth", placeholder: "20 Hz – 20 kHz" },
  weighting: { label: "Weighting", placeholder: "" },
  driven: { label: "Channels driven", placeholder: "" },
  tone: { label: "Test tone", placeholder: "3150 Hz" },
  speed: { label: "Speed", placeholder: "33⅓ rpm or 19 cm/s" },
  supply: { label: "Supply", placeholder: "" },
  distance: { label: "Distance", placeholder: "1 m" },
};

export const SELECT_FIELDS: Partial<Record<ConditionField, readonly string[]>> = {
  weighting: WEIGHTINGS,
  driven: CHANNELS_DRIVEN,
  supply: ["split", "single"],
};

export type RowErrors = Partial<Record<"quantity" | "value" | "channel" | "basis" | "note" | ConditionField, string>>;
export type RowResult = {
  reading: Reading | null;
  errors: RowErrors;
  /** Parsed value per field, to show beside it. */ shown: Partial<Record<"value" | ConditionField, string>>;
};

const NO_CONDITIONS: Record<ConditionField, string> = {
  load: "",
  frequency: "",
  range: "",
  level: "",
  limit: "",
  bandwidth: "",
  weighting: "",
  driven: "",
  tone: "",
  speed: "",
  supply: "",
  distance: "",
};

export function blankRow(key: string, basis: SheetRow["basis"] = "measured", rest: Partial<SheetRow> = {}): SheetRow {
  return { key, quantity: "", basis, channel: "", value: "", note: "", ...NO_CONDITIONS, ...rest };
}

/** What a parsed value reads as, e.g. "28.3 V rms", "0.030 % (−70.5 dB)". */
export function showParsed(p: ParsedValue, dc = false, inDb = false): string {
  switch (p.kind) {
    case "voltage":
      return `${formatValue(p.value, "voltage")} ${p.form === "dc" || dc ? "DC" : "rms"}`;
    case "ratio":
      // Distortion reads both ways in the trade (0.03 % = −70.5 dB); a speed error does not.
      return inDb && p.value > 0
        ? `${formatValue(p.value, "ratio")} (${formatNumber(ratioToDb(p.value))} dB)`
        : formatValue(p.value, "ratio");
    case "number":
      return formatValue(p.value, "number");
    default:
      return formatValue(p.value, p.kind);
  }
}

const DISTORTION_RE = /^(.*?)\s*(thd\s*\+\s*n|thdn|thd)?$/i;
const SPEED_RE = /^(\d+(?:[.,]\d+)?)\s*(⅓|1\/3|⅔|2\/3)?\s*(rpm|cm\/s|ips)?$/i;

function parseSpeed(text: string): { ok: true; rpm?: number; cmS?: number; shown: string } | { ok: false; error: string } {
  const m = SPEED_RE.exec(text.trim());
  if (!m) return { ok: false, error: `"${text}" is not a speed; write 33⅓ rpm, 45 rpm or 19 cm/s.` };
  let n = Number(m[1].replace(",", "."));
  if (m[2] === "⅓" || m[2] === "1/3") n += 1 / 3;
  if (m[2] === "⅔" || m[2] === "2/3") n += 2 / 3;
  const unit = (m[3] ?? "rpm").toLowerCase();
  if (unit === "rpm") return { ok: true, rpm: n, shown: `${formatNumber(n, 4)} rpm` };
  const cmS = unit === "ips" ? n * 2.54 : n;
  return { ok: true, cmS, shown: `${formatNumber(cmS, 3)} cm/s` };
}

/** Read one typed row. A row without a value is not a reading (null, no errors): blank rows are allowed. */
export function readRow(row: SheetRow): RowResult {
  const errors: RowErrors = {};
  const shown: RowResult["shown"] = {};
  if (row.capture) return { reading: row.capture, errors, shown };
  if (!row.value.trim()) return { reading: null, errors, shown };
  if (!row.quantity) return { reading: null, errors: { quantity: "Choose what this reading is." }, shown };
  const info = QUANTITY_INFO[row.quantity];
  const conditions: Conditions = { ...row.keep };
  let channel: Channel | undefined = row.channel || undefined;

  const value = parseValue(row.value, { kind: info.kind, voltageForm: info.dc ? "dc" : "rms" });
  if (!value.ok) errors.value = value.error;
  else {
    shown.value = showParsed(value, info.dc, row.quantity === "thd" || row.quantity === "thd_n" || row.quantity === "imd");
    if (value.channels && value.channels > 1 && !channel) channel = "both";
    if (value.weighting === "A") conditions.weighting = "A";
    if (value.plusMinus && row.quantity === "rail_voltage") conditions.supply = "split";
  }

  const asKind = (field: ConditionField, kind: Kind, set: (v: number) => void) => {
    const t = row[field].trim();
    if (!t) return;
    const p = parseValue(t, { kind });
    if (!p.ok) errors[field] = p.error;
    else {
      set(p.value);
      shown[field] = showParsed(p);
    }
  };
  const asRange = (field: ConditionField, set: (r: { lowHz: number; highHz: number }) => void) => {
    const t = row[field].trim();
    if (!t) return;
    const p = parseRange(t, { kind: "frequency" });
    if (!p.ok) errors[field] = p.error;
    else {
      set({ lowHz: p.low.value, highHz: p.high.value });
      shown[field] = `${formatValue(p.low.value, "frequency")} – ${formatValue(p.high.value, "frequency")}`;
    }
  };

  for (const field of CONDITION_FIELDS[row.quantity]) {
    const t = row[field].trim();
    if (!t) continue;
    switch (field) {
      case "load":
        asKind(field, "resistance", (v) => (conditions.loadOhm = v));
        break;
      case "frequency":
        asKind(field, "frequency", (v) => (conditions.frequencyHz = v));
        break;
      case "tone":
        asKind(field, "frequency", (v) => (conditions.testToneHz = v));
        break;
      case "range":
        asRange(field, (r) => (conditions.frequencyRange = r));
        break;
      case "bandwidth":
        asRange(field, (r) => (conditions.bandwidth = r));
        break;
      case "level": {
        const p = parseValue(t);
        if (!p.ok) errors.level = p.error;
        else if (p.kind === "power") conditions.powerW = p.value;
        else if (p.kind === "voltage") conditions.voltageV = p.value;
        else errors.level = "Give the level as a power (1 W) or a voltage (2.83 V).";
        if (p.ok && !errors.level) shown.level = showParsed(p);
        break;
      }
      case "limit": {
        const m = DISTORTION_RE.exec(t)!;
        const p = parseValue(m[1], { kind: "ratio" });
        if (!p.ok) errors.limit = p.error.replace(/^Enter a value/, "Enter the distortion limit");
        else if (p.value <= 0 || p.value > 1) errors.limit = "A distortion limit is above 0 and at most 100 %.";
        else {
          const measure = m[2] && /n/i.test(m[2]) ? "thd_n" : "thd";
          conditions.atDistortion = { ratio: p.value, measure };
          shown.limit = `${formatValue(p.value, "ratio", { trimZeros: true })} ${measure === "thd" ? "THD" : "THD+N"}`;
        }
        break;
      }
      case "speed": {
        const p = parseSpeed(t);
        if (!p.ok) errors.speed = p.error;
        else {
          if (p.rpm !== undefined) conditions.speedRpm = p.rpm;
          if (p.cmS !== undefined) conditions.tapeSpeedCmS = p.cmS;
          shown.speed = p.shown;
        }
        break;
      }
      case "distance": {
        const n = Number(t.replace(/\s*m$/i, "").replace(",", "."));
        if (!Number.isFinite(n) || n <= 0 || n > 100) errors.distance = "Give the distance in metres, e.g. 1 m.";
        else conditions.distanceM = n;
        break;
      }
      case "weighting":
        if (isOneOf(WEIGHTINGS, t)) conditions.weighting = t;
        else errors.weighting = "Choose a weighting from the list.";
        break;
      case "driven":
        if (isOneOf(CHANNELS_DRIVEN, t)) conditions.channelsDriven = t;
        else errors.driven = "Choose from the list.";
        break;
      case "supply":
        if (t === "split" || t === "single") conditions.supply = t;
        else errors.supply = "Choose split or single.";
        break;
    }
  }
  if (row.note.length > 500) errors.note = "Keep the note under 500 characters.";
  if (Object.keys(errors).length || !value.ok) return { reading: null, errors, shown };
  const reading: Reading = {
    quantity: row.quantity,
    value: value.value,
    unit: value.unit,
    text: row.value.trim().slice(0, 80),
    basis: row.basis,
    origin: "typed",
    conditions,
    ...(channel ? { channel } : {}),
    ...(row.note.trim() ? { note: row.note.trim() } : {}),
  };
  return { reading, errors, shown };
}

/** Which row field a schema path inside one reading belongs to ("conditions.loadOhm" → "load"). */
export function fieldOfPath(path: string): keyof RowErrors {
  const map: Record<string, keyof RowErrors> = {
    loadOhm: "load",
    frequencyHz: "frequency",
    frequencyRange: "range",
    powerW: "level",
    voltageV: "level",
    atDistortion: "limit",
    bandwidth: "bandwidth",
    weighting: "weighting",
    channelsDriven: "driven",
    testToneHz: "tone",
    speedRpm: "speed",
    tapeSpeedCmS: "speed",
    supply: "supply",
    distanceM: "distance",
    quantity: "quantity",
    value: "value",
    unit: "value",
    channel: "channel",
    basis: "basis",
    note: "note",
  };
  const parts = path.split(".");
  const key = parts[0] === "conditions" ? parts[1] : parts[0];
  return map[key] ?? "value";
}
