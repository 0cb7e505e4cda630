// The required list is the contract (docs/api.md, "Readings each category needs measured for the mark"):
// a sheet with exactly those readings earns the mark; an optional check with nothing to compare does not block.
import { describe, expect, it } from "vitest";
import { checkBenchSheet, type Sweep } from "@shared/bench";
import { full8, measured, rated, resultsFor, sheet } from "../bench-fixtures";

// RIAA playback response re 1 kHz at the printed frequencies, dB (IEC 60098 playback table, as commonly printed).
const RIAA_TABLE: [number, number][] = [
  [20, 19.27],
  [50, 16.96],
  [100, 13.09],
  [200, 8.22],
  [500, 2.64],
  [1000, 0],
  [2000, -2.59],
  [5000, -8.21],
  [10000, -13.73],
  [20000, -19.62],
];
const riaa = (channel: Sweep["channel"]): Sweep => ({
  kind: "riaa",
  channel,
  origin: "typed",
  conditions: {},
  points: RIAA_TABLE.map(([frequencyHz, levelDb]) => ({ frequencyHz, levelDb })),
});

describe("phono stage: exactly gain, a RIAA sweep and SNR", () => {
  const snr = measured("snr", 78, "dB(A)", { voltageV: 0.005, frequencyHz: 1000, weighting: "A" });
  it("is bench-verified with sweeps for both channels and one gain figure for both channels", () => {
    const s = sheet("phono_stage", [measured("gain", 40, "dB", { frequencyHz: 1000 }, { channel: "both" }), snr], {
      sweeps: [riaa("left"), riaa("right")],
    });
    const v = checkBenchSheet(s);
    expect(v.counts).toMatchObject({ missing: 0, questionable: 0, implausible: 0 });
    expect(v.benchVerified).toBe(true);
    expect(v.skipped.find((x) => x.ruleId === "channel-balance")?.reason).toMatch(/No left and right readings/);
  });
  it("is bench-verified with gain for each channel", () => {
    const s = sheet(
      "phono_stage",
      [
        measured("gain", 40, "dB", { frequencyHz: 1000 }, { channel: "left" }),
        measured("gain", 40.2, "dB", { frequencyHz: 1000 }, { channel: "right" }),
        snr,
      ],
      { sweeps: [riaa("left"), riaa("right")] },
    );
    const v = checkBenchSheet(s);
    expect(v.benchVerified).toBe(true);
    expect(resultsFor(v, "channel-balance").map((r) => r.outcome)).toEqual(["consistent"]);
  });
  it("still checks the balance when both channels are measured, and questions a 1 dB spread (limit 0.5 dB, common practice)", () => {
    const s = sheet(
      "phono_stage",
      [
        measured("gain", 40, "dB", { frequencyHz: 1000 }, { channel: "left" }),
        measured("gain", 41, "dB", { frequencyHz: 1000 }, { channel: "right" }),
        snr,
      ],
      { sweeps: [riaa("left"), riaa("right")] },
    );
    const v = checkBenchSheet(s);
    expect(resultsFor(v, "channel-balance").map((r) => r.outcome)).toEqual(["questionable"]);
    expect(v.benchVerified).toBe(false);
  });
});

describe("rated power at one distortion limit, measured at another (16 CFR 432: power at a stated maximum distortion)", () => {
  const rating = rated("output_power", 50, "W", { ...full8, atDistortion: { ratio: 0.0005, measure: "thd" } });
  it("compares them and says the distortion limits differ", () => {
    const m = measured("output_power", 55, "W", full8); // 0.1 % THD
    const v = checkBenchSheet(sheet("integrated_amplifier", [rating, m]));
    const [r] = resultsFor(v, "measured-vs-rated-power");
    expect(r.outcome).toBe("consistent");
    expect(r.detail).toMatch(/measured at 0\.1 % THD, the maker's 50 W at 0\.05 % THD: the distortion limits differ/);
    expect(v.skipped.map((s) => s.ruleId)).not.toContain("measured-vs-rated-power");
    expect(v.shortfalls).toEqual([]);
  });
  it("reports a shortfall when even the looser limit gives less than the rating: 45 W of 50 W is 10 % short", () => {
    const v = checkBenchSheet(sheet("integrated_amplifier", [rating, measured("output_power", 45, "W", full8)]));
    expect(resultsFor(v, "measured-vs-rated-power")[0].detail).toMatch(/falls 10\.0 % short/);
    expect(v.shortfalls.map((s) => s.percent)).toEqual([10]);
  });
});

describe("wording", () => {
  it('says "an integrated amplifier sheet"', () => {
    const v = checkBenchSheet(sheet("integrated_amplifier", []));
    const details = resultsFor(v, "required-readings").map((r) => r.detail);
    expect(details.join(" ")).toMatch(/an integrated amplifier sheet needs/);
    expect(details.join(" ")).not.toMatch(/a integrated/);
  });
});
