import { SHIPPING_ZONES, type ShippingZone } from "@shared/catalogue";
import { isOneOf } from "@shared/one-of";

// Which of a seller's shipping zones a visitor is in. Zones are relative to the seller's country:
// domestic, neighbouring countries, the rest of the world. The visitor's country is a guess from the
// browser's language tags (Accept-Language); the page always lets them pick another zone.

// Countries that share a land border, a fixed link or a short ferry crossing (common knowledge; a
// seller's "nearby" price is for such trips). Each pair once; the map below makes it symmetric.
const NEIGHBOUR_PAIRS = (
  "AT-DE AT-CZ AT-SK AT-HU AT-SI AT-IT AT-CH AT-LI BE-FR BE-LU BE-DE BE-NL BG-RO BG-RS BG-MK BG-GR BG-TR " +
  "CH-DE CH-FR CH-IT CH-LI CZ-DE CZ-PL CZ-SK DE-DK DE-PL DE-FR DE-LU DE-NL DK-SE EE-LV EE-FI ES-PT ES-FR ES-AD " +
  "FI-SE FI-NO FR-LU FR-IT FR-AD FR-MC FR-GB GB-IE GR-AL GR-MK GR-TR HR-SI HR-HU HR-RS HR-BA HR-ME HU-SK HU-RO " +
  "HU-RS HU-SI HU-UA IT-SI IT-SM IT-VA LT-LV LT-PL LV-EE NO-SE PL-SK PL-UA PL-LT RO-MD RO-RS RO-UA SK-UA " +
  "US-CA US-MX AU-NZ"
).split(" ");

const NEIGHBOURS = new Map<string, Set<string>>();
for (const pair of NEIGHBOUR_PAIRS) {
  const [a, b] = pair.split("-");
  for (const [x, y] of [
    [a, b],
    [b, a],
  ]) {
    if (!NEIGHBOURS.has(x)) NEIGHBOURS.set(x, new Set());
    NEIGHBOURS.get(x)!.add(y);
  }
}

/** The countries in a country's "nearby" shipping zone. */
export function neighboursOf(country: string): string[] {
  return [...(NEIGHBOURS.get(country.toUpperCase()) ?? [])];
}

export function areNeighbours(a: string, b: string): boolean {
  return NEIGHBOURS.get(a.toUpperCase())?.has(b.toUpperCase()) ?? false;
}

// A bare language tag points at a country only where one country is the obvious home of it.
const LANGUAGE_HOME: Record<string, string> = {
  de: "DE",
  fr: "FR",
  nl: "NL",
  it: "IT",
  es: "ES",
  pt: "PT",
  sv: "SE",
  da: "DK",
  nb: "NO",
  nn: "NO",
  no: "NO",
  fi: "FI",
  pl: "PL",
  cs: "CZ",
  sk: "SK",
  hu: "HU",
  el: "GR",
  ro: "RO",
  bg: "BG",
  hr: "HR",
  sl: "SI",
  et: "EE",
  lv: "LV",
  lt: "LT",
  ja: "JP",
  ko: "KR",
};

/** The visitor's likely country from Accept-Language ("de-AT,de;q=0.9" → AT), or null. */
export function countryFromAcceptLanguage(header: string | null | undefined): string | null {
  if (!header) return null;
  const tags = header
    .split(",")
    .map((part, i) => {
      const [tag, ...params] = part.trim().split(";");
      const q = params.map((p) => p.trim()).find((p) => p.startsWith("q="));
      const weight = q ? Number(q.slice(2)) : 1;
      return { tag: tag.trim(), weight: Number.isFinite(weight) ? weight : 0, i };
    })
    .filter((t) => t.tag && t.tag !== "*" && t.weight > 0)
    .sort((a, b) => b.weight - a.weight || a.i - b.i);
  for (const { tag } of tags) {
    const region = tag
      .split("-")
      .slice(1)
      .find((s) => /^[A-Za-z]{2}$/.test(s));
    if (region) return region.toUpperCase();
  }
  for (const { tag } of tags) {
    const home = LANGUAGE_HOME[tag.split("-")[0].toLowerCase()];
    if (home) return home;
  }
  return null;
}

/** The zone a parcel from `sellerCountry` to `visitorCountry` falls in; domestic when the visitor is unknown. */
export function zoneFor(sellerCountry: string | null, visitorCountry: string | null): ShippingZone {
  if (!sellerCountry || !visitorCountry) return "domestic";
  if (sellerCountry.toUpperCase() === visitorCountry.toUpperCase()) return "domestic";
  return areNeighbours(sellerCountry, visitorCountry) ? "nearby" : "worldwide";
}

export function parseZone(value: string | null | undefined): ShippingZone | null {
  return isOneOf(SHIPPING_ZONES, value) ? value : null;
}
