// The listing's facet columns (what the market filters by) from its bench sheet, and the one figure a
// card leads with. The picks themselves are the bench's (shared/bench/figures.ts): measured readings
// only, the weaker channel.
import { keyFigures, sheetFilterFacets, type KeyFigure as BenchKeyFigure } from "./bench/figures";
import type { BenchSheet } from "./bench/schema";

/** Columns on `listings` that copy measured figures; null when the sheet has no such reading. */
export interface ListingFacets {
  power8ohmW: number | null;
  power4ohmW: number | null;
  thdPct: number | null;
  snrDb: number | null;
  bandwidthHz: number | null;
  wowFlutterPct: number | null;
  sensitivityDb: number | null;
  impedanceOhm: number | null;
}

export const NO_FACETS: ListingFacets = {
  power8ohmW: null,
  power4ohmW: null,
  thdPct: null,
  snrDb: null,
  bandwidthHz: null,
  wowFlutterPct: null,
  sensitivityDb: null,
  impedanceOhm: null,
};

export function listingFacets(sheet: BenchSheet | null | undefined): ListingFacets {
  if (!sheet) return { ...NO_FACETS };
  const f = sheetFilterFacets(sheet);
  return {
    power8ohmW: f.powerW8Ohm ?? null,
    power4ohmW: f.powerW4Ohm ?? null,
    thdPct: f.distortionPct ?? null,
    snrDb: f.snrDb ?? null,
    bandwidthHz: f.bandwidthHighHz ?? null,
    wowFlutterPct: f.wowFlutterPct ?? null,
    sensitivityDb: f.sensitivityDb ?? null,
    impedanceOhm: f.ratedImpedanceOhm ?? f.impedanceMinOhm ?? null,
  };
}

/** A figure as a card shows it: the number and unit apart so the number can sit in tabular mono. */
export interface CardFigure {
  label: string;
  value: string;
  unit: string;
  conditions: string;
}

export function toCardFigure(k: BenchKeyFigure): CardFigure {
  const display = k.display.trim();
  const i = display.indexOf(" ");
  const value = (i < 0 ? display : display.slice(0, i)).replace(/^-/, "−");
  const unit = i < 0 ? "" : display.slice(i + 1);
  return { label: k.label, value, unit, conditions: k.conditions || "conditions not stated" };
}

/** The figure a listing card leads with: the first of the category's key figures the sheet has. */
export function leadFigure(sheet: BenchSheet | null | undefined): CardFigure | null {
  if (!sheet) return null;
  const first = keyFigures(sheet)[0];
  return first ? toCardFigure(first) : null;
}
