import { describe, expect, it } from "vitest";
import { currencyAfterCountryChange, listingCurrencyFor, sameMinorDigits } from "@shared/listing-currency";

// The currency follows the seller's country unless they change it. Expected currencies are the
// countries' legal tender (ISO 4217): sterling in the United Kingdom, the euro in Germany, Ireland,
// Croatia and Bulgaria (since 1 January 2026), the Swiss franc in Switzerland and Liechtenstein,
// the yen in Japan (no minor unit).

describe("a listing's currency", () => {
  it("starts in the country's currency", () => {
    expect(listingCurrencyFor("GB")).toBe("GBP");
    expect(listingCurrencyFor("DE")).toBe("EUR");
    expect(listingCurrencyFor("IE")).toBe("EUR");
    expect(listingCurrencyFor("HR")).toBe("EUR");
    expect(listingCurrencyFor("BG")).toBe("EUR");
    expect(listingCurrencyFor("CH")).toBe("CHF");
    expect(listingCurrencyFor("LI")).toBe("CHF");
    expect(listingCurrencyFor("SE")).toBe("SEK");
    expect(listingCurrencyFor("JP")).toBe("JPY");
    expect(listingCurrencyFor(null)).toBe("EUR");
  });

  it("follows a new country while it was the old country's", () => {
    expect(currencyAfterCountryChange({ country: "DE", currency: "EUR" }, { country: "GB", currency: "EUR" })).toBe("GBP");
    expect(currencyAfterCountryChange({ country: null, currency: "EUR" }, { country: "GB", currency: "EUR" })).toBe("GBP");
    expect(currencyAfterCountryChange({ country: "GB", currency: "GBP" }, { country: "SE", currency: "GBP" })).toBe("SEK");
  });

  it("keeps a currency the seller chose", () => {
    // Chosen in the same step as the country.
    expect(currencyAfterCountryChange({ country: "DE", currency: "EUR" }, { country: "GB", currency: "USD" })).toBe("USD");
    // Chosen earlier: a UK seller pricing in euros keeps euros when the unit moves to Sweden.
    expect(currencyAfterCountryChange({ country: "GB", currency: "EUR" }, { country: "SE", currency: "EUR" })).toBe("EUR");
    // The country unchanged: nothing follows.
    expect(currencyAfterCountryChange({ country: "GB", currency: "GBP" }, { country: "GB", currency: "EUR" })).toBe("EUR");
  });

  it("knows which currencies read a typed price alike", () => {
    expect(sameMinorDigits("EUR", "GBP")).toBe(true);
    expect(sameMinorDigits("EUR", "JPY")).toBe(false);
  });
});
