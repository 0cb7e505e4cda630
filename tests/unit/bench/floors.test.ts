// Physical floors: Johnson–Nyquist noise, the analyser's stated residual, the instrument's bandwidth; and the
// slew rate a measured edge implies.
import { describe, expect, it } from "vitest";
import { checkBenchSheet } from "@shared/bench";
import { johnsonNoiseV } from "@shared/bench/rules/floors";
import { measured, outcomes, resultsFor, sheet } from "../bench-fixtures";

const bw = { lowHz: 20, highHz: 20_000 };
const pre = (...r: Parameters<typeof sheet>[1]) => sheet("preamplifier", r);
const noise = (volts: number, more = {}) => measured("noise", volts, "µV", { bandwidth: bw, sourceOhm: 1000, ...more });

describe("thermal-noise-floor (Johnson 1928, Nyquist 1928: v = √(4kTRB))", () => {
  it("gives the textbook 4 nV/√Hz for 1 kΩ at 290 K", () => {
    // √(4 × 1.380649e-23 × 290 × 1000) = 4.002e-9 V/√Hz; over 20 kHz: × √20000 = 0.566 µV.
    expect(johnsonNoiseV(1000, 1)).toBeCloseTo(4.002e-9, 12);
    expect(johnsonNoiseV(1000, 20_000)).toBeCloseTo(0.566e-6, 9);
  });
  it("accepts noise above the source's thermal noise", () => {
    expect(outcomes(pre(noise(1e-6)), "thermal-noise-floor")).toEqual(["consistent"]);
  });
  it("catches noise below the thermal noise of the 1 kΩ source", () => {
    const [r] = resultsFor(checkBenchSheet(pre(noise(0.3e-6))), "thermal-noise-floor");
    expect(r.outcome).toBe("implausible");
    expect(r.detail).toMatch(/no unit is quieter than the resistance at its input/);
  });
  // Floor over 19.98 kHz at 290 K: 0.5657 µV; 1 dB under it is 0.5042 µV.
  it.each([
    [0.566e-6, "consistent"],
    [0.56e-6, "questionable"],
    [0.505e-6, "questionable"],
    [0.5e-6, "implausible"],
  ])("%s V against 0.5657 µV: %s", (v, outcome) => {
    expect(outcomes(pre(noise(v)), "thermal-noise-floor")).toEqual([outcome]);
  });
  it("uses the stated temperature: at 27 °C (300.15 K) the floor is 0.5755 µV", () => {
    expect(outcomes(pre(noise(0.57e-6)), "thermal-noise-floor")).toEqual(["consistent"]);
    expect(outcomes(pre(noise(0.57e-6, { temperatureC: 27 })), "thermal-noise-floor")).toEqual(["questionable"]);
  });
  it("raises the floor by the measured gain: 40 dB turns 0.566 µV into 56.6 µV at the output", () => {
    expect(outcomes(pre(noise(100e-6), measured("gain", 40, "dB")), "thermal-noise-floor")).toEqual(["consistent"]);
    expect(outcomes(pre(noise(30e-6), measured("gain", 40, "dB")), "thermal-noise-floor")).toEqual(["implausible"]);
  });
  it("needs the source impedance and the bandwidth", () => {
    expect(outcomes(pre(measured("noise", 1e-9, "nV", { bandwidth: bw })), "thermal-noise-floor")).toEqual([]);
    expect(outcomes(pre(measured("noise", 1e-9, "nV", { sourceOhm: 1000, weighting: "A" })), "thermal-noise-floor")).toEqual([]);
  });
});

describe("analyser-stated-floor (the analyser's own residual)", () => {
  const thdn = (ratio: number) => measured("thd_n", ratio, "%", { voltageV: 2, frequencyHz: 1000, bandwidth: bw });
  const withAnalyser = (ratio: number) => sheet("preamplifier", [thdn(ratio)], { analyser: { residualThdN: 1e-5 } });
  it.each([
    [2e-5, "consistent"],
    [1e-5, "consistent"], // at the residual
    [0.5e-5, "questionable"], // half of it: specifications are typical
    [0.49e-5, "implausible"],
  ])("THD+N %s with a 0.001 % analyser residual: %s", (r, outcome) => {
    expect(outcomes(withAnalyser(r), "analyser-stated-floor")).toEqual([outcome]);
  });
  it("holds noise to the analyser's noise floor", () => {
    const s = sheet("preamplifier", [measured("noise", 1e-6, "µV", { weighting: "A" })], { analyser: { noiseFloorV: 3e-6 } });
    expect(outcomes(s, "analyser-stated-floor")).toEqual(["implausible"]);
  });
  it("has nothing to check when the sheet states no analyser", () => {
    expect(checkBenchSheet(sheet("preamplifier", [thdn(1e-7)])).skipped.map((s) => s.ruleId)).toContain("analyser-stated-floor");
  });
});

describe("instrument-bandwidth (t_r = ln9/(2π·B) ≈ 0.35/B)", () => {
  // A 20 MHz oscilloscope: 0.3497/20e6 = 17.49 ns.
  const rise = (t: number) => sheet("preamplifier", [measured("rise_time", t, "ns")], { analyser: { bandwidthHz: 20e6 } });
  it.each([
    [1e-6, "consistent"],
    [17.5e-9, "consistent"],
    [16e-9, "questionable"], // 0.915 of the floor
    [15e-9, "implausible"], // 0.858
  ])("rise time %s s on a 20 MHz instrument: %s", (t, outcome) => {
    expect(outcomes(rise(t), "instrument-bandwidth")).toEqual([outcome]);
  });
  it.each([
    [150_000, "consistent"],
    [200_000, "consistent"],
    [215_000, "questionable"],
    [250_000, "implausible"],
  ])("−3 dB point %s Hz measured in a 200 kHz bandwidth: %s", (f, outcome) => {
    const s = sheet("preamplifier", [measured("f3db_high", f, "Hz", { bandwidth: { lowHz: 10, highHz: 200_000 } })]);
    expect(outcomes(s, "instrument-bandwidth")).toEqual([outcome]);
  });
});

describe("slew-rate-rise-time (SR ≥ 0.8·ΔV/t_r)", () => {
  // A 10 V edge rising (10–90 %) in 2 µs climbs 8 V in 2 µs: 4 V/µs at least.
  const s = (srVus: number) =>
    sheet("power_amplifier", [
      measured("rise_time", 2e-6, "µs", { voltageV: 10, frequencyHz: 10_000, loadOhm: 8 }),
      measured("slew_rate", srVus * 1e6, "V/µs", { loadOhm: 8 }),
    ]);
  it.each([
    [5, "consistent"],
    [3.6, "consistent"], // 0.9 of the slope
    [3.5, "questionable"],
    [2, "questionable"], // half
    [1.9, "implausible"],
  ])("slew rate %s V/µs: %s", (sr, outcome) => {
    expect(outcomes(s(sr), "slew-rate-rise-time")).toEqual([outcome]);
  });
});
