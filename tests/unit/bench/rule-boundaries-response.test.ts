// Just inside and just outside the thresholds of the speed, damping and channel-balance rules.
// Thresholds are common practice (docs/references.md §9); relations are textbook (§7).
import { describe, expect, it } from "vitest";
import type { Reading } from "@shared/bench";
import { full8, measured, outcomes, sheet } from "../bench-fixtures";

const amp = (readings: Reading[]) => sheet("integrated_amplifier", readings);

describe("rise-time-bandwidth: f₋₃dB = ln9/(2π·t_r), ×1.43 consistent, ×2 questionable", () => {
  // ln 9 / 2π = 2.1972246 / 6.2831853 = 0.3496994 (single pole, 10–90 %; electronics textbook).
  const K = 0.3496994;
  const t = 1.75e-6;
  const at = (factor: number) => amp([measured("rise_time", t, "µs"), measured("f3db_high", (K / t) * factor, "Hz")]);
  it.each([
    [1.42, "consistent"],
    [1 / 1.42, "consistent"],
    [1.44, "questionable"],
    [1 / 1.44, "questionable"],
    [1.99, "questionable"],
    [2.01, "implausible"],
    [1 / 2.01, "implausible"],
  ])("an upper −3 dB point %f× what 1.75 µs implies: %s", (k, outcome) => {
    expect(outcomes(at(k), "rise-time-bandwidth")).toEqual([outcome]);
  });
});

describe("slew-rate-full-power: SR = 2π·f·Vpk (derivative of a sine)", () => {
  // 100 W into 8 Ω is √(2·100·8) = 40 V peak; at 20 kHz it needs 2π·20000·40 = 5.0265 V/µs.
  const at = (vPerUs: number, band = true) =>
    amp([
      measured("output_power", 100, "W", full8),
      ...(band ? [measured("power_bandwidth", 20_000, "Hz")] : []),
      measured("slew_rate", vPerUs * 1e6, "V/µs", { loadOhm: 8 }),
    ]);
  it.each([
    [5.03, "consistent"],
    [5.02, "questionable"],
    [2.52, "questionable"],
    [2.51, "implausible"],
  ])("%f V/µs against the 5.03 V/µs that 40 V peak needs at 20 kHz: %s", (sr, outcome) => {
    expect(outcomes(at(sr), "slew-rate-full-power")).toEqual([outcome]);
  });
  it("without a stated power band the usual 20 Hz–20 kHz is assumed, and a shortfall only questioned", () => {
    expect(outcomes(at(5.03, false), "slew-rate-full-power")).toEqual(["consistent"]);
    expect(outcomes(at(5.02, false), "slew-rate-full-power")).toEqual(["questionable"]);
    expect(outcomes(at(1, false), "slew-rate-full-power")).toEqual(["questionable"]);
  });
});

describe("damping-output-impedance: DF = R_load / Z_out (audio glossaries); ±18 % consistent, ×2 questionable", () => {
  // 8 Ω / 0.05 Ω = 160.
  const at = (df: number, load: number | undefined = 8) =>
    amp([measured("damping_factor", df, "", load === undefined ? {} : { loadOhm: load }), measured("output_impedance", 0.05, "Ω")]);
  it.each([
    [160 * 1.17, "consistent"],
    [160 / 1.17, "consistent"],
    [160 * 1.19, "questionable"],
    [160 / 1.19, "questionable"],
    [160 * 1.99, "questionable"],
    [160 * 2.01, "implausible"],
  ])("damping factor %f against 0.05 Ω into 8 Ω (160): %s", (df, outcome) => {
    expect(outcomes(at(df), "damping-output-impedance")).toEqual([outcome]);
  });
  it("a damping factor with no stated load is taken into 8 Ω, as the trade quotes it", () => {
    expect(outcomes(at(160, undefined), "damping-output-impedance")).toEqual(["consistent"]);
  });
});

describe("channel-balance: 0.5 dB (loudspeaker pairs 1 dB), distortion within 3× or both below 0.01 %", () => {
  const lr = (q: Reading["quantity"], l: number, r: number, unit: string, c: Reading["conditions"] = full8) => [
    measured(q, l, unit, c, { channel: "left" }),
    measured(q, r, unit, c, { channel: "right" }),
  ];
  it.each([
    // Power: 10·log10(100/89.33) = 0.49 dB; 10·log10(100/88.92) = 0.51 dB.
    ["output_power", 89.33, "consistent"],
    ["output_power", 88.92, "questionable"],
    // Voltage: 20·log10(20/18.89) = 0.497 dB; 20·log10(20/18.86) = 0.51 dB.
    ["output_voltage", 18.89, "consistent"],
    ["output_voltage", 18.86, "questionable"],
  ] as const)("left 100 W / 20 V against right %s %f: %s", (q, right, outcome) => {
    const left = q === "output_power" ? 100 : 20;
    expect(outcomes(amp(lr(q, left, right, q === "output_power" ? "W" : "V")), "channel-balance")).toEqual([outcome]);
  });
  it.each([
    [0.00299, "consistent"],
    [0.00301, "questionable"],
  ])("THD 0.1 % left and %f right: %s", (right, outcome) => {
    const c = { loadOhm: 8, frequencyHz: 1000, powerW: 10 };
    expect(outcomes(amp(lr("thd", 0.001, right, "%", c)), "channel-balance")).toEqual([outcome]);
  });
  it("both channels at or below 0.01 % are balanced whatever their ratio; one just above is not", () => {
    const c = { loadOhm: 8, frequencyHz: 1000, powerW: 10 };
    expect(outcomes(amp(lr("thd", 0.00002, 0.0001, "%", c)), "channel-balance")).toEqual(["consistent"]);
    expect(outcomes(amp(lr("thd", 0.00002, 0.000101, "%", c)), "channel-balance")).toEqual(["questionable"]);
  });
  it.each([
    [0.49, "consistent"],
    [-0.49, "consistent"],
    [0.51, "questionable"],
    [-0.51, "questionable"],
  ])("a stated channel balance of %f dB: %s", (db, outcome) => {
    expect(outcomes(amp([measured("channel_balance", db, "dB")]), "channel-balance")).toEqual([outcome]);
  });
  it("a loudspeaker pair's sensitivities may differ by 1 dB, not more", () => {
    const c = { voltageV: 2.83, distanceM: 1 };
    const pair = (r: number) => sheet("loudspeaker", lr("sensitivity", 90, r, "dB", c));
    expect(outcomes(pair(89.05), "channel-balance")).toEqual(["consistent"]);
    expect(outcomes(pair(88.95), "channel-balance")).toEqual(["questionable"]);
  });
});
