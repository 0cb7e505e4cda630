// Amplifier power: voltage, load and power agree; half-load power; supply rails; measured vs rated.
import { AMPLIFIER_CATEGORIES } from "../quantities";
import { formatReadingValue } from "../describe";
import { powerFromVrms, SQRT2, vpkFromPower } from "../units";
import { formatValue } from "../format";
import { channelsCompatible, conditionsCompatible, nameOf, near, pct } from "./match";
import { fig, type Item, type Rule, type SheetIndex } from "./types";

/** Power-voltage agreement, in power (2.5 % in voltage): meter and load tolerances. */
export const PV_TOLERANCE = 0.05;
export const PV_QUESTIONABLE = 0.25;
/** Half-load power ratio: 2 for an ideal voltage source, plus measurement tolerance. */
export const HALF_LOAD_CONSISTENT = 2.06;
export const HALF_LOAD_QUESTIONABLE = 2.3;

function hintFor(ratio: number): string {
  const hints: [number, string][] = [
    [2, "The power is twice what the voltage gives: was the voltage read as peak but entered as rms?"],
    [8, "The power is eight times what the voltage gives: was the voltage peak-to-peak but entered as rms?"],
    [0.5, "The power is half what the voltage gives: was a peak voltage entered as rms, or the power per channel halved?"],
    [0.125, "The power is an eighth of what the voltage gives: was a peak-to-peak voltage entered as rms?"],
  ];
  for (const [r, h] of hints) if (near(ratio, r, 0.08)) return ` ${h}`;
  return "";
}

export const powerVoltageLoad: Rule = {
  id: "power-voltage-load",
  title: "Power, voltage and load agree",
  explanation:
    "For a sine wave, power into a resistive load is the rms voltage squared divided by the load (P = Vrms²/R), and Vrms = Vpk/√2 = Vpp/(2√2). A measured output voltage and a measured power at the same load must give the same watts.",
  source: "Ohm's law and sine relations (textbook): P = Vrms²/R, Vrms = Vpk/√2 = Vpp/(2√2); tolerance 5 % in power (common practice)",
  categories: AMPLIFIER_CATEGORIES,
  evaluate(ix, out) {
    const volts = ix.measured("output_voltage").filter((v) => v.conditions.loadOhm);
    if (!volts.length) return "No measured output voltage with its load.";
    const powers = ix.measured("output_power").filter((p) => p.conditions.loadOhm);
    let compared = 0;
    for (const v of volts) {
      const R = v.conditions.loadOhm!;
      const pv = powerFromVrms(v.value, R);
      out.derive({
        id: `power-from-voltage:${v.ref}`,
        label: `Power from ${formatReadingValue(v)} into ${formatValue(R, "resistance")}`,
        value: pv,
        kind: "power",
        refs: [v.ref],
      });
      const p = powers.find((p) => sameOperatingPoint(p, v));
      if (!p) continue;
      compared++;
      const ratio = p.value / pv;
      const off = Math.abs(ratio - 1);
      const outcome = off <= PV_TOLERANCE ? "consistent" : off <= PV_QUESTIONABLE ? "questionable" : "implausible";
      const detail =
        outcome === "consistent"
          ? `${formatReadingValue(v)} into ${formatValue(R, "resistance")} gives ${formatValue(pv, "power")}; the sheet says ${formatReadingValue(p)} (${pct(off * 100)} apart; tolerance ${PV_TOLERANCE * 100} %).`
          : `${formatReadingValue(v)} into ${formatValue(R, "resistance")} gives ${formatValue(pv, "power")}, but the sheet says ${formatReadingValue(p)} (${pct(off * 100)} apart).${hintFor(ratio)}`;
      out.result({
        outcome,
        detail,
        refs: [v.ref, p.ref],
        compared: [
          fig("output voltage as typed", v.value, "voltage", { display: formatReadingValue(v) }),
          fig("output voltage, rms", v.value, "voltage"),
          fig("output voltage, peak", v.value * SQRT2, "voltage", { display: formatValue(v.value, "voltage", { form: "peak" }) }),
          fig("load", R, "resistance"),
          fig("power from voltage and load", pv, "power"),
          fig("power on the sheet", p.value, "power"),
        ],
      });
    }
    if (!compared) return "No measured power at the same load and channel as the measured output voltage.";
  },
};

// A voltage and a power describe the same output only at the same operating point. A capture is taken
// at whatever level the seller chose, so it pairs with readings of the same capture, never with a
// typed full-power figure; typed readings pair when both or neither state a distortion limit.
function sameOperatingPoint(p: Item, v: Item): boolean {
  if (!channelsCompatible(p.channel, v.channel)) return false;
  if (!conditionsCompatible(p.conditions, v.conditions, ["loadOhm", "frequencyHz", "distortion", "channelsDriven"])) return false;
  if (p.captureId || v.captureId) return p.captureId === v.captureId;
  return (p.conditions.atDistortion === undefined) === (v.conditions.atDistortion === undefined);
}

export const halfLoadPower: Rule = {
  id: "half-load-power",
  title: "Power into half the load is at most double",
  explanation:
    "An ideal voltage source delivers twice the power into half the load; a real amplifier's supply sags and its output stage limits current, so it manages less than double. Much more than double means one of the figures is wrong.",
  source: "Textbook relation (P = V²/R at constant voltage); thresholds ×2.06 consistent, ×2.3 implausible (common practice)",
  categories: AMPLIFIER_CATEGORIES,
  evaluate(ix, out) {
    const ps = ix.measured("output_power").filter((p) => p.conditions.loadOhm);
    let pairs = 0;
    for (const full of ps)
      for (const half of ps) {
        if (!near(half.conditions.loadOhm!, full.conditions.loadOhm! / 2, 0.03)) continue;
        if (!channelsCompatible(full.channel, half.channel)) continue;
        if (!conditionsCompatible(full.conditions, half.conditions, ["frequencyHz", "distortion", "channelsDriven"])) continue;
        pairs++;
        const ratio = half.value / full.value;
        const outcome = ratio <= HALF_LOAD_CONSISTENT ? "consistent" : ratio <= HALF_LOAD_QUESTIONABLE ? "questionable" : "implausible";
        const what = `${nameOf(half)} into ${formatValue(half.conditions.loadOhm!, "resistance")} is ${ratio.toFixed(2)}× the ${formatReadingValue(full)} into ${formatValue(full.conditions.loadOhm!, "resistance")}`;
        out.result({
          outcome,
          detail:
            outcome === "consistent" ? `${what}; at most 2× is expected.` : `${what}; more than 2× is not possible from a voltage source.`,
          refs: [full.ref, half.ref],
          compared: [
            fig("power into rated load", full.value, "power"),
            fig("power into half the load", half.value, "power"),
            fig("ratio", ratio, "number", { display: `${ratio.toFixed(2)}×` }),
            fig("ideal limit", 2, "number", { display: "2.00×" }),
          ],
        });
      }
    if (!pairs) return "No measured power at two loads a factor of two apart.";
  },
};

/** Highest peak output voltage the measured figures imply. */
export function maxPeakVoltage(ix: SheetIndex, basis: "measured" | "rated" = "measured"): { vpk: number; from: Item } | undefined {
  let best: { vpk: number; from: Item } | undefined;
  const pick = basis === "measured" ? ix.measured.bind(ix) : ix.rated.bind(ix);
  for (const p of pick("output_power")) {
    if (!p.conditions.loadOhm) continue;
    const vpk = vpkFromPower(p.value, p.conditions.loadOhm);
    if (!best || vpk > best.vpk) best = { vpk, from: p };
  }
  for (const v of pick("output_voltage")) {
    const vpk = v.value * SQRT2;
    if (!best || vpk > best.vpk) best = { vpk, from: v };
  }
  return best;
}

export const peakWithinRails: Rule = {
  id: "peak-within-rails",
  title: "Peak output fits inside the supply rails",
  explanation:
    "A (non-bridged) output stage cannot swing its output beyond its supply rails, and in practice stops a few volts short. The peak voltage implied by the measured power (Vpk = √(2·P·R)) must fit inside the rails measured on the sheet.",
  source:
    "Textbook: output swing is bounded by the supply; Vpk = √(2·P·R) for a sine; 5 % allowance for rail sag and meter tolerance (common practice)",
  categories: AMPLIFIER_CATEGORIES,
  evaluate(ix, out) {
    const rails = ix.all("rail_voltage");
    if (!rails.length) return "No supply rail voltage on the sheet.";
    const peak = maxPeakVoltage(ix);
    if (!peak) return "No measured output power or voltage to compare with the rails.";
    const rail = rails.reduce((a, b) => (Math.abs(b.value) > Math.abs(a.value) ? b : a));
    const single = rail.conditions.supply === "single";
    const bridged = ix.sheet.bridged === true;
    const limit = (Math.abs(rail.value) / (single ? 2 : 1)) * (bridged ? 2 : 1);
    const ratio = peak.vpk / limit;
    const outcome = ratio <= 1 ? "consistent" : ratio <= 1.05 ? "questionable" : "implausible";
    const railText = `${single ? "a single" : "±"}${formatValue(Math.abs(rail.value), "voltage")}${single ? " rail" : " rails"}${bridged ? ", bridged" : ""}`;
    out.result({
      outcome,
      detail:
        outcome === "consistent"
          ? `${nameOf(peak.from)} needs ${formatValue(peak.vpk, "voltage")} peak; ${railText} allow up to ${formatValue(limit, "voltage")}.`
          : `${nameOf(peak.from)} needs ${formatValue(peak.vpk, "voltage")} peak, beyond the ${formatValue(limit, "voltage")} that ${railText} allow.`,
      refs: [peak.from.ref, rail.ref],
      compared: [
        fig("peak output voltage", peak.vpk, "voltage"),
        fig("rail voltage", Math.abs(rail.value), "voltage"),
        fig("largest possible peak swing", limit, "voltage"),
      ],
    });
    out.derive({
      id: "peak-output-voltage",
      label: "Highest peak output voltage",
      value: peak.vpk,
      kind: "voltage",
      refs: [peak.from.ref],
      display: formatValue(peak.vpk / SQRT2, "voltage", { form: "peak" }),
    });
  },
};

export const powerRatingConditions: Rule = {
  id: "power-rating-conditions",
  title: "A power figure states its conditions",
  explanation:
    "A watt figure means little without the load it drives, the frequency or frequency range, the distortion it was taken at and how many channels were driven together. Every power figure on the sheet, rated or measured, must state all four.",
  source:
    "US FTC amplifier rule, 16 CFR Part 432 (power per channel at a stated impedance, power band, maximum distortion, all channels driven)",
  categories: AMPLIFIER_CATEGORIES,
  evaluate(ix, out) {
    const ps = ix.all("output_power");
    if (!ps.length) return "No power figures.";
    for (const p of ps) {
      const c = p.conditions;
      const missing: string[] = [];
      if (c.loadOhm === undefined) missing.push("load");
      if (c.frequencyHz === undefined && !c.frequencyRange) missing.push("frequency or frequency range");
      if (!c.atDistortion) missing.push("distortion limit");
      if (!c.channelsDriven) missing.push("channels driven");
      out.result({
        outcome: missing.length ? "missing" : "consistent",
        detail: missing.length
          ? `${p.basis === "rated" ? "Rated" : "Measured"} ${nameOf(p)} does not state: ${missing.join(", ")}.`
          : `${p.basis === "rated" ? "Rated" : "Measured"} ${nameOf(p)} states load, frequency, distortion and channels driven.`,
        refs: [p.ref],
      });
    }
  },
};
