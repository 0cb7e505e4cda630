// Faults that make a unit unsafe to connect: they block the mark and are listed as hazards.
import { describe, expect, it } from "vitest";
import { checkBenchSheet, exampleIntegratedAmplifierSheet, type BenchSheet } from "@shared/bench";
import { measured, outcomes, sheet } from "../bench-fixtures";

function exampleWith(change: (s: BenchSheet) => void): BenchSheet {
  const s = exampleIntegratedAmplifierSheet();
  change(s);
  return s;
}
const leftOffset = (volts: number) =>
  exampleWith((s) => {
    s.readings = s.readings.map((r) => (r.quantity === "dc_offset" && r.channel === "left" ? { ...r, value: volts } : r));
  });

describe("dc-offset-safe (±50 mV, common practice)", () => {
  it("passes the example amplifier's 4 mV and −6 mV", () => {
    const v = checkBenchSheet(exampleIntegratedAmplifierSheet());
    expect(v.hazards).toEqual([]);
    expect(v.benchVerified).toBe(true);
  });
  it.each([
    [0.05, false],
    [-0.05, false],
    [0.0501, true],
    [-0.12, true],
  ])("%s V at the left output: unsafe %s", (volts, unsafe) => {
    const v = checkBenchSheet(leftOffset(volts));
    expect(v.hazards.length > 0).toBe(unsafe);
    expect(v.benchVerified).toBe(!unsafe);
  });
  it("says it first in the summary, with the cautions", () => {
    const v = checkBenchSheet(leftOffset(0.12));
    expect(v.summary).toMatch(/^Not bench-verified: unsafe to connect\. Left DC offset at the output 120 mV is beyond ±50 mV/);
    expect(v.hazards[0].detail).toMatch(/qualified technician.*local electrical-safety rules/);
  });
  it("applies to loudspeaker outputs only: not to a preamplifier's line output", () => {
    expect(outcomes(sheet("preamplifier", [measured("dc_offset", 0.2, "mV")]), "dc-offset-safe")).toEqual([]);
  });
});

describe("output-oscillation", () => {
  it("holds any stated oscillation as a hazard", () => {
    const v = checkBenchSheet(
      exampleWith((s) => s.readings.push(measured("oscillation", 450_000, "kHz", { loadOhm: 8 }, { channel: "right" }))),
    );
    expect(v.hazards.map((h) => h.ruleId)).toEqual(["output-oscillation"]);
    expect(v.hazards[0].detail).toMatch(/oscillates at 450 kHz into 8 Ω \(right channel\)/);
    expect(v.benchVerified).toBe(false);
  });
});

describe("turntable-far-off-speed (±10 %, common practice; 50/60 Hz mix-up −16.7 %)", () => {
  const tt = (err: number) =>
    sheet("turntable", [
      measured("speed_error", err, "%", { speedRpm: 33.333 }),
      measured("wow_flutter", 0.001, "%", { weighting: "IEC-60386-peak", testToneHz: 3150 }),
    ]);
  it.each([
    [0.003, false],
    [0.1, false],
    [-0.1, false],
    [0.101, true],
    [-0.1667, true], // a 60 Hz synchronous motor on 50 Hz mains: 50/60 − 1
  ])("speed error %s: unsafe %s", (err, unsafe) => {
    expect(checkBenchSheet(tt(err)).hazards.length > 0).toBe(unsafe);
  });
  it("a turntable within DIN 45500 is bench-verified", () => {
    expect(checkBenchSheet(tt(0.003)).benchVerified).toBe(true);
  });
});
