import { describe, expect, it } from "vitest";
import { parseRange, parseValue, toUnit, unitKind, type ParseResult } from "@shared/bench/units";
import { formatValue } from "@shared/bench/format";

function ok(r: ParseResult) {
  if (!r.ok) throw new Error(`expected a value, got ${r.code}: ${r.error}`);
  return r;
}

describe("parseValue: power", () => {
  it("reads W, mW and dBW", () => {
    expect(ok(parseValue("112 W"))).toMatchObject({ kind: "power", value: 112, unit: "W" });
    expect(ok(parseValue("390mW")).value).toBeCloseTo(0.39, 12);
    expect(ok(parseValue("20 dBW")).value).toBeCloseTo(100, 9);
    expect(ok(parseValue("0 dBm")).value).toBeCloseTo(0.001, 12);
  });
  it("reads '2 × 66 W' as 66 W per channel", () => {
    expect(ok(parseValue("2 × 66 W"))).toMatchObject({ value: 66, channels: 2 });
    expect(ok(parseValue("2x66W"))).toMatchObject({ value: 66, channels: 2 });
  });
});

describe("parseValue: voltage as rms, peak or peak-to-peak", () => {
  it("stores rms and remembers the form typed", () => {
    expect(ok(parseValue("28.3 Vrms"))).toMatchObject({ kind: "voltage", value: 28.3, form: "rms", unit: "Vrms" });
    const pp = ok(parseValue("80 Vpp"));
    expect(pp.form).toBe("pp");
    expect(pp.value).toBeCloseTo(80 / (2 * Math.SQRT2), 12);
    const pk = ok(parseValue("40 Vpk"));
    expect(pk.form).toBe("peak");
    expect(pk.value).toBeCloseTo(40 / Math.SQRT2, 12);
  });
  it("accepts the spellings benches use", () => {
    for (const t of ["80 Vp-p", "80 V p-p", "80 Vpk-pk", "80 V pp"]) expect(ok(parseValue(t)).form).toBe("pp");
    for (const t of ["40 V peak", "40 Vp", "40 V pk"]) expect(ok(parseValue(t)).form).toBe("peak");
    expect(ok(parseValue("250 mV")).value).toBeCloseTo(0.25, 12);
    expect(ok(parseValue("50 µVrms")).value).toBeCloseTo(50e-6, 15);
    expect(ok(parseValue("50 uV")).value).toBeCloseTo(50e-6, 15);
    expect(ok(parseValue("50 \u03bcV")).value).toBeCloseTo(50e-6, 15); // Greek mu as well as the micro sign
  });
  it("reads plain V as DC when the field says so (rails)", () => {
    expect(ok(parseValue("±42 V", { voltageForm: "dc" }))).toMatchObject({ value: 42, form: "dc", plusMinus: true });
    expect(ok(parseValue("42 VDC")).form).toBe("dc");
  });
  it("reads dBV and dBu as rms volts", () => {
    expect(ok(parseValue("0 dBV")).value).toBeCloseTo(1, 12);
    expect(ok(parseValue("0 dBu")).value).toBeCloseTo(0.7746, 4);
    expect(ok(parseValue("−10 dBV")).value).toBeCloseTo(0.3162, 4); // typographic minus
  });
});

describe("parseValue: ratios", () => {
  it("reads %, ppm and dB (with the ratio kind) as a fraction", () => {
    expect(ok(parseValue("0.01 %")).value).toBeCloseTo(1e-4, 15);
    expect(ok(parseValue("100 ppm")).value).toBeCloseTo(1e-4, 15);
    expect(ok(parseValue("-80 dB", { kind: "ratio" })).value).toBeCloseTo(1e-4, 15);
  });
  it("takes dB as a level unless the field expects a ratio", () => {
    expect(ok(parseValue("98 dB"))).toMatchObject({ kind: "decibel", value: 98 });
    expect(ok(parseValue("98 dB(A)"))).toMatchObject({ kind: "decibel", weighting: "A" });
    expect(ok(parseValue("98 dBA")).weighting).toBe("A");
  });
  it("refuses a positive dB distortion figure", () => {
    const r = parseValue("80 dB", { kind: "ratio" });
    expect(r.ok).toBe(false);
    if (!r.ok) expect(r.code).toBe("out_of_range");
  });
  it("reads decimal commas", () => {
    expect(ok(parseValue("0,010 %")).value).toBeCloseTo(1e-4, 15);
    expect(ok(parseValue("1,5 kHz")).value).toBe(1500);
    expect(ok(parseValue("1,000 Hz")).value).toBe(1000);
  });
});

describe("parseValue: frequency, time, resistance, slew rate", () => {
  it("reads Hz and kHz", () => {
    expect(ok(parseValue("20 kHz")).value).toBe(20_000);
    expect(ok(parseValue("3150 Hz")).value).toBe(3150);
    expect(ok(parseValue("20k", { kind: "frequency" })).value).toBe(20_000);
  });
  it("reads s, ms, µs, us and ns", () => {
    expect(ok(parseValue("17.5 µs")).value).toBeCloseTo(17.5e-6, 15);
    expect(ok(parseValue("17.5 us")).value).toBeCloseTo(17.5e-6, 15);
    expect(ok(parseValue("30 ms")).value).toBeCloseTo(0.03, 15);
    expect(ok(parseValue("500 ns")).value).toBeCloseTo(5e-7, 18);
    expect(ok(parseValue("2 s")).value).toBe(2);
  });
  it("reads Ω, ohm, R and the resistor code", () => {
    expect(ok(parseValue("8 Ω")).value).toBe(8);
    expect(ok(parseValue("8 \u2126")).value).toBe(8); // ohm sign
    expect(ok(parseValue("8 ohms")).value).toBe(8);
    expect(ok(parseValue("8R")).value).toBe(8);
    expect(ok(parseValue("4R7")).value).toBeCloseTo(4.7, 12);
    expect(ok(parseValue("0R05")).value).toBeCloseTo(0.05, 12);
    expect(ok(parseValue("47 kΩ")).value).toBe(47_000);
    expect(ok(parseValue("47k", { kind: "resistance" })).value).toBe(47_000);
    expect(ok(parseValue("50 mΩ")).value).toBeCloseTo(0.05, 12);
    expect(ok(parseValue("1 MΩ")).value).toBe(1e6);
  });
  it("reads V/µs into V/s", () => {
    expect(ok(parseValue("25 V/µs")).value).toBe(25e6);
    expect(ok(parseValue("25 V/us")).value).toBe(25e6);
  });
  it("reads a sensitivity with its reference", () => {
    expect(ok(parseValue("88 dB/2.83 V/1 m")).sensitivityRef).toBe("2.83V");
    expect(ok(parseValue("86 dB/1W/1m")).sensitivityRef).toBe("1W");
  });
});

describe("parseValue: errors name the problem", () => {
  it.each([
    ["", "empty"],
    ["W", "no_number"],
    ["12 furlongs", "unknown_unit"],
  ])("%j → %s", (text, code) => {
    const r = parseValue(text);
    expect(r.ok).toBe(false);
    if (!r.ok) expect(r.code).toBe(code);
  });
  it("asks for a unit when the field needs one", () => {
    const r = parseValue("0.01", { kind: "ratio" });
    expect(r).toMatchObject({ ok: false, code: "no_unit" });
    if (!r.ok) expect(r.error).toMatch(/%/);
  });
  it("refuses a unit of the wrong kind", () => {
    const r = parseValue("8 Ω", { kind: "power" });
    expect(r).toMatchObject({ ok: false, code: "wrong_kind" });
    if (!r.ok) expect(r.error).toMatch(/power/);
  });
});

describe("parseRange", () => {
  it("reads '20 Hz – 20 kHz' and '20-20k Hz'", () => {
    const a = parseRange("20 Hz – 20 kHz");
    expect(a.ok && [a.low.value, a.high.value]).toEqual([20, 20_000]);
    const b = parseRange("20-20k Hz", { kind: "frequency" });
    expect(b.ok && [b.low.value, b.high.value]).toEqual([20, 20_000]);
    const c = parseRange("10 Hz to 100 kHz");
    expect(c.ok && [c.low.value, c.high.value]).toEqual([10, 100_000]);
  });
  it("refuses a range that runs backwards", () => {
    expect(parseRange("20 kHz – 20 Hz").ok).toBe(false);
  });
});

describe("formatting", () => {
  it("shows values the way listings print them", () => {
    expect(formatValue(112, "power")).toBe("112 W");
    expect(formatValue(1e-4, "ratio")).toBe("0.010 %");
    expect(formatValue(17.5e-6, "time")).toBe("17.5 µs");
    expect(formatValue(5.0265e6, "slewRate")).toBe("5.03 V/µs");
    expect(formatValue(200_000, "frequency")).toBe("200 kHz");
    expect(formatValue(3150, "frequency")).toBe("3.15 kHz");
    expect(formatValue(0.05, "resistance")).toBe("0.05 Ω");
    expect(formatValue(47_000, "resistance")).toBe("47 kΩ");
    expect(formatValue(0.39, "power")).toBe("0.39 W");
    expect(formatValue(0.002, "voltage")).toBe("2 mV");
    expect(formatValue(40 / Math.SQRT2, "voltage", { form: "peak" })).toBe("40 Vpk");
    expect(formatValue(-0.2, "decibel")).toBe("-0.2 dB");
    expect(formatValue(0.2, "decibel", { signed: true })).toBe("+0.2 dB");
  });
  it("shows a value back in the unit it was typed in", () => {
    expect(formatValue(80 / (2 * Math.SQRT2), "voltage", { unit: "Vpp" })).toBe("80 Vpp");
    expect(formatValue(1e-4, "ratio", { unit: "dB" })).toBe("-80 dB");
    expect(formatValue(1e-4, "ratio", { unit: "ppm" })).toBe("100 ppm");
    expect(toUnit(0.7746, "dBu", "voltage")).toBeCloseTo(0, 3);
  });
  it("tells the kind of a unit spelling", () => {
    expect(unitKind("Vpp")).toBe("voltage");
    expect(unitKind("dB", "ratio")).toBe("ratio");
    expect(unitKind("dB")).toBe("decibel");
    expect(unitKind("parsecs")).toBeUndefined();
  });
});
