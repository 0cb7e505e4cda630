// Loudspeakers: impedance minimum against the rating, and a sensitivity with its reference.
import { formatReadingValue } from "../describe";
import { formatValue } from "../format";
import { near } from "./match";
import { fig, type Item, type Rule, type SheetIndex } from "./types";

/** IEC 60268-5:2003 §16.1: the impedance modulus in the rated range stays at or above 80 % of the rated impedance. */
export const IMPEDANCE_FLOOR = 0.8;
/** 2.83 V = √8 V: 1 W into 8 Ω. */
export const SENSITIVITY_VOLTS = Math.sqrt(8);

function ratedImpedance(ix: SheetIndex): Item | undefined {
  const all = ix.all("nominal_impedance");
  return all.find((r) => r.basis === "rated") ?? all[0];
}

export const speakerImpedanceMinimum: Rule = {
  id: "speaker-impedance-minimum",
  title: "Impedance minimum within 80 % of the rating",
  explanation:
    "A loudspeaker's rated impedance is a promise to the amplifier: across the rated frequency range the impedance should not dip below 80 % of it (6.4 Ω for an 8 Ω speaker, 3.2 Ω for 4 Ω). A deeper dip makes it a harder load than the rating says.",
  source: "IEC 60268-5:2003 §16.1 (rated impedance: the lowest modulus within the rated frequency range not below 80 % of it)",
  categories: ["loudspeaker"],
  evaluate(ix, out) {
    const mins = ix.measured("impedance_minimum");
    if (!mins.length) return "No measured impedance minimum.";
    const nominal = ratedImpedance(ix);
    if (!nominal) {
      out.result({
        outcome: "missing",
        detail: "The sheet has an impedance minimum but no rated impedance to hold it against.",
        refs: mins.map((m) => m.ref),
      });
      return;
    }
    for (const m of mins) {
      const floor = nominal.value * IMPEDANCE_FLOOR;
      const ok = m.value >= floor - 1e-9;
      const range = m.conditions.frequencyRange;
      const at =
        (m.conditions.frequencyHz ? ` at ${formatValue(m.conditions.frequencyHz, "frequency")}` : "") +
        (range ? ` (within ${formatValue(range.lowHz, "frequency")}–${formatValue(range.highHz, "frequency")})` : "");
      out.result({
        outcome: ok ? "consistent" : "questionable",
        detail: ok
          ? `Minimum ${formatReadingValue(m)}${at} stays above ${formatValue(floor, "resistance")}, 80 % of the rated ${formatReadingValue(nominal)}.`
          : `Minimum ${formatReadingValue(m)}${at} dips below ${formatValue(floor, "resistance")}, 80 % of the rated ${formatReadingValue(nominal)}: treat it as a ${formatValue(m.value / IMPEDANCE_FLOOR, "resistance")} load.`,
        refs: [m.ref, nominal.ref],
        compared: [
          fig("impedance minimum", m.value, "resistance"),
          fig("rated impedance", nominal.value, "resistance"),
          fig("80 % floor", floor, "resistance"),
        ],
      });
    }
  },
};

type Ref = "2.83V" | "1W" | "other" | undefined;

function referenceOf(r: Item): Ref {
  const c = r.conditions;
  const unit = r.unit.replace(/\s+/g, "");
  if (/2\.83V/i.test(unit) || (c.voltageV !== undefined && near(c.voltageV, SENSITIVITY_VOLTS, 0.01))) return "2.83V";
  if (/\/1?W|@1?W/i.test(unit) || (c.powerW !== undefined && near(c.powerW, 1, 0.02))) return "1W";
  if (c.voltageV !== undefined || c.powerW !== undefined) return "other";
  return undefined;
}

function distanceOf(r: Item): number | undefined {
  if (r.conditions.distanceM !== undefined) return r.conditions.distanceM;
  return /\/1?m$/i.test(r.unit.replace(/\s+/g, "")) ? 1 : undefined;
}

export const speakerSensitivity: Rule = {
  id: "speaker-sensitivity-reference",
  title: "Sensitivity at 2.83 V or 1 W, at 1 m",
  explanation:
    "Sensitivity is the sound pressure level at 1 m for a stated drive: 2.83 V (1 W into 8 Ω) or 1 W into the rated impedance. The two differ for speakers that are not 8 Ω (2.83 V is 2 W into 4 Ω, +3 dB), so the reference must be stated.",
  source: "IEC 60268-5 (characteristic sensitivity, 1 W at 1 m, from memory); 2.83 V = √8 V = 1 W into 8 Ω (computed)",
  categories: ["loudspeaker"],
  evaluate(ix, out) {
    const sens = ix.measured("sensitivity");
    if (!sens.length) return "No measured sensitivity.";
    const nominal = ratedImpedance(ix);
    const byRef = new Map<Ref, Item>();
    for (const s of sens) {
      const ref = referenceOf(s);
      const dist = distanceOf(s);
      if (!ref || dist === undefined) {
        out.result({
          outcome: "missing",
          detail: `Sensitivity ${formatReadingValue(s)} does not state ${!ref ? "its drive (2.83 V or 1 W)" : ""}${!ref && dist === undefined ? " and " : ""}${dist === undefined ? "its distance (1 m)" : ""}.`,
          refs: [s.ref],
        });
        continue;
      }
      if (ref === "other" || !near(dist, 1, 0.01)) {
        out.result({
          outcome: "questionable",
          detail: `Sensitivity ${formatReadingValue(s)} is referred to another drive or distance; state it at 2.83 V or 1 W, at 1 m, so buyers can compare.`,
          refs: [s.ref],
        });
        continue;
      }
      if (!byRef.has(ref)) byRef.set(ref, s);
      out.result({
        outcome: "consistent",
        detail: `Sensitivity ${formatReadingValue(s)} at ${ref === "2.83V" ? "2.83 V" : "1 W"}, 1 m.`,
        refs: [s.ref],
      });
      if (ref === "2.83V" && nominal)
        out.derive({
          id: `sensitivity-per-watt:${s.ref}`,
          label: `Sensitivity per 1 W into the rated ${formatReadingValue(nominal)}`,
          value: s.value - 10 * Math.log10(8 / nominal.value),
          kind: "decibel",
          refs: [s.ref, nominal.ref],
        });
    }
    const v = byRef.get("2.83V");
    const w = byRef.get("1W");
    if (v && w && nominal) {
      const expected = 10 * Math.log10(8 / nominal.value);
      const diff = v.value - w.value;
      const ok = Math.abs(diff - expected) <= 0.5;
      out.result({
        outcome: ok ? "consistent" : "questionable",
        detail: `At ${formatReadingValue(nominal)}, the 2.83 V figure should exceed the 1 W figure by ${formatValue(expected, "decibel")}; the sheet shows ${formatValue(diff, "decibel")}.`,
        refs: [v.ref, w.ref, nominal.ref],
        compared: [
          fig("at 2.83 V", v.value, "decibel"),
          fig("at 1 W", w.value, "decibel"),
          fig("expected difference 10·log10(8/Z)", expected, "decibel"),
        ],
      });
    }
  },
};
