// A value just inside and just outside every threshold of the amplifier rules, so a moved threshold is
// noticed. Thresholds are the rules' own common-practice figures (docs/references.md §9) unless a test
// names a published source; every expected value is derived by hand in the comment beside it.
import { describe, expect, it } from "vitest";
import { checkBenchSheet, type Reading } from "@shared/bench";
import { full8, measured, outcomes, rated, resultsFor, sheet } from "../bench-fixtures";

const amp = (readings: Reading[], more = {}) => sheet("integrated_amplifier", readings, more);
/** 20 V rms into 8 Ω is 400/8 = 50 W (P = V²/R). */
const pv = (watts: number) => amp([measured("output_voltage", 20, "V", full8), measured("output_power", watts, "W", full8)]);

describe("power-voltage-load: 5 % in power consistent, 25 % questionable (common practice)", () => {
  it.each([
    [50 * 1.049, "consistent"],
    [50 * 0.951, "consistent"],
    [50 * 1.051, "questionable"],
    [50 * 0.949, "questionable"],
    [50 * 1.249, "questionable"],
    [50 * 1.251, "implausible"],
    [50 * 0.749, "implausible"],
  ])("20 V into 8 Ω (50 W) against %f W: %s", (w, outcome) => {
    expect(outcomes(pv(w), "power-voltage-load")).toEqual([outcome]);
  });

  it("does not pair a full-power figure (at a distortion limit) with a voltage stating none", () => {
    const s = amp([measured("output_voltage", 10, "V", { loadOhm: 8, frequencyHz: 1000 }), measured("output_power", 50, "W", full8)]);
    expect(outcomes(s, "power-voltage-load")).toEqual([]);
  });

  it("pairs a capture's voltage only with readings of the same capture", () => {
    const c = { loadOhm: 8, frequencyHz: 1000 };
    const s = amp([
      measured("output_voltage", 10, "V", c, { origin: "capture", captureId: "cap-a" }),
      measured("output_power", 50, "W", c),
    ]);
    expect(outcomes(s, "power-voltage-load")).toEqual([]);
  });
});

describe("half-load-power: ×2.06 consistent, ×2.3 implausible (P = V²/R; common practice)", () => {
  const c = { frequencyHz: 1000, atDistortion: { ratio: 0.001, measure: "thd" as const }, channelsDriven: "both" as const };
  it.each([
    [205.9, "consistent"],
    [206.1, "questionable"],
    [229.9, "questionable"],
    [230.1, "implausible"],
  ])("100 W into 8 Ω and %f W into 4 Ω: %s", (w4, outcome) => {
    const s = amp([measured("output_power", 100, "W", { ...c, loadOhm: 8 }), measured("output_power", w4, "W", { ...c, loadOhm: 4 })]);
    expect(outcomes(s, "half-load-power")).toEqual([outcome]);
  });
});

describe("readings pair only at the same distortion limit (within 5 %; common practice)", () => {
  // 250 W into 4 Ω against 100 W into 8 Ω is 2.5×: implausible, but only if both were taken at one limit.
  const at = (limit4: number) => {
    const c = { frequencyHz: 1000, channelsDriven: "both" as const };
    return amp([
      measured("output_power", 100, "W", { ...c, loadOhm: 8, atDistortion: { ratio: 0.001, measure: "thd" } }),
      measured("output_power", 250, "W", { ...c, loadOhm: 4, atDistortion: { ratio: limit4, measure: "thd" } }),
    ]);
  };
  it("0.1 % and 0.104 % THD are one limit; 0.1 % and 0.14 % are not", () => {
    expect(outcomes(at(0.00104), "half-load-power")).toEqual(["implausible"]);
    expect(outcomes(at(0.0014), "half-load-power")).toEqual([]);
  });
});

describe("peak-within-rails: Vpk = √(2·P·R) against the rail, 5 % allowance (textbook; common practice)", () => {
  // Vpk = 40 V × k needs P = (40k)²/(2·8) = 100·k² W into 8 Ω; ±40 V rails allow 40 V.
  const at = (k: number, rail: Reading) => amp([measured("output_power", 100 * k * k, "W", full8), rail]);
  const split = measured("rail_voltage", 40, "V", { supply: "split" });
  it.each([
    [0.999, "consistent"],
    [1.01, "questionable"],
    [1.049, "questionable"],
    [1.051, "implausible"],
  ])("a peak %f× the ±40 V rail: %s", (k, outcome) => {
    expect(outcomes(at(k, split), "peak-within-rails")).toEqual([outcome]);
  });
  it("a single 80 V rail swings ±40 V about its midpoint, so 40 V peak fits and 42 V does not", () => {
    const single = measured("rail_voltage", 80, "V", { supply: "single" });
    expect(outcomes(at(1, single), "peak-within-rails")).toEqual(["consistent"]);
    expect(outcomes(at(1.05 * 1.001, single), "peak-within-rails")).toEqual(["implausible"]);
  });
});

describe("measured-vs-rated-power: more than 1.5× the rating questionable; any shortfall reported", () => {
  const rating = rated("output_power", 100, "W", full8);
  const at = (w: number, limit = 0.001) =>
    checkBenchSheet(amp([rating, measured("output_power", w, "W", { ...full8, atDistortion: { ratio: limit, measure: "thd" } })]));
  it("150 W against 100 W rated is consistent; 151 W is questionable", () => {
    expect(resultsFor(at(150), "measured-vs-rated-power").map((r) => r.outcome)).toEqual(["consistent"]);
    expect(resultsFor(at(151), "measured-vs-rated-power").map((r) => r.outcome)).toEqual(["questionable"]);
  });
  it("99 W against 100 W rated is reported as a 1 % shortfall, not held against the sheet", () => {
    const v = at(99);
    expect(resultsFor(v, "measured-vs-rated-power").map((r) => r.outcome)).toEqual(["consistent"]);
    expect(v.shortfalls.filter((s) => s.ruleId === "measured-vs-rated-power").map((s) => s.percent)).toEqual([1]);
  });
  it("a power measured at twice the rated distortion limit is not taken as meeting (or beating) the rating", () => {
    const v = at(200, 0.002);
    expect(resultsFor(v, "measured-vs-rated-power").some((r) => /2\.00×/.test(r.detail))).toBe(false);
  });
  it("a measurement is held against the rating only at the rated load (within 2 %) and channels driven", () => {
    const c = { ...full8, atDistortion: { ratio: 0.001, measure: "thd" as const } };
    const vs = (m: Reading) => resultsFor(checkBenchSheet(amp([rating, m])), "measured-vs-rated-power");
    // 8.1 Ω is 1.2 % from 8 Ω: the same load. 7 Ω is not, and one channel driven is not both driven.
    expect(vs(measured("output_power", 160, "W", { ...c, loadOhm: 8.1 })).map((r) => r.outcome)).toEqual(["questionable"]);
    expect(vs(measured("output_power", 160, "W", { ...c, loadOhm: 7 }))).toEqual([]);
    expect(vs(measured("output_power", 160, "W", { ...c, channelsDriven: "one" }))).toEqual([]);
  });
  it("the weakest channel's best figure stands for the unit", () => {
    const c = { ...full8, atDistortion: { ratio: 0.001, measure: "thd" as const } };
    const at = (hz: number) => ({ ...c, frequencyHz: hz });
    // Left's best is 110 W (its 90 W is at 20 kHz), right's is 105 W: the unit makes 105 W, above its rating.
    const v = checkBenchSheet(
      amp([
        rating,
        measured("output_power", 90, "W", at(20_000), { channel: "left" }),
        measured("output_power", 110, "W", at(1000), { channel: "left" }),
        measured("output_power", 105, "W", at(1000), { channel: "right" }),
      ]),
    );
    expect(resultsFor(v, "measured-vs-rated-power")[0].compared[1].value).toBe(105);
    // Left 95 W, right 105 W: the unit is 5 % short of its rating.
    const w = checkBenchSheet(
      amp([rating, measured("output_power", 95, "W", c, { channel: "left" }), measured("output_power", 105, "W", c, { channel: "right" })]),
    );
    expect(w.shortfalls.map((s) => s.percent)).toEqual([5]);
  });
  it("a power rated at a distortion limit needs the limit stated", () => {
    const s = amp([measured("output_power", 50, "W", { loadOhm: 8, frequencyHz: 1000, channelsDriven: "both" })]);
    const [r] = resultsFor(checkBenchSheet(s), "power-rating-conditions");
    expect(r.outcome).toBe("missing");
    expect(r.detail).toMatch(/distortion limit/);
  });
});

describe("thdn-not-below-thd: THD+N ≥ THD by definition (IEC 60268-3; AES17); 10 % allowance", () => {
  const c = { loadOhm: 8, frequencyHz: 1000, powerW: 10, bandwidth: { lowHz: 20, highHz: 20000 } };
  it.each([
    [0.001, "consistent"],
    [0.00099, "questionable"],
    [0.000901, "questionable"],
    [0.000899, "implausible"],
  ])("THD 0.1 % and THD+N %f: %s", (n, outcome) => {
    const s = amp([measured("thd", 0.001, "%", c), measured("thd_n", n, "%", c)]);
    expect(outcomes(s, "thdn-not-below-thd")).toEqual([outcome]);
  });
});

describe("analyser-resolution: THD −130 dB, THD+N −120 dB, SNR 130 dB, wow & flutter 0.01 % (common practice)", () => {
  const db = (x: number) => 10 ** (x / 20);
  const c = { loadOhm: 8, frequencyHz: 1000, powerW: 10, bandwidth: { lowHz: 20, highHz: 20000 } };
  it.each([
    ["thd", db(-129.9), "consistent"],
    ["thd", db(-130.1), "questionable"],
    ["thd_n", db(-119.9), "consistent"],
    ["thd_n", db(-120.1), "questionable"],
  ] as const)("%s at %f: %s", (q, x, outcome) => {
    expect(outcomes(amp([measured(q, x, "%", c)]), "analyser-resolution")).toEqual([outcome]);
  });
  it("SNR 129.9 dB is within what an analyser resolves; 130.1 dB is not", () => {
    const snr = (x: number) => amp([measured("snr", x, "dB", { powerW: 1, weighting: "A" })]);
    expect(outcomes(snr(129.9), "analyser-resolution")).toEqual(["consistent"]);
    expect(outcomes(snr(130.1), "analyser-resolution")).toEqual(["questionable"]);
  });
  it("wow & flutter 0.0101 % is resolvable; 0.0099 % is below a meter's residual", () => {
    const wf = (x: number) => sheet("turntable", [measured("wow_flutter", x, "%", { weighting: "IEC-60386-peak", testToneHz: 3150 })]);
    expect(outcomes(wf(1.01e-4), "analyser-resolution")).toEqual(["consistent"]);
    expect(outcomes(wf(0.99e-4), "analyser-resolution")).toEqual(["questionable"]);
  });
});

describe("distortion-conditions and noise-conditions (IEC 60268-3; AES17)", () => {
  it("THD+N without its measurement bandwidth is missing a condition", () => {
    const s = amp([measured("thd_n", 0.001, "%", { loadOhm: 8, frequencyHz: 1000, powerW: 10 })]);
    expect(resultsFor(checkBenchSheet(s), "distortion-conditions")[0].detail).toMatch(/measurement bandwidth/);
  });
  it("an amplifier's THD without its load is missing a condition", () => {
    const s = amp([measured("thd", 0.001, "%", { frequencyHz: 1000, powerW: 10 })]);
    expect(outcomes(s, "distortion-conditions")).toEqual(["missing"]);
  });
  it("an SNR without the level it is referred to is missing a condition", () => {
    const s = amp([measured("snr", 95, "dB", { weighting: "A" })]);
    expect(resultsFor(checkBenchSheet(s), "noise-conditions")[0].detail).toMatch(/reference level/);
  });
});
