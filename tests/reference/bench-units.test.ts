// Unit conversions against published worked examples and the trade's own rules of thumb.
// Each check names its source and how sure it is ("common practice" or "from memory" where that is all there is).
import { describe, expect, it } from "vitest";
import { parseValue, powerFromVrms, ratioToDb, toUnit, vpkFromPower, vrmsFromPower, type ParseResult } from "@shared/bench/units";
import { formatValue } from "@shared/bench/format";

const v = (r: ParseResult) => {
  if (!r.ok) throw new Error(r.error);
  return r.value;
};

describe("levels (definitions; docs/references.md §7)", () => {
  it("0 dBu = −2.218 dBV — audio glossaries quoting a measurement handbook; 0.7746 V = √(1 mW · 600 Ω)", () => {
    expect(toUnit(v(parseValue("0 dBu")), "dBV", "voltage")).toBeCloseTo(-2.218, 3);
  });
  it("+4 dBu = 1.228 V — same glossaries", () => {
    expect(v(parseValue("+4 dBu"))).toBeCloseTo(1.228, 3);
  });
  it("−10 dBV = 0.316 V — same glossaries", () => {
    expect(v(parseValue("-10 dBV"))).toBeCloseTo(0.316, 3);
  });
  it("dBW = 10·log10(P / 1 W): 20 dBW = 100 W — level definitions", () => {
    expect(v(parseValue("20 dBW"))).toBeCloseTo(100, 9);
  });
});

describe("sine relations (textbook)", () => {
  it("Vrms = Vpk/√2 = Vpp/(2√2): 40 Vpk and 80 Vpp are both 28.28 Vrms", () => {
    expect(v(parseValue("40 Vpk"))).toBeCloseTo(40 / Math.SQRT2, 12);
    expect(v(parseValue("80 Vpp"))).toBeCloseTo(28.2843, 4);
  });
  it("100 W into 8 Ω is 40 V peak — worked example [computed: √(2·100·8)]", () => {
    expect(vpkFromPower(100, 8)).toBeCloseTo(40, 12);
    expect(formatValue(vrmsFromPower(v(parseValue("100 W")), 8), "voltage", { form: "peak" })).toBe("40 Vpk");
  });
  it("a 5 V peak-to-peak sine into 8 Ω is about 0.39 W — common practice", () => {
    expect(powerFromVrms(v(parseValue("5 Vpp")), 8)).toBeCloseTo(0.39, 2);
    expect(formatValue(powerFromVrms(v(parseValue("5 Vpp")), 8), "power", { sig: 2 })).toBe("0.39 W");
  });
});

describe("distortion ratios", () => {
  it("a second-harmonic reading of 0.010 % is −80 dB — common practice", () => {
    expect(ratioToDb(v(parseValue("0.010 %")))).toBeCloseTo(-80, 9);
    expect(formatValue(v(parseValue("-80 dB", { kind: "ratio" })), "ratio")).toBe("0.010 %");
  });
  it("100 ppm = 0.01 % — definition of ppm", () => {
    expect(v(parseValue("100 ppm"))).toBeCloseTo(v(parseValue("0.01 %")), 15);
  });
});

describe("loudspeaker drive (IEC 60268-5; docs/references.md §5)", () => {
  it("2.83 V rms is 1.00 W into 8 Ω and 2.00 W into 4 Ω [computed: 2.83 ≈ √8]", () => {
    const volts = v(parseValue("2.83 V"));
    expect(powerFromVrms(volts, 8)).toBeCloseTo(1.0, 2);
    expect(powerFromVrms(volts, 4)).toBeCloseTo(2.0, 2);
    expect(powerFromVrms(Math.sqrt(8), 8)).toBeCloseTo(1, 12);
  });
});
