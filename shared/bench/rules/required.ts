// The readings each category needs measured (not only rated) before a sheet can be bench-verified.
import { QUANTITY_INFO, type Category, type Quantity } from "../quantities";
import { categoryNoun, withArticle } from "../words";
import type { Rule } from "./types";

export type Requirement = {
  id: string;
  label: string;
  /** Any one of these quantities satisfies it. */
  anyOf: Quantity[];
  /** A sweep of this kind also satisfies it. */
  sweep?: "riaa" | "flat";
  /** A maker's figure is enough (e.g. a loudspeaker's rated impedance). */
  ratedIsEnough?: boolean;
};

const power: Requirement = { id: "output-power", label: "Output power into a stated load", anyOf: ["output_power"] };
const distortion: Requirement = { id: "distortion", label: "THD or THD+N", anyOf: ["thd", "thd_n"] };
const response: Requirement = {
  id: "frequency-response",
  label: "Frequency response (−3 dB point or deviation over a range)",
  anyOf: ["f3db_high", "response_deviation"],
  sweep: "flat",
};
const noise: Requirement = { id: "noise", label: "Signal-to-noise ratio or output noise", anyOf: ["snr", "noise"] };
const amp = [power, distortion, response, noise];

export const REQUIRED_READINGS: Record<Category, Requirement[]> = {
  integrated_amplifier: amp,
  power_amplifier: amp,
  receiver: amp,
  preamplifier: [{ id: "gain", label: "Gain or output voltage", anyOf: ["gain", "output_voltage"] }, distortion, response, noise],
  phono_stage: [
    { id: "gain", label: "Gain", anyOf: ["gain"] },
    { id: "riaa-sweep", label: "Response sweep against the RIAA curve", anyOf: [], sweep: "riaa" },
    noise,
  ],
  loudspeaker: [
    { id: "rated-impedance", label: "Rated impedance", anyOf: ["nominal_impedance"], ratedIsEnough: true },
    { id: "impedance-minimum", label: "Impedance minimum", anyOf: ["impedance_minimum"] },
    { id: "sensitivity", label: "Sensitivity", anyOf: ["sensitivity"] },
  ],
  turntable: [
    { id: "speed-error", label: "Speed error", anyOf: ["speed_error"] },
    { id: "wow-flutter", label: "Wow & flutter", anyOf: ["wow_flutter"] },
  ],
  tape_deck: [
    { id: "speed-error", label: "Speed error", anyOf: ["speed_error"] },
    { id: "wow-flutter", label: "Wow & flutter", anyOf: ["wow_flutter"] },
    response,
    noise,
  ],
};

export const requiredReadings: Rule = {
  id: "required-readings",
  title: "Required readings are measured",
  explanation:
    "Each kind of unit has a short list of readings a buyer needs to judge it. For the bench-verified mark each must be on the sheet as a measurement of this unit; the maker's figure alone does not count.",
  source: "Loadline bench requirements per category",
  evaluate(ix, out) {
    for (const req of REQUIRED_READINGS[ix.category]) {
      const measured = req.anyOf.flatMap((q) => (req.ratedIsEnough ? ix.all(q) : ix.measured(q)));
      const sweeps = req.sweep ? ix.sweeps.filter((s) => s.kind === req.sweep) : [];
      const rated = req.anyOf.flatMap((q) => ix.rated(q));
      const names = req.anyOf.map((q) => QUANTITY_INFO[q].label).join(" or ");
      if (measured.length || sweeps.length) {
        out.result({
          outcome: "consistent",
          detail: `${req.label}: ${req.ratedIsEnough ? "stated" : "measured"}.`,
          refs: [...measured, ...sweeps].map((m) => m.ref),
        });
      } else if (rated.length) {
        out.result({
          outcome: "missing",
          detail: `${req.label}: only the maker's figure is on the sheet; measure ${names || "it"} on this unit.`,
          refs: rated.map((r) => r.ref),
        });
      } else {
        const what = req.sweep === "riaa" ? "a response sweep of the phono stage" : names;
        out.result({
          outcome: "missing",
          detail: `${req.label}: ${withArticle(categoryNoun(ix.category))} sheet needs ${what}.`,
          refs: [],
        });
      }
    }
  },
};
