// The headline figures a listing shows and compare sets side by side: the conservative reading, and
// "at rated power" only when the figure was taken there.
import { describe, expect, it } from "vitest";
import { keyFigures, type Reading } from "@shared/bench";
import { judgeRow } from "@shared/bench/compare";
import { full8, measured, rated, sheet } from "../bench-fixtures";

const distortion = (atW: number) => {
  const s = sheet("integrated_amplifier", [
    rated("output_power", 100, "W", full8),
    measured("thd_n", 0.0005, "%", { loadOhm: 8, frequencyHz: 1000, powerW: atW, bandwidth: { lowHz: 20, highHz: 20000 } }),
  ]);
  return keyFigures(s).find((f) => f.key === "distortion")!;
};

describe("distortion at rated power (common practice: within 20 % of the rating)", () => {
  it("THD+N taken at 85 W of a 100 W rating is shown as at rated power; at 50 W it is not", () => {
    expect(distortion(85).label).toBe("THD+N at rated power");
    expect(distortion(50).label).toBe("THD+N");
  });
});

describe("setting units side by side", () => {
  const entry = (value: number): Parameters<typeof judgeRow>[1][number] => {
    const r: Reading = measured("thd_n", value, "%", { loadOhm: 8, frequencyHz: 1000, powerW: 1 });
    const fig = keyFigures(sheet("integrated_amplifier", [r])).find((f) => f.key === "distortion")!;
    return { figure: fig, category: "integrated_amplifier" };
  };
  it("the lower distortion is the stronger figure", () => {
    expect(judgeRow("distortion", [entry(0.001), entry(0.0001)])).toEqual({ kind: "stronger", strongest: [1] });
  });
  it("a figure only one unit has is not marked", () => {
    expect(judgeRow("distortion", [entry(0.001), null])).toEqual({ kind: "alone" });
  });
});
