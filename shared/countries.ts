// Countries a listing may be located in (ISO 3166-1 alpha-2). Names come from the runtime's own
// locale data (Intl.DisplayNames), so they are never typed by hand.
export const COUNTRY_CODES = [
  "AT",
  "AU",
  "BE",
  "BG",
  "CA",
  "CH",
  "CY",
  "CZ",
  "DE",
  "DK",
  "EE",
  "ES",
  "FI",
  "FR",
  "GB",
  "GR",
  "HR",
  "HU",
  "IE",
  "IS",
  "IT",
  "JP",
  "LI",
  "LT",
  "LU",
  "LV",
  "MT",
  "NL",
  "NO",
  "NZ",
  "PL",
  "PT",
  "RO",
  "SE",
  "SI",
  "SK",
  "US",
] as const;
export type CountryCode = (typeof COUNTRY_CODES)[number];

let names: Intl.DisplayNames | undefined;
export function countryName(code: string): string {
  names ??= new Intl.DisplayNames(["en-GB"], { type: "region" });
  return names.of(code) ?? code;
}

/** Country options sorted by name, for a select. */
export function countryOptions(): { value: string; label: string }[] {
  return COUNTRY_CODES.map((c) => ({ value: c, label: countryName(c) })).sort((a, b) => a.label.localeCompare(b.label, "en-GB"));
}
