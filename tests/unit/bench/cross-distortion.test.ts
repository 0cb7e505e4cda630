// power-at-distortion-limit: a power quoted at a distortion limit holds that limit at any power from 250 mW
// up to it (US FTC amplifier rule, 16 CFR 432.2(a)); 1 dB meter tolerance (common practice).
import { describe, expect, it } from "vitest";
import { checkBenchSheet } from "@shared/bench";
import { full8, measured, outcomes, rated, resultsFor, sheet } from "../bench-fixtures";

const band = { lowHz: 20, highHz: 20_000 };
const rating = rated("output_power", 50, "W", {
  loadOhm: 8,
  frequencyRange: band,
  atDistortion: { ratio: 0.001, measure: "thd" },
  channelsDriven: "both",
});
const thdAt = (ratio: number, powerW: number, more = {}) => measured("thd", ratio, "%", { powerW, loadOhm: 8, frequencyHz: 1000, ...more });
const measuredPower = measured("output_power", 55, "W", full8); // 55 W at 0.1 % THD, 1 kHz

describe("power-at-distortion-limit (16 CFR 432.2(a))", () => {
  it("accepts a reading below the limit at a lower power", () => {
    expect(outcomes(sheet("integrated_amplifier", [rating, thdAt(0.0005, 10)]), "power-at-distortion-limit")).toEqual(["consistent"]);
  });
  it("reports the maker's rating as not met when a lower-power reading is above its limit", () => {
    const v = checkBenchSheet(sheet("integrated_amplifier", [rating, thdAt(0.002, 10)]));
    const [r] = resultsFor(v, "power-at-distortion-limit");
    expect(r.outcome).toBe("consistent");
    expect(r.detail).toMatch(/does not meet its rating's distortion limit/);
    expect(v.shortfalls.map((s) => s.percent)).toEqual([100]); // 0.2 % against 0.1 %: 100 % over
  });
  it("catches a measured power whose own sheet shows the limit passed at a lower power", () => {
    const [r] = resultsFor(checkBenchSheet(sheet("integrated_amplifier", [measuredPower, thdAt(0.002, 10)])), "power-at-distortion-limit");
    expect(r.outcome).toBe("questionable");
    expect(r.detail).toMatch(/THD 0\.20 % at 10 W is above the 0\.1 % THD that the measured 55 W into 8 Ω is quoted at/);
  });
  // The limit 0.1 % plus 1 dB is 0.1122 %.
  it.each([
    [0.00112, "consistent"],
    [0.00113, "questionable"],
  ])("THD %s at 10 W against 0.1 %: %s", (thd, outcome) => {
    expect(outcomes(sheet("integrated_amplifier", [measuredPower, thdAt(thd, 10)]), "power-at-distortion-limit")).toEqual([outcome]);
  });
  it("counts readings from 250 mW up to the power, and none outside", () => {
    expect(outcomes(sheet("integrated_amplifier", [measuredPower, thdAt(0.005, 0.25)]), "power-at-distortion-limit")).toEqual([
      "questionable",
    ]);
    expect(outcomes(sheet("integrated_amplifier", [measuredPower, thdAt(0.005, 0.24)]), "power-at-distortion-limit")).toEqual([]);
    expect(outcomes(sheet("integrated_amplifier", [measuredPower, thdAt(0.005, 56)]), "power-at-distortion-limit")).toEqual([]);
  });
  it("reads a level given as a voltage: 2 V into 8 Ω is 0.5 W", () => {
    const d = measured("thd", 0.005, "%", { voltageV: 2, loadOhm: 8, frequencyHz: 1000 });
    expect(outcomes(sheet("integrated_amplifier", [measuredPower, d]), "power-at-distortion-limit")).toEqual(["questionable"]);
  });
  it("P = V²/R: 1.5 V into 8 Ω is 0.28 W, within the range; 22 V is 60.5 W, above the 55 W and left out", () => {
    const at = (voltageV: number) => measured("thd", 0.005, "%", { voltageV, loadOhm: 8, frequencyHz: 1000 });
    expect(outcomes(sheet("integrated_amplifier", [measuredPower, at(1.5)]), "power-at-distortion-limit")).toEqual(["questionable"]);
    expect(outcomes(sheet("integrated_amplifier", [measuredPower, at(22)]), "power-at-distortion-limit")).toEqual([]);
  });
  it("leaves out readings into another load or outside the rated band", () => {
    expect(outcomes(sheet("integrated_amplifier", [rating, thdAt(0.005, 10, { loadOhm: 4 })]), "power-at-distortion-limit")).toEqual([]);
    expect(
      outcomes(sheet("integrated_amplifier", [rating, thdAt(0.005, 10, { frequencyHz: 40_000 })]), "power-at-distortion-limit"),
    ).toEqual([]);
  });
  it("does not hold THD+N against a THD limit (THD+N ≥ THD), but THD against a THD+N limit", () => {
    const thdn = measured("thd_n", 0.005, "%", { powerW: 10, loadOhm: 8, frequencyHz: 1000, bandwidth: band });
    expect(outcomes(sheet("integrated_amplifier", [measuredPower, thdn]), "power-at-distortion-limit")).toEqual([]);
    const thdnLimit = measured("output_power", 55, "W", { ...full8, atDistortion: { ratio: 0.001, measure: "thd_n" } });
    expect(outcomes(sheet("integrated_amplifier", [thdnLimit, thdAt(0.005, 10)]), "power-at-distortion-limit")).toEqual(["questionable"]);
  });
});
