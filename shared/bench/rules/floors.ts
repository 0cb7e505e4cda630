// Physical floors: nothing quieter than thermal noise, nothing cleaner than the analyser that measured it,
// nothing faster than the instrument's bandwidth; and the slew rate a measured edge implies.
import { formatReadingValue } from "../describe";
import { formatValue } from "../format";
import { withArticle } from "../words";
import { channelsCompatible, nameOf, near } from "./match";
import { RISE_BW_PRODUCT } from "./response";
import { fig, type Outcome, type Rule } from "./types";

/** Boltzmann constant, J/K: exact since the 2019 SI redefinition (SI Brochure, 9th ed., Table 1). */
export const BOLTZMANN = 1.380649e-23;
/** Reference noise temperature T₀ = 290 K (IEEE Std 100 noise-figure definition; ITU-R P.372). */
export const T0_KELVIN = 290;
/** Below a floor by at most 1 dB: meter tolerance (common practice); further below cannot have been measured. */
export const FLOOR_TOLERANCE = 10 ** (-1 / 20);
/** Analyser specifications are typical, not guaranteed: a reading down to half the stated residual is questioned, not refused (common practice). */
export const ANALYSER_SLACK = 0.5;

/** Slew rate against the edge's mean slope: 10 % under for meter tolerance, down to half questioned (common practice). */
export const SLEW_CONSISTENT = 0.9;
export const SLEW_QUESTIONABLE = 0.5;

/** Johnson–Nyquist noise voltage of a resistance R over bandwidth B at temperature T: v = √(4kTRB) (Johnson 1928; Nyquist 1928). */
export function johnsonNoiseV(ohms: number, bandwidthHz: number, kelvin = T0_KELVIN): number {
  return Math.sqrt(4 * BOLTZMANN * kelvin * ohms * bandwidthHz);
}

function floorOutcome(ratio: number, slack: number): Outcome {
  return ratio >= 1 - 1e-9 ? "consistent" : ratio >= slack ? "questionable" : "implausible";
}

export const thermalNoiseFloor: Rule = {
  id: "thermal-noise-floor",
  title: "Noise not below the thermal noise of the source",
  explanation:
    "Every resistance makes noise of its own: v = √(4kTRB), about 4 nV/√Hz for 1 kΩ at room temperature, so 0.57 µV over 20 kHz. An output noise measured with the input terminated in a stated source impedance cannot be lower than that source's thermal noise raised by the unit's gain.",
  source:
    "Johnson–Nyquist thermal noise, v = √(4kTRB) (J. B. Johnson and H. Nyquist, Phys. Rev. 32, 1928); k = 1.380649e-23 J/K (SI 2019); T = 290 K unless stated (IEEE Std 100); 1 dB meter tolerance (common practice)",
  evaluate(ix, out) {
    const ns = ix.measured("noise").filter((n) => n.conditions.sourceOhm !== undefined);
    if (!ns.length) return "No measured noise with the source impedance it was terminated in.";
    let checked = 0;
    for (const n of ns) {
      const bw = n.conditions.bandwidth;
      if (!bw) continue;
      checked++;
      const kelvin = n.conditions.temperatureC !== undefined ? n.conditions.temperatureC + 273.15 : T0_KELVIN;
      const g = ix.measured("gain").find((g) => channelsCompatible(g.channel, n.channel));
      const gain = g && g.value > 0 ? 10 ** (g.value / 20) : 1;
      const floor = johnsonNoiseV(n.conditions.sourceOhm!, bw.highHz - bw.lowHz, kelvin) * gain;
      const outcome = floorOutcome(n.value / floor, FLOOR_TOLERANCE);
      const src = `the ${formatValue(n.conditions.sourceOhm!, "resistance")} source's thermal noise over ${formatValue(bw.highHz - bw.lowHz, "frequency")} at ${formatValue(kelvin, "number")} K${g && gain > 1 ? `, raised by the ${formatReadingValue(g)} gain` : ""}`;
      out.result({
        outcome,
        detail:
          outcome === "consistent"
            ? `${nameOf(n)} is above ${src}, ${formatValue(floor, "voltage")}.`
            : `${nameOf(n)} is below ${src}, ${formatValue(floor, "voltage")}: no unit is quieter than the resistance at its input.`,
        refs: [n.ref, ...(g && gain > 1 ? [g.ref] : [])],
        compared: [fig("output noise", n.value, "voltage"), fig("thermal-noise floor √(4kTRB)", floor, "voltage")],
      });
    }
    if (!checked) return "The noise with a source impedance states no measurement bandwidth.";
  },
};

export const analyserFloor: Rule = {
  id: "analyser-stated-floor",
  title: "Nothing cleaner than the analyser that measured it",
  explanation:
    "An analyser cannot show distortion or noise below its own residual: a loopback of its generator into its input reads that much already. Where the sheet states the analyser's residual THD, THD+N or noise floor, no reading it took can be lower.",
  source:
    "The analyser's stated residual (its loopback reading); readings down to half of it questioned, as specifications are typical (common practice)",
  evaluate(ix, out) {
    const a = ix.sheet.analyser;
    if (!a || (a.residualThd === undefined && a.residualThdN === undefined && a.noiseFloorV === undefined))
      return "The sheet states no analyser residual.";
    const checks = [
      { items: ix.measured("thd"), floor: a.residualThd ?? a.residualThdN, what: "residual", kind: "ratio" as const },
      { items: ix.measured("thd_n"), floor: a.residualThdN, what: "residual THD+N", kind: "ratio" as const },
      { items: ix.measured("noise"), floor: a.noiseFloorV, what: "noise floor", kind: "voltage" as const },
    ];
    let seen = 0;
    for (const { items, floor, what, kind } of checks) {
      if (floor === undefined) continue;
      for (const r of items) {
        seen++;
        const outcome = floorOutcome(r.value / floor, ANALYSER_SLACK);
        out.result({
          outcome,
          detail:
            outcome === "consistent"
              ? `${nameOf(r)} is at or above the analyser's ${what} of ${formatValue(floor, kind)}.`
              : `${nameOf(r)} is below the analyser's ${what} of ${formatValue(floor, kind)}: it cannot have read that.`,
          refs: [r.ref],
          compared: [fig("reading", r.value, kind), fig(`analyser ${what}`, floor, kind)],
        });
      }
    }
    if (!seen) return "No reading of the kind the analyser's residual covers.";
  },
};

export const instrumentBandwidth: Rule = {
  id: "instrument-bandwidth",
  title: "Nothing faster than the instrument's bandwidth allows",
  explanation:
    "An oscilloscope or analyser of bandwidth B has a rise time of its own, about 0.35/B, and the rise times of unit and instrument add as the root of the sum of squares: no edge it shows is faster than 0.35/B, and no −3 dB point it finds lies above B.",
  source:
    "Single-pole rise time t_r = ln9/(2π·B) ≈ 0.35/B; cascaded rise times add root-sum-square (oscilloscope and electronics textbooks); 1 dB/10 % tolerance (common practice)",
  evaluate(ix, out) {
    const stated = ix.sheet.analyser?.bandwidthHz;
    let seen = 0;
    for (const t of ix.measured("rise_time")) {
      const bw = t.conditions.bandwidth?.highHz ?? stated;
      if (bw === undefined) continue;
      seen++;
      const fastest = RISE_BW_PRODUCT / bw;
      const outcome = floorOutcome(t.value / fastest, 0.9);
      out.result({
        outcome,
        detail: `${nameOf(t)} against ${formatValue(fastest, "time")}, the rise time of ${withArticle(formatValue(bw, "frequency"))} instrument${outcome === "consistent" ? "." : ": it cannot show a faster edge."}`,
        refs: [t.ref],
        compared: [
          fig("rise time", t.value, "time"),
          fig("instrument bandwidth", bw, "frequency"),
          fig("fastest edge it shows (0.35/B)", fastest, "time"),
        ],
      });
    }
    for (const f of ix.measured("f3db_high")) {
      const bw = f.conditions.bandwidth?.highHz ?? stated;
      if (bw === undefined) continue;
      seen++;
      const outcome = floorOutcome(bw / f.value, 0.9);
      out.result({
        outcome,
        detail: `${nameOf(f)} against the ${formatValue(bw, "frequency")} bandwidth of the instrument${outcome === "consistent" ? "." : ": it cannot find a −3 dB point above its own bandwidth."}`,
        refs: [f.ref],
        compared: [fig("upper −3 dB point", f.value, "frequency"), fig("instrument bandwidth", bw, "frequency")],
      });
    }
    if (!seen) return "No rise time or −3 dB point with the instrument's bandwidth.";
  },
};

export const slewRateRiseTime: Rule = {
  id: "slew-rate-rise-time",
  title: "Slew rate at least the slope of the measured edge",
  explanation:
    "A 10–90 % rise time covers 80 % of a step in t_r, so the output's mean slope over that part is 0.8·ΔV/t_r, and its steepest slope, the slew rate, cannot be less. A square-wave rise time with its level and a slew rate on the same sheet must fit: SR ≥ 0.8·ΔV/t_r, taking the stated level as the whole step (the smallest step it could mean).",
  source:
    "10–90 % rise time definition; mean slope ≤ maximum slope (mean value theorem); 10 % tolerance consistent, half questionable (common practice)",
  evaluate(ix, out) {
    const srs = ix.measured("slew_rate");
    const rises = ix.measured("rise_time").filter((t) => t.conditions.voltageV !== undefined);
    if (!srs.length || !rises.length) return "Needs a measured slew rate and a rise time with its level.";
    let pairs = 0;
    for (const t of rises) {
      const s = srs.find(
        (s) =>
          channelsCompatible(s.channel, t.channel) &&
          (s.conditions.loadOhm === undefined || t.conditions.loadOhm === undefined || near(s.conditions.loadOhm, t.conditions.loadOhm)),
      );
      if (!s) continue;
      pairs++;
      const slope = (0.8 * t.conditions.voltageV!) / t.value;
      const ratio = s.value / slope;
      const outcome: Outcome = ratio >= SLEW_CONSISTENT ? "consistent" : ratio >= SLEW_QUESTIONABLE ? "questionable" : "implausible";
      out.result({
        outcome,
        detail: `A ${formatValue(t.conditions.voltageV!, "voltage")} edge rising in ${formatReadingValue(t)} climbs at least ${formatValue(slope, "slewRate")}; the sheet's ${nameOf(s)} ${outcome === "consistent" ? "covers it" : "is slower than the edge it measured"}.`,
        refs: [t.ref, s.ref],
        compared: [fig("mean slope of the edge 0.8·ΔV/t_r", slope, "slewRate"), fig("slew rate on the sheet", s.value, "slewRate")],
      });
    }
    if (!pairs) return "No slew rate on the channel and load of a rise time with its level.";
  },
};
