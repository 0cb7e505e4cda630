// Distortion and noise: THD+N ≥ THD, figures beyond what analysers resolve, and the conditions each figure needs.
import { AMPLIFIER_CATEGORIES, type Quantity } from "../quantities";
import { formatReadingValue } from "../describe";
import { channelsCompatible, conditionsCompatible, nameOf } from "./match";
import { fig, type Rule } from "./types";

export const thdnNotBelowThd: Rule = {
  id: "thdn-not-below-thd",
  title: "THD+N is not below THD",
  explanation:
    "THD+N is the harmonics plus everything else left once the test tone is notched out, so at the same level, frequency and load it can never read lower than THD alone.",
  source: "Definitions of THD and THD+N (IEC 60268-3; AES17); 10 % allowance for separate readings (common practice)",
  evaluate(ix, out) {
    const thds = ix.measured("thd");
    const thdns = ix.measured("thd_n");
    if (!thds.length || !thdns.length) return "Needs both a measured THD and a measured THD+N.";
    let pairs = 0;
    for (const t of thds) {
      const n = thdns.find(
        (n) =>
          channelsCompatible(n.channel, t.channel) &&
          conditionsCompatible(n.conditions, t.conditions, ["loadOhm", "frequencyHz", "powerW", "voltageV"]),
      );
      if (!n) continue;
      pairs++;
      const ratio = n.value / t.value;
      const outcome = ratio >= 1 ? "consistent" : ratio >= 0.9 ? "questionable" : "implausible";
      out.result({
        outcome,
        detail:
          outcome === "consistent"
            ? `THD+N ${formatReadingValue(n)} is at or above THD ${formatReadingValue(t)}.`
            : `THD+N ${formatReadingValue(n)} reads below THD ${formatReadingValue(t)} at the same conditions: one of them is mistyped or taken differently.`,
        refs: [t.ref, n.ref],
        compared: [fig("THD", t.value, "ratio"), fig("THD+N", n.value, "ratio")],
      });
    }
    if (!pairs) return "No THD and THD+N taken at the same conditions.";
  },
};

/** Best figures bench analysers resolve, with margin (common practice). */
export const RESOLUTION_LIMITS: { q: Quantity; below?: number; above?: number; why: string }[] = [
  { q: "thd", below: 10 ** (-130 / 20), why: "below −130 dB (0.00003 %), beyond what bench analysers resolve" },
  { q: "thd_n", below: 10 ** (-120 / 20), why: "below −120 dB (0.0001 %), beyond the residual of bench analysers" },
  { q: "imd", below: 10 ** (-120 / 20), why: "below −120 dB (0.0001 %), beyond what bench analysers resolve" },
  { q: "snr", above: 130, why: "above 130 dB, beyond the dynamic range of bench analysers and 24-bit interfaces" },
  { q: "wow_flutter", below: 1e-4, why: "below 0.01 %, beyond the residual of wow & flutter meters" },
];

export const analyserResolution: Rule = {
  id: "analyser-resolution",
  title: "Figures within what bench analysers resolve",
  explanation:
    "Distortion, noise and wow & flutter meters have a floor of their own. A figure better than that floor cannot have been measured and is likely a typing slip (a % read as dB, a missing zero) or a copy of a brochure figure.",
  source: "Common practice: residuals of current bench analysers (about −120 dB THD+N) and wow & flutter meters (about 0.01 %)",
  evaluate(ix, out) {
    let seen = 0;
    let fine = 0;
    const fineRefs: string[] = [];
    for (const lim of RESOLUTION_LIMITS)
      for (const r of ix.measured(lim.q)) {
        seen++;
        const beyond = (lim.below !== undefined && r.value < lim.below) || (lim.above !== undefined && r.value > lim.above);
        if (!beyond) {
          fine++;
          fineRefs.push(r.ref);
          continue;
        }
        const kind = lim.q === "snr" ? "decibel" : "ratio";
        out.result({
          outcome: "questionable",
          detail: `${nameOf(r)} is ${lim.why}.`,
          refs: [r.ref],
          compared: [
            fig("figure", r.value, kind),
            fig("analyser limit", (lim.below ?? lim.above)!, kind, kind === "ratio" ? { sig: 1 } : {}),
          ],
        });
      }
    if (!seen) return "No measured distortion, SNR or wow & flutter figures.";
    if (fine)
      out.result({
        outcome: "consistent",
        detail: `${fine} figure${fine > 1 ? "s are" : " is"} within what bench analysers resolve.`,
        refs: fineRefs,
      });
  },
};

export const distortionConditions: Rule = {
  id: "distortion-conditions",
  title: "A distortion figure states its conditions",
  explanation:
    "Distortion changes with level, frequency and load, and THD+N also with the measurement bandwidth (noise above 20 kHz counts if the bandwidth is wider). A measured distortion figure must say at what level and frequency it was taken, into what load for an amplifier, and over what bandwidth for THD+N.",
  source: "IEC 60268-3 (rated conditions for distortion); AES17 (20 kHz measurement bandwidth)",
  evaluate(ix, out) {
    const amp = AMPLIFIER_CATEGORIES.includes(ix.category);
    let seen = 0;
    for (const q of ["thd", "thd_n", "imd"] as const)
      for (const r of ix.measured(q)) {
        seen++;
        const c = r.conditions;
        const missing: string[] = [];
        if (c.powerW === undefined && c.voltageV === undefined) missing.push("output level (W or V)");
        if (q !== "imd" && c.frequencyHz === undefined) missing.push("test frequency");
        if (amp && c.loadOhm === undefined) missing.push("load");
        if (q === "thd_n" && !c.bandwidth) missing.push("measurement bandwidth");
        out.result({
          outcome: missing.length ? "missing" : "consistent",
          detail: missing.length ? `${nameOf(r)} does not state: ${missing.join(", ")}.` : `${nameOf(r)} states its conditions.`,
          refs: [r.ref],
        });
      }
    if (!seen) return "No measured distortion figures.";
  },
};

export const noiseConditions: Rule = {
  id: "noise-conditions",
  title: "A noise figure states its reference and weighting",
  explanation:
    "A signal-to-noise ratio depends on the level it is referred to (1 W, rated power, 0.5 V...) and on the weighting or bandwidth of the noise measurement: A-weighting alone can add 10 dB or more. Noise voltages and rumble need their weighting or bandwidth too.",
  source: "IEC 60268-3 (signal-to-noise ratio); IEC 61672-1 (A-weighting)",
  evaluate(ix, out) {
    let seen = 0;
    for (const q of ["snr", "noise", "rumble"] as const)
      for (const r of ix.measured(q)) {
        seen++;
        const c = r.conditions;
        const missing: string[] = [];
        if (q === "snr" && c.powerW === undefined && c.voltageV === undefined) missing.push("reference level (W or V)");
        if (!c.weighting && !(q !== "rumble" && c.bandwidth)) missing.push(q === "rumble" ? "weighting" : "weighting or bandwidth");
        out.result({
          outcome: missing.length ? "missing" : "consistent",
          detail: missing.length
            ? `${nameOf(r)} does not state: ${missing.join(", ")}.`
            : `${nameOf(r)} states its ${q === "snr" ? "reference and " : ""}weighting.`,
          refs: [r.ref],
        });
      }
    if (!seen) return "No measured noise figures.";
  },
};
