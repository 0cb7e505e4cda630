import { describe, expect, it } from "vitest";
import { checkBenchSheet } from "@shared/bench";
import { speakerImpedanceMinimum } from "@shared/bench/rules/loudspeaker";
import { measured, outcomes, rated, resultsFor, sheet } from "./bench-fixtures";

// IEC 60268-5:2003 §16.1: the lowest impedance modulus within the rated frequency range must not fall
// below 80 % of the rated impedance (8 Ω → 6.4 Ω, 4 Ω → 3.2 Ω). Boundaries just inside and outside.

const spk = (nominal: number, min: number, conditions = {}) =>
  sheet("loudspeaker", [
    rated("nominal_impedance", nominal, "Ω"),
    measured("impedance_minimum", min, "Ω", { frequencyHz: 180, ...conditions }),
  ]);

describe("the impedance minimum against 80 % of the rating (IEC 60268-5 §16.1)", () => {
  it.each([
    [8, 6.4, "consistent"],
    [8, 6.39, "questionable"],
    [4, 3.2, "consistent"],
    [4, 3.19, "questionable"],
    [6, 4.8, "consistent"],
    [6, 4.79, "questionable"],
  ])("rated %s Ω, minimum %s Ω: %s", (nominal, min, outcome) => {
    expect(outcomes(spk(nominal, min), "speaker-impedance-minimum")).toEqual([outcome]);
  });

  it("a questionable minimum withholds the mark", () => {
    const s = sheet("loudspeaker", [
      rated("nominal_impedance", 8, "Ω"),
      measured("impedance_minimum", 6.0, "Ω", { frequencyHz: 180 }),
      measured("sensitivity", 87, "dB SPL", { voltageV: Math.sqrt(8), distanceM: 1 }),
    ]);
    expect(checkBenchSheet(s).benchVerified).toBe(false);
    const ok = sheet("loudspeaker", [
      rated("nominal_impedance", 8, "Ω"),
      measured("impedance_minimum", 6.6, "Ω", { frequencyHz: 180 }),
      measured("sensitivity", 87, "dB SPL", { voltageV: Math.sqrt(8), distanceM: 1 }),
    ]);
    expect(checkBenchSheet(ok).benchVerified).toBe(true);
  });

  it("names the clause, and the range a sweep's minimum was sought in", () => {
    expect(speakerImpedanceMinimum.source).toContain("IEC 60268-5:2003 §16.1");
    const [r] = resultsFor(checkBenchSheet(spk(8, 6.0, { frequencyRange: { lowHz: 20, highHz: 20_000 } })), "speaker-impedance-minimum");
    expect(r.detail).toContain("within 20 Hz–20 kHz");
    expect(r.detail).toContain("dips below 6.4 Ω");
  });
});
