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

// Reading a format's options builds a fresh object each time: a currency's decimals are kept too.
const digitsOf = new Map<string, number>();
function currencyDigits(locale: string, currency: string): number {
  const key = `${locale}|${currency}`;
  let digits = digitsOf.get(key);
  if (digits === undefined) {
    digits = priceFormat(locale, currency).resolvedOptions().maximumFractionDigits ?? 2;
    if (digitsOf.size > 200) digitsOf.clear();
    digitsOf.set(key, digits);
  }
  return digits;
}

/** Integer minor units to a display price, respecting the currency's own decimals (JPY has none). */
export function formatPrice(minorUnits: number, currency: string, opts: { locale?: string } = {}): string {
  const locale = opts.locale ?? "en-GB";
  const digits = currencyDigits(locale, currency);
  const major = minorUnits / 10 ** digits;
  // Whole prices read calmer without ".00".
  const whole = Number.isInteger(major);
  return priceFormat(locale, currency, [whole ? 0 : digits, digits]).format(major);
}
