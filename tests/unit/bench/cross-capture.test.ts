// typed-vs-capture: a typed figure against the bench's own reading of the capture, and a typed −3 dB point
// against the sweep. Tolerances (common practice): 1 dB for ratios and dB, 5 % linear, 10 % from a sweep.
import { describe, expect, it } from "vitest";
import { checkBenchSheet, type Conditions, type Sweep } from "@shared/bench";
import { measured, outcomes, resultsFor, sheet } from "../bench-fixtures";

const at60 = { powerW: 60, loadOhm: 8, frequencyHz: 1000 };
const fromCapture = { origin: "capture" as const, captureId: "cap_1k_left", channel: "left" as const };
const capturedThd = measured("thd", 0.0001, "%", at60, fromCapture); // 0.010 %
const typedThd = (ratio: number, cond: Conditions = at60) => measured("thd", ratio, "%", cond, { channel: "left" });
const amp = (...r: Parameters<typeof sheet>[1]) => sheet("integrated_amplifier", r);

describe("typed-vs-capture", () => {
  it("accepts a typed THD that matches the capture", () => {
    expect(outcomes(amp(capturedThd, typedThd(0.000105)), "typed-vs-capture")).toEqual(["consistent"]);
  });
  it("catches a typed THD five times better than the capture read", () => {
    const [r] = resultsFor(checkBenchSheet(amp(capturedThd, typedThd(0.00002))), "typed-vs-capture");
    expect(r.outcome).toBe("implausible");
    expect(r.detail).toMatch(/read from the capture \(14 dB apart\)/); // 20·log10(5) = 13.98 dB
  });
  // 1 dB is a factor 1.122; 2× is the edge of questionable.
  it.each([
    [0.0001122, "consistent"],
    [0.000113, "questionable"],
    [0.0002, "questionable"],
    [0.000201, "implausible"],
    [0.0000892, "consistent"], // 0.0001/0.0000892 = 1.121, inside 1 dB
    [0.000089, "questionable"], // 1.124, just outside
  ])("typed THD %s against 0.0001 from the capture: %s", (typed, outcome) => {
    expect(outcomes(amp(capturedThd, typedThd(typed)), "typed-vs-capture")).toEqual([outcome]);
  });
  it("compares only like with like: another level, or a typed figure that states no level or no load, is not paired", () => {
    expect(outcomes(amp(capturedThd, typedThd(0.001, { ...at60, powerW: 1 })), "typed-vs-capture")).toEqual([]);
    expect(outcomes(amp(capturedThd, typedThd(0.001, { loadOhm: 8, frequencyHz: 1000 })), "typed-vs-capture")).toEqual([]);
    // The capture was read into 8 Ω; a typed 60 W figure that names no load may have been taken into 4 Ω.
    expect(outcomes(amp(capturedThd, typedThd(0.001, { powerW: 60, frequencyHz: 1000 })), "typed-vs-capture")).toEqual([]);
  });
  it.each([
    [31.5, "consistent"], // (31.5 − 30)/31.5 = 4.8 % of the larger
    [31.6, "questionable"], // 5.06 %
    [40, "questionable"], // (40 − 30)/40 = 25 %
    [40.1, "implausible"],
  ])("typed output voltage %s V against 30 V from the capture: %s", (typed, outcome) => {
    const cond = { loadOhm: 8, frequencyHz: 1000 };
    const cap = measured("output_voltage", 30, "V", cond, fromCapture);
    expect(outcomes(amp(cap, measured("output_voltage", typed, "V", cond, { channel: "left" })), "typed-vs-capture")).toEqual([outcome]);
  });
  it("holds a typed dB figure to 1 dB of the capture", () => {
    const cond = { powerW: 1, loadOhm: 8, weighting: "A" as const };
    const cap = measured("snr", 90, "dB(A)", cond, fromCapture);
    expect(outcomes(amp(cap, measured("snr", 91, "dB(A)", cond, { channel: "left" })), "typed-vs-capture")).toEqual(["consistent"]);
    expect(outcomes(amp(cap, measured("snr", 95, "dB(A)", cond, { channel: "left" })), "typed-vs-capture")).toEqual(["implausible"]);
  });
});

describe("typed −3 dB point against a response sweep", () => {
  // 0 dB at 1 kHz; −2 dB at 100 kHz and −4 dB at 200 kHz: −3 dB half-way in log frequency, 100 kHz·√2 = 141.4 kHz.
  const sweep: Sweep = {
    kind: "flat",
    origin: "typed",
    conditions: {},
    points: [
      { frequencyHz: 1000, levelDb: 0 },
      { frequencyHz: 10_000, levelDb: 0 },
      { frequencyHz: 100_000, levelDb: -2 },
      { frequencyHz: 200_000, levelDb: -4 },
    ],
  };
  it.each([
    [141_000, "consistent"],
    [128_000, "consistent"], // 9.5 % below
    [127_000, "questionable"], // 10.2 %
    [99_000, "questionable"], // 30.0 %
    [98_000, "implausible"],
  ])("typed %s Hz: %s", (f, outcome) => {
    const s = sheet("integrated_amplifier", [measured("f3db_high", f, "Hz")], { sweeps: [sweep] });
    expect(outcomes(s, "typed-vs-capture")).toEqual([outcome]);
  });
});
