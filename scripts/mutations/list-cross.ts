// Realistic one-line slips in the cross-checks between figures, the physical floors, the hazards and
// the rated-power rule. Part of MUTATIONS (list.ts).
import type { Mutation } from "./list";

const R = "shared/bench/rules/";

export const CROSS_MUTATIONS: Mutation[] = [
  // A typed figure against the capture
  {
    file: `${R}cross-capture.ts`,
    from: "ratio: { consistent: 10 ** (1 / 20), questionable: 2 }",
    to: "ratio: { consistent: 10 ** (1 / 10), questionable: 2 }",
    why: "typed distortion within 1 dB read as 10·log10",
  },
  {
    file: `${R}cross-capture.ts`,
    from: "decibel: { consistent: 1, questionable: 3 }",
    to: "decibel: { consistent: 1, questionable: 6 }",
    why: "typed dB figure implausible beyond 3 dB → 6 dB",
  },
  {
    file: `${R}cross-capture.ts`,
    from: "linear: { consistent: 0.05, questionable: 0.25 }",
    to: "linear: { consistent: 0.1, questionable: 0.25 }",
    why: "typed linear figure consistent within 5 % → 10 %",
  },
  {
    file: `${R}cross-capture.ts`,
    from: "sweep: { consistent: 0.1, questionable: 0.3 }",
    to: "sweep: { consistent: 0.2, questionable: 0.3 }",
    why: "typed −3 dB point within 10 % → 20 % of the sweep",
  },
  {
    file: `${R}cross-capture.ts`,
    from: "if (cc.loadOhm !== undefined && tc.loadOhm === undefined) return false;",
    to: "",
    why: "a typed figure without a load held against a loaded capture",
  },
  {
    file: `${R}cross-capture.ts`,
    from: 't.quantity === "f3db_high" ? "up" : "down"',
    to: 't.quantity === "f3db_high" ? "down" : "up"',
    why: "upper and lower −3 dB crossings swapped",
  },
  // Distortion below a power's limit (16 CFR 432.2(a))
  {
    file: `${R}cross-distortion.ts`,
    from: "FTC_LOWEST_POWER_W = 0.25",
    to: "FTC_LOWEST_POWER_W = 1",
    why: "FTC lowest power 250 mW → 1 W",
  },
  {
    file: `${R}cross-distortion.ts`,
    from: "LIMIT_TOLERANCE = 10 ** (1 / 20)",
    to: "LIMIT_TOLERANCE = 10 ** (1 / 10)",
    why: "distortion limit tolerance 1 dB as 10·log10",
  },
  {
    file: `${R}cross-distortion.ts`,
    from: "at > p.value * 1.001",
    to: "at > p.value * 2",
    why: "distortion readings above the rated power held against it",
  },
  {
    file: `${R}cross-distortion.ts`,
    from: '...(lim.measure === "thd_n" ? ix.measured("thd_n") : [])',
    to: '...ix.measured("thd_n")',
    why: "THD+N readings held against a THD limit",
  },
  {
    file: `${R}cross-distortion.ts`,
    from: "if (range) return f >= range.lowHz * 0.98 && f <= range.highHz * 1.02;",
    to: "if (range) return true;",
    why: "readings outside the power's band held against it",
  },
  {
    file: `${R}cross-distortion.ts`,
    from: "return (c.voltageV * c.voltageV) / (c.loadOhm ?? load);",
    to: "return c.voltageV / (c.loadOhm ?? load);",
    why: "distortion reading's power P = V/R (square dropped)",
  },
  // Level identities (IEC 60268-3 definitions)
  {
    file: `${R}cross-levels.ts`,
    from: "LEVEL_CONSISTENT_DB = 1",
    to: "LEVEL_CONSISTENT_DB = 2",
    why: "level identities consistent within 1 dB → 2 dB",
  },
  {
    file: `${R}cross-levels.ts`,
    from: "LEVEL_QUESTIONABLE_DB = 3",
    to: "LEVEL_QUESTIONABLE_DB = 6",
    why: "level identities implausible beyond 3 dB → 6 dB",
  },
  {
    file: `${R}cross-levels.ts`,
    from: "refs.map((v) => 20 * Math.log10(v / n.value))",
    to: "refs.map((v) => 10 * Math.log10(v / n.value))",
    why: "SNR from voltages as 10·log10",
  },
  {
    file: `${R}cross-levels.ts`,
    from: "const predicted = s.value * 10 ** (g.value / 20);",
    to: "const predicted = s.value * 10 ** (g.value / 10);",
    why: "gain in dB applied as a power ratio to a voltage",
  },
  {
    file: `${R}cross-levels.ts`,
    from: "return Math.sqrt(c.powerW * load);",
    to: "return Math.sqrt(c.powerW / load);",
    why: "level volts as √(P/R)",
  },
  {
    file: `${R}cross-levels.ts`,
    from: "if (wa && wb) return wa === wb;",
    to: "if (wa && wb) return true;",
    why: "A-weighted noise paired with an unweighted SNR",
  },
  // Physical floors
  { file: `${R}floors.ts`, from: "BOLTZMANN = 1.380649e-23", to: "BOLTZMANN = 1.380649e-22", why: "Boltzmann constant 10× too large" },
  {
    file: `${R}floors.ts`,
    from: "Math.sqrt(4 * BOLTZMANN * kelvin * ohms * bandwidthHz)",
    to: "Math.sqrt(BOLTZMANN * kelvin * ohms * bandwidthHz)",
    why: "Johnson noise √(kTRB) without the 4",
  },
  {
    file: `${R}floors.ts`,
    from: "n.conditions.temperatureC + 273.15",
    to: "n.conditions.temperatureC",
    why: "stated temperature in °C used as kelvin",
  },
  {
    file: `${R}floors.ts`,
    from: "g && g.value > 0 ? 10 ** (g.value / 20) : 1",
    to: "g && g.value > 0 ? 10 ** (g.value / 10) : 1",
    why: "thermal floor raised by the gain as a power ratio",
  },
  {
    file: `${R}floors.ts`,
    from: "FLOOR_TOLERANCE = 10 ** (-1 / 20)",
    to: "FLOOR_TOLERANCE = 10 ** (-3 / 20)",
    why: "thermal floor tolerance 1 dB → 3 dB",
  },
  {
    file: `${R}floors.ts`,
    from: "ANALYSER_SLACK = 0.5",
    to: "ANALYSER_SLACK = 0.25",
    why: "reading down to a quarter of the analyser residual questioned, not refused",
  },
  {
    file: `${R}floors.ts`,
    from: "const slope = (0.8 * t.conditions.voltageV!) / t.value;",
    to: "const slope = t.conditions.voltageV! / t.value;",
    why: "edge slope over the whole step, not 10–90 %",
  },
  {
    file: `${R}floors.ts`,
    from: "const outcome = floorOutcome(bw / f.value, 0.9);",
    to: "const outcome = floorOutcome(f.value / bw, 0.9);",
    why: "−3 dB point against the instrument bandwidth inverted",
  },
  // Hazards
  { file: `${R}hazards.ts`, from: "DC_OFFSET_LIMIT_V = 0.05", to: "DC_OFFSET_LIMIT_V = 0.1", why: "DC offset hazard ±50 mV → ±100 mV" },
  {
    file: `${R}hazards.ts`,
    from: "FAR_OFF_SPEED = 0.1",
    to: "FAR_OFF_SPEED = 0.2",
    why: "far off speed ±10 % → ±20 % (a 50/60 Hz mix-up passes)",
  },
  {
    file: `${R}hazards.ts`,
    from: "const ok = Math.abs(m.value) <= DC_OFFSET_LIMIT_V;",
    to: "const ok = m.value <= DC_OFFSET_LIMIT_V;",
    why: "a negative DC offset never a hazard",
  },
  {
    file: `${R}hazards.ts`,
    from: "if (Math.abs(m.value) <= FAR_OFF_SPEED) {",
    to: "if (m.value <= FAR_OFF_SPEED) {",
    why: "a turntable running slow never a hazard",
  },
  // The maker's rating against the measured power
  {
    file: `${R}rated-power.ts`,
    from: "near(m.conditions.loadOhm, r.conditions.loadOhm!) &&",
    to: "",
    why: "measured power at another load compared with the rating",
  },
  {
    file: `${R}rated-power.ts`,
    from: "const short = (1 - ratio) * 100;",
    to: "const short = (1 / ratio - 1) * 100;",
    why: "shortfall percent relative to the measured power",
  },
  {
    file: `${R}rated-power.ts`,
    from: "if (ratio < 1) out.shortfall({ detail, percent: Number(((1 - ratio) * 100).toFixed(1)), refs });",
    to: "",
    why: "a shortfall at a looser limit not reported",
  },
  {
    file: `${R}rated-power.ts`,
    from: 'conditionsCompatible(m.conditions, r.conditions, ["channelsDriven"]) &&',
    to: "",
    why: "one channel driven compared with all-channels rating",
  },
];
