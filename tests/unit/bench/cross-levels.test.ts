// snr-noise-reference and gain-sensitivity-output. Expected figures are worked by hand in the comments.
import { describe, expect, it } from "vitest";
import { checkBenchSheet } from "@shared/bench";
import { measured, outcomes, rated, resultsFor, sheet } from "../bench-fixtures";

// SNR = 20·log10(V_ref / V_noise) (IEC 60268-3 definition). 1 W into 8 Ω is √8 = 2.828 V; 100 dB below it is 28.28 µV.
const ref1W = { powerW: 1, loadOhm: 8, weighting: "A" as const };
const noise = measured("noise", 28.28427e-6, "µV", { loadOhm: 8, weighting: "A" });
const amp = (snrDb: number) => sheet("integrated_amplifier", [measured("snr", snrDb, "dB(A)", ref1W), noise]);

describe("snr-noise-reference (SNR = 20·log10(Vref/Vnoise), IEC 60268-3)", () => {
  it("accepts an SNR that matches its noise and reference", () => {
    expect(outcomes(amp(100), "snr-noise-reference")).toEqual(["consistent"]);
  });
  it("catches an SNR 10 dB better than its own noise figure allows", () => {
    const [r] = resultsFor(checkBenchSheet(amp(110)), "snr-noise-reference");
    expect(r.outcome).toBe("implausible");
    expect(r.detail).toMatch(/gives 100 dB; the sheet says 110 dB/);
  });
  it.each([
    [101, "consistent"], // 1.0 dB apart: inside the 1 dB tolerance (common practice)
    [101.1, "questionable"],
    [103, "questionable"], // 3.0 dB: the edge of questionable
    [103.1, "implausible"],
    [96.9, "implausible"],
  ])("SNR %s dB against 100 dB from the noise: %s", (snr, outcome) => {
    expect(outcomes(amp(snr), "snr-noise-reference")).toEqual([outcome]);
  });
  it("does not pair an A-weighted SNR with an unweighted noise figure", () => {
    const s = sheet("integrated_amplifier", [
      measured("snr", 110, "dB(A)", ref1W),
      measured("noise", 28.28427e-6, "µV", { loadOhm: 8, weighting: "unweighted" }),
    ]);
    expect(outcomes(s, "snr-noise-reference")).toEqual([]);
  });
  it("reads a phono stage's SNR against its input reference times the gain", () => {
    // 5 mV in, 40 dB gain → 0.5 V out; 50 µV of output noise → 20·log10(0.5/50e-6) = 80 dB.
    const s = sheet("phono_stage", [
      measured("snr", 80, "dB(A)", { voltageV: 0.005, weighting: "A" }),
      measured("gain", 40, "dB", { frequencyHz: 1000 }),
      measured("noise", 50e-6, "µV", { weighting: "A" }),
    ]);
    const [r] = resultsFor(checkBenchSheet(s), "snr-noise-reference");
    expect(r.outcome).toBe("consistent");
    expect(r.detail).toMatch(/the 5 mV input times the \+40 dB gain/);
  });
});

describe("gain-sensitivity-output (V_out = V_in·10^(G/20), P = V²/R)", () => {
  // 100 W into 8 Ω is √800 = 28.28 V; 1 V in with 29 dB of gain is 10^(29/20) = 28.18 V: 0.03 dB apart.
  const power = rated("output_power", 100, "W", { loadOhm: 8, frequencyHz: 1000, atDistortion: { ratio: 0.001, measure: "thd" } });
  it("accepts a maker's gain, sensitivity and rated power that agree", () => {
    const s = sheet("power_amplifier", [power, rated("input_sensitivity", 1, "V"), rated("gain", 29, "dB")]);
    expect(outcomes(s, "gain-sensitivity-output")).toEqual(["consistent"]);
  });
  it("catches a gain 6 dB off the sensitivity and rated power", () => {
    const s = sheet("power_amplifier", [power, rated("input_sensitivity", 1, "V"), rated("gain", 35, "dB")]);
    expect(outcomes(s, "gain-sensitivity-output")).toEqual(["implausible"]);
  });
  it("does not hold a measured gain against the maker's sensitivity", () => {
    const s = sheet("power_amplifier", [power, rated("input_sensitivity", 1, "V"), measured("gain", 35, "dB")]);
    expect(outcomes(s, "gain-sensitivity-output")).toEqual([]);
  });
  // A preamplifier: 0.1 V in for 1 V out is 20 dB exactly.
  it.each([
    [21, "consistent"],
    [21.1, "questionable"],
    [23, "questionable"],
    [23.1, "implausible"],
    [16.9, "implausible"],
  ])("preamplifier gain %s dB against the 20 dB of 0.1 V in for 1 V out: %s", (gain, outcome) => {
    const s = sheet("preamplifier", [measured("input_sensitivity", 0.1, "V", { voltageV: 1 }), measured("gain", gain, "dB")]);
    expect(outcomes(s, "gain-sensitivity-output")).toEqual([outcome]);
  });
});
