// The measured figures an inventory CSV carries: a short list per category, each a value column typed the
// way the trade writes it ("2 × 105 W", "0.02 %", "96 dB") and one plain column per condition that gives it
// its meaning ("8 Ω", "0.1 % THD", "A"). The cells are read by the bench sheet form's own row reader, so
// a figure in a CSV means exactly what it means when typed into the editor.
import type { Category, Quantity } from "./bench/quantities";
import type { ConditionField } from "./bench-form/rows";

export type FigureColumn = {
  /** The value's column name; its conditions are `<column>_<field>`. */
  column: string;
  quantity: Quantity;
  /** The conditions that travel with the figure, in the order the columns appear. */
  conditions: readonly ConditionField[];
  categories: readonly Category[];
  /** What the template's header help says the column holds. */
  example: string;
};

const AMPLIFIERS: readonly Category[] = ["integrated_amplifier", "power_amplifier", "receiver"];
const LINE_LEVEL: readonly Category[] = ["preamplifier", "phono_stage"];
const WITH_PHONO: readonly Category[] = ["integrated_amplifier", "receiver", "preamplifier", "phono_stage"];
const ELECTRONICS: readonly Category[] = [...AMPLIFIERS, ...LINE_LEVEL];
const DECKS: readonly Category[] = ["turntable", "tape_deck"];

/** Every figure column, in the order they appear after the unit's own columns. */
export const FIGURE_COLUMNS: readonly FigureColumn[] = [
  { column: "power", quantity: "output_power", conditions: ["load", "limit", "driven"], categories: AMPLIFIERS, example: "2 × 105 W" },
  {
    column: "thd",
    quantity: "thd",
    conditions: ["level", "load", "frequency"],
    categories: [...ELECTRONICS, "tape_deck", "loudspeaker"],
    example: "0.02 %",
  },
  { column: "snr", quantity: "snr", conditions: ["level", "weighting"], categories: [...ELECTRONICS, "tape_deck"], example: "96 dB" },
  {
    column: "response",
    quantity: "response_deviation",
    conditions: ["range"],
    categories: [...ELECTRONICS, "tape_deck", "loudspeaker"],
    example: "0.5 dB",
  },
  { column: "damping", quantity: "damping_factor", conditions: ["load", "frequency"], categories: AMPLIFIERS, example: "120" },
  { column: "dc_offset", quantity: "dc_offset", conditions: [], categories: ELECTRONICS, example: "12 mV" },
  { column: "gain", quantity: "gain", conditions: ["frequency"], categories: LINE_LEVEL, example: "40 dB" },
  { column: "riaa", quantity: "riaa_deviation", conditions: ["range"], categories: WITH_PHONO, example: "0.3 dB" },
  { column: "impedance_min", quantity: "impedance_minimum", conditions: ["frequency"], categories: ["loudspeaker"], example: "3.4 Ω" },
  { column: "sensitivity", quantity: "sensitivity", conditions: ["level", "distance"], categories: ["loudspeaker"], example: "88 dB" },
  { column: "speed_error", quantity: "speed_error", conditions: ["speed"], categories: DECKS, example: "+0.2 %" },
  { column: "wow_flutter", quantity: "wow_flutter", conditions: ["weighting", "speed", "tone"], categories: DECKS, example: "0.05 %" },
  { column: "rumble", quantity: "rumble", conditions: ["weighting"], categories: ["turntable"], example: "68 dB" },
];

/** A condition's column name, e.g. power_load. */
export const conditionColumn = (figure: FigureColumn, field: ConditionField) => `${figure.column}_${field}`;

/** Every column the figures add, value then its conditions. */
export const FIGURE_COLUMN_NAMES: readonly string[] = FIGURE_COLUMNS.flatMap((f) => [
  f.column,
  ...f.conditions.map((c) => conditionColumn(f, c)),
]);

/** The figure columns that belong to a category. */
export function figuresFor(category: Category): FigureColumn[] {
  return FIGURE_COLUMNS.filter((f) => f.categories.includes(category));
}
