import { compareFamily, judgeRow, type RowEntry, type RowJudgement } from "@shared/bench/compare";
import { FIGURE_COMPARISON, type FigureDirection, type FigureKey, type KeyFigure } from "@shared/bench/figures";
import { toCardFigure } from "@shared/listing-facets";
import type { Category } from "@shared/catalogue";
import type { FigureCell, FigureGroup, FigureRow } from "./types";

// The compare table's rows: every measured figure any of the units has, grouped as a bench sheet
// reads, each row judged by the bench's own rules (shared/bench/compare.ts).

const GROUPS: { title: string; rows: [FigureKey, string][] }[] = [
  {
    title: "Power",
    rows: [
      ["power8", "Power into 8 Ω"],
      ["power4", "Power into 4 Ω"],
      ["dampingFactor", "Damping factor"],
    ],
  },
  {
    title: "Distortion and noise",
    rows: [
      ["distortion", "Distortion"],
      ["snr", "Signal-to-noise ratio"],
    ],
  },
  {
    title: "Frequency response",
    rows: [
      ["bandwidthLow", "Lower −3 dB point"],
      ["bandwidthHigh", "Upper −3 dB point"],
    ],
  },
  {
    title: "Gain and equalisation",
    rows: [
      ["gain", "Gain"],
      ["riaaDeviation", "RIAA deviation (worst)"],
    ],
  },
  {
    title: "Loudspeaker",
    rows: [
      ["sensitivity", "Sensitivity (2.83 V, 1 m)"],
      ["impedanceMinimum", "Impedance minimum"],
    ],
  },
  {
    title: "Speed",
    rows: [
      ["speedError", "Speed error"],
      ["wowFlutter", "Wow & flutter"],
      ["rumble", "Rumble"],
    ],
  },
];

export const BETTER_WORDS: Record<FigureDirection, string> = {
  higher: "higher is better",
  lower: "lower is better",
  nearer_zero: "nearer zero is better",
};

function cell(f: KeyFigure, rowLabel: string, stronger: boolean): FigureCell {
  const card = toCardFigure(f);
  const channel = f.channel === "left" || f.channel === "right" ? `${f.channel} channel` : null;
  const own = f.label !== rowLabel ? f.label : null;
  const conditions = [own, card.conditions === "conditions not stated" && own ? null : card.conditions, channel].filter(Boolean).join(", ");
  return { value: card.value, unit: card.unit, conditions, stronger, fromCapture: f.fromCapture };
}

function noteFor(j: RowJudgement, present: number, mixed: boolean): string | null {
  switch (j.kind) {
    case "not_comparable": {
      const list = j.differ.length > 1 ? `${j.differ.slice(0, -1).join(", ")} and ${j.differ.at(-1)}` : j.differ[0];
      return `Not ranked: the ${list} ${j.differ.length > 1 ? "differ" : "differs"} between these units, so the figures do not compare.`;
    }
    case "no_direction":
      return "Not ranked: more is not better here; it should suit the rest of the system.";
    case "level":
      return "Measured alike.";
    case "alone":
      // Across kinds of unit most rows belong to one kind; saying so on each would only be noise.
      return present === 1 && !mixed ? "Only one of these units has this figure on its sheet." : null;
    default:
      return null;
  }
}

/** `units[i]`: the unit's category and its measured figures (compareFigures). Rows no unit has are left out. */
export function figureGroups(units: { category: Category; figures: KeyFigure[] }[]): FigureGroup[] {
  const out: FigureGroup[] = [];
  const mixed = new Set(units.map((u) => compareFamily(u.category))).size > 1;
  for (const group of GROUPS) {
    const rows: FigureRow[] = [];
    for (const [key, label] of group.rows) {
      const entries: (RowEntry | null)[] = units.map((u) => {
        const figure = u.figures.find((f) => f.key === key);
        return figure ? { figure, category: u.category } : null;
      });
      const present = entries.filter(Boolean).length;
      if (!present) continue;
      const judgement = judgeRow(key, entries);
      const strongest = judgement.kind === "stronger" ? judgement.strongest : [];
      rows.push({
        key,
        label,
        better: FIGURE_COMPARISON[key].better,
        cells: entries.map((e, i) => (e ? cell(e.figure, label, strongest.includes(i)) : null)),
        judgement,
        note: units.length > 1 ? noteFor(judgement, present, mixed) : null,
      });
    }
    if (rows.length) out.push({ title: group.title, rows });
  }
  return out;
}
