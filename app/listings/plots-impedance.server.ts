import { formatValue } from "@shared/bench";
import { IMPEDANCE_RATED_FLOOR, type ImpedanceAnalysis } from "@shared/bench/analysis";
import type { Capture } from "~/models/capture.server";
import type { ImpedancePlot } from "./types";

// Plot data for a loudspeaker's impedance sweep: the modulus (and phase, when measured) against log
// frequency, from the capture's stored analysis, with the 80 % floor of the rated impedance. One
// function per capture so the seller's editor can draw the same plot while editing.

const MAX_PLOTS = 3;
/** A few hundred points draw the curve as finely as the plot's width can show. */
const MAX_POINTS = 400;
const CHANNEL_WORDS: Record<string, string> = { left: "left", right: "right", mono: "mono", both: "both" };

function thin<T>(points: T[]): T[] {
  if (points.length <= MAX_POINTS) return points;
  const step = (points.length - 1) / (MAX_POINTS - 1);
  return Array.from({ length: MAX_POINTS }, (_, i) => points[Math.round(i * step)]);
}

/** The plot of one analysed impedance capture; `ratedOhm` from the sheet when the capture did not state one. */
export function impedancePlot(capture: Capture, ratedOhm?: number, index = 0): ImpedancePlot | null {
  const a: ImpedanceAnalysis | null = capture.analysis?.kind === "impedance" ? capture.analysis : null;
  if (!a || a.points.length < 2) return null;
  const rated = a.conditions.ratedOhm ?? ratedOhm ?? null;
  const c = capture.conditions?.kind === "impedance" ? capture.conditions : null;
  const band = a.conditions.band;
  const conditions = [
    `${a.points.length} points, ${formatValue(a.conditions.sweepRange.lowHz, "frequency")}–${formatValue(a.conditions.sweepRange.highHz, "frequency")}`,
    c?.driveV ? `at ${formatValue(c.driveV, "voltage")}` : null,
    c?.channel ? `${CHANNEL_WORDS[c.channel]} speaker` : null,
    a.conditions.hasPhase ? "modulus and phase" : "modulus only",
    "from a capture",
  ];
  const figures = [
    {
      label: `Minimum within ${formatValue(band.lowHz, "frequency")}–${formatValue(band.highHz, "frequency")}`,
      display: `${formatValue(a.minimum.ohms.value, "resistance")} at ${formatValue(a.minimum.frequency.value, "frequency")}`,
    },
  ];
  if (a.resonance)
    figures.push({
      label: "Resonance (first impedance peak)",
      display: `${formatValue(a.resonance.frequency.value, "frequency")}, ${formatValue(a.resonance.peak.value, "resistance")}`,
    });
  if (rated !== null)
    figures.push({ label: "80 % of the rated impedance", display: formatValue(rated * IMPEDANCE_RATED_FLOOR, "resistance") });
  return {
    id: `impedance-${index}`,
    title: "Impedance against frequency",
    conditions: conditions.filter(Boolean).join(", "),
    points: thin(a.points).map((p) => ({
      f: Number(p.frequency.toPrecision(5)),
      ohms: Number(p.ohms.toPrecision(4)),
      ...(p.phaseDeg !== undefined ? { phase: Math.round(p.phaseDeg * 10) / 10 } : {}),
    })),
    floorOhm: rated !== null ? rated * IMPEDANCE_RATED_FLOOR : null,
    figures,
  };
}

export function impedancePlots(captures: Capture[], ratedOhm?: number): ImpedancePlot[] {
  const out: ImpedancePlot[] = [];
  for (const c of captures) {
    const plot = impedancePlot(c, ratedOhm, out.length);
    if (plot) out.push(plot);
    if (out.length >= MAX_PLOTS) break;
  }
  return out;
}
