// A typed figure against the capture or sweep that should have produced it.
import { QUANTITY_INFO, type Quantity } from "../quantities";
import { formatReadingValue } from "../describe";
import { formatValue } from "../format";
import { ALL_KEYS, channelsCompatible, conditionsCompatible, nameOf } from "./match";
import { crossing, levelAt } from "./phono";
import { fig, type Item, type Outcome, type Rule } from "./types";

/** Agreement between a typed figure and the bench's own reading of the capture (common practice: meter and rounding). */
export const CAPTURE_TOLERANCE = {
  /** Distortion ratios: within 1 dB (×1.122); beyond ×2 implausible. */
  ratio: { consistent: 10 ** (1 / 20), questionable: 2 },
  /** Decibel figures: within 1 dB; beyond 3 dB implausible. */
  decibel: { consistent: 1, questionable: 3 },
  /** Everything linear (W, V, Hz, s, Ω): within 5 %; beyond 25 % implausible. */
  linear: { consistent: 0.05, questionable: 0.25 },
  /** A −3 dB point read off a sweep by interpolation: within 10 %; beyond 30 % implausible. */
  sweep: { consistent: 0.1, questionable: 0.3 },
};

function grade(off: number, t: { consistent: number; questionable: number }): Outcome {
  return off <= t.consistent + 1e-9 ? "consistent" : off <= t.questionable + 1e-9 ? "questionable" : "implausible";
}

/** How far apart, in the unit the tolerance is written in, and the outcome. */
function compare(q: Quantity, typed: number, captured: number): { outcome: Outcome; apart: string } {
  const kind = QUANTITY_INFO[q].kind;
  if (kind === "ratio") {
    const f = Math.max(typed, captured) / Math.min(typed, captured);
    return { outcome: grade(f, CAPTURE_TOLERANCE.ratio), apart: `${formatValue(20 * Math.log10(f), "decibel", { sig: 2 })} apart` };
  }
  if (kind === "decibel") {
    const d = Math.abs(typed - captured);
    return { outcome: grade(d, CAPTURE_TOLERANCE.decibel), apart: `${formatValue(d, "decibel", { sig: 2 })} apart` };
  }
  const off = Math.abs(typed - captured) / Math.max(Math.abs(typed), Math.abs(captured));
  return { outcome: grade(off, CAPTURE_TOLERANCE.linear), apart: `${(off * 100).toFixed(1)} % apart` };
}

/** A capture states its level, load and frequency; a typed figure it is held against must state the same, not merely leave them out. */
function sameSetup(t: Item, c: Item): boolean {
  if (!channelsCompatible(t.channel, c.channel) || !conditionsCompatible(t.conditions, c.conditions, ALL_KEYS)) return false;
  const tc = t.conditions;
  const cc = c.conditions;
  const level = (x: typeof tc) => x.powerW !== undefined || x.voltageV !== undefined;
  if (level(cc) && !level(tc)) return false;
  if (cc.loadOhm !== undefined && tc.loadOhm === undefined) return false;
  return cc.frequencyHz === undefined || tc.frequencyHz !== undefined;
}

export const typedVsCapture: Rule = {
  id: "typed-vs-capture",
  title: "Typed figures agree with the captures",
  explanation:
    "Where the bench has read a figure from a capture, a figure typed for the same quantity under the same conditions must agree with it, and a −3 dB point typed next to a response sweep must be where the sweep crosses −3 dB. A typed figure far from the bench's own reading is a slip or wishful thinking.",
  source:
    "The capture as the record of the measurement; within 1 dB (distortion, dB figures), 5 % (linear figures), 10 % (−3 dB points from a sweep) consistent (common practice)",
  evaluate(ix, out) {
    const captured = ix.items.filter((r) => r.origin === "capture" && r.basis === "measured");
    const typed = ix.items.filter((r) => r.origin !== "capture" && r.basis === "measured");
    let pairs = 0;
    for (const t of typed) {
      const c = captured.find((c) => c.quantity === t.quantity && sameSetup(t, c));
      if (!c) continue;
      pairs++;
      const { outcome, apart } = compare(t.quantity, t.value, c.value);
      out.result({
        outcome,
        detail: `Typed ${nameOf(t)} against ${formatReadingValue(c)} read from the capture (${apart}).`,
        refs: [t.ref, c.ref],
        compared: [fig("typed", t.value, QUANTITY_INFO[t.quantity].kind), fig("from the capture", c.value, QUANTITY_INFO[t.quantity].kind)],
      });
    }
    for (const t of typed) {
      if (t.quantity !== "f3db_high" && t.quantity !== "f3db_low") continue;
      for (const s of ix.sweeps) {
        if (s.kind !== "flat" || !channelsCompatible(s.channel, t.channel)) continue;
        const ref = levelAt(s.points, 1000);
        if (ref === undefined) continue;
        const f = crossing(s.points, ref - 3, t.quantity === "f3db_high" ? "up" : "down");
        if (f === undefined) continue;
        pairs++;
        const off = Math.abs(t.value - f) / Math.max(t.value, f);
        out.result({
          outcome: grade(off, CAPTURE_TOLERANCE.sweep),
          detail: `Typed ${nameOf(t)} against ${formatValue(f, "frequency")} where the ${s.origin === "capture" ? "captured " : ""}sweep crosses −3 dB (${(off * 100).toFixed(1)} % apart).`,
          refs: [t.ref, s.ref],
          compared: [fig("typed", t.value, "frequency"), fig("from the sweep", f, "frequency")],
        });
      }
    }
    if (!pairs) return "No typed figure next to a capture or sweep of the same quantity and conditions.";
  },
};
