// The bench rules' relations against published sources and the trade's rules of thumb.
// Each check names its source and how sure it is ("common practice" or "from memory" where that is all there is).
import { describe, expect, it } from "vitest";
import { checkBenchSheet, type BenchSheet, type Reading } from "@shared/bench";
import { riaaPlaybackDb } from "@shared/bench/curves";
import { RISE_BW_PRODUCT } from "@shared/bench/rules/response";

const m = (quantity: Reading["quantity"], value: number, unit: string, conditions: Reading["conditions"] = {}): Reading => ({
  quantity,
  value,
  unit,
  basis: "measured",
  origin: "typed",
  conditions,
});
const r = (quantity: Reading["quantity"], value: number, unit: string): Reading => ({ ...m(quantity, value, unit), basis: "rated" });
const sheet = (category: BenchSheet["category"], readings: Reading[], sweeps: BenchSheet["sweeps"] = []): BenchSheet => ({
  category,
  readings,
  sweeps,
});
const derived = (s: BenchSheet, prefix: string) => checkBenchSheet(s).derived.find((d) => d.id.startsWith(prefix));
const outcome = (s: BenchSheet, id: string) => checkBenchSheet(s).results.find((x) => x.ruleId === id)?.outcome;

describe("slew rate for full power (SR = 2π·f·Vpk, derivative of a sine, textbook calculus; docs/references.md §7)", () => {
  it("100 W into 8 Ω → 40 V peak → 5.03 V/µs at 20 kHz [computed worked example]", () => {
    const s = sheet("power_amplifier", [
      m("output_power", 100, "W", { loadOhm: 8, frequencyRange: { lowHz: 20, highHz: 20000 } }),
      m("slew_rate", 6e6, "V/µs"),
    ]);
    const need = derived(s, "slew-rate-needed")!;
    expect(need.value / 1e6).toBeCloseTo(5.03, 2);
    expect(need.display).toBe("5.03 V/µs");
  });
});

describe("rise time and bandwidth (single pole, 10–90 %: BW·t_r = ln9/2π; electronics textbook; docs/references.md §7)", () => {
  it("the product is 0.3497 ≈ 0.35", () => {
    expect(RISE_BW_PRODUCT).toBeCloseTo(0.3497, 4);
  });
  it("a 1.75 µs rise time means about 200 kHz — common practice", () => {
    const bw = derived(sheet("integrated_amplifier", [m("rise_time", 1.75e-6, "µs")]), "bandwidth-from-rise-time")!;
    expect(bw.value).toBeGreaterThan(195e3);
    expect(bw.value).toBeLessThan(205e3);
    expect(bw.display).toBe("200 kHz");
  });
  it("a 20 kHz bandwidth gives 17.5 µs [computed from ln9/2π]", () => {
    expect((RISE_BW_PRODUCT / 20e3) * 1e6).toBeCloseTo(17.5, 1); // 17.48 µs
    expect(
      outcome(sheet("integrated_amplifier", [m("rise_time", 17.5e-6, "µs"), m("f3db_high", 20e3, "kHz")]), "rise-time-bandwidth"),
    ).toBe("consistent");
  });
});

describe("damping factor (DF = R_load / Z_out; audio glossaries; docs/references.md §7)", () => {
  it("8 Ω / 0.05 Ω = 160", () => {
    expect(derived(sheet("integrated_amplifier", [m("output_impedance", 0.05, "Ω")]), "damping-factor-from-impedance")!.value).toBeCloseTo(
      160,
      9,
    );
    expect(
      outcome(
        sheet("integrated_amplifier", [m("damping_factor", 160, "", { loadOhm: 8 }), m("output_impedance", 0.05, "Ω")]),
        "damping-output-impedance",
      ),
    ).toBe("consistent");
  });
});

describe("loudspeaker minimum impedance (IEC 60268-5: not below 80 % of rated; secondary glossary; docs/references.md §5)", () => {
  const spk = (rated: number, min: number) => sheet("loudspeaker", [r("nominal_impedance", rated, "Ω"), m("impedance_minimum", min, "Ω")]);
  it("an 8 Ω speaker may dip to 6.4 Ω, not 6.3 Ω", () => {
    expect(outcome(spk(8, 6.4), "speaker-impedance-minimum")).toBe("consistent");
    expect(outcome(spk(8, 6.3), "speaker-impedance-minimum")).toBe("questionable");
  });
  it("a 4 Ω speaker may dip to 3.2 Ω, not 3.1 Ω", () => {
    expect(outcome(spk(4, 3.2), "speaker-impedance-minimum")).toBe("consistent");
    expect(outcome(spk(4, 3.1), "speaker-impedance-minimum")).toBe("questionable");
  });
  it("a dB/2.83 V figure exceeds the dB/W figure by 10·log10(8/Z): +3.01 dB at 4 Ω [computed: 2.83 V = √8 V is 1 W into 8 Ω]", () => {
    const s = sheet("loudspeaker", [r("nominal_impedance", 4, "Ω"), m("sensitivity", 90, "dB/2.83 V/1 m")]);
    expect(90 - derived(s, "sensitivity-per-watt")!.value).toBeCloseTo(3.01, 2);
  });
});

describe("RIAA playback (IEC 60098, time constants 3180/318/75 µs; playback table re 1 kHz, docs/references.md §1 [computed from the time constants])", () => {
  // Published-style table, dB re 1 kHz, rounded to 0.01 dB.
  const TABLE: [number, number][] = [
    [20, 19.27],
    [50, 16.95],
    [100, 13.09],
    [500, 2.65],
    [1000, 0],
    [2000, -2.59],
    [5000, -8.21],
    [10000, -13.73],
    [20000, -19.62],
  ];
  it("a sweep typed from the table deviates from the curve by no more than the table's rounding", () => {
    const points = TABLE.map(([f, db]) => ({ frequencyHz: f, levelDb: db - 40 }));
    const v = checkBenchSheet(sheet("phono_stage", [], [{ kind: "riaa", variant: "riaa", origin: "typed", conditions: {}, points }]));
    const res = v.results.find((x) => x.ruleId === "riaa-deviation")!;
    expect(res.outcome).toBe("consistent");
    expect(Math.abs(res.compared[0].value)).toBeLessThanOrEqual(0.006);
  });
  it("the curve the rule uses matches the table to ±0.01 dB", () => {
    for (const [f, db] of TABLE) expect(Math.abs(riaaPlaybackDb(f) - db)).toBeLessThanOrEqual(0.01);
  });
  it("with the IEC 7950 µs pole the table's 20 Hz point (+16.26 dB) fits the IEC variant, not plain RIAA", () => {
    const points = [
      [10, 12.75],
      [20, 16.26],
      [30, 17.0],
      [50, 16.3],
      [100, 12.92],
      [500, 2.64],
      [1000, 0],
      [10000, -13.73],
    ].map(([f, db]) => ({ frequencyHz: f, levelDb: db }));
    const v = checkBenchSheet(sheet("phono_stage", [], [{ kind: "riaa", origin: "typed", conditions: {}, points }]));
    const res = v.results.find((x) => x.ruleId === "riaa-deviation")!;
    expect(res.detail).toMatch(/IEC subsonic pole/);
    expect(Math.abs(res.compared[0].value)).toBeLessThanOrEqual(0.01);
  });
});

describe("half-load power (ideal voltage source doubles into half the load; textbook)", () => {
  it("an ideal 100 W / 8 Ω source makes 200 W into 4 Ω, and the rule accepts exactly that", () => {
    const c = { frequencyHz: 1000, atDistortion: { ratio: 0.001, measure: "thd" as const }, channelsDriven: "both" as const };
    const vpk = Math.sqrt(2 * 100 * 8);
    const into4 = (vpk / Math.SQRT2) ** 2 / 4;
    expect(into4).toBeCloseTo(200, 9);
    expect(
      outcome(
        sheet("power_amplifier", [m("output_power", 100, "W", { ...c, loadOhm: 8 }), m("output_power", into4, "W", { ...c, loadOhm: 4 })]),
        "half-load-power",
      ),
    ).toBe("consistent");
  });
});

describe("wow & flutter (IEC 60386 / AES6: 3150 Hz test tone, weighted; docs/references.md §6)", () => {
  it("accepts the IEC tone and refuses a figure without weighting", () => {
    expect(
      outcome(sheet("turntable", [m("wow_flutter", 0.001, "%", { weighting: "IEC-60386-peak", testToneHz: 3150 })]), "wow-flutter"),
    ).toBe("consistent");
    expect(outcome(sheet("turntable", [m("wow_flutter", 0.001, "%", { testToneHz: 3150 })]), "wow-flutter")).toBe("missing");
  });
});
