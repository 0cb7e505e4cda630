// Every SI prefix a bench meter shows, and the trade's logarithmic levels.
// Prefix factors: SI Brochure, 9th edition (BIPM 2019), Table 7. Levels: IEC 60027-3 (dBm re 1 mW, dBV re 1 V),
// dBu re 0.7746 V = √(1 mW · 600 Ω) (IEC 60268-2's 600 Ω reference impedance).
import { describe, expect, it } from "vitest";
import { parseValue, toUnit, type ParseResult } from "@shared/bench/units";
import { formatValue } from "@shared/bench/format";
import { lowerLabel, withArticle, categoryNoun } from "@shared/bench/words";

function ok(r: ParseResult) {
  if (!r.ok) throw new Error(r.error);
  return r;
}

describe("SI prefixes (SI Brochure Table 7)", () => {
  it.each([
    ["3 pW", "power", 3e-12],
    ["3 nW", "power", 3e-9],
    ["3 µW", "power", 3e-6],
    ["3 uW", "power", 3e-6],
    ["3 mW", "power", 3e-3],
    ["3 kW", "power", 3e3],
    ["5 pV", "voltage", 5e-12],
    ["5 nV", "voltage", 5e-9],
    ["5 nVrms", "voltage", 5e-9],
    ["5 µV", "voltage", 5e-6],
    ["5 mV", "voltage", 5e-3],
    ["1.2 kV", "voltage", 1.2e3],
    ["40 ps", "time", 40e-12],
    ["40 ns", "time", 40e-9],
    ["40 µs", "time", 40e-6],
    ["40 ms", "time", 40e-3],
    ["4 mHz", "frequency", 4e-3],
    ["4 kHz", "frequency", 4e3],
    ["4 MHz", "frequency", 4e6],
    ["1.5 GHz", "frequency", 1.5e9],
    ["20 µΩ", "resistance", 20e-6],
    ["20 mΩ", "resistance", 20e-3],
    ["20 kΩ", "resistance", 20e3],
    ["20 MΩ", "resistance", 20e6],
    ["2 GΩ", "resistance", 2e9],
    ["1.5 V/ns", "slewRate", 1.5e9],
  ] as const)("%s", (text, kind, base) => {
    const r = ok(parseValue(text));
    expect(r.kind).toBe(kind);
    expect(r.value / base).toBeCloseTo(1, 12);
  });
  it("keeps the case a prefix needs: mHz is millihertz, MHz megahertz; mΩ milliohm, MΩ megohm", () => {
    expect(ok(parseValue("1 mHz")).value).toBeCloseTo(1e-3, 15);
    expect(ok(parseValue("1 MHz")).value).toBe(1e6);
    expect(ok(parseValue("1 mΩ")).value).toBeCloseTo(1e-3, 15);
    expect(ok(parseValue("1 MΩ")).value).toBe(1e6);
  });
  it("turns a typed nV and pW back into their unit for display", () => {
    expect(toUnit(5e-9, "nV", "voltage")).toBeCloseTo(5, 9);
    expect(toUnit(3e-12, "pW", "power")).toBeCloseTo(3, 9);
    expect(formatValue(5e-9, "voltage")).toBe("5 nV");
    expect(formatValue(3e-12, "power")).toBe("3 pW");
  });
});

describe("logarithmic levels", () => {
  it("dBm is 10·log10(P / 1 mW), not 20·log10 (IEC 60027-3)", () => {
    // 30 dBm = 10^(30/10) mW = 1 W; with 20·log10 it would read 31.6 mW.
    expect(ok(parseValue("30 dBm")).value).toBeCloseTo(1, 12);
    expect(ok(parseValue("-90 dBm")).value).toBeCloseTo(1e-12, 24);
  });
  it("a voltage in dBm is referred to 600 Ω: 0 dBm = 0.7746 V, the dBu reference (IEC 60268-2)", () => {
    const r = ok(parseValue("0 dBm", { kind: "voltage" }));
    expect(r.kind).toBe("voltage");
    expect(r.value).toBeCloseTo(0.7746, 4); // √(0.001 × 600) = 0.774597
    expect(ok(parseValue("+4 dBm (600 Ω)")).value).toBeCloseTo(1.2277, 4); // 0.7746 × 10^(4/20)
    expect(toUnit(0.7746, "dBm", "voltage")).toBeCloseTo(0, 3);
  });
  it("reads dBu and dBV", () => {
    expect(ok(parseValue("+4 dBu")).value).toBeCloseTo(1.2277, 4);
    expect(ok(parseValue("-10 dBV")).value).toBeCloseTo(0.31623, 5);
  });
  it("reads an analyser's dBc as a distortion ratio: −80 dBc = 0.01 %", () => {
    expect(ok(parseValue("-80 dBc", { kind: "ratio" })).value).toBeCloseTo(1e-4, 15);
    expect(parseValue("+3 dBc", { kind: "ratio" }).ok).toBe(false);
  });
  it("reads ppm: 100 ppm = 0.01 %", () => {
    expect(ok(parseValue("100 ppm")).value).toBeCloseTo(1e-4, 15);
  });
});

describe("words in sentences", () => {
  it("gives the right article", () => {
    expect(withArticle(categoryNoun("integrated_amplifier"))).toBe("an integrated amplifier");
    expect(withArticle(categoryNoun("phono_stage"))).toBe("a phono stage");
    expect(withArticle(categoryNoun("loudspeaker"))).toBe("a loudspeaker");
    expect(withArticle("RIAA sweep")).toBe("an RIAA sweep");
    expect(withArticle("8 Ω load")).toBe("an 8 Ω load");
    expect(withArticle("80 kHz instrument")).toBe("an 80 kHz instrument");
    expect(withArticle("18 V reference")).toBe("an 18 V reference");
    expect(withArticle("11.5 V reference")).toBe("an 11.5 V reference");
    expect(withArticle("1.8 V reference")).toBe("a 1.8 V reference");
    expect(withArticle("110 V reference")).toBe("a 110 V reference");
    expect(withArticle("500 kHz instrument")).toBe("a 500 kHz instrument");
    expect(withArticle("unit")).toBe("a unit");
  });
  it("lower-cases labels but keeps the trade's abbreviations", () => {
    expect(lowerLabel("THD or THD+N")).toBe("THD or THD+N");
    expect(lowerLabel("Response sweep against the RIAA curve")).toBe("response sweep against the RIAA curve");
    expect(lowerLabel("Signal-to-noise ratio or output noise")).toBe("signal-to-noise ratio or output noise");
  });
});
