import { describe, expect, it } from "vitest";
import { COMPARE_FIGURES, type FigureKey, type KeyFigure } from "@shared/bench/figures";
import { CATEGORIES, type Category, type Conditions } from "@shared/bench";
import { figureGroups } from "~/compare/rows";

// The compare table's rows: every figure compare reads has a row, cells follow the judgement, and the
// notes say why a row is not ranked.

function fig(key: FigureKey, value: number, basis: Conditions = {}): KeyFigure {
  return { key, label: key, value, unit: "W", display: `${value} W`, conditions: "into 8 Ω", fromCapture: false, ref: "", basis };
}

describe("figureGroups", () => {
  it("has a row for every figure compare reads, in every category", () => {
    for (const c of CATEGORIES) {
      const keys = COMPARE_FIGURES[c];
      const rows = figureGroups([{ category: c, figures: keys.map((k) => fig(k, 1)) }]).flatMap((g) => g.rows.map((r) => r.key));
      expect(rows.sort()).toEqual([...keys].sort());
    }
  });

  it("leaves out rows no unit has, and marks the cells the judgement names", () => {
    const groups = figureGroups([
      { category: "integrated_amplifier", figures: [fig("power8", 66)] },
      { category: "power_amplifier", figures: [fig("power8", 128)] },
    ]);
    expect(groups.map((g) => g.title)).toEqual(["Power"]);
    const [row] = groups[0].rows;
    expect(row.cells.map((c) => [c?.value, c?.unit, c?.stronger])).toEqual([
      ["66", "W", false],
      ["128", "W", true],
    ]);
    expect(row.note).toBeNull();
  });

  it("says why a row is not ranked", () => {
    const at = (ratio: number): Conditions => ({ atDistortion: { ratio, measure: "thd" } });
    const units = (a: Category, b: Category, fb = fig("power8", 128, at(0.01))) => [
      { category: a, figures: [fig("power8", 66, at(0.001)), fig("snr", 98)] },
      { category: b, figures: [fb] },
    ];
    const rows = figureGroups(units("receiver", "receiver")).flatMap((g) => g.rows);
    expect(rows.find((r) => r.key === "power8")!.note).toBe(
      "Not ranked: the distortion limit differs between these units, so the figures do not compare.",
    );
    expect(rows.find((r) => r.key === "snr")!.note).toBe("Only one of these units has this figure on its sheet.");
    // Across kinds of unit, a row only one kind has goes without a note.
    const mixed = figureGroups(units("receiver", "turntable", fig("speedError", 0.001))).flatMap((g) => g.rows);
    expect(mixed.find((r) => r.key === "snr")!.note).toBeNull();
  });
});
