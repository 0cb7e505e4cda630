// A capture's analysis read back from storage. The job wrote it from these types; reading it checks
// the kind and the parts pages draw from — enough to tell today's shape from an older one without
// restating every figure as a schema.
import { z } from "zod";
import type { SineAnalysis } from "./sine";
import type { SquareAnalysis } from "./square";
import type { SweepAnalysis } from "./sweep";
import type { ImpedanceAnalysis } from "./impedance";

export type AnyAnalysis = SineAnalysis | SquareAnalysis | SweepAnalysis | ImpedanceAnalysis;

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
    default:
      return false;
  }
}

export const storedAnalysisSchema = z.custom<AnyAnalysis>(fits, { message: "not a capture analysis of today's shape" });
