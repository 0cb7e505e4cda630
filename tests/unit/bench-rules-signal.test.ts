import { describe, expect, it } from "vitest";
import { checkBenchSheet } from "@shared/bench";
import { full8, measured, outcomes, resultsFor, sheet } from "./bench-fixtures";

const amp = (...readings: Parameters<typeof sheet>[1]) => sheet("integrated_amplifier", readings);
const at60 = { powerW: 60, loadOhm: 8, frequencyHz: 1000 };
const bw = { lowHz: 20, highHz: 20000 };

describe("thdn-not-below-thd", () => {
  it("accepts THD+N above THD at the same conditions", () => {
    expect(
      outcomes(amp(measured("thd", 1e-4, "%", at60), measured("thd_n", 2e-4, "%", { ...at60, bandwidth: bw })), "thdn-not-below-thd"),
    ).toEqual(["consistent"]);
  });
  it("rejects THD+N well below THD", () => {
    expect(
      outcomes(amp(measured("thd", 1e-3, "%", at60), measured("thd_n", 5e-4, "%", { ...at60, bandwidth: bw })), "thdn-not-below-thd"),
    ).toEqual(["implausible"]);
  });
  it("questions THD+N a hair below THD", () => {
    expect(
      outcomes(amp(measured("thd", 1e-3, "%", at60), measured("thd_n", 0.95e-3, "%", { ...at60, bandwidth: bw })), "thdn-not-below-thd"),
    ).toEqual(["questionable"]);
  });
  it("does not compare figures taken at different levels", () => {
    expect(
      outcomes(
        amp(measured("thd", 1e-3, "%", at60), measured("thd_n", 1e-4, "%", { ...at60, powerW: 1, bandwidth: bw })),
        "thdn-not-below-thd",
      ),
    ).toEqual([]);
  });
});

describe("analyser-resolution", () => {
  it("questions distortion below what analysers resolve", () => {
    const v = checkBenchSheet(amp(measured("thd_n", 1e-7, "%", { ...at60, bandwidth: bw })));
    const [r] = resultsFor(v, "analyser-resolution");
    expect(r.outcome).toBe("questionable");
    expect(r.detail).toMatch(/−120 dB/);
  });
  it("questions an SNR beyond 130 dB", () => {
    expect(outcomes(amp(measured("snr", 140, "dB", { powerW: 60, weighting: "A" })), "analyser-resolution")).toEqual(["questionable"]);
  });
  it("accepts ordinary figures", () => {
    expect(
      outcomes(
        amp(measured("thd_n", 2e-4, "%", { ...at60, bandwidth: bw }), measured("snr", 100, "dB", { powerW: 60, weighting: "A" })),
        "analyser-resolution",
      ),
    ).toEqual(["consistent"]);
  });
});

describe("distortion-conditions and noise-conditions", () => {
  it("wants level, frequency, load and (for THD+N) bandwidth", () => {
    const v = checkBenchSheet(amp(measured("thd_n", 2e-4, "%", { powerW: 60 })));
    const [r] = resultsFor(v, "distortion-conditions");
    expect(r.outcome).toBe("missing");
    expect(r.detail).toMatch(/test frequency, load, measurement bandwidth/);
  });
  it("wants an SNR's reference level and weighting", () => {
    const v = checkBenchSheet(amp(measured("snr", 95, "dB"), measured("snr", 95, "dB", { powerW: 1, weighting: "A" })));
    expect(resultsFor(v, "noise-conditions").map((r) => r.outcome)).toEqual(["missing", "consistent"]);
    expect(resultsFor(v, "noise-conditions")[0].detail).toMatch(/reference level .* weighting or bandwidth/);
  });
});

describe("rise-time-bandwidth", () => {
  it("accepts 3.5 µs with a 100 kHz −3 dB point", () => {
    expect(outcomes(amp(measured("rise_time", 3.5e-6, "µs"), measured("f3db_high", 100e3, "kHz")), "rise-time-bandwidth")).toEqual([
      "consistent",
    ]);
  });
  it("questions a factor of 1.7 and rejects a factor of 5", () => {
    expect(outcomes(amp(measured("rise_time", 3.5e-6, "µs"), measured("f3db_high", 170e3, "kHz")), "rise-time-bandwidth")).toEqual([
      "questionable",
    ]);
    expect(outcomes(amp(measured("rise_time", 3.5e-6, "µs"), measured("f3db_high", 500e3, "kHz")), "rise-time-bandwidth")).toEqual([
      "implausible",
    ]);
  });
});

describe("slew-rate-full-power", () => {
  const power = measured("output_power", 100, "W", { ...full8, frequencyHz: undefined, frequencyRange: { lowHz: 20, highHz: 20000 } });
  it("accepts a slew rate above 2π·f·Vpk", () => {
    expect(outcomes(amp(power, measured("slew_rate", 10e6, "V/µs")), "slew-rate-full-power")).toEqual(["consistent"]);
  });
  it("rejects a slew rate far below what the claimed power band needs", () => {
    // 100 W / 8 Ω at 20 kHz needs 5.03 V/µs.
    expect(outcomes(amp(power, measured("slew_rate", 2e6, "V/µs")), "slew-rate-full-power")).toEqual(["implausible"]);
    expect(outcomes(amp(power, measured("slew_rate", 4e6, "V/µs")), "slew-rate-full-power")).toEqual(["questionable"]);
  });
  it("only questions it when the power band is assumed, not claimed", () => {
    const v = checkBenchSheet(amp(measured("output_power", 100, "W", full8), measured("slew_rate", 2e6, "V/µs")));
    const [r] = resultsFor(v, "slew-rate-full-power");
    expect(r.outcome).toBe("questionable");
    expect(r.detail).toMatch(/assumed/);
  });
});

describe("damping-output-impedance", () => {
  it("accepts DF 160 with 0.05 Ω", () => {
    expect(
      outcomes(
        amp(measured("damping_factor", 160, "", { loadOhm: 8 }), measured("output_impedance", 0.05, "Ω")),
        "damping-output-impedance",
      ),
    ).toEqual(["consistent"]);
  });
  it("rejects DF 800 with 0.05 Ω", () => {
    expect(
      outcomes(
        amp(measured("damping_factor", 800, "", { loadOhm: 8 }), measured("output_impedance", 0.05, "Ω")),
        "damping-output-impedance",
      ),
    ).toEqual(["implausible"]);
  });
  it("derives the missing one", () => {
    const v = checkBenchSheet(amp(measured("damping_factor", 160, "")));
    expect(v.derived.find((d) => d.id.startsWith("output-impedance-from-damping"))?.value).toBeCloseTo(0.05, 12);
  });
});

describe("channel-balance", () => {
  const L = { channel: "left" as const };
  const R = { channel: "right" as const };
  it("accepts channels within 0.5 dB", () => {
    expect(
      outcomes(amp(measured("output_power", 66, "W", full8, L), measured("output_power", 64, "W", full8, R)), "channel-balance"),
    ).toEqual(["consistent"]);
  });
  it("questions 2 dB between channels", () => {
    // 10·log10(100/63) = 2.0 dB
    expect(
      outcomes(amp(measured("output_power", 100, "W", full8, L), measured("output_power", 63, "W", full8, R)), "channel-balance"),
    ).toEqual(["questionable"]);
  });
  it("questions distortion ten times higher in one channel", () => {
    expect(outcomes(amp(measured("thd", 2e-4, "%", at60, L), measured("thd", 2e-3, "%", at60, R)), "channel-balance")).toEqual([
      "questionable",
    ]);
  });
  it("reads a stated balance figure", () => {
    expect(outcomes(amp(measured("channel_balance", 0.2, "dB")), "channel-balance")).toEqual(["consistent"]);
    expect(outcomes(amp(measured("channel_balance", -1.5, "dB")), "channel-balance")).toEqual(["questionable"]);
  });
  it("skips, without blocking the mark, a stereo amplifier with no per-channel figures (balance is not a required reading)", () => {
    const v = checkBenchSheet(amp(measured("output_power", 66, "W", full8, { channel: "both" })));
    expect(resultsFor(v, "channel-balance")).toEqual([]);
    expect(v.skipped.map((s) => s.ruleId)).toContain("channel-balance");
  });
  it("skips a mono block", () => {
    expect(
      outcomes({ ...sheet("power_amplifier", [measured("output_power", 66, "W", full8)]), channelCount: 1 }, "channel-balance"),
    ).toEqual([]);
  });
});
