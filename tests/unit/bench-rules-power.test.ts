import { describe, expect, it } from "vitest";
import { checkBenchSheet } from "@shared/bench";
import { full4, full8, measured, outcomes, rated, resultsFor, sheet } from "./bench-fixtures";

const amp = (...readings: Parameters<typeof sheet>[1]) => sheet("integrated_amplifier", readings);
const vpp = (v: number) => v / (2 * Math.SQRT2);
const vpk = (v: number) => v / Math.SQRT2;

describe("power-voltage-load", () => {
  it("agrees when the rms voltage squared over the load gives the power", () => {
    expect(
      outcomes(amp(measured("output_power", 100, "W", full8), measured("output_voltage", 28.3, "Vrms", full8)), "power-voltage-load"),
    ).toEqual(["consistent"]);
  });
  it("accepts peak and peak-to-peak voltages converted for a sine", () => {
    expect(
      outcomes(amp(measured("output_power", 100, "W", full8), measured("output_voltage", vpk(40), "Vpk", full8)), "power-voltage-load"),
    ).toEqual(["consistent"]);
    expect(
      outcomes(amp(measured("output_power", 100, "W", full8), measured("output_voltage", vpp(80), "Vpp", full8)), "power-voltage-load"),
    ).toEqual(["consistent"]);
  });
  it("calls a factor-of-two mismatch implausible and suggests a peak read as rms", () => {
    // 40 V typed as rms into 8 Ω is 200 W, not 100 W.
    const v = checkBenchSheet(amp(measured("output_power", 100, "W", full8), measured("output_voltage", 40, "V", full8)));
    const [r] = resultsFor(v, "power-voltage-load");
    expect(r.outcome).toBe("implausible");
    expect(r.detail).toMatch(/peak/);
    expect(r.compared.find((f) => f.label === "power from voltage and load")?.value).toBeCloseTo(200, 9);
  });
  it("calls a 10 % mismatch questionable", () => {
    expect(
      outcomes(amp(measured("output_power", 110, "W", full8), measured("output_voltage", 28.28, "V", full8)), "power-voltage-load"),
    ).toEqual(["questionable"]);
  });
  it("does not pair a capture taken below full power with a typed full-power reading", () => {
    // A 1 kHz capture at 23 V rms into 8 Ω (66 W) says nothing about the 100 W clipping figure.
    const captured = measured("output_voltage", 23, "V", { loadOhm: 8, frequencyHz: 1000 }, { origin: "capture", captureId: "cap-1" });
    const capturedPower = measured(
      "output_power",
      23 ** 2 / 8,
      "W",
      { loadOhm: 8, frequencyHz: 1000 },
      { origin: "capture", captureId: "cap-1" },
    );
    const v = checkBenchSheet(amp(measured("output_power", 100, "W", full8), captured, capturedPower));
    const results = resultsFor(v, "power-voltage-load");
    expect(results.map((r) => r.outcome)).toEqual(["consistent"]);
    expect(results[0].refs).toEqual(["readings.1", "readings.2"]);
  });
  it("does not pair readings at different loads", () => {
    const v = checkBenchSheet(amp(measured("output_power", 100, "W", full8), measured("output_voltage", 28.3, "V", full4)));
    expect(resultsFor(v, "power-voltage-load")).toEqual([]);
    expect(v.skipped.map((s) => s.ruleId)).toContain("power-voltage-load");
    expect(v.derived.find((d) => d.id.startsWith("power-from-voltage"))?.value).toBeCloseTo(28.3 ** 2 / 4, 9);
  });
});

describe("half-load-power", () => {
  it("accepts less than double into half the load", () => {
    expect(outcomes(amp(measured("output_power", 100, "W", full8), measured("output_power", 160, "W", full4)), "half-load-power")).toEqual([
      "consistent",
    ]);
  });
  it("accepts exactly double (an ideal voltage source)", () => {
    expect(outcomes(amp(measured("output_power", 100, "W", full8), measured("output_power", 200, "W", full4)), "half-load-power")).toEqual([
      "consistent",
    ]);
  });
  it("questions a little over double and rejects three times", () => {
    expect(outcomes(amp(measured("output_power", 100, "W", full8), measured("output_power", 220, "W", full4)), "half-load-power")).toEqual([
      "questionable",
    ]);
    expect(outcomes(amp(measured("output_power", 100, "W", full8), measured("output_power", 300, "W", full4)), "half-load-power")).toEqual([
      "implausible",
    ]);
  });
  it("pairs left with left and right with right", () => {
    const s = amp(
      measured("output_power", 100, "W", full8, { channel: "left" }),
      measured("output_power", 50, "W", full8, { channel: "right" }),
      measured("output_power", 150, "W", full4, { channel: "left" }),
      measured("output_power", 80, "W", full4, { channel: "right" }),
    );
    expect(outcomes(s, "half-load-power")).toEqual(["consistent", "consistent"]);
  });
});

describe("peak-within-rails", () => {
  const rails = (v: number, supply?: "single") => measured("rail_voltage", v, "V", supply ? { supply } : {});
  it("accepts a peak inside the rails", () => {
    // 100 W into 8 Ω is 40 V peak.
    expect(outcomes(amp(measured("output_power", 100, "W", full8), rails(45)), "peak-within-rails")).toEqual(["consistent"]);
  });
  it("rejects a peak beyond the rails", () => {
    const v = checkBenchSheet(amp(measured("output_power", 100, "W", full8), rails(35)));
    const [r] = resultsFor(v, "peak-within-rails");
    expect(r.outcome).toBe("implausible");
    expect(r.compared[0].value).toBeCloseTo(40, 9);
  });
  it("halves a single rail and doubles a bridged output", () => {
    expect(outcomes(amp(measured("output_power", 100, "W", full8), rails(70, "single")), "peak-within-rails")).toEqual(["implausible"]);
    expect(outcomes({ ...amp(measured("output_power", 100, "W", full8), rails(25)), bridged: true }, "peak-within-rails")).toEqual([
      "consistent",
    ]);
  });
  it("questions a peak just over the rails (within meter tolerance)", () => {
    expect(outcomes(amp(measured("output_power", 100, "W", full8), rails(39)), "peak-within-rails")).toEqual(["questionable"]);
  });
});

describe("measured-vs-rated-power", () => {
  const rating = rated("output_power", 100, "W", { ...full8, frequencyHz: undefined, frequencyRange: { lowHz: 20, highHz: 20000 } });
  it("reports falling short with the percentage, without holding it against the sheet", () => {
    const v = checkBenchSheet(amp(rating, measured("output_power", 88, "W", full8)));
    const [r] = resultsFor(v, "measured-vs-rated-power");
    expect(r.outcome).toBe("consistent");
    expect(r.detail).toMatch(/falls short of the maker.s 100 W by 12 %/);
    expect(v.shortfalls).toEqual([expect.objectContaining({ ruleId: "measured-vs-rated-power", percent: 12 })]);
  });
  it("uses the weaker channel", () => {
    const v = checkBenchSheet(
      amp(
        rating,
        measured("output_power", 104, "W", full8, { channel: "left" }),
        measured("output_power", 95, "W", full8, { channel: "right" }),
      ),
    );
    expect(resultsFor(v, "measured-vs-rated-power")[0].detail).toMatch(/^Right output power 95 W/);
  });
  it("questions a measurement far above the rating", () => {
    expect(outcomes(amp(rating, measured("output_power", 160, "W", full8)), "measured-vs-rated-power")).toEqual(["questionable"]);
  });
  it("does not hold a power taken at a looser distortion limit against the rating, but says the limits differ", () => {
    const loose = measured("output_power", 130, "W", { ...full8, atDistortion: { ratio: 0.01, measure: "thd" } });
    const [r] = resultsFor(checkBenchSheet(amp(rating, loose)), "measured-vs-rated-power");
    expect(r.outcome).toBe("consistent");
    expect(r.detail).toMatch(/distortion limits differ/);
  });
});

describe("power-rating-conditions (16 CFR Part 432)", () => {
  it("wants load, frequency, distortion and channels driven on every power figure", () => {
    const v = checkBenchSheet(amp(rated("output_power", 100, "W", { loadOhm: 8 }), measured("output_power", 100, "W", full8)));
    const rs = resultsFor(v, "power-rating-conditions");
    expect(rs.map((r) => r.outcome)).toEqual(["missing", "consistent"]);
    expect(rs[0].detail).toMatch(/frequency or frequency range, distortion limit, channels driven/);
  });
});
