import { describe, expect, it } from "vitest";
import { CaptureError, IMPEDANCE_COLUMNS, parseColumnsCsv, parseTwoColumnCsv, SQUARE_COLUMNS, SWEEP_COLUMNS } from "@shared/bench/analysis";
import { inferKind } from "~/bench/captures.server";

// The CSV dialects benches export (RFC 4180 quoting; ";" with decimal commas where the comma is the
// decimal mark; tab-separated; a byte-order mark; a header row with units; "#" comments), and refusals
// that name the line and column at fault.

function refusal(run: () => unknown): CaptureError {
  try {
    run();
  } catch (e) {
    if (e instanceof CaptureError) return e;
    throw e;
  }
  throw new Error("expected the file to be refused");
}

const values = (a: Float64Array | null) => (a ? Array.from(a) : null);

describe("CSV dialects", () => {
  it("quoted fields, a quoted header holding the delimiter, CRLF line ends", () => {
    const csv = '"Frequency (Hz)","Level (dB, re 1 V)"\r\n"20","-0.5"\r\n"1000","0"\r\n"20000","-1.25"\r\n';
    const r = parseTwoColumnCsv(csv, SWEEP_COLUMNS);
    expect(r.header).toEqual(["Frequency (Hz)", "Level (dB, re 1 V)"]);
    expect(Array.from(r.x)).toEqual([20, 1000, 20000]);
    expect(Array.from(r.y)).toEqual([-0.5, 0, -1.25]);
  });

  it("semicolons with decimal commas, and a byte-order mark before the header", () => {
    const csv = "\uFEFFFrequenz (Hz);Level (dB)\n20;-0,5\n1000;0\n20000;-1,25\n".replace("Frequenz", "Frequency");
    const r = parseTwoColumnCsv(csv, SWEEP_COLUMNS);
    expect(r.header).toEqual(["Frequency (Hz)", "Level (dB)"]);
    expect(Array.from(r.y)).toEqual([-0.5, 0, -1.25]);
  });

  it("tab-separated, with comment lines and blank lines; no header means the columns in order", () => {
    const csv =
      "# exported by the bench PC\n\n0\t0.1\n1e-6\t0.2\n\n# mid-file note\n2e-6\t0.3\n3e-6\t0.3\n4e-6\t0.3\n5e-6\t0.3\n6e-6\t0.3\n7e-6\t0.3\n8e-6\t0.3\n9e-6\t0.3\n";
    const r = parseTwoColumnCsv(csv, SQUARE_COLUMNS);
    expect(r.header).toBeNull();
    expect(r.x.length).toBe(10);
    expect(r.x[1]).toBe(1e-6);
  });

  it("columns found by their header words in any order, extra columns ignored", () => {
    const csv = "index,Level (dB),freq\n1,-3,20\n2,0,1000\n3,-3,20000\n";
    const r = parseTwoColumnCsv(csv, SWEEP_COLUMNS);
    expect(Array.from(r.x)).toEqual([20, 1000, 20000]);
    expect(Array.from(r.y)).toEqual([-3, 0, -3]);
  });

  it("an impedance sweep's optional phase: by header, by position, or absent", () => {
    const withPhase = parseColumnsCsv("Frequency (Hz);|Z| (Ω);Phase (°)\n20;7,1;12,5\n50;36;0\n200;8;-20\n", IMPEDANCE_COLUMNS);
    expect(values(withPhase.values[1])).toEqual([7.1, 36, 8]);
    expect(values(withPhase.values[2])).toEqual([12.5, 0, -20]);
    const positional = parseColumnsCsv("20,7.1,12.5\n50,36,0\n200,8,-20\n", IMPEDANCE_COLUMNS);
    expect(values(positional.values[2])).toEqual([12.5, 0, -20]);
    const none = parseColumnsCsv("frequency,impedance\n20,7.1\n50,36\n200,8\n", IMPEDANCE_COLUMNS);
    expect(none.values[2]).toBeNull();
    expect(none.header).toEqual(["frequency", "impedance", null]);
  });

  it("an impedance CSV is told from a response sweep by its header", () => {
    const enc = (s: string) => new TextEncoder().encode(s);
    expect(inferKind(enc("Frequency (Hz),Impedance (ohm),Phase (deg)\n"), "csv")).toBe("impedance");
    expect(inferKind(enc("freq;|Z|;phase\n"), "csv")).toBe("impedance");
    expect(inferKind(enc("Frequency (Hz),Level (dB)\n"), "csv")).toBe("sweep");
  });
});

describe("refusals name the line and column", () => {
  it("a header without the needed column", () => {
    const e = refusal(() => parseTwoColumnCsv("time,current\n0,1\n", SQUARE_COLUMNS));
    expect(e.code).toBe("csv_columns_missing");
    expect(e.message).toBe("The CSV header (line 1: time, current) has no 'volts' column; expected columns 'time' and 'volts'.");
  });

  it("an impedance header without ohms; the optional phase is named as optional", () => {
    const e = refusal(() => parseColumnsCsv("frequency,level\n20,1\n", IMPEDANCE_COLUMNS));
    expect(e.message).toBe(
      "The CSV header (line 1: frequency, level) has no 'ohms' column; expected columns 'frequency' and 'ohms' (and optionally 'phase').",
    );
  });

  it("a short row, counted on the lines the seller sees (comments and blanks included)", () => {
    const e = refusal(() => parseTwoColumnCsv("# note\nfrequency,level\n\n20,-0.1\n1000\n", SWEEP_COLUMNS));
    expect(e.code).toBe("csv_columns_missing");
    expect(e.message).toBe("Line 5 has 1 column; expected columns 'frequency' and 'level'.");
    expect(e.details).toEqual({ line: 5 });
  });

  it("a quoted header cell that spans two lines counts both", () => {
    const e = refusal(() => parseTwoColumnCsv('"Frequency\n(Hz)",level\n20,1\n1000,x\n', SWEEP_COLUMNS));
    expect(e.message).toBe("Line 4, column 'level': 'x' is not a number.");
  });

  it("a cell that is not a number, even quoted", () => {
    const e = refusal(() => parseTwoColumnCsv('frequency,level\n20,-0.1\n"1000","abc"\n20000,-0.2\n', SWEEP_COLUMNS));
    expect(e.code).toBe("csv_not_number");
    expect(e.message).toBe("Line 3, column 'level': 'abc' is not a number.");
  });

  it("numbers as benches write them, and not what JavaScript alone would take (hex, Infinity, blank)", () => {
    const r = parseTwoColumnCsv("frequency,level\n 20 ,5.\n.5e3,-.25\n1E4,+1e-6\n", SWEEP_COLUMNS);
    expect(Array.from(r.x)).toEqual([20, 500, 10_000]);
    expect(Array.from(r.y)).toEqual([5, -0.25, 1e-6]);
    for (const bad of ["0x10", "Infinity", "-Infinity", "", "1,5e", "NaN", "1_000"]) {
      const e = refusal(() => parseTwoColumnCsv(`frequency;level\n20;1\n1000;${bad}\n20000;2\n`, SWEEP_COLUMNS));
      expect(e.message).toBe(`Line 3, column 'level': '${bad}' is not a number.`);
    }
  });

  it("too few rows, and an empty file", () => {
    expect(refusal(() => parseTwoColumnCsv("frequency,level\n1000,0\n", SWEEP_COLUMNS)).message).toBe(
      "The CSV file has 1 data row; at least 3 are needed.",
    );
    expect(refusal(() => parseTwoColumnCsv("\uFEFF\n\n", SWEEP_COLUMNS)).message).toBe(
      "The CSV file is empty; expected columns 'frequency' and 'level'.",
    );
  });
});
