import { describe, expect, it } from "vitest";
import { readConditions } from "~/bench/capture-form.server";
import { captureConditionsSchema, storedAnalysisSchema } from "@shared/bench/analysis";

// The capture form's plain fields for the separation, intermodulation and output-impedance kinds, as
// the seller's browser and curl send them.

const form = (fields: Record<string, string>) => {
  const f = new FormData();
  for (const [k, v] of Object.entries(fields)) f.append(k, v);
  return f;
};

describe("plain form fields for the new capture kinds", () => {
  it("separation: the test tones as a list, fields of other kinds left out", () => {
    const r = readConditions(
      form({ kind: "separation", driven: "left", frequenciesHz: "100, 1000 10000", loadOhm: "8", channel: "left", method: "smpte" }),
      null,
    );
    expect(r).toEqual({ ok: true, conditions: { kind: "separation", driven: "left", frequenciesHz: [100, 1000, 10_000], loadOhm: 8 } });
  });

  it("separation: a test tone that is not a number is named by the form's label", () => {
    const r = readConditions(form({ kind: "separation", frequenciesHz: "1000, one" }), null);
    expect(r.ok).toBe(false);
    if (!r.ok) expect(r.message).toMatch(/^The stated conditions do not fit\. frequenciesHz\.1/);
  });

  it("imd: the method is required and named", () => {
    expect(readConditions(form({ kind: "imd", method: "dfd", loadOhm: "4" }), null)).toEqual({
      ok: true,
      conditions: { kind: "imd", method: "dfd", loadOhm: 4 },
    });
    const r = readConditions(form({ kind: "imd" }), null);
    expect(r.ok).toBe(false);
    if (!r.ok) expect(r.issues.map((i) => i.path)).toEqual(["method"]);
  });

  it("imd: a low tone above the high tone is refused", () => {
    const r = captureConditionsSchema.safeParse({ kind: "imd", method: "smpte", lowToneHz: 8000, highToneHz: 60 });
    expect(r.success).toBe(false);
  });

  it("output_impedance: the load is required, the damping factor's load optional", () => {
    expect(readConditions(form({ kind: "output_impedance", loadOhm: "8", nominalLoadOhm: "8", frequencyHz: "1000" }), null)).toEqual({
      ok: true,
      conditions: { kind: "output_impedance", loadOhm: 8, nominalLoadOhm: 8, frequencyHz: 1000 },
    });
    const r = readConditions(form({ kind: "output_impedance" }), null);
    expect(r.ok).toBe(false);
    if (!r.ok) expect(r.message).toMatch(/Load: type the load the second reading was taken into/);
  });

  it("a stored analysis of each new kind reads back; a broken one does not", () => {
    const fig = (value: number, unit: string) => ({ value, unit });
    expect(
      storedAnalysisSchema.safeParse({
        kind: "separation",
        conditions: {},
        points: [{ frequency: fig(1000, "Hz"), separation: fig(70, "dB") }],
      }).success,
    ).toBe(true);
    expect(storedAnalysisSchema.safeParse({ kind: "separation", conditions: {}, points: [{ frequency: 1000 }] }).success).toBe(false);
    expect(
      storedAnalysisSchema.safeParse({ kind: "imd", conditions: {}, channels: [{ imd: { ratio: 0.001 }, products: [] }] }).success,
    ).toBe(true);
    expect(
      storedAnalysisSchema.safeParse({
        kind: "output_impedance",
        conditions: {},
        channels: [{ outputImpedance: fig(0.1, "Ω"), levels: [] }],
      }).success,
    ).toBe(true);
    expect(storedAnalysisSchema.safeParse({ kind: "output_impedance", conditions: {}, channels: [{ levels: [] }] }).success).toBe(false);
  });
});
