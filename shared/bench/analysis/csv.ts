// Two-column CSV as oscilloscopes and analysers export it: an optional header row, comma, semicolon or tab.
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

const NUMBER = /^[+-]?(\d+\.?\d*|\.\d+)([eE][+-]?\d+)?$/;

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

function detectDelimiter(line: string): string {
  if (line.includes("\t")) return "\t";
  if (line.includes(";")) return ";";
  return ",";
}

export function parseTwoColumnCsv(text: string, spec: ColumnSpec): TwoColumns {
  const lines = text.replace(/^\uFEFF/, "").split(/\r\n|\n|\r/);
  const rows: { line: number; cells: string[] }[] = [];
  let delim: string | null = null;
  for (let i = 0; i < lines.length; i++) {
    const raw = lines[i].trim();
    if (raw === "" || raw.startsWith("#")) continue;
    delim ??= detectDelimiter(raw);
    rows.push({ line: i + 1, cells: raw.split(delim).map((c) => c.trim().replace(/^"(.*)"$/, "$1")) });
  }
  const [nx, ny] = spec.names;
  const expected = `'${nx}' and '${ny}'`;
  if (rows.length === 0) throw new CaptureError("csv_columns_missing", `The CSV file is empty; expected columns ${expected}.`);

  // Semicolon files often use the decimal comma.
  const toNumber = (cell: string): number | null => {
    const c = delim === ";" ? cell.replace(",", ".") : cell;
    return NUMBER.test(c) ? Number(c) : null;
  };

  let colX = 0;
  let colY = 1;
  let header: [string, string] | null = null;
  const first = rows[0];
  if (first.cells.some((c) => toNumber(c) === null)) {
    const words = first.cells.map(headerWord);
    colX = words.findIndex((w) => spec.aliases[0].includes(w));
    colY = words.findIndex((w, i) => i !== colX && spec.aliases[1].includes(w));
    if (colX < 0 || colY < 0) {
      const missing = [colX < 0 ? nx : null, colY < 0 ? ny : null].filter(Boolean).join("' and '");
      throw new CaptureError(
        "csv_columns_missing",
        `The CSV header (line ${first.line}: ${first.cells.join(", ")}) has no '${missing}' column; expected columns ${expected}.`,
        { line: first.line, header: first.cells },
      );
    }
    header = [first.cells[colX], first.cells[colY]];
    rows.shift();
  }

  const need = Math.max(colX, colY) + 1;
  const x = new Float64Array(rows.length);
  const y = new Float64Array(rows.length);
  for (let r = 0; r < rows.length; r++) {
    const { line, cells } = rows[r];
    if (cells.length < need) {
      throw new CaptureError(
        "csv_columns_missing",
        `Line ${line} has ${cells.length} column${cells.length === 1 ? "" : "s"}; expected columns ${expected}.`,
        { line },
      );
    }
    const vx = toNumber(cells[colX]);
    const vy = toNumber(cells[colY]);
    if (vx === null || vy === null) {
      const [name, cell] = vx === null ? [nx, cells[colX]] : [ny, cells[colY]];
      throw new CaptureError("csv_not_number", `Line ${line}, column '${name}': '${cell}' is not a number.`, { line, column: name });
    }
    x[r] = vx;
    y[r] = vy;
  }
  if (rows.length < spec.minRows) {
    throw new CaptureError(
      "csv_too_few_rows",
      `The CSV file has ${rows.length} data row${rows.length === 1 ? "" : "s"}; at least ${spec.minRows} are needed.`,
      { rows: rows.length, minRows: spec.minRows },
    );
  }
  return { x, y, header };
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
