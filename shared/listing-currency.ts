// A listing's currency follows the seller's country until the seller chooses another: a new draft
// starts in its country's currency (GBP for the United Kingdom, EUR in the euro area; shared/currency.ts
// holds the table), and moving the unit to another country moves the currency with it, unless the
// seller had set a currency other than the country's. Isomorphic: the form applies it as the seller
// picks a country, the server when a plain form saves a draft.
import { currencyForCountry } from "./currency";
import { CURRENCIES, isCurrency, type Currency } from "./listing-input";

/** The currency a listing in this country starts in (the euro for a country whose own is not offered). */
export function listingCurrencyFor(country: string | null | undefined): Currency {
  return currencyForCountry(country);
}

type Place = { country: string | null | undefined; currency: string };

/**
 * The currency after a change from `before` to `after`: the country's when the currency was following
 * the old country and the seller did not change it in the same step; otherwise what the seller has.
 */
export function currencyAfterCountryChange(before: Place, after: Place): string {
  if ((after.country ?? null) === (before.country ?? null)) return after.currency;
  if (after.currency !== before.currency) return after.currency;
  if (before.currency !== listingCurrencyFor(before.country)) return after.currency;
  return listingCurrencyFor(after.country);
}

/** Minor-unit digits alike, so a price typed in one reads the same in the other (JPY has none). */
export function sameMinorDigits(a: string, b: string): boolean {
  return isCurrency(a) && isCurrency(b) && CURRENCIES[a] === CURRENCIES[b];
}
