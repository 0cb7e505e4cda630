// What sellers type into the listing form, read into stored values: prices to integer minor units,
// "1975–79" to a year span, "14.2 kg" to grams. Isomorphic: the form checks as the seller types and the
// server reads the same way. Every parser returns a value or a message for the field.

export type Parsed<T> = { ok: true; value: T } | { ok: false; message: string };
const ok = <T>(value: T): Parsed<T> => ({ ok: true, value });
const no = (message: string): Parsed<never> => ({ ok: false, message });

/** Currencies a listing may be priced in, with their minor-unit digits (ISO 4217). */
export const CURRENCIES = {
  EUR: 2,
  GBP: 2,
  USD: 2,
  CHF: 2,
  SEK: 2,
  NOK: 2,
  DKK: 2,
  PLN: 2,
  CZK: 2,
  CAD: 2,
  AUD: 2,
  JPY: 0,
} as const;
export type Currency = keyof typeof CURRENCIES;
export const CURRENCY_CODES = Object.keys(CURRENCIES) as Currency[];
export function isCurrency(code: string): code is Currency {
  return Object.hasOwn(CURRENCIES, code);
}

/** The highest price a listing may ask, in major units (keeps minor units well inside a 32-bit column). */
export const MAX_PRICE_MAJOR = 1_000_000;

const SYMBOLS = /[€£$¥]|\b(?:EUR|GBP|USD|CHF|SEK|NOK|DKK|PLN|CZK|CAD|AUD|JPY|kr|zł|Kč|Fr\.?)\b/gi;

/**
 * A typed price to integer minor units, without floating point: "1,250" → 125000, "1.250,50" → 125050,
 * "€ 899.9" → 89990, "1 250" → 125000. The separator followed by one or two digits at the end is the decimal
 * mark; one followed by exactly three digits, or used more than once, groups thousands.
 */
export function parsePrice(text: string, currency: Currency, opts: { allowZero?: boolean } = {}): Parsed<number> {
  const digits = CURRENCIES[currency];
  const raw = (text ?? "").replace(SYMBOLS, "").replace(/[\s\u00a0\u202f']/g, "");
  if (!raw) return no("Enter a price.");
  if (raw.startsWith("-") || raw.startsWith("−")) return no("A price cannot be negative.");
  if (!/^[\d.,]+$/.test(raw)) return no(`"${text.trim()}" is not a price; type it like 1250 or 1,250.00.`);
  let whole = raw;
  let fraction = "";
  const lastSep = Math.max(raw.lastIndexOf("."), raw.lastIndexOf(","));
  if (lastSep >= 0) {
    const sep = raw[lastSep];
    const after = raw.slice(lastSep + 1);
    const usedOnce = raw.indexOf(sep) === lastSep;
    const otherSepBefore = raw.slice(0, lastSep).includes(sep === "." ? "," : ".");
    const before = raw.slice(0, lastSep);
    // A single separator groups thousands only after 1–3 leading digits ("1,250"; not "1250.999" or "0.250").
    const groups = usedOnce && after.length === 3 && /^[1-9]\d{0,2}$/.test(before);
    const isDecimal = (usedOnce && !groups) || otherSepBefore;
    if (isDecimal) {
      whole = raw.slice(0, lastSep);
      fraction = after;
    }
  }
  whole = whole.replace(/[.,]/g, "");
  if (!/^\d*$/.test(whole) || !/^\d*$/.test(fraction) || (whole === "" && fraction === ""))
    return no(`"${text.trim()}" is not a price; type it like 1250 or 1,250.00.`);
  if (fraction.length > digits)
    return no(digits === 0 ? `${currency} prices have no decimals.` : `Use at most ${digits} decimals for ${currency}.`);
  const major = Number(whole || "0");
  if (major > MAX_PRICE_MAJOR) return no(`Prices above ${MAX_PRICE_MAJOR.toLocaleString("en-GB")} ${currency} are not accepted.`);
  const minor = major * 10 ** digits + Number(fraction.padEnd(digits, "0") || "0");
  if (minor === 0 && !opts.allowZero) return no("A price must be above zero.");
  return ok(minor);
}

/** Minor units back to what the input shows: 125000 → "1250", 125050 → "1250.50". */
export function priceInputValue(minor: number | null | undefined, currency: Currency): string {
  if (minor === null || minor === undefined) return "";
  const digits = CURRENCIES[currency];
  if (digits === 0) return String(minor);
  const major = Math.floor(minor / 10 ** digits);
  const frac = minor % 10 ** digits;
  return frac === 0 ? String(major) : `${major}.${String(frac).padStart(digits, "0")}`;
}

export type Era = { from: number | null; to: number | null };
export const FIRST_YEAR = 1900;
export function latestYear(now = new Date()): number {
  return now.getUTCFullYear() + 1;
}

/**
 * A year or an era as sellers write it: "1978", "1975-79", "1975–1979", "1970s", "late 1970s", "c. 1980",
 * "circa 1980", "around 1980". A decade gives its whole span; "c." gives a start only.
 */
export function parseEra(text: string, now = new Date()): Parsed<Era> {
  const t = (text ?? "").trim().toLowerCase().replace(/[–—]/g, "-").replace(/\s+/g, " ");
  if (!t) return ok({ from: null, to: null });
  const inRange = (y: number) => y >= FIRST_YEAR && y <= latestYear(now);
  const outOfRange = no(`Give a year between ${FIRST_YEAR} and ${latestYear(now)}.`);
  let m = /^(?:early |mid |mid-|late )?(\d{4})'?s$/.exec(t);
  if (m) {
    const decade = Number(m[1]);
    if (decade % 10 !== 0) return no(`"${text.trim()}" is not a decade; write e.g. 1970s.`);
    const part = t.startsWith("early") ? [0, 3] : t.startsWith("mid") ? [3, 6] : t.startsWith("late") ? [6, 9] : [0, 9];
    const from = decade + part[0];
    const to = Math.min(decade + part[1], latestYear(now));
    return inRange(from) ? ok({ from, to }) : outOfRange;
  }
  m = /^(?:c\.?|ca\.?|circa|around|about) ?(\d{4})$/.exec(t);
  if (m) {
    const y = Number(m[1]);
    return inRange(y) ? ok({ from: y, to: null }) : outOfRange;
  }
  m = /^(\d{4})$/.exec(t);
  if (m) {
    const y = Number(m[1]);
    return inRange(y) ? ok({ from: y, to: y }) : outOfRange;
  }
  m = /^(\d{4}) ?(?:-|to|\/) ?(\d{2}|\d{4})$/.exec(t);
  if (m) {
    const from = Number(m[1]);
    const to = m[2].length === 2 ? Math.floor(from / 100) * 100 + Number(m[2]) : Number(m[2]);
    if (!inRange(from) || !inRange(to)) return outOfRange;
    if (to < from) return no("The era must run forwards, e.g. 1975–79.");
    return ok({ from, to });
  }
  return no(`"${text.trim()}" is not a year or era; write e.g. 1978, 1975–79 or 1970s.`);
}

/** The era as the input shows it again (round-trips through parseEra). */
export function eraInputValue(from: number | null | undefined, to: number | null | undefined): string {
  if (!from && !to) return "";
  if (from && !to) return `c. ${from}`;
  if (!from && to) return String(to);
  if (from === to) return String(from);
  return `${from}–${to}`;
}

/** A decimal number as typed with a point or a comma: "14,2" → 14.2. */
export function parseDecimal(text: string): number | null {
  const t = (text ?? "").trim().replace(/\s/g, "").replace(",", ".");
  if (!/^\d+(?:\.\d+)?$|^\.\d+$/.test(t)) return null;
  return Number(t);
}

const LB_G = 453.59237; // the international avoirdupois pound (1959 agreement)

/** A weight as typed, "14.2", "14,2 kg", "850 g" or "31 lb", to whole grams; a bare number is kilograms. */
export function parseWeight(text: string): Parsed<number | null> {
  const t = (text ?? "").trim().toLowerCase();
  if (!t) return ok(null);
  const m = /^([\d.,\s]+?)\s*(kg|g|lb|lbs)?$/.exec(t);
  const n = m ? parseDecimal(m[1]) : null;
  if (!m || n === null) return no(`"${text.trim()}" is not a weight; type it in kilograms, e.g. 14.2.`);
  const grams = Math.round(m[2] === "g" ? n : m[2]?.startsWith("lb") ? n * LB_G : n * 1000);
  if (grams <= 0) return no("A weight must be above zero.");
  if (grams > 500_000) return no("Weights above 500 kg are not accepted; ship such units as freight by arrangement.");
  return ok(grams);
}

export function weightInputValue(grams: number | null | undefined): string {
  if (!grams) return "";
  return String(Math.round(grams / 10) / 100);
}

/** A boxed dimension in centimetres ("62", "62.5", "62,5 cm", "620 mm") to whole millimetres. */
export function parseLength(text: string): Parsed<number | null> {
  const t = (text ?? "").trim().toLowerCase();
  if (!t) return ok(null);
  const m = /^([\d.,\s]+?)\s*(cm|mm|m)?$/.exec(t);
  const n = m ? parseDecimal(m[1]) : null;
  if (!m || n === null) return no(`"${text.trim()}" is not a length; type it in centimetres, e.g. 62.`);
  const mm = Math.round(m[2] === "mm" ? n : m[2] === "m" ? n * 1000 : n * 10);
  if (mm <= 0) return no("A dimension must be above zero.");
  if (mm > 5000) return no("Boxes longer than 5 m are not accepted.");
  return ok(mm);
}

export function lengthInputValue(mm: number | null | undefined): string {
  if (!mm) return "";
  return String(mm / 10);
}

/** A whole number in a range, or null when blank. */
export function parseWhole(text: string, min: number, max: number, what: string): Parsed<number | null> {
  const t = (text ?? "").trim();
  if (!t) return ok(null);
  if (!/^\d+$/.test(t)) return no(`Give ${what} as a whole number.`);
  const n = Number(t);
  if (n < min || n > max) return no(`Give ${what} between ${min} and ${max}.`);
  return ok(n);
}
