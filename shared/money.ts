// Money as people read it. Free of zod on purpose: the root layout's price components import it, and in
// the browser nothing may build a zod schema before root.tsx has turned zod's eval probe off
// (app/zod-jitless.ts), or the Content-Security-Policy reports a violation on every page.

// Building an Intl.NumberFormat costs far more than formatting with one, and a list page formats a
// price per card: keep one per locale, currency and style.
const priceFormats = new Map<string, Intl.NumberFormat>();
function priceFormat(locale: string, currency: string, fractionDigits?: [number, number]): Intl.NumberFormat {
  const key = `${locale}|${currency}|${fractionDigits?.join(",") ?? ""}`;
  let fmt = priceFormats.get(key);
  if (!fmt) {
    fmt = new Intl.NumberFormat(locale, {
      style: "currency",
      currency,
      ...(fractionDigits ? { minimumFractionDigits: fractionDigits[0], maximumFractionDigits: fractionDigits[1] } : {}),
    });
    if (priceFormats.size > 200) priceFormats.clear();
    priceFormats.set(key, fmt);
  }
  return fmt;
}

// The listing currencies as en-GB writes them (CLDR's en-GB currency symbols, the form ICU's
// Intl.NumberFormat gives them; tests/unit/catalogue.test.ts checks every one against it): a symbol, or
// the code and a no-break space. A price in one of these is written by hand below: the first
// Intl.NumberFormat a page builds loads the runtime's locale data, some 15 to 50 ms of a phone's main
// thread in one piece while the page hydrates, and these are the only prices a public page shows.
const EN_GB_SYMBOLS: Partial<Record<string, string>> = { EUR: "€", GBP: "£", USD: "US$", CAD: "CA$", AUD: "A$", JPY: "JP¥" };
const EN_GB_CODES = ["CHF", "SEK", "NOK", "DKK", "PLN", "CZK"];

/** Integer minor units to a display price, respecting the currency's own decimals (JPY has none). */
export function formatPrice(minorUnits: number, currency: string, opts: { locale?: string } = {}): string {
  const locale = opts.locale ?? "en-GB";
  const prefix = Object.hasOwn(EN_GB_SYMBOLS, currency)
    ? EN_GB_SYMBOLS[currency]
    : EN_GB_CODES.includes(currency)
      ? `${currency}\u00a0`
      : null;
  if (locale === "en-GB" && prefix && Number.isSafeInteger(minorUnits)) {
    // Two minor digits (ISO 4217) but for the yen, which has none; whole prices read calmer without ".00".
    const scale = currency === "JPY" ? 1 : 100;
    const amount = (Math.abs(minorUnits) / scale).toFixed(minorUnits % scale ? 2 : 0);
    return `${minorUnits < 0 ? "-" : ""}${prefix}${amount.replace(/\B(?=(\d{3})+(?!\d))/g, ",")}`;
  }
  const digits = priceFormat(locale, currency).resolvedOptions().maximumFractionDigits ?? 2;
  const major = minorUnits / 10 ** digits;
  const whole = Number.isInteger(major);
  return priceFormat(locale, currency, [whole ? 0 : digits, digits]).format(major);
}
