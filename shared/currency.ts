import { formatPrice } from "./money";
import { CURRENCIES, isCurrency, type Currency } from "./listing-input";

// Prices stay in the seller's currency; a buyer may also see an approximate figure in their own
// (docs/decisions/0013). The rates are the admin's table (`currency_rates`: units of a currency per
// euro), passed in as data so the server and the browser convert alike. Integer arithmetic only: a
// rate is a decimal string, read as an integer count of millionths.

/** One row of the rate table as pages receive it: "0.86" GBP per euro, 2 minor digits. */
export interface Rate {
  perEur: string;
  minorDigits: number;
}
export type Rates = Partial<Record<string, Rate>>;

/** A rate has at most this many decimals (the admin form refuses more). */
export const RATE_DECIMALS = 6;
const RATE_SCALE = 10n ** BigInt(RATE_DECIMALS);

/** "0.86" → 860000n (millionths); null when not a positive decimal. More decimals round half up. */
export function rateMillionths(perEur: string): bigint | null {
  const m = /^(\d{1,12})(?:\.(\d+))?$/.exec(perEur.trim());
  if (!m) return null;
  const fraction = m[2] ?? "";
  let value = BigInt(m[1]) * RATE_SCALE + BigInt(fraction.slice(0, RATE_DECIMALS).padEnd(RATE_DECIMALS, "0"));
  if (fraction.length > RATE_DECIMALS && Number(fraction[RATE_DECIMALS]) >= 5) value += 1n;
  return value > 0n ? value : null;
}

/** a / b rounded half away from zero (b > 0), as PostgreSQL's round() does for numeric. */
function divRound(a: bigint, b: bigint): bigint {
  const q = (2n * (a < 0n ? -a : a) + b) / (2n * b);
  return a < 0n ? -q : q;
}

/**
 * The ONE conversion: `amountMinor` of `from` in minor units of `to`, at the rates given (both
 * through the euro, as the table is kept). `whole` rounds to whole units of `to` in the same step
 * (approximate figures). Null when either currency has no rate, or the amount or the result is not a safe integer.
 */
export function convertMinor(amountMinor: number, from: string, to: string, rates: Rates, opts: { whole?: boolean } = {}): number | null {
  if (!Number.isSafeInteger(amountMinor)) return null;
  const rf = rates[from];
  const rt = rates[to];
  const fromRate = rf ? rateMillionths(rf.perEur) : null;
  const toRate = rt ? rateMillionths(rt.perEur) : null;
  if (!rf || !rt || fromRate === null || toRate === null) return null;
  // amount · 10^-dFrom / fromRate · toRate · 10^dTo, rounded to minor (or whole) units of `to`.
  const wholeDigits = opts.whole ? BigInt(rt.minorDigits) : 0n;
  const numerator = BigInt(amountMinor) * toRate * 10n ** BigInt(rt.minorDigits);
  const denominator = fromRate * 10n ** BigInt(rf.minorDigits) * 10n ** wholeDigits;
  const result = divRound(numerator, denominator) * 10n ** wholeDigits;
  return result <= BigInt(Number.MAX_SAFE_INTEGER) && result >= -BigInt(Number.MAX_SAFE_INTEGER) ? Number(result) : null;
}

/** A price as a buyer sees it: the seller's figure, and an approximate one in the buyer's currency when they differ. */
export interface ShownPrice {
  text: string;
  /** "€1,395" (whole units), or null when the currencies are the same or no rate is known. */
  approx: string | null;
}

export function showPrice(minor: number, currency: string, display: string | null, rates: Rates | null): ShownPrice {
  const text = formatPrice(minor, currency);
  if (!display || !rates || display === currency) return { text, approx: null };
  const converted = convertMinor(minor, currency, display, rates, { whole: true });
  return { text, approx: converted === null ? null : formatPrice(converted, display) };
}

// The currency a country pays in, for the display currency's first guess. Euro countries and
// anything unknown fall back to the euro.
const COUNTRY_CURRENCY: Record<string, Currency> = {
  GB: "GBP",
  GG: "GBP",
  JE: "GBP",
  IM: "GBP",
  US: "USD",
  CH: "CHF",
  LI: "CHF",
  SE: "SEK",
  NO: "NOK",
  DK: "DKK",
  FO: "DKK",
  GL: "DKK",
  PL: "PLN",
  CZ: "CZK",
  CA: "CAD",
  AU: "AUD",
  JP: "JPY",
};

export const DEFAULT_DISPLAY_CURRENCY: Currency = "EUR";

export function currencyForCountry(country: string | null | undefined): Currency {
  return (country && COUNTRY_CURRENCY[country.toUpperCase()]) || DEFAULT_DISPLAY_CURRENCY;
}

/** A currency code from a cookie or a form, or null. */
export function readCurrency(value: unknown): Currency | null {
  if (typeof value !== "string") return null;
  const code = value.trim().toUpperCase();
  return isCurrency(code) ? code : null;
}

/**
 * Names for the selector. The zloty as ISO 4217 names it (Zloty), without the ł: that one letter in every
 * page's footer fetched the fonts' Latin Extended subset and laid the whole page out again.
 */
export const CURRENCY_NAMES: Record<Currency, string> = {
  EUR: "Euro",
  GBP: "Pound sterling",
  USD: "US dollar",
  CHF: "Swiss franc",
  SEK: "Swedish krona",
  NOK: "Norwegian krone",
  DKK: "Danish krone",
  PLN: "Polish zloty",
  CZK: "Czech koruna",
  CAD: "Canadian dollar",
  AUD: "Australian dollar",
  JPY: "Japanese yen",
};

/** The minor-unit digits of a listing currency (for rates built in tests and fallbacks). */
export function minorDigits(currency: Currency): number {
  return CURRENCIES[currency];
}
