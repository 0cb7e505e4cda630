// A loudspeaker's impedance sweep (CSV frequency, ohms and optionally phase) to its analysis and readings.
import {
  analyseImpedance,
  impedanceToReadings,
  parseColumnsCsv,
  IMPEDANCE_COLUMNS,
  type ImpedanceCaptureConditions,
} from "@shared/bench/analysis";
import type { CaptureAnalysis } from "./captures.server";

export function analyseImpedanceCsv(bytes: Uint8Array, c: ImpedanceCaptureConditions, captureId: string): CaptureAnalysis {
  const { values, header } = parseColumnsCsv(new TextDecoder("utf-8").decode(bytes), IMPEDANCE_COLUMNS);
  const [f, z, phase] = values;
  const analysis = analyseImpedance(f!, z!, phase, { ratedOhm: c.ratedOhm, band: c.band });
  return {
    kind: "impedance",
    analysis,
    readings: impedanceToReadings(analysis, c, captureId),
    format: { file: "csv", rows: f!.length, header: header ? [header[0] ?? "", header[1] ?? ""] : null },
  };
}
