import { describe, expect, it } from "vitest";
import { blankRow, readRow } from "@shared/bench-form/rows";
import { readSheetForm, readSheetState, rowField, sheetFingerprint, sheetToState, type SheetFormState } from "@shared/bench-form/state";
import { checkBenchSheet, doctoredIntegratedAmplifierSheet, exampleIntegratedAmplifierSheet } from "@shared/bench";

// The bench sheet form: what a seller types in a row, read into a reading with its conditions.
// Sine relations (common practice): Vrms = Vpp / (2√2).

const row = (rest: Parameters<typeof blankRow>[2]) => blankRow("k", "measured", rest);

describe("a typed reading", () => {
  it('reads "112 W" into 8 Ω at 1 kHz, 0.1 % THD, both channels driven', () => {
    const r = readRow(
      row({
        quantity: "output_power",
        channel: "left",
        value: "112 W",
        load: "8 Ω",
        frequency: "1 kHz",
        limit: "0.1 % THD",
        driven: "both",
      }),
    );
    expect(r.errors).toEqual({});
    expect(r.reading).toMatchObject({
      quantity: "output_power",
      value: 112,
      unit: "W",
      text: "112 W",
      basis: "measured",
      origin: "typed",
      channel: "left",
      conditions: { loadOhm: 8, frequencyHz: 1000, atDistortion: { ratio: 0.001, measure: "thd" }, channelsDriven: "both" },
    });
    expect(r.shown.value).toBe("112 W");
  });

  it('reads "80 Vpp" as 28.3 V rms (Vpp / 2√2, sine; common practice)', () => {
    const r = readRow(row({ quantity: "output_voltage", value: "80 Vpp", load: "8R" }));
    expect(r.reading!.value).toBeCloseTo(80 / (2 * Math.SQRT2), 12);
    expect(r.reading!.unit).toBe("Vpp");
    expect(r.shown.value).toBe("28.3 V rms");
  });

  it('reads "0.03 %" as a ratio of 0.0003 and shows it in dB too (20·log10 0.0003 = −70.5 dB)', () => {
    const r = readRow(
      row({ quantity: "thd", value: "0.03 %", level: "60 W", load: "8 Ω", frequency: "1 kHz", bandwidth: "20 Hz – 20 kHz" }),
    );
    expect(r.reading!.value).toBeCloseTo(0.0003, 15);
    expect(r.reading!.conditions).toMatchObject({ powerW: 60, bandwidth: { lowHz: 20, highHz: 20_000 } });
    expect(r.shown.value).toBe("0.030 % (-70.5 dB)");
  });

  it('reads "17 µs" and "17 us" as 17 microseconds', () => {
    for (const text of ["17 µs", "17 us"])
      expect(readRow(row({ quantity: "rise_time", value: text })).reading!.value).toBeCloseTo(17e-6, 18);
  });

  it('reads "28.3 Vrms" and a level of "2.83 V"', () => {
    const r = readRow(row({ quantity: "sensitivity", value: "89 dB", level: "2.83 V", distance: "1 m" }));
    expect(r.reading!.conditions).toEqual({ voltageV: 2.83, distanceM: 1 });
    expect(readRow(row({ quantity: "output_voltage", value: "28.3 Vrms" })).reading!.value).toBe(28.3);
  });

  it("turns dB(A) into A-weighting and ±42 V rails into a split supply", () => {
    expect(readRow(row({ quantity: "snr", value: "98 dB(A)", level: "1 W" })).reading!.conditions).toMatchObject({
      weighting: "A",
      powerW: 1,
    });
    expect(readRow(row({ quantity: "rail_voltage", value: "±42 V" })).reading!.conditions).toEqual({ supply: "split" });
  });

  it("gives a clear message for input it cannot read, next to the field", () => {
    expect(readRow(row({ quantity: "output_power", value: "112" })).errors.value).toMatch(/Add a unit/);
    expect(readRow(row({ quantity: "output_power", value: "112 Hz" })).errors.value).toMatch(/this field needs a power/);
    expect(readRow(row({ quantity: "output_power", value: "lots" })).errors.value).toMatch(/does not start with a number/);
    expect(readRow(row({ quantity: "output_power", value: "112 W", load: "eight" })).errors.load).toBeTruthy();
    expect(readRow(row({ quantity: "thd", value: "0.1 %", level: "1 Hz" })).errors.level).toMatch(/power .* or a voltage/);
    expect(readRow(row({ value: "112 W" })).errors.quantity).toMatch(/Choose/);
  });

  it("skips a row without a value", () => {
    expect(readRow(row({ quantity: "output_power", load: "8 Ω" }))).toEqual({ reading: null, errors: {}, shown: {} });
  });

  it("keeps rated and measured apart", () => {
    const rated = readRow(
      blankRow("r", "rated", {
        quantity: "output_power",
        value: "2 × 60 W",
        load: "8 Ω",
        range: "20 Hz – 20 kHz",
        limit: "0.1 % THD",
        driven: "both",
      }),
    );
    expect(rated.reading).toMatchObject({
      basis: "rated",
      value: 60,
      channel: "both",
      conditions: { frequencyRange: { lowHz: 20, highHz: 20_000 } },
    });
  });
});

describe("the whole sheet", () => {
  it("round-trips a stored sheet through the form without changing what it says", () => {
    for (const sheet of [exampleIntegratedAmplifierSheet(), doctoredIntegratedAmplifierSheet()]) {
      const read = readSheetState(sheetToState(sheet, sheet.category));
      expect(read.errorCount).toBe(0);
      expect(sheetFingerprint(read.sheet)).toBe(sheetFingerprint(sheet));
      expect(checkBenchSheet(read.sheet!).summary).toBe(checkBenchSheet(sheet).summary);
    }
  });

  it("reads the posted HTML form the way the browser state reads, dropping a removed row", () => {
    const sheet = exampleIntegratedAmplifierSheet();
    const state = sheetToState(sheet, sheet.category);
    const fields = new URLSearchParams({
      rows: String(state.rows.length),
      sweeps: "[]",
      remove: "0",
      equipment: JSON.stringify(state.equipment),
      measuredOn: state.meta.measuredOn,
      measuredBy: state.meta.measuredBy,
      channelCount: state.meta.channelCount,
      notes: state.meta.notes,
    });
    state.rows.forEach((r, i) => {
      fields.set(rowField(i, "key"), r.key);
      fields.set(rowField(i, "basis"), r.basis);
      fields.set(rowField(i, "quantity"), r.quantity);
      fields.set(rowField(i, "channel"), r.channel);
      fields.set(rowField(i, "value"), r.value);
      fields.set(rowField(i, "note"), r.note);
      for (const f of ["load", "frequency", "range", "level", "limit", "bandwidth", "weighting", "driven", "supply"] as const)
        fields.set(rowField(i, f), r[f]);
      if (r.keep) fields.set(rowField(i, "keep"), JSON.stringify(r.keep));
      if (r.capture) fields.set(rowField(i, "capture"), JSON.stringify(r.capture));
    });
    const posted: SheetFormState = readSheetForm(fields, "integrated_amplifier");
    expect(posted.rows).toHaveLength(state.rows.length - 1);
    const read = readSheetState(posted);
    expect(read.sheet!.readings).toHaveLength(sheet.readings.length - 1);
    expect(sheetFingerprint({ ...read.sheet!, readings: read.sheet!.readings })).toBe(
      sheetFingerprint({ ...sheet, readings: sheet.readings.slice(1) }),
    );
  });

  it("points a rule's references back at the rows it compared", () => {
    const sheet = doctoredIntegratedAmplifierSheet();
    const state = sheetToState(sheet, sheet.category);
    const read = readSheetState(state);
    const halfLoad = checkBenchSheet(read.sheet!).results.find((r) => r.outcome === "implausible")!;
    const rows = halfLoad.refs.map((ref) => state.rows.find((r) => r.key === read.refToRow[ref])!);
    expect(rows.every((r) => r.quantity === "output_power")).toBe(true);
    expect(rows.map((r) => r.load)).toEqual(expect.arrayContaining(["8 Ω", "4 Ω"]));
  });

  it("does not accept a reading that does not belong on the unit's sheet", () => {
    const state = sheetToState(null, "turntable");
    state.rows.push(blankRow("x", "measured", { quantity: "output_power", value: "50 W" }));
    const read = readSheetState(state);
    expect(read.sheet).toBeNull();
    expect(read.rowErrors.x.quantity).toBeTruthy();
  });

  it("starts a new sheet with the rows its kind of unit needs, values left for the seller", () => {
    const state = sheetToState(null, "integrated_amplifier");
    expect(state.rows.map((r) => `${r.quantity}/${r.channel}/${r.load}`)).toEqual(
      expect.arrayContaining(["output_power/left/8 Ω", "output_power/right/4 Ω", "thd/left/8 Ω", "snr/both/8 Ω", "f3db_high/both/8 Ω"]),
    );
    expect(state.rows.every((r) => r.value === "")).toBe(true);
    expect(readSheetState(state).sheet!.readings).toEqual([]);
  });
});
