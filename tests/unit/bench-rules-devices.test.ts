import { describe, expect, it } from "vitest";
import { checkBenchSheet } from "@shared/bench";
import { measured, outcomes, rated, resultsFor, riaaSweep, sheet } from "./bench-fixtures";

describe("speaker-impedance-minimum", () => {
  const spk = (nominal: number, min: number) =>
    sheet("loudspeaker", [rated("nominal_impedance", nominal, "Ω"), measured("impedance_minimum", min, "Ω", { frequencyHz: 180 })]);
  it("accepts a dip to 80 % of the rating", () => {
    expect(outcomes(spk(8, 6.4), "speaker-impedance-minimum")).toEqual(["consistent"]);
  });
  it("questions a deeper dip and says what load it really is", () => {
    const [r] = resultsFor(checkBenchSheet(spk(8, 5)), "speaker-impedance-minimum");
    expect(r.outcome).toBe("questionable");
    expect(r.detail).toMatch(/6\.25 Ω load/);
  });
  it("calls it missing without a rated impedance", () => {
    expect(outcomes(sheet("loudspeaker", [measured("impedance_minimum", 6, "Ω")]), "speaker-impedance-minimum")).toEqual(["missing"]);
  });
});

describe("speaker-sensitivity-reference", () => {
  const z4 = rated("nominal_impedance", 4, "Ω");
  it("accepts 2.83 V or 1 W at 1 m, from the unit or the conditions", () => {
    const s = sheet("loudspeaker", [
      z4,
      measured("sensitivity", 89, "dB/2.83 V/1 m"),
      measured("sensitivity", 86, "dB SPL", { powerW: 1, distanceM: 1 }),
    ]);
    expect(outcomes(s, "speaker-sensitivity-reference")).toEqual(["consistent", "consistent", "consistent"]);
  });
  it("questions two figures that disagree by more than 10·log10(8/Z)", () => {
    const s = sheet("loudspeaker", [z4, measured("sensitivity", 92, "dB/2.83 V/1 m"), measured("sensitivity", 86, "dB/1 W/1 m")]);
    expect(outcomes(s, "speaker-sensitivity-reference").at(-1)).toBe("questionable");
  });
  it("calls a bare dB figure missing its reference", () => {
    expect(outcomes(sheet("loudspeaker", [measured("sensitivity", 89, "dB")]), "speaker-sensitivity-reference")).toEqual(["missing"]);
  });
  it("derives the per-watt figure of a 4 Ω speaker (3 dB less than at 2.83 V)", () => {
    const v = checkBenchSheet(sheet("loudspeaker", [z4, measured("sensitivity", 89, "dB/2.83 V/1 m")]));
    expect(v.derived.find((d) => d.id.startsWith("sensitivity-per-watt"))?.value).toBeCloseTo(89 - 3.0103, 3);
  });
});

describe("riaa-deviation", () => {
  const phono = (sweeps: ReturnType<typeof riaaSweep>[], readings: Parameters<typeof sheet>[1] = []) =>
    sheet("phono_stage", readings, { sweeps });
  it("finds a faithful stage consistent, with its worst deviation and where", () => {
    const v = checkBenchSheet(phono([riaaSweep({ offsetDb: 35 })]));
    const [r] = resultsFor(v, "riaa-deviation");
    expect(r.outcome).toBe("consistent");
    expect(Math.abs(r.compared[0].value)).toBeLessThan(0.01);
  });
  it("finds a 1.5 dB bass lift at 20 Hz", () => {
    const v = checkBenchSheet(phono([riaaSweep({ tiltDb: (f) => (f <= 20 ? 1.5 : 0) })]));
    const [r] = resultsFor(v, "riaa-deviation");
    // The table is rounded to 0.01 dB, so the deviation read back is 1.5 dB to within 0.005 dB.
    expect(Math.abs(r.compared[0].value - 1.5)).toBeLessThanOrEqual(0.005);
    expect(r.compared[1].value).toBe(20);
    expect(r.outcome).toBe("consistent");
  });
  it("questions a stage beyond ±2 dB", () => {
    expect(outcomes(phono([riaaSweep({ tiltDb: (f) => (f >= 10000 ? -3 : 0) })]), "riaa-deviation")).toEqual(["questionable"]);
  });
  it("questions a sweep worse than the sheet's own claim", () => {
    const s = phono([riaaSweep({ tiltDb: (f) => (f <= 50 ? 0.8 : 0) })], [measured("riaa_deviation", 0.2, "dB")]);
    const [r] = resultsFor(checkBenchSheet(s), "riaa-deviation");
    expect(r.outcome).toBe("questionable");
    expect(r.detail).toMatch(/more than the 0\.2 dB/);
  });
  it("recognises a stage with the IEC subsonic pole", () => {
    const v = checkBenchSheet(phono([riaaSweep({ iec: true })]));
    expect(resultsFor(v, "riaa-deviation")[0].detail).toMatch(/IEC subsonic pole/);
  });
  it("needs the sweep to span 1 kHz", () => {
    const s = riaaSweep({});
    s.points = s.points.filter((p) => p.frequencyHz < 1000);
    expect(outcomes(phono([s]), "riaa-deviation")).toEqual(["missing"]);
  });
});

describe("speed-error", () => {
  const tt = (...readings: Parameters<typeof sheet>[1]) => sheet("turntable", readings);
  it("accepts a turntable within DIN 45500 and reports one outside it as a shortfall", () => {
    expect(outcomes(tt(measured("speed_error", 0.004, "%", { speedRpm: 33.33 })), "speed-error")).toEqual(["consistent"]);
    const v = checkBenchSheet(tt(measured("speed_error", -0.02, "%", { speedRpm: 33.33 })));
    expect(resultsFor(v, "speed-error")[0].detail).toMatch(/2\.0 % slow .* outside/);
    expect(v.shortfalls).toHaveLength(1);
  });
  it("holds it against the maker's tolerance when there is one", () => {
    const v = checkBenchSheet(tt(rated("speed_error", 0.001, "%"), measured("speed_error", 0.003, "%", { speedRpm: 45 })));
    expect(resultsFor(v, "speed-error")[0].detail).toMatch(/outside the maker's ±0\.10 %/);
  });
  it("needs the speed on a turntable and questions a figure beyond a semitone", () => {
    expect(outcomes(tt(measured("speed_error", 0.004, "%")), "speed-error")).toEqual(["missing"]);
    expect(outcomes(tt(measured("speed_error", 0.09, "%", { speedRpm: 33.33 })), "speed-error")).toEqual(["questionable"]);
  });
});

describe("wow-flutter", () => {
  const tape = (...readings: Parameters<typeof sheet>[1]) => sheet("tape_deck", readings);
  const iec = { weighting: "IEC-60386-peak" as const, testToneHz: 3150 };
  it("wants weighting and test tone", () => {
    expect(outcomes(tape(measured("wow_flutter", 0.001, "%")), "wow-flutter")).toEqual(["missing"]);
    expect(outcomes(tape(measured("wow_flutter", 0.001, "%", iec)), "wow-flutter")).toEqual(["consistent"]);
  });
  it("questions a tone that is not a wow & flutter tone", () => {
    expect(outcomes(tape(measured("wow_flutter", 0.001, "%", { ...iec, testToneHz: 1000 })), "wow-flutter")).toEqual(["questionable"]);
  });
  it("compares with the maker only at the same weighting", () => {
    const v = checkBenchSheet(tape(rated("wow_flutter", 0.0005, "%", { weighting: "WRMS" }), measured("wow_flutter", 0.001, "%", iec)));
    expect(resultsFor(v, "wow-flutter")[0].detail).toMatch(/another weighting/);
    expect(v.shortfalls).toEqual([]);
    const w = checkBenchSheet(tape(rated("wow_flutter", 0.0005, "%", iec), measured("wow_flutter", 0.001, "%", iec)));
    expect(w.shortfalls[0].detail).toMatch(/100 % above the maker's 0\.050 %/);
  });
});
