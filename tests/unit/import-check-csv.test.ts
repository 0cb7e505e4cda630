import { describe, expect, it } from "vitest";
import { checkInventoryCsv, MAX_LISTED_PROBLEMS } from "~/imports/check-csv";
import { EXAMPLE_ROWS, exampleCsv, templateCsv } from "~/imports/files";
import { INVENTORY_COLUMNS, inventoryCsv, MAX_INVENTORY_ROWS } from "@shared/inventory-csv";

// Row numbers are the spreadsheet's: the header is row 1, each record (a quoted cell may span lines) one row.
const HEADER = "category,maker,model,price,currency,power,power_load,description";

describe("the import's check of a whole file", () => {
  it("reads the example file: four units, rows 2 to 5, no problems", () => {
    const r = checkInventoryCsv(exampleCsv());
    expect(r.ok).toBe(true);
    if (r.ok) {
      expect(r.rows.map((x) => x.row)).toEqual([2, 3, 4, 5]);
      expect(r.rows.map((x) => x.cells.model)).toEqual(EXAMPLE_ROWS.map((x) => x.model));
    }
  });

  it("the template is the layout's header and a comment line, and holds no units", () => {
    const [header, comment] = templateCsv().split("\r\n");
    expect(header.split(",")).toEqual([...INVENTORY_COLUMNS]);
    expect(comment.startsWith('"#')).toBe(true);
    const r = checkInventoryCsv(templateCsv());
    expect(r.ok).toBe(false);
    if (!r.ok) expect(r.problems).toEqual([{ row: 3, column: "row", message: "The file has a header and no units; add a row per unit." }]);
  });

  it("names each problem by row and column, counting comment lines and multi-line cells as rows", () => {
    const text = [
      HEADER,
      "# a note: rows 2 and 5 are comments and still numbered",
      'integrated_amplifier,Vantrell,IA-70,"1,250.00",EUR,2 × 72 W,8 Ω,',
      "integrated_amp,Vantrell,IA-71,900,EUR,,,",
      "# second note",
      'integrated_amplifier,Vantrell,IA-72,twelve,EUR,,,"Recapped.\nNew relay."',
      "integrated_amplifier,Vantrell,IA-73,900,EUR,72 X,8 Ω,",
    ].join("\n");
    const r = checkInventoryCsv(text);
    expect(r.ok).toBe(false);
    if (r.ok) return;
    expect(r.problems.map((p) => [p.row, p.column])).toEqual([
      [4, "category"],
      [6, "price"],
      [7, "power"],
    ]);
    expect(r.problems[0].message).toMatch(/"integrated_amp" is not a category/);
    expect(r.problems[1].message).toMatch(/"twelve" is not a price/);
    expect(r.rowsWithProblems).toBe(3);
    expect(r.rowCount).toBe(4);
  });

  it("refuses a header with an unknown column, and a row with more cells than the header", () => {
    const bad = checkInventoryCsv("category,maker,model,colour\nturntable,Pellquist,DT 3,red\n");
    expect(!bad.ok && bad.problems).toEqual([{ row: 1, column: "colour", message: '"colour" is not a column of the layout.' }]);
    const wide = checkInventoryCsv("category,maker,model\nturntable,Pellquist,DT 3,extra\n");
    expect(!wide.ok && wide.problems.map((p) => [p.row, p.column])).toEqual([[2, "row"]]);
  });

  it("reads a semicolon file as a European spreadsheet saves it", () => {
    const r = checkInventoryCsv("category;maker;model;price;currency\nturntable;Pellquist;DT 3;1.250,50;EUR\n");
    expect(r.ok).toBe(true);
  });

  it("takes the delimiter from the header, not from semicolons or commas inside descriptions", () => {
    // The example's amplifier twice: its description holds two semicolons, unquoted (a spreadsheet quotes a
    // cell only for commas), and the 50-column header says the file is comma-separated.
    const amp = EXAMPLE_ROWS.find((r) => r.description.includes(";"))!;
    const commas = checkInventoryCsv(inventoryCsv([amp, { ...amp, reference: "WB-2041" }]));
    expect(commas.ok && commas.rows.map((r) => r.cells.description)).toEqual([amp.description, amp.description]);
    const semicolons = checkInventoryCsv('category;maker;model;description\nturntable;Pellquist;DT 3;"Belt, mat, lid hinges."\n');
    expect(semicolons.ok && semicolons.rows.map((r) => r.cells.description)).toEqual(["Belt, mat, lid hinges."]);
  });

  it(`refuses more than ${MAX_INVENTORY_ROWS} units with one message at the first row past the limit`, () => {
    const rows = Array.from({ length: MAX_INVENTORY_ROWS + 1 }, (_, i) => `turntable,Pellquist,DT ${i}`);
    const r = checkInventoryCsv(["category,maker,model", ...rows].join("\n"));
    expect(r.ok).toBe(false);
    if (!r.ok) {
      expect(r.problems).toHaveLength(1);
      // The header is row 1, so unit number 5001 is row 5002.
      expect(r.problems[0].row).toBe(MAX_INVENTORY_ROWS + 2);
      expect(r.problems[0].message).toMatch(/5,001 units; one import takes at most 5,000/);
    }
  });

  it(`lists at most ${MAX_LISTED_PROBLEMS} problems and counts the rest`, () => {
    const rows = Array.from({ length: 300 }, (_, i) => `kettle,Pellquist,DT ${i}`);
    const r = checkInventoryCsv(["category,maker,model", ...rows].join("\n"));
    expect(!r.ok && [r.problems.length, r.problemCount, r.rowsWithProblems]).toEqual([MAX_LISTED_PROBLEMS, 300, 300]);
  });

  it("refuses a quoted cell that is never closed", () => {
    const r = checkInventoryCsv('category,maker,model\nturntable,"Pellquist,DT 3\n');
    expect(r.ok).toBe(false);
  });
});
