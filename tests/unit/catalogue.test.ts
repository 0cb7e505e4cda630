import fc from "fast-check";
import { describe, expect, it, vi } from "vitest";
import {
  CATEGORIES,
  CATEGORY_LABELS,
  COSMETIC_GRADE_TEXT,
  SERVICE_STATE_TEXT,
  categoryFromSlug,
  formatEra,
  formatPrice,
  formatWeight,
} from "@shared/catalogue";
import { ShippingOptionsSchema } from "@shared/catalogue-schemas";
import { CURRENCY_CODES } from "@shared/listing-input";
import { leadFigure, listingFacets, publishState } from "@shared/listing-facets";
import { checkBenchSheet, doctoredIntegratedAmplifierSheet, exampleIntegratedAmplifierSheet } from "@shared/bench";

describe("catalogue words", () => {
  it("uses Loadline's condition words with a line for sellers", () => {
    expect(Object.values(COSMETIC_GRADE_TEXT).map((g) => g.label)).toEqual(["Showroom", "Clean", "Lived-in", "Rough"]);
    expect(Object.values(SERVICE_STATE_TEXT).map((s) => s.label)).toEqual([
      "Serviced & measured",
      "Working, unserviced",
      "Needs work",
      "Parts only",
    ]);
    for (const t of [...Object.values(COSMETIC_GRADE_TEXT), ...Object.values(SERVICE_STATE_TEXT)]) {
      expect(t.description.length).toBeGreaterThan(20);
      expect(t.description.length).toBeLessThan(140);
    }
  });

  it("maps every category to a unique URL slug and back", () => {
    const slugs = CATEGORIES.map((c) => CATEGORY_LABELS[c].slug);
    expect(new Set(slugs).size).toBe(CATEGORIES.length);
    for (const c of CATEGORIES) expect(categoryFromSlug(CATEGORY_LABELS[c].slug)).toBe(c);
    expect(categoryFromSlug("jukeboxes")).toBeNull();
    expect(categoryFromSlug(undefined)).toBeNull();
  });
});

describe("formatting", () => {
  it("writes a year, a span or a decade", () => {
    expect(formatEra(1978, 1978)).toBe("1978");
    expect(formatEra(1975, 1979)).toBe("1975–79");
    expect(formatEra(1970, 1979)).toBe("the 1970s");
    expect(formatEra(1998, 2003)).toBe("1998–2003");
    expect(formatEra(1980, null)).toBe("c. 1980");
    expect(formatEra(null, null)).toBeNull();
  });

  it("shows money from integer minor units with the currency's own decimals", () => {
    expect(formatPrice(68_500, "GBP")).toBe("£685");
    expect(formatPrice(68_550, "GBP")).toBe("£685.50");
    expect(formatPrice(145_000, "EUR")).toBe("€1,450");
    expect(formatPrice(98_000, "JPY")).toBe("JP¥98,000"); // yen has no minor unit (ISO 4217)
  });

  it("formats each price as a freshly built formatter would, in any order of currencies and locales", () => {
    // The formatters are kept between calls; a whole price after a fractional one must not reuse its style.
    const fresh = (minor: number, currency: string, locale: string) => {
      const digits = new Intl.NumberFormat(locale, { style: "currency", currency }).resolvedOptions().maximumFractionDigits ?? 2;
      const major = minor / 10 ** digits;
      const min = Number.isInteger(major) ? 0 : digits;
      return new Intl.NumberFormat(locale, {
        style: "currency",
        currency,
        minimumFractionDigits: min,
        maximumFractionDigits: digits,
      }).format(major);
    };
    fc.assert(
      fc.property(
        fc.array(
          fc.tuple(
            fc.integer({ min: 0, max: 10_000_000 }),
            fc.constantFrom("GBP", "EUR", "JPY", "USD", "KWD"),
            fc.constantFrom("en-GB", "de-DE"),
          ),
          { minLength: 1, maxLength: 12 },
        ),
        (calls) => {
          for (const [minor, currency, locale] of calls)
            expect(formatPrice(minor, currency, { locale })).toBe(fresh(minor, currency, locale));
        },
      ),
    );
  });

  it("writes every listing currency in en-GB exactly as Intl.NumberFormat does, without building one", () => {
    // The oracle is the runtime's ICU (CLDR's en-GB symbols and grouping); formatPrice writes these by hand
    // so that a page hydrating its prices does not load the locale data.
    const viaIntl = (minor: number, currency: string) => {
      const digits = new Intl.NumberFormat("en-GB", { style: "currency", currency }).resolvedOptions().maximumFractionDigits ?? 2;
      const major = minor / 10 ** digits;
      const min = Number.isInteger(major) ? 0 : digits;
      return new Intl.NumberFormat("en-GB", {
        style: "currency",
        currency,
        minimumFractionDigits: min,
        maximumFractionDigits: digits,
      }).format(major);
    };
    const pairs = fc.sample(fc.tuple(fc.integer({ min: -1e12, max: 1e12 }), fc.constantFrom(...CURRENCY_CODES)), {
      numRuns: 2000,
      seed: 41,
    });
    const cases = [
      ...CURRENCY_CODES.flatMap((c) => [0, 1, 5, -5, 99, 100, 68_500, 68_550, 100_000_000].map((m) => [m, c] as const)),
      ...pairs,
    ];
    const expected = cases.map(([minor, currency]) => viaIntl(minor, currency));
    const built = vi.spyOn(Intl, "NumberFormat");
    try {
      expect(cases.map(([minor, currency]) => formatPrice(minor, currency))).toEqual(expected);
      expect(built).not.toHaveBeenCalled();
    } finally {
      built.mockRestore();
    }
  });

  it("writes weights in kg above a kilogram", () => {
    expect(formatWeight(850)).toBe("850 g");
    expect(formatWeight(11_200)).toBe("11.2 kg");
    expect(formatWeight(34_000)).toBe("34 kg");
  });
});

describe("shipping options", () => {
  it("accepts collection, parcel and freight with prices per zone in minor units", () => {
    const ok = ShippingOptionsSchema.safeParse([
      { method: "collection", note: "By appointment" },
      { method: "parcel", prices: { domestic: 2500, nearby: 6000 } },
      { method: "freight", prices: { domestic: 9500 } },
    ]);
    expect(ok.success).toBe(true);
  });

  it("refuses a method twice, a method without any price, and fractional money", () => {
    expect(ShippingOptionsSchema.safeParse([{ method: "collection" }, { method: "collection" }]).success).toBe(false);
    expect(ShippingOptionsSchema.safeParse([{ method: "parcel", prices: {} }]).success).toBe(false);
    expect(ShippingOptionsSchema.safeParse([{ method: "parcel", prices: { domestic: 24.5 } }]).success).toBe(false);
    expect(ShippingOptionsSchema.safeParse([{ method: "drone", prices: { domestic: 100 } }]).success).toBe(false);
  });
});

describe("listing state from the bench", () => {
  it("leads a card with power into 8 Ω of the weaker channel, with its conditions", () => {
    // Example sheet: 66 W left, 65 W right into 8 Ω at 1 kHz, 0.1 % THD, both driven.
    expect(leadFigure(exampleIntegratedAmplifierSheet())).toEqual({
      label: "Power into 8 Ω",
      value: "65",
      unit: "W",
      conditions: "into 8 Ω, 1 kHz, 0.1 % THD, both channels driven",
    });
    expect(listingFacets(exampleIntegratedAmplifierSheet())).toMatchObject({ power8ohmW: 65, power4ohmW: 96 });
    expect(listingFacets(null).power8ohmW).toBeNull();
  });

  it("goes live with the mark when every check passes and is held when one is implausible", () => {
    expect(publishState(checkBenchSheet(exampleIntegratedAmplifierSheet()))).toEqual({
      status: "live",
      benchVerified: true,
      heldReason: null,
    });
    const held = publishState(checkBenchSheet(doctoredIntegratedAmplifierSheet()));
    expect(held.status).toBe("held");
    expect(held.benchVerified).toBe(false);
    expect(held.heldReason).toMatch(/implausible/);
    expect(publishState(null)).toEqual({ status: "live", benchVerified: false, heldReason: null });
  });
});
