// Column CSV as oscilloscopes, analysers and impedance bridges export it: an optional header row, comma,
// semicolon or tab between fields, quoted fields, a byte-order mark, "#" comment lines. The splitting
// is papaparse's (quotes and embedded delimiters are its job); which column is which, and the messages
// naming the line and column that cannot be read, are ours.
import Papa from "papaparse";
import { CaptureError } from "./errors";

export interface ColumnSpec {
  /** Names shown in messages, e.g. ["time", "volts"]. */
  names: [string, string];
  /** Accepted header words per column (compared without units, case and punctuation). */
  aliases: [readonly string[], readonly string[]];
  minRows: number;
}

export interface TwoColumns {
  x: Float64Array;
  y: Float64Array;
  /** The header as written, when the file had one. */
  header: [string, string] | null;
}

/** Two required columns and optional ones after them (e.g. an impedance sweep's phase). */
export interface ColumnsSpec {
  columns: { name: string; aliases: readonly string[]; optional?: boolean }[];
  minRows: number;
}

export interface Columns {
  /** One array per column of the spec; null for an optional column the file does not have. */
  values: (Float64Array | null)[];
  /** The header cells of the columns found, as written, when the file had a header. */
  header: (string | null)[] | null;
}

/**
 * A decimal number as benches write it (1, -0.5, .5, 5., 1e-6), or null. Number() alone would also take
 * "0x10", "Infinity" and "": those are refused by their first characters and by finiteness.
 */
function readNumber(c: string): number | null {
  const ch = c.charCodeAt(0);
  if (!((ch >= 48 && ch <= 57) || ch === 43 || ch === 45 || ch === 46)) return null;
  if (ch === 48 && c.length > 1) {
    const next = c.charCodeAt(1) | 32;
    if (next === 120 || next === 111 || next === 98) return null; // 0x, 0o, 0b
  }
  const v = Number(c);
  return Number.isFinite(v) ? v : null;
}

/** "Time (s)" → "time", "level_dB" → "leveldb". */
function headerWord(s: string): string {
  return s
    .replace(/^\uFEFF/, "")
    .replace(/[([].*?[)\]]/g, "")
    .toLowerCase()
    .replace(/[^a-z0-9]/g, "");
}

/** Unit written in a header cell: "Level (dB)" → "db". */
export function headerUnit(s: string): string | null {
  const m = /[([]\s*([^)\]]+?)\s*[)\]]/.exec(s);
  return m ? m[1].toLowerCase() : null;
}

/** The delimiter of the first non-comment line, counted outside quotes: tab, then semicolon, then comma. */
function detectDelimiter(text: string): string {
  const line =
    text
      .slice(0, 65_536)
      .split(/\r\n|\n|\r/)
      .find((l) => l.trim() !== "" && !l.trim().startsWith("#")) ?? "";
  const bare = line.replace(/"[^"]*"/g, "");
  if (bare.includes("\t")) return "\t";
  if (bare.includes(";")) return ";";
  return ",";
}

const quoteList = (names: string[]) => names.map((n) => `'${n}'`).join(" and ");

function expectedText(spec: ColumnsSpec): string {
  const required = spec.columns.filter((c) => !c.optional).map((c) => c.name);
  const optional = spec.columns.filter((c) => c.optional).map((c) => c.name);
  return quoteList(required) + (optional.length ? ` (and optionally ${quoteList(optional)})` : "");
}

/** Read the columns a spec names, by header words when the first row is a header, else by position. */
export function parseColumnsCsv(text: string, spec: ColumnsSpec): Columns {
  const body = text.replace(/^\uFEFF/, "");
  const delimiter = detectDelimiter(body);
  // Without a quote anywhere, papaparse may split on the delimiter alone (its fast mode).
  const quoted = body.includes('"');
  const parsed = Papa.parse<string[]>(body, { delimiter, skipEmptyLines: false, fastMode: !quoted });
  // Line numbers as the seller's editor shows them: a quoted field may itself hold line breaks.
  const rows: { line: number; cells: string[] }[] = [];
  let line = 1;
  for (const cells of parsed.data) {
    let breaks = 0;
    if (quoted) for (const c of cells) if (c.includes("\n") || c.includes("\r")) breaks += c.match(/\r\n|\n|\r/g)?.length ?? 0;
    const first = cells[0].trim();
    if (!(cells.length === 1 && first === "") && !first.startsWith("#")) rows.push({ line, cells });
    line += 1 + breaks;
  }
  const expected = expectedText(spec);
  if (rows.length === 0) throw new CaptureError("csv_columns_missing", `The CSV file is empty; expected columns ${expected}.`);

  // Semicolon files often use the decimal comma.
  const toNumber = (cell: string): number | null => readNumber(delimiter === ";" ? cell.replace(",", ".") : cell);

  let cols: number[] = spec.columns.map((_, i) => i);
  let header: (string | null)[] | null = null;
  const first = { line: rows[0].line, cells: rows[0].cells.map((c) => c.trim()) };
  if (first.cells.some((c) => toNumber(c) === null)) {
    const words = first.cells.map(headerWord);
    cols = [];
    for (const c of spec.columns) cols.push(words.findIndex((w, i) => !cols.includes(i) && c.aliases.includes(w)));
    const missing = spec.columns.filter((c, i) => !c.optional && cols[i] < 0).map((c) => c.name);
    if (missing.length) {
      throw new CaptureError(
        "csv_columns_missing",
        `The CSV header (line ${first.line}: ${first.cells.join(", ")}) has no '${missing.join("' and '")}' column; expected columns ${expected}.`,
        { line: first.line, header: first.cells },
      );
    }
    header = cols.map((k) => (k < 0 ? null : first.cells[k]));
    rows.shift();
  } else {
    // No header: an optional column is there when the first row has a cell for it.
    cols = cols.map((k, i) => (spec.columns[i].optional && k >= first.cells.length ? -1 : k));
  }

  const need = Math.max(...spec.columns.map((c, i) => (c.optional ? -1 : cols[i]))) + 1;
  const values = spec.columns.map((_, i) => (cols[i] < 0 ? null : new Float64Array(rows.length)));
  for (let r = 0; r < rows.length; r++) {
    const { line: at, cells } = rows[r];
    if (cells.length < need) {
      throw new CaptureError(
        "csv_columns_missing",
        `Line ${at} has ${cells.length} column${cells.length === 1 ? "" : "s"}; expected columns ${expected}.`,
        { line: at },
      );
    }
    for (let i = 0; i < spec.columns.length; i++) {
      const out = values[i];
      if (!out) continue;
      const cell = (cells[cols[i]] ?? "").trim();
      const v = toNumber(cell);
      if (v === null) {
        const name = spec.columns[i].name;
        throw new CaptureError("csv_not_number", `Line ${at}, column '${name}': '${cell}' is not a number.`, { line: at, column: name });
      }
      out[r] = v;
    }
  }
  if (rows.length < spec.minRows) {
    throw new CaptureError(
      "csv_too_few_rows",
      `The CSV file has ${rows.length} data row${rows.length === 1 ? "" : "s"}; at least ${spec.minRows} are needed.`,
      { rows: rows.length, minRows: spec.minRows },
    );
  }
  return { values, header };
}

export function parseTwoColumnCsv(text: string, spec: ColumnSpec): TwoColumns {
  const { values, header } = parseColumnsCsv(text, {
    columns: [
      { name: spec.names[0], aliases: spec.aliases[0] },
      { name: spec.names[1], aliases: spec.aliases[1] },
    ],
    minRows: spec.minRows,
  });
  return { x: values[0]!, y: values[1]!, header: header ? [header[0] ?? "", header[1] ?? ""] : null };
}

export const SQUARE_COLUMNS: ColumnSpec = {
  names: ["time", "volts"],
  aliases: [
    ["time", "t", "s", "sec", "second", "seconds"],
    ["volts", "volt", "voltage", "v", "level", "ch1", "channel1"],
  ],
  minRows: 10,
};

export const SWEEP_COLUMNS: ColumnSpec = {
  names: ["frequency", "level"],
  aliases: [
    ["frequency", "freq", "f", "hz"],
    ["level", "db", "dbv", "dbu", "dbr", "gain", "magnitude", "volts", "voltage", "v", "response"],
  ],
  minRows: 3,
};

/** A loudspeaker's impedance sweep: frequency, impedance modulus in ohms, and optionally phase in degrees. */
export const IMPEDANCE_COLUMNS: ColumnsSpec = {
  columns: [
    { name: "frequency", aliases: ["frequency", "freq", "f", "hz"] },
    { name: "ohms", aliases: ["ohms", "ohm", "impedance", "z", "magnitude", "mag", "modulus", "zohm", "zohms", "r"] },
    { name: "phase", aliases: ["phase", "deg", "degrees", "angle", "phi", "zphase"], optional: true },
  ],
  minRows: 3,
};
