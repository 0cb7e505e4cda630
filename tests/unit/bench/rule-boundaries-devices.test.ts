// Just inside and just outside the thresholds of the phono, turntable, tape and loudspeaker rules, and
// what the verdict makes of a sheet whose only problem is one questionable or missing outcome.
import { describe, expect, it } from "vitest";
import { checkBenchSheet, exampleIntegratedAmplifierSheet, type Reading } from "@shared/bench";
import { measured, outcomes, rated, resultsFor, riaaSweep, sheet } from "../bench-fixtures";
import { RIAA_PLAYBACK_TABLE, sweepFromTable } from "../../support/published-tables";

const phono = (sweeps: ReturnType<typeof riaaSweep>[], readings: Reading[] = []) => sheet("phono_stage", readings, { sweeps });

describe("riaa-deviation: ±2 dB re 1 kHz on equalised inputs (DIN 45500 part 6), against IEC 60098's table", () => {
  // The table is rounded to 0.01 dB, so a tilt t at 20 kHz reads back as t ± 0.005 dB. (A bass cut would
  // fit the IEC variant's 7950 µs pole better, so the treble end is the one to bend.)
  it.each([
    [1.99, "consistent"],
    [-1.99, "consistent"],
    [2.01, "questionable"],
    [-2.01, "questionable"],
  ])("a stage %f dB off the table at 20 kHz: %s", (tilt, outcome) => {
    const s = phono([riaaSweep({ offsetDb: 35, tiltDb: (f) => (f === 20000 ? tilt : 0) })]);
    expect(outcomes(s, "riaa-deviation")).toEqual([outcome]);
  });
  it.each([
    [1.99, "consistent"],
    [-1.99, "consistent"],
    [2.01, "questionable"],
    [-2.01, "questionable"],
  ])("a typed RIAA deviation of %f dB without a sweep: %s", (db, outcome) => {
    expect(outcomes(phono([], [measured("riaa_deviation", db, "dB")]), "riaa-deviation")).toEqual([outcome]);
  });
  it("a sweep may exceed the sheet's claimed deviation by 0.1 dB of rounding, not more", () => {
    const claim = [measured("riaa_deviation", 0.5, "dB")];
    const tilted = (t: number) => phono([riaaSweep({ tiltDb: (f) => (f === 50 ? t : 0) })], claim);
    expect(outcomes(tilted(0.58), "riaa-deviation")).toEqual(["consistent"]);
    expect(outcomes(tilted(0.62), "riaa-deviation")).toEqual(["questionable"]);
  });
  it("a sweep without a 1 kHz point is referred to 1 kHz by interpolating in log frequency", () => {
    // 1 kHz is the geometric mean of 500 Hz and 2 kHz: the level there is (2.65 − 2.59)/2 = +0.03 dB.
    const points = sweepFromTable(RIAA_PLAYBACK_TABLE.filter(([f]) => f !== 1000));
    const v = checkBenchSheet(phono([{ kind: "riaa", variant: "riaa", origin: "typed", conditions: {}, points }]));
    const [r] = resultsFor(v, "riaa-deviation");
    expect(r.outcome).toBe("consistent");
    expect(Math.abs(r.compared[0].value)).toBeLessThan(0.05);
  });
});

describe("speed-error: DIN 45500 turntables +1.5 %/−1 %, tape ±1.5 %; beyond a semitone (6 %) a unit slip", () => {
  const turntable = (e: number) => sheet("turntable", [measured("speed_error", e, "%", { speedRpm: 33.33 })]);
  const tape = (e: number) => sheet("tape_deck", [measured("speed_error", e, "%")]);
  const short = (s: ReturnType<typeof sheet>) => checkBenchSheet(s).shortfalls.filter((x) => x.ruleId === "speed-error").length;
  it.each([
    [0.0149, 0],
    [0.0151, 1],
    [-0.0099, 0],
    [-0.0101, 1],
  ])("a turntable %f fast: %d shortfall(s), and never held against the sheet", (e, n) => {
    expect(short(turntable(e))).toBe(n);
    expect(outcomes(turntable(e), "speed-error")).toEqual(["consistent"]);
  });
  it.each([
    [0.0149, 0],
    [-0.0149, 0],
    [0.0151, 1],
    [-0.0151, 1],
  ])("a tape deck %f fast: %d shortfall(s)", (e, n) => {
    expect(short(tape(e))).toBe(n);
  });
  it("a turntable 1.2 % slow is outside DIN's −1 %, by 20 % of the limit", () => {
    const v = checkBenchSheet(turntable(-0.012));
    expect(v.shortfalls.map((s) => s.percent)).toEqual([20]);
  });
  it("5.9 % is read as a speed error; 6.1 % (more than a semitone) is questioned as a likely slip", () => {
    expect(outcomes(turntable(0.059), "speed-error")).toEqual(["consistent"]);
    expect(outcomes(turntable(0.061), "speed-error")).toEqual(["questionable"]);
  });
});

describe("wow-flutter: IEC 60386 3150 Hz tone (3000 Hz WRMS), DIN 45500 ±0.2 % weighted", () => {
  const wf = (x: number, c: Reading["conditions"] = {}, extra: Reading[] = []) =>
    sheet("turntable", [measured("wow_flutter", x, "%", { weighting: "IEC-60386-peak", testToneHz: 3150, ...c }), ...extra]);
  it("0.19 % weighted peak is within DIN 45500; 0.21 % is noted above it", () => {
    expect(resultsFor(checkBenchSheet(wf(0.0019)), "wow-flutter")[0].detail).not.toMatch(/Above DIN/);
    expect(resultsFor(checkBenchSheet(wf(0.0021)), "wow-flutter")[0].detail).toMatch(/Above DIN 45500/);
  });
  it("up to 10 % above the maker's figure is within it; beyond is reported as a shortfall", () => {
    const maker = [rated("wow_flutter", 0.001, "%", { weighting: "IEC-60386-peak" })];
    const n = (x: number) => checkBenchSheet(wf(x, {}, maker)).shortfalls.filter((s) => s.ruleId === "wow-flutter").length;
    expect(n(0.00109)).toBe(0);
    expect(n(0.00111)).toBe(1);
  });
  it.each([
    [3150, "consistent"],
    [3120, "consistent"],
    [3000, "consistent"],
    [3100, "questionable"],
    [2850, "questionable"],
    [1000, "questionable"],
  ])("a %d Hz test tone: %s", (tone, outcome) => {
    expect(outcomes(wf(0.001, { testToneHz: tone }), "wow-flutter")).toEqual([outcome]);
  });
});

describe("loudspeakers: impedance minimum ≥ 80 % of rated (IEC 60268-5); 2.83 V vs 1 W differ by 10·log10(8/Z)", () => {
  const spk = (readings: Reading[]) => sheet("loudspeaker", readings);
  it("an 8 Ω speaker may dip to 6.4 Ω, not to 6.39 Ω", () => {
    const at = (m: number) => spk([rated("nominal_impedance", 8, "Ω"), measured("impedance_minimum", m, "Ω")]);
    expect(outcomes(at(6.4), "speaker-impedance-minimum")).toEqual(["consistent"]);
    expect(outcomes(at(6.39), "speaker-impedance-minimum")).toEqual(["questionable"]);
  });
  it("at 4 Ω the 2.83 V figure exceeds the 1 W figure by 3.01 dB, within 0.5 dB", () => {
    // 10·log10(8/4) = 3.0103 dB; 3.5 dB is 0.49 dB off, 3.52 dB is 0.51 dB off.
    const pair = (d: number) =>
      spk([
        rated("nominal_impedance", 4, "Ω"),
        measured("sensitivity", 88 + d, "dB", { voltageV: 2.83, distanceM: 1 }),
        measured("sensitivity", 88, "dB", { powerW: 1, distanceM: 1 }),
      ]);
    const last = (d: number) => outcomes(pair(d), "speaker-sensitivity-reference").at(-1);
    expect(last(3.01)).toBe("consistent");
    expect(last(3.5)).toBe("consistent");
    expect(last(3.52)).toBe("questionable");
    expect(last(2.5)).toBe("questionable");
  });
  it("a sensitivity measured at 2 m is questioned: buyers compare figures at 1 m", () => {
    const s = spk([rated("nominal_impedance", 8, "Ω"), measured("sensitivity", 84, "dB", { voltageV: 2.83, distanceM: 2 })]);
    expect(outcomes(s, "speaker-sensitivity-reference")).toEqual(["questionable"]);
  });
});

describe("required-readings and the verdict", () => {
  it("an amplifier needs a measured noise figure; the maker's SNR alone does not count", () => {
    const s = exampleIntegratedAmplifierSheet();
    s.readings = s.readings.filter((r) => r.quantity !== "snr");
    s.readings.push(rated("snr", 100, "dB", { powerW: 1, weighting: "A" }));
    const v = checkBenchSheet(s);
    const noise = resultsFor(v, "required-readings").filter((r) => /noise/i.test(r.detail));
    expect(noise.map((r) => r.outcome)).toEqual(["missing"]);
    expect(v.benchVerified).toBe(false);
  });
  it("a sheet whose only problem is one questionable outcome is not bench-verified", () => {
    // The example sheet is verified; a THD typed at −131 dB is beyond what any analyser resolves.
    const s = exampleIntegratedAmplifierSheet();
    s.readings.push(measured("thd", 10 ** (-131 / 20), "%", { powerW: 1, loadOhm: 8, frequencyHz: 1000 }));
    const v = checkBenchSheet(s);
    expect(v.counts).toMatchObject({ questionable: 1, implausible: 0, missing: 0 });
    expect(v.benchVerified).toBe(false);
    expect(v.summary).toMatch(/^Not bench-verified: 1 questionable/);
  });
  it("a sheet whose only problem is one missing condition is not bench-verified", () => {
    const s = exampleIntegratedAmplifierSheet();
    s.readings.push(measured("snr", 95, "dB", { weighting: "A" }));
    const v = checkBenchSheet(s);
    expect(v.counts).toMatchObject({ questionable: 0, implausible: 0, missing: 1 });
    expect(v.benchVerified).toBe(false);
  });
  it("the rails check runs on every amplifier sheet that states its rails", () => {
    const v = checkBenchSheet(exampleIntegratedAmplifierSheet());
    expect(resultsFor(v, "peak-within-rails").map((r) => r.outcome)).toEqual(["consistent"]);
  });
});
