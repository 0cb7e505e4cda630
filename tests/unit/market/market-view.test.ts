import { describe, expect, it } from "vitest";
import fc from "fast-check";
import { COSMETIC_GRADES } from "@shared/catalogue";
import { countryOptions } from "@shared/countries";
import { MEASURED_FILTERS, marketFiltersToParams, parseMarketFilters, type MarketFilters } from "@shared/market-filters";
import { appliedFilters, clearedFilters, inCategory, marketHref, sortOptions } from "~/catalogue/market-view";

// How the market's filters read on the page: chips, category moves and sorts.

const read = (query: string): MarketFilters => parseMarketFilters(new URLSearchParams(query)).filters;

describe("the applied filters", () => {
  it("reads each filter the trade's way, the bound as a sign", () => {
    const f = read("category=integrated-amplifiers&power8Min=100+W&thdMax=0.05+%25&riaaMax=0.2+dB&condition=clean&verified=1&q=orrin");
    expect(appliedFilters(f).map((a) => a.label)).toEqual([
      "“orrin”",
      "Clean",
      "Bench-verified only",
      "Power into 8 Ω ≥ 100 W",
      "THD ≤ 0.05 %",
      "RIAA deviation ≤ ±0.2 dB",
    ]);
  });

  it("names the delivery country as the page names it (the market's loader), else shows its code", () => {
    const f = read("deliverTo=DE");
    const names = new Map(countryOptions().map((c) => [c.value, c.label]));
    expect(appliedFilters(f, (code) => names.get(code) ?? code).map((a) => a.label)).toEqual(["Delivers to Germany"]);
    expect(appliedFilters(f).map((a) => a.label)).toEqual(["Delivers to DE"]);
  });

  it("removing a chip removes that filter alone; Clear all keeps the category", () => {
    const query = fc.record({
      power: fc.option(fc.integer({ min: 1, max: 500 }), { nil: undefined }),
      grades: fc.subarray([...COSMETIC_GRADES]),
      verified: fc.boolean(),
      words: fc.option(fc.constantFrom("orrin", "tallow a-60"), { nil: undefined }),
    });
    fc.assert(
      fc.property(query, ({ power, grades, verified, words }) => {
        const p = new URLSearchParams({ category: "receivers" });
        if (power) p.set("power8Min", `${power} W`);
        for (const g of grades) p.append("condition", g);
        if (verified) p.set("verified", "1");
        if (words) p.set("q", words);
        const f = read(p.toString());
        const applied = appliedFilters(f);
        expect(applied).toHaveLength((power ? 1 : 0) + grades.length + (verified ? 1 : 0) + (words ? 1 : 0));
        for (const a of applied) {
          const left = appliedFilters(read(marketHref(a.without).split("?")[1] ?? "")).map((x) => x.id);
          expect(left).toEqual(applied.map((x) => x.id).filter((id) => id !== a.id));
        }
        expect(marketHref(clearedFilters(f))).toBe("/market?category=receivers");
      }),
    );
  });
});

describe("moving to another category", () => {
  it("drops the figures the new category does not have, keeps the rest, and starts at page one", () => {
    const f = read("category=integrated-amplifiers&power8Min=80+W&thdMax=0.05+%25&sort=price_per_watt&page=3&verified=1");
    expect(marketHref(inCategory(f, "phono_stage"))).toBe("/market?category=phono-stages&verified=1&thdMax=0.05+%25");
    expect(marketHref(inCategory(f, "receiver"))).toBe(
      "/market?category=receivers&verified=1&power8Min=80+W&thdMax=0.05+%25&sort=price_per_watt",
    );
    // Every figure is offered when no category is chosen.
    expect(Object.keys(inCategory(f, null).measured)).toEqual(["power8", "thd"]);
    expect(MEASURED_FILTERS.length).toBeGreaterThan(2);
  });

  it("offers price per watt only where units have a power into 8 Ω, and relevance only with words", () => {
    expect(sortOptions({ q: null, category: "turntable" }).map((o) => o.value)).toEqual(["newest", "price_asc", "price_desc"]);
    expect(sortOptions({ q: "orrin", category: "power_amplifier" }).map((o) => o.value)).toEqual([
      "relevance",
      "newest",
      "price_asc",
      "price_desc",
      "price_per_watt",
    ]);
    expect(marketFiltersToParams(inCategory(read("sort=price_per_watt"), "turntable")).toString()).toBe("category=turntables");
  });
});
