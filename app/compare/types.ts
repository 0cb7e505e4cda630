import type { FigureDirection, FigureKey } from "@shared/bench/figures";
import type { RowJudgement } from "@shared/bench/compare";
import type { ListingSummary } from "~/catalogue/types";
import type { ResponseSeries } from "~/components/plots";

// What the compare page receives: the units' heads, their measured figures row by row with the
// judgement of each row, and their frequency responses. Built only from live and sold listings.

export interface ComparedUnit extends ListingSummary {
  status: "live" | "sold";
  href: string;
  categoryLabel: string;
  /** Short name for the plot's legend and the columns on a phone: the title, numbered if two units share it. */
  shortName: string;
}

export interface FigureCell {
  value: string;
  unit: string;
  /** Conditions in words; the figure's own name first when it is more exact than the row's ("THD+N at rated power"). */
  conditions: string;
  stronger: boolean;
  fromCapture: boolean;
}

export interface FigureRow {
  key: FigureKey;
  label: string;
  better: FigureDirection | null;
  /** One cell per unit, in column order; null where the unit's sheet has no such measured figure. */
  cells: (FigureCell | null)[];
  judgement: RowJudgement;
  /** Why nothing is marked, in words, when that needs saying. */
  note: string | null;
}

export interface FigureGroup {
  title: string;
  rows: FigureRow[];
}

export interface Comparison {
  units: ComparedUnit[];
  /** Ids asked for that are not shown (no such listing, or not public): all said the same way. */
  unavailable: string[];
  /** Category labels when the units are of different kinds; null when they are one kind. */
  mixedKinds: string[] | null;
  groups: FigureGroup[];
  /**
   * The units' responses, one series each (its id is the unit's): flat sweeps as level re 1 kHz, RIAA
   * sweeps as deviation from the curve. `without` names the units with neither.
   */
  responses: { flat: Overlay | null; riaa: Overlay | null; without: string[] };
}

export interface Overlay {
  series: ResponseSeries[];
  /** How the sweeps were taken and what the level is relative to, in words. */
  conditions: string;
}

/** What the compare action answers a script (a plain form is redirected instead). */
export type CompareActionResult = { ok: true; ids: string[] } | { ok: false; reason: string; path?: string };
