import Papa from "papaparse";
import { checkBenchSheet, parseBenchSheet } from "@shared/bench";
import {
  checkHeader,
  figuresFor,
  INVENTORY_COLUMNS,
  MAX_INVENTORY_ROWS,
  rowToDraft,
  type InventoryDraft,
  type InventoryRow,
} from "@shared/inventory-csv";

// An uploaded inventory CSV read and checked row by row, before anything is written: papaparse splits
// it (quotes, line breaks in cells, the delimiter a spreadsheet chose), the layout's reader
// (shared/inventory-csv.ts, zod) reads each row, and the bench checks each row's figures as the editor
// does. Figures the bench finds implausible together are a problem here: in a file of many units that
// is most often a slip of the keyboard, and the editor would send the unit to the review desk for it.
// A reading that makes the unit unsafe to connect is a finding, not a slip: it is imported, and publishing
// holds the unit for the desk as the editor does (docs/decisions/0032).

/** The largest file one import takes; with MAX_INVENTORY_ROWS it bounds the work of one request. */
export const MAX_IMPORT_BYTES = 4 * 1024 * 1024;
export { MAX_INVENTORY_ROWS };
/** The preview lists at most this many problems; the rest are counted. */
export const MAX_LISTED_PROBLEMS = 200;

/** One problem: the row as a spreadsheet numbers it (the header is row 1), its column, what is wrong. */
export type ImportProblem = { row: number; column: string; message: string };
/** A row that reads: its number in the file and its cells by column. */
export type CheckedRow = { row: number; cells: InventoryRow };

export type CsvCheck =
  | { ok: true; rows: CheckedRow[] }
  | { ok: false; problems: ImportProblem[]; problemCount: number; rowsWithProblems: number; rowCount: number };

const isComment = (cells: string[]) => (cells[0] ?? "").trim().startsWith("#");
const isBlank = (cells: string[]) => cells.every((c) => c.trim() === "");

const column = (refs: readonly string[], withValues: readonly string[]) => {
  const m = /^readings\.(\d+)$/.exec(refs[0] ?? "");
  return (m && withValues[Number(m[1])]) || "row";
};

/** The bench's say on a row's figures, as problems: its implausible results. */
export function benchProblems(draft: InventoryDraft, cells: InventoryRow, row: number): ImportProblem[] {
  if (!draft.benchSheet) return [];
  const parsed = parseBenchSheet(draft.benchSheet);
  if (!parsed.ok) return [];
  // The sheet's readings are the row's filled figure columns, in layout order (shared/inventory-csv.ts).
  const withValues = figuresFor(draft.category)
    .filter((f) => cells[f.column]?.trim())
    .map((f) => f.column);
  const verdict = checkBenchSheet(parsed.sheet);
  return verdict.results
    .filter((r) => r.outcome === "implausible")
    .map((r) => ({ row, column: column(r.refs, withValues), message: `The bench finds this implausible (${r.title}): ${r.detail}` }));
}

const DELIMITERS = [",", ";", "\t"] as const;
const KNOWN = new Set(INVENTORY_COLUMNS);

/**
 * The delimiter that splits the header into the layout's column names. The header decides: papaparse's
 * guess counts fields over the first rows, and descriptions holding semicolons (a spreadsheet quotes a
 * cell only for commas) outvote the commas of a 50-column header.
 */
function headerDelimiter(body: string): string | undefined {
  const lines = body.split(/\r\n|\n|\r/, 50).filter((l) => l.trim() !== "" && !l.trim().startsWith("#"));
  for (const line of lines) {
    let best: string | undefined;
    let most = 0;
    for (const d of DELIMITERS) {
      const known = line.split(d).filter((c) =>
        KNOWN.has(
          c
            .trim()
            .replace(/^"(.*)"$/, "$1")
            .trim()
            .toLowerCase(),
        ),
      ).length;
      if (known > most) [best, most] = [d, known];
    }
    if (best) return best;
  }
  return undefined;
}

/** Reads and checks a whole file's text. Nothing here writes; the caller imports only an `ok` file. */
export function checkInventoryCsv(text: string): CsvCheck {
  const body = text.replace(/^\uFEFF/, "");
  const delimiter = headerDelimiter(body);
  const parsed = Papa.parse<string[]>(body, {
    skipEmptyLines: false,
    ...(delimiter ? { delimiter } : { delimitersToGuess: [...DELIMITERS] }),
  });
  const problems: ImportProblem[] = [];
  const fail = (rowCount: number): CsvCheck => ({
    ok: false,
    problems: problems.slice(0, MAX_LISTED_PROBLEMS),
    problemCount: problems.length,
    rowsWithProblems: new Set(problems.map((p) => p.row)).size,
    rowCount,
  });
  for (const e of parsed.errors)
    if (e.type === "Quotes")
      problems.push({ row: (e.row ?? 0) + 1, column: "row", message: `${e.message}: a quoted cell is never closed.` });
  if (problems.length) return fail(0);

  const records = parsed.data.map((cells, i) => ({ row: i + 1, cells })).filter((r) => !isComment(r.cells) && !isBlank(r.cells));
  const head = records.shift();
  if (!head) {
    problems.push({
      row: 1,
      column: "row",
      message: `The file is empty; it needs the header line (${INVENTORY_COLUMNS.slice(0, 4).join(",")}…) and a row per unit.`,
    });
    return fail(0);
  }
  const header = head.cells.map((c) => c.trim().toLowerCase());
  for (const p of checkHeader(head.cells)) problems.push({ row: head.row, ...p });
  if (problems.length) return fail(records.length);
  if (!records.length) {
    // The row a first unit would take: after the header and any comment lines.
    const next = parsed.data.findLastIndex((cells) => !isBlank(cells)) + 2;
    problems.push({ row: next, column: "row", message: "The file has a header and no units; add a row per unit." });
    return fail(0);
  }
  if (records.length > MAX_INVENTORY_ROWS) {
    problems.push({
      row: records[MAX_INVENTORY_ROWS].row,
      column: "row",
      message: `The file has ${records.length.toLocaleString("en-GB")} units; one import takes at most ${MAX_INVENTORY_ROWS.toLocaleString("en-GB")}. Split it into smaller files.`,
    });
    return fail(records.length);
  }

  const rows: CheckedRow[] = [];
  for (const r of records) {
    if (r.cells.length > header.length && r.cells.slice(header.length).some((c) => c.trim())) {
      problems.push({
        row: r.row,
        column: "row",
        message: `The row has ${r.cells.length} cells and the header ${header.length}; a comma may be missing its quotes.`,
      });
      continue;
    }
    const cells: InventoryRow = Object.fromEntries(header.map((name, i) => [name, r.cells[i] ?? ""]));
    const read = rowToDraft(cells);
    if (!read.ok) {
      for (const p of read.problems) problems.push({ row: r.row, ...p });
      continue;
    }
    const bench = benchProblems(read.draft, cells, r.row);
    if (bench.length) problems.push(...bench);
    else rows.push({ row: r.row, cells });
  }
  return problems.length ? fail(records.length) : { ok: true, rows };
}
