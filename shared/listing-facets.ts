// The listing's facet columns (what the market filters by) from its bench sheet, and the one figure a
// card leads with. The picks themselves are the bench's (shared/bench/figures.ts): measured readings
// only, the weaker channel.
import { keyFigures, sheetFilterFacets, type FigureKey, type KeyFigure as BenchKeyFigure } from "./bench/figures";
import type { Category } from "./bench/quantities";
import type { BenchSheet } from "./bench/schema";

/**
 * Columns on `listings` that copy measured figures, in the units their names say; null when the sheet
 * has no such measured reading. Rated (maker's) figures never count. The one home for these values:
 * the bench's check, the demo seed and the search migration's backfill all call `listingFacets`.
 */
export interface ListingFacets {
  power8ohmW: number | null;
  power4ohmW: number | null;
  /** THD; THD+N where only that was measured (it bounds THD from above). */
  thdPct: number | null;
  thdnPct: number | null;
  snrDb: number | null;
  /** The lower −3 dB point (the higher of the channels'). */
  f3LowHz: number | null;
  /** The upper −3 dB point (the lower of the channels'). */
  f3HighHz: number | null;
  dampingFactor: number | null;
  /** Worst deviation from the RIAA curve, ± dB as a magnitude. */
  riaaDeviationDb: number | null;
  gainDb: number | null;
  /** Output noise in µV. */
  noiseUv: number | null;
  /** At 2.83 V, 1 m. */
  sensitivityDb: number | null;
  /** The measured impedance minimum (never the rated impedance). */
  impedanceMinOhm: number | null;
  /** Speed error as a magnitude, %. */
  speedErrorPct: number | null;
  wowFlutterPct: number | null;
}

export const NO_FACETS: ListingFacets = {
  power8ohmW: null,
  power4ohmW: null,
  thdPct: null,
  thdnPct: null,
  snrDb: null,
  f3LowHz: null,
  f3HighHz: null,
  dampingFactor: null,
  riaaDeviationDb: null,
  gainDb: null,
  noiseUv: null,
  sensitivityDb: null,
  impedanceMinOhm: null,
  speedErrorPct: null,
  wowFlutterPct: null,
};

// The columns' checks: a figure outside them is a sheet the bench will flag, not a facet to store.
const positive = (v: number | undefined) => (v !== undefined && Number.isFinite(v) && v > 0 ? v : null);
const nonNegative = (v: number | undefined) => (v !== undefined && Number.isFinite(v) && v >= 0 ? v : null);
const finite = (v: number | undefined) => (v !== undefined && Number.isFinite(v) ? v : null);

export function listingFacets(sheet: BenchSheet | null | undefined): ListingFacets {
  if (!sheet) return { ...NO_FACETS };
  const f = sheetFilterFacets(sheet);
  return {
    power8ohmW: positive(f.powerW8Ohm),
    power4ohmW: positive(f.powerW4Ohm),
    thdPct: nonNegative(f.thdPct ?? f.thdnPct),
    thdnPct: nonNegative(f.thdnPct),
    snrDb: finite(f.snrDb),
    f3LowHz: positive(f.bandwidthLowHz),
    f3HighHz: positive(f.bandwidthHighHz),
    dampingFactor: positive(f.dampingFactor),
    riaaDeviationDb: nonNegative(f.riaaDeviationDb),
    gainDb: finite(f.gainDb),
    noiseUv: positive(f.noiseV === undefined ? undefined : f.noiseV * 1e6),
    sensitivityDb: finite(f.sensitivityDb),
    impedanceMinOhm: positive(f.impedanceMinOhm),
    speedErrorPct: nonNegative(f.speedErrorPct),
    wowFlutterPct: nonNegative(f.wowFlutterPct),
  };
}

/** A figure as a card shows it: the number and unit apart so the number can sit in tabular mono. */
export interface CardFigure {
  label: string;
  value: string;
  unit: string;
  conditions: string;
}

// What a card leads with, by category: the figure buyers compare units of that kind by.
const CARD_ORDER: Record<Category, FigureKey[]> = {
  integrated_amplifier: ["power8", "power4", "distortion"],
  power_amplifier: ["power8", "power4", "distortion"],
  receiver: ["power8", "power4", "distortion"],
  preamplifier: ["distortion", "snr", "gain"],
  phono_stage: ["riaaDeviation", "snr", "gain"],
  turntable: ["wowFlutter", "speedError", "rumble"],
  tape_deck: ["wowFlutter", "snr", "speedError"],
  loudspeaker: ["sensitivity", "impedanceMinimum", "ratedImpedance"],
};

// Conditions a card can leave to the listing page: they matter on the sheet, not in a one-line summary.
const CARD_DROPS = [/ V mains$/, /^after .* warm-up$/];

export function toCardFigure(k: BenchKeyFigure): CardFigure {
  const display = k.display.trim();
  const i = display.indexOf(" ");
  const value = (i < 0 ? display : display.slice(0, i)).replace(/^-/, "−");
  const unit = i < 0 ? "" : display.slice(i + 1);
  const conditions = k.conditions
    .split(", ")
    .filter((part) => part && !CARD_DROPS.some((re) => re.test(part)))
    .join(", ");
  return { label: k.label, value, unit, conditions: conditions || "conditions not stated" };
}

/** The figure a listing card leads with, or null when the sheet has none of the category's key figures. */
export function leadFigure(sheet: BenchSheet | null | undefined): CardFigure | null {
  if (!sheet) return null;
  const figures = keyFigures(sheet);
  for (const key of CARD_ORDER[sheet.category]) {
    const hit = figures.find((f) => f.key === key);
    if (hit) return toCardFigure(hit);
  }
  return figures[0] ? toCardFigure(figures[0]) : null;
}

/** The parts of a bench verdict the listing row keeps: the mark, and whether publishing holds it for the desk. */
export interface PublishState {
  status: "live" | "held";
  benchVerified: boolean;
  heldReason: string | null;
}

type VerdictLike = {
  benchVerified: boolean;
  counts: { implausible: number };
  results: { outcome: string; title: string; detail: string }[];
};

/** A published listing goes live unless its sheet has an implausible outcome: then a moderator looks first. */
export function publishState(verdict: VerdictLike | null | undefined): PublishState {
  if (!verdict) return { status: "live", benchVerified: false, heldReason: null };
  const implausible = verdict.results.find((r) => r.outcome === "implausible");
  if (verdict.counts.implausible > 0 && implausible) {
    return {
      status: "held",
      benchVerified: false,
      heldReason: `The bench found an implausible figure. ${implausible.title}: ${implausible.detail}`,
    };
  }
  return { status: "live", benchVerified: verdict.benchVerified, heldReason: null };
}
