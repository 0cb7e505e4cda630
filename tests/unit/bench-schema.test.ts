import { describe, expect, it } from "vitest";
import {
  CATEGORIES,
  categorySheetSchemas,
  exampleIntegratedAmplifierRequest,
  exampleIntegratedAmplifierSheet,
  parseBenchSheet,
} from "@shared/bench";

function issuesOf(input: unknown) {
  const r = parseBenchSheet(input);
  if (r.ok) throw new Error("expected the sheet to be refused");
  return r.issues;
}

const base = () => JSON.parse(JSON.stringify(exampleIntegratedAmplifierRequest()));

describe("bench sheet schema", () => {
  it("accepts the example as a client sends it and fills the defaults", () => {
    const r = parseBenchSheet(base());
    expect(r.ok).toBe(true);
    if (!r.ok) return;
    expect(r.sheet.sweeps).toEqual([]);
    expect(r.sheet.readings.every((x) => x.origin === "typed" || x.origin === "capture")).toBe(true);
    expect(r.sheet.readings.every((x) => typeof x.conditions === "object")).toBe(true);
    // Rated and measured stay apart.
    expect(r.sheet.readings.filter((x) => x.basis === "rated").map((x) => x.quantity)).toEqual(["output_power", "output_power", "thd"]);
  });

  it("has a schema for every category", () => {
    expect(Object.keys(categorySheetSchemas).sort()).toEqual([...CATEGORIES].sort());
  });

  it("names the path of a wrong value", () => {
    const s = base();
    s.readings[0].value = "sixty";
    expect(issuesOf(s)).toContainEqual(expect.objectContaining({ path: "readings.0.value" }));
  });

  it("refuses a unit that does not fit the quantity", () => {
    const s = base();
    s.readings[3].unit = "Ω"; // an output power in ohms
    const issues = issuesOf(s);
    expect(issues).toContainEqual({ path: "readings.3.unit", message: expect.stringMatching(/Output power/) });
  });

  it("refuses a quantity the category does not have", () => {
    const s = base();
    s.readings.push({ quantity: "wow_flutter", value: 0.001, unit: "%", basis: "measured" });
    expect(issuesOf(s)).toContainEqual(expect.objectContaining({ path: `readings.${s.readings.length - 1}.quantity` }));
  });

  it("refuses an unknown category with the allowed ones", () => {
    const issues = issuesOf({ category: "toaster", readings: [] });
    expect(issues[0].path).toBe("category");
    expect(issues[0].message).toMatch(/integrated_amplifier/);
  });

  it("refuses misspelt condition names instead of ignoring them", () => {
    const s = base();
    s.readings[3].conditions.load = 8;
    expect(issuesOf(s)).toContainEqual(expect.objectContaining({ path: "readings.3.conditions" }));
  });

  it("refuses a rated figure said to come from a capture, and a captureId on a typed figure", () => {
    const s = base();
    s.readings[0].origin = "capture";
    s.readings[4].captureId = "cap_x";
    const paths = issuesOf(s).map((i) => i.path);
    expect(paths).toContain("readings.0.basis");
    expect(paths).toContain("readings.4.captureId");
  });

  it("refuses negative power and a zero load", () => {
    const s = base();
    s.readings[3].value = -66;
    s.readings[4].conditions.loadOhm = 0;
    const paths = issuesOf(s).map((i) => i.path);
    expect(paths).toContain("readings.3.value");
    expect(paths).toContain("readings.4.conditions.loadOhm");
  });

  it("allows a signed speed error but not a negative THD", () => {
    const tt = {
      category: "turntable",
      readings: [{ quantity: "speed_error", value: -0.002, unit: "%", basis: "measured", conditions: { speedRpm: 33.33 } }],
    };
    expect(parseBenchSheet(tt).ok).toBe(true);
    const s = base();
    s.readings[9].value = -0.0001;
    expect(issuesOf(s).map((i) => i.path)).toContain("readings.9.value");
  });

  it("wants sweep frequencies rising and RIAA sweeps only where there is a phono input", () => {
    const points = [
      { frequencyHz: 100, levelDb: 0 },
      { frequencyHz: 50, levelDb: 0 },
      { frequencyHz: 1000, levelDb: 0 },
    ];
    const amp = { ...base(), sweeps: [{ kind: "flat", points }] };
    expect(issuesOf(amp).map((i) => i.path)).toContain("sweeps.0.points.1.frequencyHz");
    const speaker = {
      category: "loudspeaker",
      readings: [],
      sweeps: [
        {
          kind: "riaa",
          points: [
            { frequencyHz: 20, levelDb: 0 },
            { frequencyHz: 1000, levelDb: 0 },
            { frequencyHz: 20000, levelDb: 0 },
          ],
        },
      ],
    };
    expect(issuesOf(speaker).map((i) => i.path)).toContain("sweeps.0.kind");
  });

  it("round-trips the example sheet through JSON", () => {
    const s = exampleIntegratedAmplifierSheet();
    const r = parseBenchSheet(JSON.parse(JSON.stringify(s)));
    expect(r.ok && r.sheet).toEqual(s);
  });
});
