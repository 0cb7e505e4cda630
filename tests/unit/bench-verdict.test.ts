import { describe, expect, it } from "vitest";
import {
  CATEGORIES,
  OUTCOMES,
  REQUIRED_READINGS,
  RULES,
  checkBenchSheet,
  doctoredIntegratedAmplifierSheet,
  exampleIntegratedAmplifierSheet,
  keyFigures,
  sheetFilterFacets,
} from "@shared/bench";
import { full8, measured, rated, riaaSweep, sheet } from "./bench-fixtures";

describe("checkBenchSheet", () => {
  it("marks the example integrated amplifier bench-verified", () => {
    const v = checkBenchSheet(exampleIntegratedAmplifierSheet());
    expect(v.benchVerified).toBe(true);
    expect(v.counts).toMatchObject({ questionable: 0, implausible: 0, missing: 0 });
    expect(v.summary).toMatch(/^Bench-verified integrated amplifier/);
  });

  it("refuses the doctored sheet (4 Ω power three times the 8 Ω power) and says why", () => {
    const v = checkBenchSheet(doctoredIntegratedAmplifierSheet());
    expect(v.benchVerified).toBe(false);
    expect(v.results.filter((r) => r.outcome === "implausible").map((r) => r.ruleId)).toEqual(["half-load-power", "half-load-power"]);
    expect(v.summary).toMatch(/^Not bench-verified: 2 implausible/);
    expect(v.summary).toMatch(/3\.00×/);
  });

  it("gives every result its rule's explanation, source and the numbers compared with units", () => {
    const v = checkBenchSheet(exampleIntegratedAmplifierSheet());
    const byId = new Map(RULES.map((r) => [r.id, r]));
    for (const r of v.results) {
      expect(OUTCOMES).toContain(r.outcome);
      expect(r.explanation).toBe(byId.get(r.ruleId)!.explanation);
      expect(r.source.length).toBeGreaterThan(10);
      for (const f of r.compared) expect(f.display).toMatch(/\S/);
    }
    const pv = v.results.find((r) => r.ruleId === "power-voltage-load")!;
    expect(pv.compared.map((f) => [f.label, f.display])).toContainEqual(["output voltage as typed", "65 Vpp"]);
  });

  it("lists the figures that came from captures", () => {
    const v = checkBenchSheet(exampleIntegratedAmplifierSheet());
    expect(v.fromCaptures.map((c) => c.quantity).sort()).toEqual(["rise_time", "thd", "thd", "thd_n", "thd_n"]);
    expect(v.fromCaptures.every((c) => c.captureId?.startsWith("cap_demo_"))).toBe(true);
  });

  it("does not verify a sheet of maker's figures only", () => {
    const v = checkBenchSheet(
      sheet("integrated_amplifier", [rated("output_power", 60, "W", full8), rated("thd", 0.0005, "%", { powerW: 60 })]),
    );
    expect(v.benchVerified).toBe(false);
    const req = v.results.filter((r) => r.ruleId === "required-readings");
    expect(req.map((r) => r.outcome)).toEqual(["missing", "missing", "missing", "missing"]);
    expect(req[0].detail).toMatch(/only the maker's figure/);
  });

  it("does not verify a sheet whose only fault is a missing condition", () => {
    const s = exampleIntegratedAmplifierSheet();
    delete s.readings[13].conditions.weighting; // the SNR
    const v = checkBenchSheet(s);
    expect(v.benchVerified).toBe(false);
    expect(v.counts.missing).toBe(1);
  });

  it("still verifies a unit that falls short of its rating, and reports it", () => {
    const s = exampleIntegratedAmplifierSheet();
    for (const r of s.readings) if (r.basis === "rated" && r.quantity === "output_power") r.value *= 1.25;
    const v = checkBenchSheet(s);
    expect(v.benchVerified).toBe(true);
    expect(v.shortfalls.length).toBe(2);
    expect(v.summary).toMatch(/fall short of the rating/);
  });

  it("explains why a rule had nothing to check", () => {
    const v = checkBenchSheet(exampleIntegratedAmplifierSheet());
    expect(v.skipped).toContainEqual(expect.objectContaining({ ruleId: "riaa-deviation", reason: expect.stringMatching(/No RIAA sweep/) }));
  });

  it("never verifies an empty sheet, and names what each category needs", () => {
    for (const category of CATEGORIES) {
      const v = checkBenchSheet(sheet(category, []));
      expect(v.benchVerified).toBe(false);
      const missing = v.results.filter((r) => r.ruleId === "required-readings" && r.outcome === "missing");
      expect(missing.length).toBe(REQUIRED_READINGS[category].length);
      expect(v.summary).toMatch(/^Not bench-verified: \d+ missing/);
    }
  });

  it("verifies a complete phono stage sheet with a RIAA sweep, and a loudspeaker sheet", () => {
    const phono = sheet(
      "phono_stage",
      [
        measured("gain", 40, "dB", { frequencyHz: 1000 }, { channel: "left" }),
        measured("gain", 40.1, "dB", { frequencyHz: 1000 }, { channel: "right" }),
        measured("snr", 82, "dB(A)", { voltageV: 0.005, weighting: "A" }),
      ],
      { sweeps: [riaaSweep({ offsetDb: 40 })] },
    );
    expect(checkBenchSheet(phono).benchVerified).toBe(true);
    const speaker = sheet("loudspeaker", [
      rated("nominal_impedance", 8, "Ω"),
      measured("impedance_minimum", 6.6, "Ω", { frequencyHz: 210 }),
      measured("sensitivity", 87.5, "dB/2.83 V/1 m"),
    ]);
    expect(checkBenchSheet(speaker).benchVerified).toBe(true);
  });

  it("verifies a complete turntable sheet", () => {
    const v = checkBenchSheet(
      sheet("turntable", [
        measured("speed_error", 0.002, "%", { speedRpm: 33.33, testToneHz: 3150 }),
        measured("wow_flutter", 0.0008, "%", { weighting: "IEC-60386-peak", testToneHz: 3150, speedRpm: 33.33 }),
        measured("rumble", 65, "dB", { weighting: "unweighted" }),
      ]),
    );
    expect(v.summary).toMatch(/^Bench-verified turntable/);
  });
});

describe("keyFigures and sheetFilterFacets", () => {
  it("gives the listing's headline figures with units and conditions, weaker channel first", () => {
    const figs = keyFigures(exampleIntegratedAmplifierSheet());
    expect(figs.map((f) => f.key)).toEqual(["power8", "power4", "distortion", "snr", "bandwidthHigh", "dampingFactor"]);
    expect(figs[0]).toMatchObject({
      display: "65 W",
      channel: "right",
      conditions: expect.stringMatching(/^into 8 Ω, 1 kHz, 0\.1 % THD, both channels driven/),
    });
    expect(figs[2]).toMatchObject({ label: "THD+N at rated power", display: "0.021 %", fromCapture: true });
  });

  it("gives numbers to index in the units their names say", () => {
    expect(sheetFilterFacets(exampleIntegratedAmplifierSheet())).toEqual({
      category: "integrated_amplifier",
      measuredReadings: 19,
      captureFigures: 5,
      powerW8Ohm: 65,
      powerW4Ohm: 96,
      distortionPct: expect.closeTo(0.021, 9),
      thdPct: expect.closeTo(0.014, 9),
      thdnPct: expect.closeTo(0.021, 9),
      snrDb: 98,
      bandwidthHighHz: 95000,
      bandwidthLowHz: 7,
      dampingFactor: 150,
    });
  });

  it("leaves out what was not measured", () => {
    const f = sheetFilterFacets(sheet("integrated_amplifier", [rated("output_power", 60, "W", full8)]));
    expect(f.powerW8Ohm).toBeUndefined();
    expect(f.measuredReadings).toBe(0);
  });

  it("indexes a turntable's wow & flutter and speed error in %", () => {
    const f = sheetFilterFacets(sheet("turntable", [measured("speed_error", -0.003, "%"), measured("wow_flutter", 0.0008, "%")]));
    expect(f.speedErrorPct).toBeCloseTo(0.3, 12);
    expect(f.wowFlutterPct).toBeCloseTo(0.08, 12);
  });
});
