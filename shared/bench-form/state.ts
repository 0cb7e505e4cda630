// The whole bench sheet form: rows and sheet details to a bench sheet and back, the HTML form's fields,
// and the rows a new sheet starts with. Used by the browser (live outcomes) and the server (the authority).
import { CATEGORY_QUANTITIES, QUANTITIES, QUANTITY_INFO, type Category, type Quantity } from "../bench/quantities";
import {
  CHANNELS,
  conditionsSchema,
  equipmentSchema,
  parseBenchSheet,
  readingSchema,
  sweepSchema,
  type BenchSheet,
  type Conditions,
  type Reading,
  type Sweep,
} from "../bench/schema";
import { isOneOf } from "../one-of";
import { formatValue } from "../bench/units";
import type { FormLike } from "../listing-draft";
import {
  blankRow,
  CONDITION_FIELDS,
  fieldOfPath,
  readRow,
  ROW_FIELDS,
  type ConditionField,
  type RowErrors,
  type RowResult,
  type SheetRow,
} from "./rows";

/** A form field's JSON, or undefined when it does not parse (the schema after it then refuses it). */
function parseJson(text: string): unknown {
  try {
    return JSON.parse(text);
  } catch {
    return undefined;
  }
}

/** The stored condition keys each form field writes. */
const CONDITION_KEYS: Record<ConditionField, (keyof Conditions)[]> = {
  load: ["loadOhm"],
  frequency: ["frequencyHz"],
  range: ["frequencyRange"],
  level: ["powerW", "voltageV"],
  limit: ["atDistortion"],
  bandwidth: ["bandwidth"],
  weighting: ["weighting"],
  driven: ["channelsDriven"],
  tone: ["testToneHz"],
  speed: ["speedRpm", "tapeSpeedCmS"],
  supply: ["supply"],
  distance: ["distanceM"],
};

export type SheetMeta = { measuredOn: string; measuredBy: string; channelCount: string; bridged: boolean; notes: string };
export type SheetFormState = {
  category: Category;
  meta: SheetMeta;
  rows: SheetRow[];
  sweeps: Sweep[];
  /** The unit the sheet describes, as an API client sent it; kept, not edited here. */
  equipment?: BenchSheet["equipment"];
};

export type SheetRead = {
  /** The sheet when every row reads and the schema accepts it; null otherwise. */
  sheet: BenchSheet | null;
  rows: Record<string, RowResult>;
  rowErrors: Record<string, RowErrors>;
  metaErrors: Partial<Record<keyof SheetMeta, string>>;
  /** "readings.3" → row key, to point at the rows a rule compared. */
  refToRow: Record<string, string>;
  errorCount: number;
};

const MAX_ROWS = 300;

/** Read the form state into a bench sheet. Blank rows are skipped; every other row must read. */
export function readSheetState(state: SheetFormState): SheetRead {
  const rows: Record<string, RowResult> = {};
  const rowErrors: Record<string, RowErrors> = {};
  const refToRow: Record<string, string> = {};
  const readings: Reading[] = [];
  for (const row of state.rows.slice(0, MAX_ROWS)) {
    const r = readRow(row);
    rows[row.key] = r;
    if (Object.keys(r.errors).length) rowErrors[row.key] = r.errors;
    else if (r.reading && (!r.reading.quantity || CATEGORY_QUANTITIES[state.category].includes(r.reading.quantity))) {
      refToRow[`readings.${readings.length}`] = row.key;
      readings.push(r.reading);
    } else if (r.reading) rowErrors[row.key] = { quantity: "This reading does not belong on this kind of unit's sheet." };
  }
  const metaErrors: SheetRead["metaErrors"] = {};
  const m = state.meta;
  if (m.measuredOn && !/^\d{4}-\d{2}-\d{2}$/.test(m.measuredOn)) metaErrors.measuredOn = "Give the date as YYYY-MM-DD.";
  else if (m.measuredOn && m.measuredOn > new Date().toISOString().slice(0, 10))
    metaErrors.measuredOn = "The date cannot be in the future.";
  if (m.measuredBy.length > 120) metaErrors.measuredBy = "At most 120 characters.";
  if (m.notes.length > 4000) metaErrors.notes = "At most 4000 characters.";
  const channelCount = m.channelCount ? Number(m.channelCount) : undefined;
  if (channelCount !== undefined && !(Number.isInteger(channelCount) && channelCount >= 1 && channelCount <= 8))
    metaErrors.channelCount = "Give the number of channels, 1 to 8.";
  const candidate = {
    category: state.category,
    ...(state.equipment ? { equipment: state.equipment } : {}),
    ...(channelCount !== undefined && !metaErrors.channelCount ? { channelCount } : {}),
    ...(m.bridged ? { bridged: true } : {}),
    ...(m.measuredOn ? { measuredOn: m.measuredOn } : {}),
    ...(m.measuredBy.trim() ? { measuredBy: m.measuredBy.trim() } : {}),
    readings,
    sweeps: state.sweeps,
    ...(m.notes.trim() ? { notes: m.notes.trim() } : {}),
  };
  let sheet: BenchSheet | null = null;
  const rowsWithErrors = Object.keys(rowErrors).length;
  if (!rowsWithErrors && !Object.keys(metaErrors).length) {
    const parsed = parseBenchSheet(candidate);
    if (parsed.ok) sheet = parsed.sheet;
    else
      for (const issue of parsed.issues) {
        const [head, index, ...rest] = issue.path.split(".");
        const key = head === "readings" ? refToRow[`readings.${index}`] : undefined;
        if (key) (rowErrors[key] ??= {})[fieldOfPath(rest.join("."))] ??= issue.message;
        else if (head === "measuredOn" || head === "measuredBy" || head === "notes" || head === "channelCount")
          metaErrors[head] ??= issue.message;
        else if (head === "bridged") metaErrors.bridged ??= issue.message;
        else metaErrors.notes ??= `${issue.path}: ${issue.message}`;
      }
  }
  const errorCount = Object.values(rowErrors).reduce((n, e) => n + Object.keys(e).length, 0) + Object.keys(metaErrors).length;
  return { sheet, rows, rowErrors, metaErrors, refToRow, errorCount };
}

const text = (v: number | undefined, kind: Parameters<typeof formatValue>[1]) => (v === undefined ? "" : formatValue(v, kind, { sig: 6 }));

/** A stored reading as form text (six significant figures, so a re-save does not change the number). */
export function readingToRow(r: Reading, key: string): SheetRow {
  if (r.origin === "capture")
    return blankRow(key, "measured", { quantity: r.quantity, channel: r.channel ?? "", capture: r, value: "capture" });
  const info = QUANTITY_INFO[r.quantity];
  const c = r.conditions ?? {};
  const value =
    r.text ??
    (r.unit || info.kind === "number"
      ? formatValue(r.value, info.kind, { unit: r.unit, sig: 6, trimZeros: true })
      : formatValue(r.value, info.kind, { sig: 6 }));
  const shownKeys = new Set<string>(CONDITION_FIELDS[r.quantity].flatMap((f) => CONDITION_KEYS[f]));
  const kept = Object.fromEntries(Object.entries(c).filter(([k]) => !shownKeys.has(k)));
  const range = (b?: { lowHz: number; highHz: number }) => (b ? `${text(b.lowHz, "frequency")} – ${text(b.highHz, "frequency")}` : "");
  return blankRow(key, r.basis, {
    quantity: r.quantity,
    channel: r.channel ?? "",
    value,
    note: r.note ?? "",
    load: text(c.loadOhm, "resistance"),
    frequency: text(c.frequencyHz, "frequency"),
    range: range(c.frequencyRange),
    level: c.powerW !== undefined ? text(c.powerW, "power") : text(c.voltageV, "voltage"),
    limit: c.atDistortion
      ? `${formatValue(c.atDistortion.ratio, "ratio", { sig: 6, trimZeros: true })} ${c.atDistortion.measure === "thd" ? "THD" : "THD+N"}`
      : "",
    bandwidth: range(c.bandwidth),
    weighting: c.weighting ?? "",
    driven: c.channelsDriven ?? "",
    tone: text(c.testToneHz, "frequency"),
    speed:
      c.speedRpm !== undefined ? `${+c.speedRpm.toFixed(3)} rpm` : c.tapeSpeedCmS !== undefined ? `${+c.tapeSpeedCmS.toFixed(3)} cm/s` : "",
    supply: c.supply ?? "",
    distance: c.distanceM !== undefined ? `${c.distanceM} m` : "",
    ...(Object.keys(kept).length ? { keep: kept } : {}),
  });
}

export function sheetToState(sheet: BenchSheet | null, category: Category): SheetFormState {
  const rows = (sheet?.readings ?? []).map((r, i) => readingToRow(r, `r${i}`));
  return {
    category,
    meta: {
      measuredOn: sheet?.measuredOn ?? "",
      measuredBy: sheet?.measuredBy ?? "",
      channelCount: sheet?.channelCount ? String(sheet.channelCount) : "",
      bridged: sheet?.bridged ?? false,
      notes: sheet?.notes ?? "",
    },
    rows: [...rows, ...suggestedRows(category, rows)],
    sweeps: sheet?.sweeps ?? [],
    ...(sheet?.equipment ? { equipment: sheet.equipment } : {}),
  };
}

type Suggestion = Partial<SheetRow> & { quantity: Quantity };
const bothDriven = { frequency: "1 kHz", limit: "0.1 % THD", driven: "both" };
const AMP: Suggestion[] = [
  { quantity: "output_power", channel: "left", load: "8 Ω", ...bothDriven },
  { quantity: "output_power", channel: "right", load: "8 Ω", ...bothDriven },
  { quantity: "output_power", channel: "left", load: "4 Ω", ...bothDriven },
  { quantity: "output_power", channel: "right", load: "4 Ω", ...bothDriven },
  { quantity: "thd", channel: "left", load: "8 Ω", frequency: "1 kHz" },
  { quantity: "snr", channel: "both", load: "8 Ω", weighting: "A" },
  { quantity: "f3db_high", channel: "both", load: "8 Ω", level: "1 W" },
];
const SUGGESTED: Record<Category, Suggestion[]> = {
  integrated_amplifier: AMP,
  power_amplifier: AMP,
  receiver: AMP,
  preamplifier: [
    { quantity: "gain", channel: "both", frequency: "1 kHz" },
    { quantity: "thd", channel: "both", frequency: "1 kHz", level: "1 V" },
    { quantity: "f3db_high", channel: "both", level: "1 V" },
    { quantity: "snr", channel: "both", level: "1 V", weighting: "A" },
  ],
  phono_stage: [
    { quantity: "gain", channel: "both", frequency: "1 kHz" },
    { quantity: "snr", channel: "both", level: "5 mV", weighting: "A" },
  ],
  loudspeaker: [
    { quantity: "nominal_impedance", basis: "rated" },
    { quantity: "impedance_minimum", channel: "left" },
    { quantity: "sensitivity", channel: "left", level: "2.83 V", distance: "1 m" },
  ],
  turntable: [
    { quantity: "speed_error", speed: "33⅓ rpm", tone: "3150 Hz" },
    { quantity: "wow_flutter", speed: "33⅓ rpm", tone: "3150 Hz", weighting: "IEC-60386-peak" },
  ],
  tape_deck: [
    { quantity: "speed_error", tone: "3150 Hz" },
    { quantity: "wow_flutter", tone: "3150 Hz", weighting: "IEC-60386-peak" },
    { quantity: "f3db_high", level: "-20 dBV" },
    { quantity: "snr", weighting: "A" },
  ],
};

/** Blank rows, conditions filled in, for the readings a category needs that the sheet does not have yet. */
export function suggestedRows(category: Category, existing: SheetRow[]): SheetRow[] {
  // A reading "covers" a suggestion when it is the same quantity and basis, on that channel (or both), at that load.
  const covers = (r: SheetRow, s: Suggestion) => {
    const channel = r.capture?.channel ?? r.channel;
    const load = r.capture ? text(r.capture.conditions?.loadOhm, "resistance") : r.load;
    return (
      r.quantity === s.quantity &&
      r.basis === (s.basis ?? "measured") &&
      (channel === (s.channel ?? "") || channel === "both" || s.channel === "both") &&
      (!s.load || !load || load === s.load)
    );
  };
  return SUGGESTED[category].filter((s) => !existing.some((r) => covers(r, s))).map((s, i) => blankRow(`s${i}`, s.basis ?? "measured", s));
}

// ---- the HTML form ----

/** Field name of a row's input, e.g. "row.3.load". */
export const rowField = (index: number, field: string) => `row.${index}.${field}`;

/** Reads the posted form (rows are numbered 0…rows-1; capture readings travel as JSON). */
export function readSheetForm(form: FormLike, category: Category): SheetFormState {
  const get = (name: string) => {
    const v = form.get(name);
    return typeof v === "string" ? v : "";
  };
  const count = Math.min(MAX_ROWS, Math.max(0, Number(get("rows")) || 0));
  const removed = get("remove");
  const removedCapture = get("removeCapture");
  const rows: SheetRow[] = [];
  for (let i = 0; i < count; i++) {
    if (removed === String(i)) continue;
    const basis = get(rowField(i, "basis")) === "rated" ? "rated" : "measured";
    const quantity = get(rowField(i, "quantity"));
    const channel = get(rowField(i, "channel"));
    const row = blankRow(get(rowField(i, "key")) || `f${i}`, basis, {
      quantity: isOneOf(QUANTITIES, quantity) ? quantity : "",
      channel: isOneOf(CHANNELS, channel) ? channel : "",
      value: get(rowField(i, "value")),
      note: get(rowField(i, "note")),
    });
    for (const f of ROW_FIELDS) row[f] = get(rowField(i, f));
    const kept = get(rowField(i, "keep"));
    if (kept) {
      try {
        const c = conditionsSchema.safeParse(JSON.parse(kept));
        if (c.success) row.keep = c.data;
      } catch {
        // unreadable kept conditions are dropped; the typed ones still count
      }
    }
    const captured = get(rowField(i, "capture"));
    if (captured) {
      // A mangled capture row is dropped; the server rebuilds capture readings from the capture anyway.
      const reading = readingSchema.safeParse(parseJson(captured));
      if (!reading.success) continue;
      row.capture = reading.data;
      if (removedCapture && row.capture.captureId === removedCapture) continue;
    }
    rows.push(row);
  }
  const rawSweeps = parseJson(get("sweeps") || "[]");
  const sweeps: Sweep[] = Array.isArray(rawSweeps)
    ? rawSweeps
        .map((s) => sweepSchema.safeParse(s))
        .filter((r) => r.success)
        .map((r) => r.data)
    : [];
  let equipment: BenchSheet["equipment"];
  try {
    const e = equipmentSchema.safeParse(JSON.parse(get("equipment") || "null"));
    if (e.success) equipment = e.data;
  } catch {
    equipment = undefined;
  }
  return {
    category,
    meta: {
      measuredOn: get("measuredOn").trim(),
      measuredBy: get("measuredBy"),
      channelCount: get("channelCount").trim(),
      bridged: get("bridged") === "on" || get("bridged") === "true",
      notes: get("notes"),
    },
    rows,
    sweeps,
    ...(equipment ? { equipment } : {}),
  };
}

/** A sheet's content in a fixed key order, without what does not change its meaning (typed text, client ids). */
export function sheetFingerprint(sheet: BenchSheet | null | undefined): string {
  if (!sheet) return "";
  const norm = (v: unknown): unknown => {
    if (Array.isArray(v)) return v.map(norm);
    if (v && typeof v === "object")
      return Object.fromEntries(
        Object.entries(v)
          .filter(([k, x]) => k !== "text" && k !== "id" && x !== undefined)
          .sort(([a], [b]) => (a < b ? -1 : a > b ? 1 : 0))
          .map(([k, x]) => [k, norm(x)]),
      );
    return v;
  };
  return JSON.stringify(norm({ ...sheet, sweeps: sheet.sweeps ?? [] }));
}
