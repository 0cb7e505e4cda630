// The inventory CSV: Loadline's own plain layout for a workshop's units, one row per unit. The import reads
// it into drafts; the inventory exports the same layout, so an export opened, edited and imported again
// means the same units. Cells are text as a person types them; this module reads one row into what the
// editor's steps store (the item, the condition, a bench sheet) and writes one listing back as a row.
// Isomorphic and pure: no CSV parsing here (the import keeps its parser), no database.
import { z } from "zod";
import { CATEGORIES, COSMETIC_GRADES, SERVICE_STATES, type Category, type CosmeticGrade, type ServiceState } from "./catalogue";
import { ConditionSchema, ItemFieldsSchema, type ConditionValues, type ItemPatch } from "./listing-draft";
import { CURRENCY_CODES, eraInputValue, isCurrency, parseEra, parsePrice, parseWeight, parseWhole, priceInputValue } from "./listing-input";
import { COUNTRY_CODES } from "./countries";
import { isOneOf } from "./one-of";
import { parseBenchSheet, type BenchSheet, type BenchSheetInput, type Reading } from "./bench/schema";
import { blankRow, readRow } from "./bench-form/rows";
import { readingToRow } from "./bench-form/state";
import { FIGURE_COLUMN_NAMES, FIGURE_COLUMNS, conditionColumn, figuresFor } from "./inventory-csv-figures";

export { FIGURE_COLUMNS, figuresFor, type FigureColumn } from "./inventory-csv-figures";

/** The unit's own columns, in file order. */
export const UNIT_COLUMNS = [
  "reference",
  "category",
  "maker",
  "model",
  "era",
  "cosmetic_grade",
  "service_state",
  "description",
  "price",
  "currency",
  "handling_days",
  "mains_voltage",
  "weight_kg",
  "country",
  "measured_on",
  "measured_by",
] as const;
export type UnitColumn = (typeof UNIT_COLUMNS)[number];

/** Every column of the layout, in file order: the header line of a template and of an export. */
export const INVENTORY_COLUMNS: readonly string[] = [...UNIT_COLUMNS, ...FIGURE_COLUMN_NAMES];

/** The most rows one file may hold (the import's limit, stated here so the template can say it). */
export const MAX_INVENTORY_ROWS = 5000;

const cell = z.string().max(4000, "A cell holds at most 4000 characters.").default("");

/**
 * One row as read from a file: every column a string ("" when blank or absent). Unknown columns are
 * refused by `checkHeader`, not here, so a row object may come straight from a CSV parser's record.
 */
export const InventoryRowSchema = z.object(Object.fromEntries(INVENTORY_COLUMNS.map((c) => [c, cell]))) as z.ZodType<
  InventoryRow,
  Partial<InventoryRow>
>; // zod cannot type an object built from a runtime list of keys; the cast names the shape it checks.
export type InventoryRow = Record<string, string>;

/** One problem in one row, named by its column ("row" when it is the row as a whole). */
export type RowProblem = { column: string; message: string };

/** What one row becomes: the values the editor's item, condition and bench steps store. */
export type InventoryDraft = {
  /** The workshop's own stock number, kept with the listing (not shown to buyers). */
  reference: string | null;
  category: Category;
  item: ItemPatch;
  condition: ConditionValues;
  /** null when the row has no figures. */
  benchSheet: BenchSheetInput | null;
};

/** Header problems: missing required columns, unknown or repeated ones. Column order does not matter. */
export function checkHeader(header: readonly string[]): RowProblem[] {
  const problems: RowProblem[] = [];
  const seen = new Set<string>();
  for (const raw of header) {
    const name = raw.trim().toLowerCase();
    if (seen.has(name)) problems.push({ column: name, message: `The column "${name}" appears twice.` });
    seen.add(name);
    if (!INVENTORY_COLUMNS.includes(name)) problems.push({ column: name, message: `"${raw.trim()}" is not a column of the layout.` });
  }
  for (const required of ["category", "maker", "model"] as const)
    if (!seen.has(required)) problems.push({ column: required, message: `The file needs a "${required}" column.` });
  return problems;
}

const LABEL: Record<string, string> = { cosmetic_grade: "cosmetic grade", service_state: "service state" };
const oneOf = <T extends string>(list: readonly T[], text: string, column: string, problems: RowProblem[]): T | null => {
  const t = text
    .trim()
    .toLowerCase()
    .replace(/[\s-]+/g, "_");
  if (!t) return null;
  if (isOneOf(list, t)) return t;
  problems.push({ column, message: `"${text.trim()}" is not a ${LABEL[column] ?? column}; use one of ${list.join(", ")}.` });
  return null;
};

/** Reads one row (already checked by `InventoryRowSchema`) into draft input, or every problem it has. */
export function rowToDraft(input: Partial<InventoryRow>): { ok: true; draft: InventoryDraft } | { ok: false; problems: RowProblem[] } {
  const parsedRow = InventoryRowSchema.safeParse(input);
  if (!parsedRow.success)
    return { ok: false, problems: parsedRow.error.issues.map((i) => ({ column: String(i.path[0] ?? "row"), message: i.message })) };
  // The export's guard against spreadsheet formulas (`safeCell`) comes off again here.
  const row = Object.fromEntries(Object.entries(parsedRow.data).map(([k, v]) => [k, v.replace(/^'(?=[=+\-@])/, "")]));
  const problems: RowProblem[] = [];
  const take = <T>(column: string, r: { ok: true; value: T } | { ok: false; message: string }, fallback: T): T => {
    if (r.ok) return r.value;
    problems.push({ column, message: r.message });
    return fallback;
  };
  const category = oneOf(CATEGORIES, row.category, "category", problems);
  if (!category && !row.category.trim())
    problems.push({ column: "category", message: "Give the kind of unit, e.g. integrated_amplifier." });
  const currencyText = row.currency.trim().toUpperCase() || "EUR";
  if (!isCurrency(currencyText))
    problems.push({ column: "currency", message: `"${row.currency.trim()}" is not a currency Loadline takes.` });
  const currency = isCurrency(currencyText) ? currencyText : "EUR";
  const era = take("era", parseEra(row.era), { from: null, to: null });
  const countryText = row.country.trim().toUpperCase();
  if (countryText && !isOneOf(COUNTRY_CODES, countryText))
    problems.push({ column: "country", message: `"${row.country.trim()}" is not a country code Loadline knows (two letters, e.g. DE).` });

  const item = {
    category: category ?? "integrated_amplifier",
    maker: row.maker,
    model: row.model,
    yearFrom: era.from,
    yearTo: era.to,
    priceMinor: row.price.trim() ? take("price", parsePrice(row.price, currency), null) : null,
    currency,
    handlingDays: take("handling_days", parseWhole(row.handling_days, 0, 30, "the handling time in days"), null),
    mainsVoltageV: take("mains_voltage", parseWhole(row.mains_voltage, 90, 260, "the mains voltage in volts"), null),
    weightG: take("weight_kg", parseWeight(row.weight_kg), null),
    country: countryText && isOneOf(COUNTRY_CODES, countryText) ? countryText : null,
  };
  const itemParsed = ItemFieldsSchema.pick({
    category: true,
    maker: true,
    model: true,
    yearFrom: true,
    yearTo: true,
    priceMinor: true,
    currency: true,
    handlingDays: true,
    mainsVoltageV: true,
    weightG: true,
    country: true,
  }).safeParse(item);
  if (!itemParsed.success)
    for (const i of itemParsed.error.issues) problems.push({ column: ITEM_COLUMN[String(i.path[0])] ?? "row", message: i.message });

  const conditionParsed = ConditionSchema.safeParse({
    cosmeticGrade: oneOf(COSMETIC_GRADES, row.cosmetic_grade, "cosmetic_grade", problems),
    serviceState: oneOf(SERVICE_STATES, row.service_state, "service_state", problems),
    conditionNote: row.description,
  });
  if (!conditionParsed.success)
    for (const i of conditionParsed.error.issues)
      problems.push({ column: CONDITION_COLUMN[String(i.path[0])] ?? "description", message: i.message });

  const reference = row.reference.trim();
  if (reference.length > 40) problems.push({ column: "reference", message: "A reference is at most 40 characters." });
  const benchSheet = category ? readFigures(row, category, problems) : null;
  if (problems.length || !itemParsed.success || !conditionParsed.success || !category)
    return { ok: false, problems: inFileOrder(problems) };
  return {
    ok: true,
    draft: { reference: reference || null, category, item: itemParsed.data, condition: conditionParsed.data, benchSheet },
  };
}

/** Problems in the order of the columns they name, so a preview reads left to right ("row" last). */
function inFileOrder(problems: RowProblem[]): RowProblem[] {
  const at = (p: RowProblem) => (INVENTORY_COLUMNS.includes(p.column) ? INVENTORY_COLUMNS.indexOf(p.column) : INVENTORY_COLUMNS.length);
  return [...problems].sort((a, b) => at(a) - at(b));
}

const ITEM_COLUMN: Record<string, string> = {
  category: "category",
  maker: "maker",
  model: "model",
  yearFrom: "era",
  yearTo: "era",
  priceMinor: "price",
  currency: "currency",
  handlingDays: "handling_days",
  mainsVoltageV: "mains_voltage",
  weightG: "weight_kg",
  country: "country",
};
const CONDITION_COLUMN: Record<string, string> = {
  cosmeticGrade: "cosmetic_grade",
  serviceState: "service_state",
  conditionNote: "description",
};

/** The row's figures as a bench sheet (measured readings), through the bench form's row reader. */
function readFigures(row: InventoryRow, category: Category, problems: RowProblem[]): BenchSheetInput | null {
  const own = new Set(figuresFor(category));
  for (const f of FIGURE_COLUMNS)
    if (!own.has(f) && [f.column, ...f.conditions.map((c) => conditionColumn(f, c))].some((c) => row[c].trim()))
      problems.push({
        column: f.column,
        message: `A ${category.replace(/_/g, " ")} has no ${f.column.replace(/_/g, " ")} figure; leave it blank.`,
      });
  const readings: Reading[] = [];
  for (const f of own) {
    const conditions = Object.fromEntries(f.conditions.map((c) => [c, row[conditionColumn(f, c)].trim()]));
    if (!row[f.column].trim()) {
      const stray = f.conditions.find((c) => conditions[c]);
      if (stray)
        problems.push({
          column: conditionColumn(f, stray),
          message: `A condition without its figure: fill in ${f.column} or leave this blank.`,
        });
      continue;
    }
    const read = readRow(blankRow(f.column, "measured", { quantity: f.quantity, value: row[f.column], ...conditions }));
    for (const [field, message] of Object.entries(read.errors))
      problems.push({ column: field === "value" || field === "quantity" ? f.column : `${f.column}_${field}`, message });
    if (read.reading) readings.push(read.reading);
  }
  const measuredOn = row.measured_on.trim();
  const measuredBy = row.measured_by.trim();
  if (!readings.length) {
    if (measuredOn || measuredBy)
      problems.push({ column: measuredOn ? "measured_on" : "measured_by", message: "The row has no figures to go with this." });
    return null;
  }
  const sheet: BenchSheetInput = {
    category,
    readings,
    sweeps: [],
    ...(measuredOn ? { measuredOn } : {}),
    ...(measuredBy ? { measuredBy } : {}),
  };
  const parsed = parseBenchSheet(sheet);
  if (!parsed.ok)
    for (const i of parsed.issues) {
      const [head, index] = i.path.split(".");
      const column =
        head === "readings"
          ? [...own].filter((f) => row[f.column].trim())[Number(index)]?.column
          : head === "measuredOn"
            ? "measured_on"
            : "measured_by";
      problems.push({ column: column ?? "row", message: i.message });
    }
  return sheet;
}

/** What `listingToRow` needs of a listing: its stored fields, its reference and its bench sheet. */
export type InventoryListing = {
  reference: string | null;
  category: Category;
  maker: string | null;
  model: string | null;
  yearFrom: number | null;
  yearTo: number | null;
  cosmeticGrade: CosmeticGrade | null;
  serviceState: ServiceState | null;
  conditionNote: string | null;
  priceMinor: number | null;
  currency: string;
  handlingDays: number | null;
  mainsVoltageV: number | null;
  weightG: number | null;
  country: string | null;
  sheet: BenchSheet | null;
};

/** A reading for the figure's column: typed and measured, the whole unit's (both/mono/unstated) first, else a channel's. */
function pickReading(sheet: BenchSheet, quantity: string): Reading | undefined {
  const candidates = sheet.readings.filter((r) => r.quantity === quantity && r.basis === "measured");
  return candidates.find((r) => !r.channel || r.channel === "both" || r.channel === "mono") ?? candidates[0];
}

/**
 * One listing as a row of the layout. Figures the layout has no column for, and conditions other than a
 * figure's own columns, stay on Loadline (the bench sheet and its API carry them); a figure taken from a
 * capture is written as its measured value.
 */
export function listingToRow(l: InventoryListing): InventoryRow {
  const currency = isCurrency(l.currency) ? l.currency : "EUR";
  const row: InventoryRow = Object.fromEntries(INVENTORY_COLUMNS.map((c) => [c, ""]));
  Object.assign(row, {
    reference: l.reference ?? "",
    category: l.category,
    maker: l.maker ?? "",
    model: l.model ?? "",
    era: eraInputValue(l.yearFrom, l.yearTo),
    cosmetic_grade: l.cosmeticGrade ?? "",
    service_state: l.serviceState ?? "",
    description: l.conditionNote ?? "",
    price: l.priceMinor === null ? "" : priceWithDecimals(l.priceMinor, currency),
    currency,
    handling_days: l.handlingDays === null ? "" : String(l.handlingDays),
    mains_voltage: l.mainsVoltageV === null ? "" : String(l.mainsVoltageV),
    weight_kg: l.weightG === null ? "" : String(l.weightG / 1000),
    country: l.country ?? "",
    measured_on: l.sheet?.measuredOn ?? "",
    measured_by: l.sheet?.measuredBy ?? "",
  } satisfies Record<UnitColumn, string>);
  if (l.sheet)
    for (const f of figuresFor(l.category)) {
      const reading = pickReading(l.sheet, f.quantity);
      if (!reading) continue;
      const typed = readingToRow(reading.origin === "capture" ? { ...reading, origin: "typed", captureId: undefined } : reading, f.column);
      row[f.column] = typed.value;
      for (const c of f.conditions) row[conditionColumn(f, c)] = typed[c];
    }
  return row;
}

/** A price in major units with its decimals, as a spreadsheet shows it: 124900 EUR → "1249.00". */
function priceWithDecimals(minor: number, currency: (typeof CURRENCY_CODES)[number]): string {
  const plain = priceInputValue(minor, currency);
  if (currency === "JPY" || plain.includes(".")) return plain;
  return `${plain}.00`;
}

/** One CSV line (RFC 4180: a cell with a comma, quote or line break is quoted, quotes doubled), no line end. */
export function csvLine(cells: readonly string[]): string {
  return cells.map((c) => (/[",\r\n]/.test(c) || /^\s|\s$/.test(c) ? `"${c.replace(/"/g, '""')}"` : c)).join(",");
}

/** A cell a spreadsheet would run as a formula ("=", "+", "-", "@" first) is written with a leading apostrophe. */
export function safeCell(text: string): string {
  return /^[=+\-@\t\r]/.test(text) && !/^[+-]?\d/.test(text) ? `'${text}` : text;
}

/** The rows as a whole file: the header, then one line per row, CRLF line ends (RFC 4180). */
export function inventoryCsv(rows: readonly InventoryRow[]): string {
  const lines = [csvLine(INVENTORY_COLUMNS), ...rows.map((r) => csvLine(INVENTORY_COLUMNS.map((c) => safeCell(r[c] ?? ""))))];
  return lines.join("\r\n") + "\r\n";
}
