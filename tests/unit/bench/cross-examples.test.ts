// The documented examples (docs/api.md, "Cross-checks and safety"): every cross-check has something to
// check on the good sheet and passes; on its doctored twin each one catches its figure.
import { describe, expect, it } from "vitest";
import { checkBenchSheet } from "@shared/bench";
import { doctoredCrossCheckedSheet, exampleCrossCheckedSheet, offSpeedTurntableSheet } from "@shared/bench/examples-cross";

const CROSS = [
  "snr-noise-reference",
  "gain-sensitivity-output",
  "power-at-distortion-limit",
  "slew-rate-rise-time",
  "typed-vs-capture",
  "thermal-noise-floor",
  "analyser-stated-floor",
  "instrument-bandwidth",
  "dc-offset-safe",
];

describe("the cross-checked example", () => {
  const v = checkBenchSheet(exampleCrossCheckedSheet());
  it("is bench-verified, every cross-check run", () => {
    expect(v.benchVerified).toBe(true);
    for (const id of CROSS) expect(v.results.filter((r) => r.ruleId === id).length, id).toBeGreaterThan(0);
  });
});

describe("its doctored twin", () => {
  const v = checkBenchSheet(doctoredCrossCheckedSheet());
  it.each(CROSS)("%s catches its figure", (id) => {
    expect(v.results.some((r) => r.ruleId === id && r.outcome !== "consistent")).toBe(true);
  });
  it("is unsafe to connect for its 80 mV offset", () => {
    expect(v.hazards.map((h) => h.ruleId)).toEqual(["dc-offset-safe"]);
    expect(v.benchVerified).toBe(false);
  });
});

describe("a turntable 16.7 % slow", () => {
  it("is unsafe to connect: a 60 Hz motor on 50 Hz mains", () => {
    const v = checkBenchSheet(offSpeedTurntableSheet());
    expect(v.hazards.map((h) => h.ruleId)).toEqual(["turntable-far-off-speed"]);
    expect(v.hazards[0].detail).toMatch(/voltage selector/);
  });
});
