// Level cross-checks: SNR against the output noise and its reference level; gain against the input
// sensitivity and the output it drives. Each is a decibel identity, so the tolerances are in dB.
import { AMPLIFIER_CATEGORIES, STEREO_ELECTRONICS } from "../quantities";
import { formatReadingValue } from "../describe";
import { formatValue } from "../format";
import { withArticle } from "../words";
import type { Outcome } from "./types";
import { channelsCompatible, nameOf } from "./match";
import { fig, type Item, type Rule, type SheetIndex } from "./types";

/** Two figures of one decibel identity agree within 1 dB (meters, rounding); beyond 3 dB one is wrong (common practice). */
export const LEVEL_CONSISTENT_DB = 1;
export const LEVEL_QUESTIONABLE_DB = 3;

export function levelOutcome(diffDb: number): Outcome {
  const d = Math.abs(diffDb);
  return d <= LEVEL_CONSISTENT_DB + 1e-9 ? "consistent" : d <= LEVEL_QUESTIONABLE_DB + 1e-9 ? "questionable" : "implausible";
}

const db = (x: number) => formatValue(x, "decibel", { sig: 3 });

/** The output voltage a reading's level stands for: voltageV, or √(P·R) for a power into its load. */
export function levelVolts(r: Item, fallbackLoad?: number): number | undefined {
  const c = r.conditions;
  if (c.voltageV !== undefined) return c.voltageV;
  const load = c.loadOhm ?? fallbackLoad;
  if (c.powerW !== undefined && load !== undefined) return Math.sqrt(c.powerW * load);
  return undefined;
}

function sameWeighting(a: Item, b: Item): boolean {
  const wa = a.conditions.weighting;
  const wb = b.conditions.weighting;
  if (wa && wb) return wa === wb;
  const ba = a.conditions.bandwidth;
  const bb = b.conditions.bandwidth;
  if (ba && bb) return Math.abs(ba.highHz / bb.highHz - 1) <= 0.05;
  return true;
}

function measuredGain(ix: SheetIndex, ch: Item["channel"]): Item | undefined {
  return ix.measured("gain").find((g) => channelsCompatible(g.channel, ch));
}

export const snrNoiseReference: Rule = {
  id: "snr-noise-reference",
  title: "Signal-to-noise ratio, noise and reference level agree",
  explanation:
    "A signal-to-noise ratio is the reference level over the noise, in decibels: SNR = 20·log10(V_ref / V_noise). With the SNR, its reference (a voltage, or a power into a load) and the output noise measured the same way on one sheet, the three must agree within about a decibel.",
  source:
    "Definition of signal-to-noise ratio (IEC 60268-3): SNR = 20·log10(V_ref/V_noise); within 1 dB consistent, beyond 3 dB implausible (common practice)",
  categories: STEREO_ELECTRONICS,
  evaluate(ix, out) {
    const snrs = ix.measured("snr");
    const noises = ix.measured("noise");
    if (!snrs.length || !noises.length) return "Needs both a measured SNR and a measured output noise.";
    let pairs = 0;
    for (const s of snrs) {
      const n = noises.find((n) => channelsCompatible(n.channel, s.channel) && sameWeighting(n, s));
      if (!n) continue;
      const vref = levelVolts(s, n.conditions.loadOhm);
      if (vref === undefined) continue;
      pairs++;
      // A phono stage or preamplifier may quote its SNR re an input level: then the output reference is gain × input.
      const g = AMPLIFIER_CATEGORIES.includes(ix.category) || s.conditions.voltageV === undefined ? undefined : measuredGain(ix, s.channel);
      const refs = [vref, ...(g ? [vref * 10 ** (g.value / 20)] : [])];
      const implied = refs.map((v) => 20 * Math.log10(v / n.value));
      const best = implied.reduce((a, b) => (Math.abs(b - s.value) < Math.abs(a - s.value) ? b : a));
      const viaInput = g !== undefined && best === implied[1];
      const diff = s.value - best;
      out.result({
        outcome: levelOutcome(diff),
        detail: `${nameOf(n)} against ${withArticle(formatValue(viaInput ? refs[1] : vref, "voltage"))} reference${viaInput ? ` (the ${formatValue(vref, "voltage")} input times the ${formatReadingValue(g)} gain)` : ""} gives ${db(best)}; the sheet says ${formatReadingValue(s)} (${db(Math.abs(diff))} apart).`,
        refs: [s.ref, n.ref, ...(viaInput ? [g.ref] : [])],
        compared: [
          fig("SNR on the sheet", s.value, "decibel"),
          fig("reference level", viaInput ? refs[1] : vref, "voltage"),
          fig("output noise", n.value, "voltage"),
          fig("SNR from noise and reference", best, "decibel"),
        ],
      });
    }
    if (!pairs) return "No SNR with a stated reference level next to an output noise measured the same way.";
  },
};

export const gainSensitivityOutput: Rule = {
  id: "gain-sensitivity-output",
  title: "Gain, input sensitivity and output level agree",
  explanation:
    "Input sensitivity is the input that drives the unit to its rated output; gain is output over input. So the output is the sensitivity raised by the gain: V_out = V_in·10^(G/20), and for a power into a load V_out = √(P·R). A gain, a sensitivity and an output on one sheet must tell the same story.",
  source:
    "Definitions of gain and input sensitivity (IEC 60268-3); V_out = V_in·10^(G/20), P = V²/R; within 1 dB consistent, beyond 3 dB implausible (common practice)",
  categories: STEREO_ELECTRONICS,
  evaluate(ix, out) {
    const sens = ix.all("input_sensitivity");
    const gains = ix.all("gain");
    if (!sens.length || !gains.length) return "Needs both a gain and an input sensitivity.";
    let pairs = 0;
    for (const s of sens) {
      // Like with like: a measured sensitivity with a measured gain, the maker's with the maker's.
      const g = gains.find((g) => g.basis === s.basis && channelsCompatible(g.channel, s.channel));
      if (!g) continue;
      const output = outputFor(ix, s);
      if (!output) continue;
      pairs++;
      const predicted = s.value * 10 ** (g.value / 20);
      const diff = 20 * Math.log10(predicted / output.volts);
      out.result({
        outcome: levelOutcome(diff),
        detail: `${nameOf(s)} raised by ${formatReadingValue(g)} gives ${formatValue(predicted, "voltage")}; ${output.what} is ${formatValue(output.volts, "voltage")} (${db(Math.abs(diff))} apart).`,
        refs: [s.ref, g.ref, ...output.refs],
        compared: [
          fig("input sensitivity", s.value, "voltage"),
          fig("gain", g.value, "decibel"),
          fig("output from sensitivity and gain", predicted, "voltage"),
          fig("output on the sheet", output.volts, "voltage"),
        ],
      });
    }
    if (!pairs) return "No gain and input sensitivity of the same basis with the output level they drive.";
  },
};

/** The output level a sensitivity is quoted for: its own conditions, else the rated power into its load. */
function outputFor(ix: SheetIndex, s: Item): { volts: number; what: string; refs: string[] } | undefined {
  const own = levelVolts(s);
  if (own !== undefined)
    return {
      volts: own,
      what: `the output it is quoted for (${s.conditions.voltageV !== undefined ? "voltage" : "power into the load"})`,
      refs: [],
    };
  const p = ix.rated("output_power").find((p) => p.conditions.loadOhm !== undefined && channelsCompatible(p.channel, s.channel));
  if (p)
    return {
      volts: Math.sqrt(p.value * p.conditions.loadOhm!),
      what: `the rated ${formatReadingValue(p)} into ${formatValue(p.conditions.loadOhm!, "resistance")}`,
      refs: [p.ref],
    };
  const v = ix.rated("output_voltage").find((v) => channelsCompatible(v.channel, s.channel));
  if (v) return { volts: v.value, what: `the rated output ${formatReadingValue(v)}`, refs: [v.ref] };
  return undefined;
}
