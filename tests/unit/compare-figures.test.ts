import { describe, expect, it } from "vitest";
import fc from "fast-check";
import { compareFamily, judgeRow, type RowEntry } from "@shared/bench/compare";
import { COMPARE_FIGURES, FIGURE_COMPARISON, compareFigures, type FigureKey, type KeyFigure } from "@shared/bench/figures";
import { CATEGORIES, exampleIntegratedAmplifierSheet, type Category, type Conditions, type Quantity } from "@shared/bench";
import { MEASURED_FILTERS, type MeasuredFilterKey } from "@shared/measured-filters";
import { amplifierSheet } from "../../db/seeds/demo-sheets";

// Which of several units' figures is the stronger, and when the bench refuses to say. The directions
// are written out again here, on their own, so flipping any one in shared/bench/figures.ts fails.

const TRADE_DIRECTIONS: Record<FigureKey, "higher" | "lower" | "nearer_zero" | null> = {
  power8: "higher",
  power4: "higher",
  distortion: "lower",
  thd: "lower",
  thdN: "lower",
  snr: "higher",
  noise: "lower",
  bandwidthHigh: "higher",
  bandwidthLow: "lower",
  dampingFactor: "higher",
  gain: null,
  riaaDeviation: "lower",
  sensitivity: "higher",
  impedanceMinimum: "higher",
  ratedImpedance: null,
  wowFlutter: "lower",
  speedError: "nearer_zero",
  rumble: "higher",
};
const KEYS = Object.keys(TRADE_DIRECTIONS) as FigureKey[];

function fig(key: FigureKey, value: number, basis: Conditions = {}, quantity?: Quantity): KeyFigure {
  return { key, label: key, value, unit: "", display: String(value), conditions: "", fromCapture: false, ref: "", basis, quantity };
}
const entry = (f: KeyFigure, category: Category = "integrated_amplifier"): RowEntry => ({ figure: f, category });

/** Index of the value the trade calls best, or null when there is no direction. */
function expectedBest(dir: (typeof TRADE_DIRECTIONS)[FigureKey], values: number[]): number {
  const score = (v: number) => (dir === "higher" ? v : dir === "lower" ? -v : -Math.abs(v));
  return values.reduce((best, v, i) => (score(v) > score(values[best]) ? i : best), 0);
}

/** Distinct values whose scores under every direction differ too (no |a| = |b|). */
const distinctValues = (signed: boolean) =>
  fc
    .uniqueArray(fc.integer({ min: 1, max: 100_000 }), { minLength: 2, maxLength: 4 })
    .chain((xs) => fc.tuple(fc.constant(xs), fc.array(fc.boolean(), { minLength: xs.length, maxLength: xs.length })))
    .map(([xs, negs]) => xs.map((x, i) => (signed && negs[i] ? -x : x) / 100));

describe("the stronger figure", () => {
  it("every figure has the trade's direction", () => {
    for (const key of KEYS) expect({ key, better: FIGURE_COMPARISON[key].better }).toEqual({ key, better: TRADE_DIRECTIONS[key] });
  });

  for (const key of KEYS) {
    const dir = TRADE_DIRECTIONS[key];
    it(`${key}: ${dir ? `the ${dir.replace("_", " ")} value is marked` : "nothing is marked"}`, () => {
      fc.assert(
        fc.property(distinctValues(dir === "nearer_zero"), (values) => {
          const q = key === "distortion" ? "thd_n" : undefined;
          const verdict = judgeRow(
            key,
            values.map((v) => entry(fig(key, v, { loadOhm: 8 }, q))),
          );
          if (!dir) expect(verdict).toEqual({ kind: "no_direction" });
          else expect(verdict).toEqual({ kind: "stronger", strongest: [expectedBest(dir, values)] });
        }),
        { seed: 8, numRuns: 60 },
      );
    });
  }

  it("marks the same unit whatever the order of the columns", () => {
    fc.assert(
      fc.property(distinctValues(false), fc.integer({ min: 0, max: 1000 }), (values, shift) => {
        const n = values.length;
        const rotated = values.map((_, i) => values[(i + shift) % n]);
        const a = judgeRow(
          "power8",
          values.map((v) => entry(fig("power8", v))),
        );
        const b = judgeRow(
          "power8",
          rotated.map((v) => entry(fig("power8", v))),
        );
        if (a.kind !== "stronger" || b.kind !== "stronger") throw new Error("expected a stronger unit");
        expect(rotated[b.strongest[0]]).toBe(values[a.strongest[0]]);
      }),
      { seed: 8, numRuns: 100 },
    );
  });

  it("marks every unit that shares the best figure, and none when all are alike", () => {
    expect(judgeRow("power8", [entry(fig("power8", 66)), entry(fig("power8", 108)), entry(fig("power8", 108))])).toEqual({
      kind: "stronger",
      strongest: [1, 2],
    });
    expect(judgeRow("power8", [entry(fig("power8", 66)), entry(fig("power8", 66.0000001))])).toEqual({ kind: "level" });
  });

  it("says nothing when fewer than two units have the figure", () => {
    expect(judgeRow("power8", [entry(fig("power8", 66)), null, null])).toEqual({ kind: "alone" });
    expect(judgeRow("power8", [entry(fig("power8", 66)), entry(fig("power8", NaN))])).toEqual({ kind: "alone" });
    expect(judgeRow("power8", [])).toEqual({ kind: "alone" });
  });

  it("skips units without the figure and marks among the rest", () => {
    expect(judgeRow("snr", [null, entry(fig("snr", 98)), entry(fig("snr", 101))])).toEqual({ kind: "stronger", strongest: [2] });
  });
});

describe("figures that cannot be set against each other", () => {
  it("refuses when a condition the figure stands on differs, naming it", () => {
    const at = (ratio: number): Conditions => ({ frequencyHz: 1000, atDistortion: { ratio, measure: "thd" }, channelsDriven: "both" });
    expect(judgeRow("power8", [entry(fig("power8", 66, at(0.001))), entry(fig("power8", 80, at(0.01)))])).toEqual({
      kind: "not_comparable",
      differ: ["distortion limit"],
    });
    expect(
      judgeRow("snr", [
        entry(fig("snr", 98, { powerW: 60, weighting: "A" })),
        entry(fig("snr", 101, { powerW: 1, weighting: "unweighted" })),
      ]),
    ).toEqual({ kind: "not_comparable", differ: ["weighting", "output level"] });
    // A stated condition never matches one the sheet leaves out.
    expect(
      judgeRow("wowFlutter", [entry(fig("wowFlutter", 0.0008, { weighting: "WRMS" })), entry(fig("wowFlutter", 0.001))]),
    ).toMatchObject({
      kind: "not_comparable",
    });
  });

  it("for every figure with a direction, any listed condition that differs stops the mark", () => {
    const withConditions = KEYS.filter((k) => FIGURE_COMPARISON[k].better && FIGURE_COMPARISON[k].sameConditions.length);
    expect(withConditions.length).toBeGreaterThan(8);
    for (const key of withConditions) {
      for (const c of FIGURE_COMPARISON[key].sameConditions) {
        const verdict = judgeRow(key, [entry(fig(key, 1, { [c]: 1 }, "thd")), entry(fig(key, 2, { [c]: 2 }, "thd"))]);
        expect({ key, c, kind: verdict.kind }).toEqual({ key, c, kind: "not_comparable" });
      }
    }
  });

  it("ignores conditions that do not change the figure (mains, warm-up)", () => {
    const a = fig("power8", 66, { frequencyHz: 1000, mainsV: 230, warmUpS: 1800 });
    const b = fig("power8", 86, { frequencyHz: 1000, mainsV: 120 });
    expect(judgeRow("power8", [entry(a), entry(b)])).toEqual({ kind: "stronger", strongest: [1] });
  });

  it("does not set THD against THD+N", () => {
    expect(judgeRow("distortion", [entry(fig("distortion", 0.0001, {}, "thd")), entry(fig("distortion", 0.0002, {}, "thd_n"))])).toEqual({
      kind: "not_comparable",
      differ: ["measure (THD or THD+N)"],
    });
  });

  it("compares amplifiers of any kind with each other, and nothing across kinds", () => {
    expect(compareFamily("power_amplifier")).toBe(compareFamily("receiver"));
    const amp = entry(fig("snr", 98), "integrated_amplifier");
    expect(judgeRow("snr", [amp, entry(fig("snr", 101), "power_amplifier")])).toEqual({ kind: "stronger", strongest: [1] });
    expect(judgeRow("snr", [amp, entry(fig("snr", 70), "tape_deck")])).toEqual({ kind: "not_comparable", differ: ["kind of unit"] });
  });
});

describe("the figures compare reads off a sheet", () => {
  it("are measured only, for every category", () => {
    for (const c of CATEGORIES) expect(COMPARE_FIGURES[c]).not.toContain("ratedImpedance");
    expect(COMPARE_FIGURES.integrated_amplifier).toEqual(expect.arrayContaining(["power8", "distortion", "bandwidthLow", "bandwidthHigh"]));
  });

  it("keep the conditions each figure stands on; distortion at rated power drops the power", () => {
    const figures = compareFigures(exampleIntegratedAmplifierSheet());
    const byKey = Object.fromEntries(figures.map((f) => [f.key, f]));
    expect(byKey.power8.basis).toMatchObject({ loadOhm: 8, frequencyHz: 1000, atDistortion: { ratio: 0.001, measure: "thd" } });
    expect(byKey.distortion).toMatchObject({ label: "THD+N at rated power", quantity: "thd_n" });
    expect(byKey.distortion.basis.powerW).toBeUndefined();
    expect(byKey.bandwidthLow.value).toBe(7);
  });

  it("two demo amplifiers: power and distortion are compared, SNR re different rated powers is not", () => {
    const who = (model: string) => ({ maker: "Carrowain", model, measuredBy: "Bench", measuredOn: "2026-01-01" });
    const small = amplifierSheet("integrated_amplifier", who("WQ 46i"), {
      rated8: 60, rated4: 90, meas8: [66, 65], meas4: [98, 96], thdPct: [0.012, 0.014], snrDb: 98, f3HighHz: 95_000, f3LowHz: 7,
    }); // prettier-ignore
    const big = amplifierSheet("integrated_amplifier", who("WQ 72i"), {
      rated8: 100, rated4: 150, meas8: [108, 106], meas4: [162, 158], thdPct: [0.009, 0.011], snrDb: 101, f3HighHz: 110_000, f3LowHz: 5,
    }); // prettier-ignore
    const units = [compareFigures(small), compareFigures(big)];
    const row = (key: FigureKey) =>
      judgeRow(
        key,
        units.map((fs) => fs.find((f) => f.key === key) ?? null).map((f) => f && entry(f)),
      );
    expect(row("power8")).toEqual({ kind: "stronger", strongest: [1] });
    expect(row("distortion")).toEqual({ kind: "stronger", strongest: [1] });
    expect(row("bandwidthLow")).toEqual({ kind: "stronger", strongest: [1] });
    expect(row("snr")).toEqual({ kind: "not_comparable", differ: ["output level"] });
  });
});

describe("the market's filters", () => {
  // The filters keep which way is better for their own use; it must say what the figures say.
  const FIGURE_OF: Partial<Record<MeasuredFilterKey, FigureKey>> = {
    power8: "power8",
    power4: "power4",
    thd: "thd",
    thdn: "thdN",
    snr: "snr",
    f3Low: "bandwidthLow",
    f3High: "bandwidthHigh",
    damping: "dampingFactor",
    riaa: "riaaDeviation",
    noise: "noise",
    sensitivity: "sensitivity",
    impedanceMin: "impedanceMinimum",
    speedError: "speedError",
    wowFlutter: "wowFlutter",
  };

  it("call the same direction better as compare does", () => {
    const checked = MEASURED_FILTERS.filter((f) => FIGURE_OF[f.key]);
    expect(checked.length).toBe(Object.keys(FIGURE_OF).length);
    for (const f of checked) {
      const better = FIGURE_COMPARISON[FIGURE_OF[f.key]!].better;
      // The speed-error column holds the size of the error, so "nearer zero" is "lower" there.
      expect({ filter: f.key, better: f.better }).toEqual({ filter: f.key, better: better === "nearer_zero" ? "lower" : better });
    }
  });
});
