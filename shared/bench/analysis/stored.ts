// A capture's analysis read back from storage. The job wrote it from these types; reading it checks
// the kind and the parts pages draw from — enough to tell today's shape from an older one without
// restating every figure as a schema.
import { z } from "zod";
import type { SineAnalysis } from "./sine";
import type { SquareAnalysis } from "./square";
import type { SweepAnalysis } from "./sweep";
import type { ImpedanceAnalysis } from "./impedance";
import type { ImdAnalysis } from "./imd";
import type { SeparationAnalysis } from "./separation";
import type { OutputImpedanceAnalysis } from "./output-impedance";
import type { WowFlutterAnalysis } from "./wow-flutter";

export type AnyAnalysis =
  | SineAnalysis
  | SquareAnalysis
  | SweepAnalysis
  | ImpedanceAnalysis
  | SeparationAnalysis
  | ImdAnalysis
  | OutputImpedanceAnalysis
  | WowFlutterAnalysis;

const isRecord = (x: unknown): x is Record<string, unknown> => typeof x === "object" && x !== null && !Array.isArray(x);
const isFigure = (x: unknown) => isRecord(x) && typeof x.value === "number";

function isSineChannel(x: unknown): boolean {
  return (
    isRecord(x) &&
    isRecord(x.fundamental) &&
    isFigure(x.fundamental.frequency) &&
    Array.isArray(x.harmonics) &&
    isRecord(x.thd) &&
    isRecord(x.thdN)
  );
}

function fits(x: unknown): x is AnyAnalysis {
  if (!isRecord(x) || !isRecord(x.conditions)) return false;
  switch (x.kind) {
    case "sine":
      return Array.isArray(x.channels) && x.channels.every(isSineChannel) && Array.isArray(x.skipped);
    case "square":
      return [x.riseTime, x.overshoot, x.impliedBandwidth, x.amplitude].every(isFigure);
    case "sweep":
      return Array.isArray(x.points) && isRecord(x.worstDeviation) && isFigure(x.levelAt1kHz);
    case "impedance":
      return Array.isArray(x.points) && isRecord(x.minimum) && isFigure(x.minimum.ohms) && isFigure(x.minimum.frequency);
    case "separation":
      return Array.isArray(x.points) && x.points.every((p) => isRecord(p) && isFigure(p.frequency) && isFigure(p.separation));
    case "imd":
      return Array.isArray(x.channels) && x.channels.every((c) => isRecord(c) && isRecord(c.imd) && Array.isArray(c.products));
    case "output_impedance":
      return Array.isArray(x.channels) && x.channels.every((c) => isRecord(c) && isFigure(c.outputImpedance) && Array.isArray(c.levels));
    case "wow_flutter":
      return [x.meanFrequency, x.speedError, x.weightedPeak, x.weightedRms].every(isFigure) && Array.isArray(x.trace);
    default:
      return false;
  }
}

export const storedAnalysisSchema = z.custom<AnyAnalysis>(fits, { message: "not a capture analysis of today's shape" });
