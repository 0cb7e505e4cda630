// The sold-price index's arithmetic, kept free of the database so it can be checked on its own:
// median, range and count of what a maker and model sold for, split by whether the unit was
// bench-verified. The server module (app/reputation/price-index.server.ts) feeds it the sales.

/** The index is shown, and used by the low-price flag, once a model has at least this many sales. */
export const INDEX_MIN_SALES = 3;

/**
 * A price under this share of the index's median is flagged for the review desk. Half the median is
 * common practice among marketplaces' fraud checks, not a published figure.
 */
export const LOW_PRICE_RATIO = 0.5;

export interface Sale {
  priceMinor: number;
  benchVerified: boolean;
}

export interface IndexGroup {
  count: number;
  medianMinor: number;
  lowMinor: number;
  highMinor: number;
}

export interface IndexFigures {
  all: IndexGroup;
  verified: IndexGroup | null;
  unverified: IndexGroup | null;
}

/** The median of whole minor units: the middle one, or the two middle ones' mean rounded half up. */
export function medianMinor(values: readonly number[]): number {
  if (values.length === 0) throw new Error("the median of no values");
  const sorted = [...values].sort((a, b) => a - b);
  const mid = sorted.length >> 1;
  return sorted.length % 2 ? sorted[mid] : Math.round((sorted[mid - 1] + sorted[mid]) / 2);
}

export function indexGroup(prices: readonly number[]): IndexGroup | null {
  if (prices.length === 0) return null;
  return { count: prices.length, medianMinor: medianMinor(prices), lowMinor: Math.min(...prices), highMinor: Math.max(...prices) };
}

/** The figures for a model's sales; null below INDEX_MIN_SALES (too few to say anything). */
export function indexFigures(sales: readonly Sale[]): IndexFigures | null {
  if (sales.length < INDEX_MIN_SALES) return null;
  return {
    all: indexGroup(sales.map((s) => s.priceMinor))!,
    verified: indexGroup(sales.filter((s) => s.benchVerified).map((s) => s.priceMinor)),
    unverified: indexGroup(sales.filter((s) => !s.benchVerified).map((s) => s.priceMinor)),
  };
}

/** Whether `priceMinor` is far enough under the median to put in front of a moderator. */
export function isFarBelow(priceMinor: number, figures: IndexFigures): boolean {
  return priceMinor < figures.all.medianMinor * LOW_PRICE_RATIO;
}

/** A maker or model as the index matches it: trimmed, case and inner spacing ignored. */
export function indexKey(text: string | null | undefined): string {
  return (text ?? "").trim().replace(/\s+/g, " ").toLowerCase();
}
