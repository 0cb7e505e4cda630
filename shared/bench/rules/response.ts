// Speed of the amplifier: rise time against bandwidth, slew rate against the full-power bandwidth; damping factor.
import { AMPLIFIER_CATEGORIES } from "../quantities";
import { formatReadingValue } from "../describe";
import { formatValue } from "../format";
import { channelsCompatible, conditionsCompatible, nameOf } from "./match";
import { maxPeakVoltage } from "./power";
import { fig, type Rule } from "./types";

/** BW·t_r for a single pole, 10–90 %: ln 9 / 2π = 0.3497. */
export const RISE_BW_PRODUCT = Math.log(9) / (2 * Math.PI);
/** Default full-power band when the sheet states none: 20 Hz–20 kHz (as power ratings usually are). */
export const DEFAULT_POWER_BAND_HZ = 20_000;

export const riseTimeBandwidth: Rule = {
  id: "rise-time-bandwidth",
  title: "Rise time and bandwidth agree",
  explanation:
    "A square wave's 10–90 % rise time and the upper −3 dB point describe the same thing: for a single-pole response f₋₃dB ≈ 0.35 / t_rise (1.75 µs ≈ 200 kHz). Real amplifiers are not exactly single-pole, so the bench allows a factor of 1.4 either way before asking.",
  source:
    "Single-pole relation f₋₃dB = ln9/(2π·t_r) ≈ 0.35/t_r, 10–90 % (electronics textbook); ×1.4 consistent, ×2 questionable (common practice)",
  evaluate(ix, out) {
    const rises = ix.measured("rise_time");
    if (!rises.length) return "No measured rise time.";
    const highs = ix.measured("f3db_high");
    let pairs = 0;
    for (const t of rises) {
      const predicted = RISE_BW_PRODUCT / t.value;
      out.derive({
        id: `bandwidth-from-rise-time:${t.ref}`,
        label: `Bandwidth implied by ${formatReadingValue(t)} rise time`,
        value: predicted,
        kind: "frequency",
        refs: [t.ref],
      });
      const f = highs.find((f) => channelsCompatible(f.channel, t.channel));
      if (!f) continue;
      pairs++;
      const ratio = f.value / predicted;
      const spread = Math.max(ratio, 1 / ratio);
      const outcome = spread <= 1.43 ? "consistent" : spread <= 2 ? "questionable" : "implausible";
      out.result({
        outcome,
        detail: `A ${formatReadingValue(t)} rise time implies about ${formatValue(predicted, "frequency")}; the sheet's upper −3 dB point is ${formatReadingValue(f)} (${ratio.toFixed(2)}×).`,
        refs: [t.ref, f.ref],
        compared: [
          fig("rise time (10–90 %)", t.value, "time"),
          fig("bandwidth implied (0.35 / t)", predicted, "frequency"),
          fig("upper −3 dB point on the sheet", f.value, "frequency"),
        ],
      });
    }
    if (!pairs) return "No measured upper −3 dB point to compare with the rise time.";
  },
};

export const slewRateFullPower: Rule = {
  id: "slew-rate-full-power",
  title: "Slew rate covers the full-power bandwidth",
  explanation:
    "To reproduce a sine of peak voltage Vpk at frequency f without slew limiting, the output must change at up to SR = 2π·f·Vpk volts per second (100 W into 8 Ω is 40 V peak, needing 5.03 V/µs at 20 kHz). A slew rate below that contradicts a claim of full power up to f.",
  source: "Derivative of a sine: SR = 2π·f·Vpk (textbook calculus)",
  categories: AMPLIFIER_CATEGORIES,
  evaluate(ix, out) {
    const srs = ix.measured("slew_rate");
    if (!srs.length) return "No measured slew rate.";
    const peak = maxPeakVoltage(ix) ?? maxPeakVoltage(ix, "rated");
    if (!peak) return "No output power or voltage to size the slew rate against.";
    let fTop: number | undefined;
    let fRef: string | undefined;
    for (const b of ix.all("power_bandwidth")) if (fTop === undefined || b.value > fTop) [fTop, fRef] = [b.value, b.ref];
    if (fTop === undefined)
      for (const p of ix.all("output_power")) {
        const hi = p.conditions.frequencyRange?.highHz;
        if (hi !== undefined && (fTop === undefined || hi > fTop)) [fTop, fRef] = [hi, p.ref];
      }
    const assumed = fTop === undefined;
    const f = fTop ?? DEFAULT_POWER_BAND_HZ;
    const need = 2 * Math.PI * f * peak.vpk;
    out.derive({
      id: "slew-rate-needed",
      label: `Slew rate needed for ${formatValue(peak.vpk, "voltage")} peak at ${formatValue(f, "frequency")}`,
      value: need,
      kind: "slewRate",
      refs: [peak.from.ref],
    });
    for (const s of srs) {
      out.derive({
        id: `full-power-bandwidth-from-slew:${s.ref}`,
        label: `Full-power bandwidth ${formatReadingValue(s)} allows`,
        value: s.value / (2 * Math.PI * peak.vpk),
        kind: "frequency",
        refs: [s.ref, peak.from.ref],
      });
      const ratio = s.value / need;
      const outcome = ratio >= 1 ? "consistent" : assumed || ratio >= 0.5 ? "questionable" : "implausible";
      const band = assumed ? `${formatValue(f, "frequency")} (assumed: the sheet states no power band)` : formatValue(f, "frequency");
      out.result({
        outcome,
        detail:
          ratio >= 1
            ? `${nameOf(s)} covers the ${formatValue(need, "slewRate")} that ${formatValue(peak.vpk, "voltage")} peak needs at ${band}.`
            : `${nameOf(s)} is below the ${formatValue(need, "slewRate")} that ${formatValue(peak.vpk, "voltage")} peak needs at ${band}: full power cannot reach that frequency.`,
        refs: [s.ref, peak.from.ref, ...(fRef ? [fRef] : [])],
        compared: [
          fig("slew rate", s.value, "slewRate"),
          fig("peak output voltage", peak.vpk, "voltage"),
          fig("top of the power band", f, "frequency"),
          fig("slew rate needed (2π·f·Vpk)", need, "slewRate"),
        ],
      });
    }
  },
};

export const dampingVsImpedance: Rule = {
  id: "damping-output-impedance",
  title: "Damping factor and output impedance agree",
  explanation:
    "Damping factor is the load divided by the amplifier's output impedance (DF = R_load / Z_out, usually quoted into 8 Ω): 0.05 Ω into 8 Ω is 160. The two figures on a sheet must agree, allowing for rounding.",
  source: "DF = R_load / Z_out (audio glossaries); ±15 % for rounding, ×2 questionable (common practice)",
  evaluate(ix, out) {
    const dfs = ix.measured("damping_factor");
    const zs = ix.measured("output_impedance");
    if (!dfs.length && !zs.length) return "No measured damping factor or output impedance.";
    for (const z of zs)
      out.derive({
        id: `damping-factor-from-impedance:${z.ref}`,
        label: `Damping factor into 8 Ω from ${formatReadingValue(z)}`,
        value: 8 / z.value,
        kind: "number",
        refs: [z.ref],
      });
    let pairs = 0;
    for (const d of dfs) {
      const load = d.conditions.loadOhm ?? 8;
      const z = zs.find(
        (z) => channelsCompatible(z.channel, d.channel) && conditionsCompatible(z.conditions, d.conditions, ["frequencyHz"]),
      );
      if (!z) {
        out.derive({
          id: `output-impedance-from-damping:${d.ref}`,
          label: `Output impedance from damping factor ${formatReadingValue(d)}`,
          value: load / d.value,
          kind: "resistance",
          refs: [d.ref],
        });
        continue;
      }
      pairs++;
      const expected = load / z.value;
      const ratio = d.value / expected;
      const spread = Math.max(ratio, 1 / ratio);
      const outcome = spread <= 1.18 ? "consistent" : spread <= 2 ? "questionable" : "implausible";
      out.result({
        outcome,
        detail: `${formatValue(load, "resistance")}${d.conditions.loadOhm === undefined ? " (assumed)" : ""} ÷ ${formatReadingValue(z)} gives a damping factor of ${formatValue(expected, "number")}; the sheet says ${formatReadingValue(d)}.`,
        refs: [d.ref, z.ref],
        compared: [
          fig("damping factor on the sheet", d.value, "number"),
          fig("output impedance", z.value, "resistance"),
          fig("load", load, "resistance"),
          fig("damping factor from impedance", expected, "number"),
        ],
      });
    }
    if (!pairs) return "Needs both a measured damping factor and a measured output impedance.";
  },
};
