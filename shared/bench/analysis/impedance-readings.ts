// An impedance sweep's analysis as bench-sheet readings (origin "capture"): the impedance minimum with
// where it falls and the range it was sought in, and the resonance frequency with its peak.
import type { Reading } from "../schema";
import type { ImpedanceAnalysis } from "./impedance";
import type { ImpedanceCaptureConditions } from "./conditions";

/** Four figures: more than an impedance bridge resolves, without float noise in the sheet. */
const sig = (x: number, n = 4) => Number(x.toPrecision(n));

export function impedanceToReadings(a: ImpedanceAnalysis, c: ImpedanceCaptureConditions, captureId: string): Reading[] {
  const base = { basis: "measured" as const, origin: "capture" as const, captureId, ...(c.channel ? { channel: c.channel } : {}) };
  const band = a.conditions.band;
  const drive = c.driveV !== undefined ? { voltageV: c.driveV } : {};
  const floor = a.rated ? `; 80 % of the rated ${sig(a.rated.rated.value, 3)} Ω is ${sig(a.rated.floor.value, 3)} Ω` : "";
  const out: Reading[] = [
    {
      ...base,
      quantity: "impedance_minimum",
      value: sig(a.minimum.ohms.value),
      unit: "Ω",
      conditions: {
        frequencyHz: sig(a.minimum.frequency.value),
        frequencyRange: { lowHz: sig(band.lowHz), highHz: sig(band.highHz) },
        ...drive,
      },
      note: `lowest modulus of ${a.conditions.pointsInBand} sweep points within ${sig(band.lowHz)}–${sig(band.highHz)} Hz${floor}`,
    },
  ];
  if (a.resonance) {
    out.push({
      ...base,
      quantity: "resonance_frequency",
      value: sig(a.resonance.frequency.value),
      unit: "Hz",
      conditions: { ...drive },
      note: `first impedance peak, ${sig(a.resonance.peak.value, 3)} Ω; read at the ${a.resonance.method}`,
    });
  }
  return out;
}
