import { describe, expect, it } from "vitest";
import fc from "fast-check";
import { CATEGORIES, COSMETIC_GRADES, SERVICE_STATES } from "@shared/catalogue";
import { CURRENCY_CODES } from "@shared/listing-input";
import {
  DEFAULT_FILTERS,
  FIGURE_SOURCES,
  MARKET_SORTS,
  MEASURED_FILTERS,
  SELLER_KINDS,
  defaultSort,
  marketFiltersToParams,
  normaliseFigure,
  parseMarketFilters,
  type MarketFilters,
} from "@shared/market-filters";

// The market's URL state: read the way the trade types figures, written back in one canonical
// spelling, and every refusal names its parameter.

const strict = (qs: string) => parseMarketFilters(new URLSearchParams(qs), { strict: true });
const lenient = (qs: string) => parseMarketFilters(new URLSearchParams(qs));

describe("measured figures as the trade types them", () => {
  it.each([
    ["power8Min", "80 W", "power8", 80],
    ["power8Min", "80W", "power8", 80],
    ["power8Min", "80", "power8", 80],
    ["power4Min", "0.12 kW", "power4", 120],
    ["thdMax", "0.05 %", "thd", 0.05],
    ["thdMax", "−80 dB", "thd", 0.01],
    ["thdnMax", "500 ppm", "thdn", 0.05],
    ["snrMin", "90 dB", "snr", 90],
    ["snrMin", "−80 dB", "snr", -80],
    ["f3LowMax", "20 Hz", "f3Low", 20],
    ["f3HighMin", "20 kHz", "f3High", 20_000],
    ["dampingMin", "100", "damping", 100],
    ["riaaMax", "±0.2 dB", "riaa", 0.2],
    ["gainMin", "40 dB", "gainMin", 40],
    ["noiseMax", "0.2 mV", "noise", 200],
    ["noiseMax", "150 µV", "noise", 150],
    ["sensitivityMin", "88 dB", "sensitivity", 88],
    ["impedanceMinMin", "4R", "impedanceMin", 4],
    ["impedanceMinMin", "3.2 Ω", "impedanceMin", 3.2],
    ["speedErrorMax", "0.1 %", "speedError", 0.1],
    ["wowFlutterMax", "0,05 %", "wowFlutter", 0.05],
  ])("%s=%s reads as %s %d in the column's units", (param, text, key, value) => {
    const { filters, issues } = strict(`${param}=${encodeURIComponent(text)}`);
    expect(issues).toEqual([]);
    expect(filters.measured).toEqual({ [key]: value });
  });

  it("refuses a value of the wrong kind, naming the parameter", () => {
    expect(strict("power8Min=80%25").issues).toEqual([{ param: "power8Min", message: expect.stringMatching(/power/) }]);
    expect(strict("f3LowMax=20%20W").issues[0].param).toBe("f3LowMax");
    expect(strict("thdMax=lots").issues[0].param).toBe("thdMax");
  });
});

describe("strict and lenient reading", () => {
  it("names every bad, unknown or repeated parameter when strict", () => {
    const { issues } = strict(
      "category=jukeboxes&sort=relevance&minPower=80&q=a&q=b&seller=shop&figures=rated&cursor=%24%24&page=0&mains=9000",
    );
    expect(issues.map((i) => i.param).sort()).toEqual(["category", "cursor", "figures", "mains", "minPower", "page", "q", "seller"].sort());
    // relevance is fine here: q was given (the first of the two).
  });

  it("refuses words the database could not hold (NUL, a broken character) rather than failing on them", () => {
    expect(strict("q=velt%00").issues.map((i) => i.param)).toEqual(["q"]);
    expect(parseMarketFilters({ q: "velt \ud800" }, { strict: true }).issues.map((i) => i.param)).toEqual(["q"]);
  });

  it("refuses relevance without words to search for", () => {
    expect(strict("sort=relevance").issues.map((i) => i.param)).toEqual(["sort"]);
    expect(strict("q=velt&sort=relevance").issues).toEqual([]);
  });

  it("drops what it cannot read when lenient, keeping the message and the rest", () => {
    const { filters, issues } = lenient("category=turntables&wowFlutterMax=fast&priceMax=abc&minPower=80&condition=clean,mint");
    expect(filters).toMatchObject({ category: "turntable", measured: {}, priceMaxMinor: null, condition: ["clean"] });
    expect(issues.map((i) => i.param)).toEqual(["priceMax", "condition", "wowFlutterMax"]);
  });

  it("reads prices in the buyer's currency, and refuses a range the wrong way round", () => {
    expect(strict("priceMin=1,250&priceMax=1500.50&currency=gbp").filters).toMatchObject({
      currency: "GBP",
      priceMinMinor: 125_000,
      priceMaxMinor: 150_050,
    });
    expect(strict("priceMin=20000&currency=JPY").filters.priceMinMinor).toBe(20_000);
    expect(strict("priceMin=900&priceMax=100").issues.map((i) => i.param)).toEqual(["priceMax"]);
  });

  it("sorts by relevance when there are words, newest otherwise", () => {
    expect(strict("q=tellis").filters.sort).toBe("relevance");
    expect(strict("").filters).toEqual(DEFAULT_FILTERS);
    expect(marketFiltersToParams(strict("q=tellis&sort=relevance").filters).toString()).toBe("q=tellis");
  });
});

// Filters as the parser gives them out: normalised text and numbers, lists in catalogue order.
const word = fc.stringMatching(/^[a-z0-9äéø]{1,8}$/);
const measured = fc.record(
  Object.fromEntries(
    MEASURED_FILTERS.map((f) => [
      f.key,
      fc
        .double({ min: f.kind === "decibel" ? -120 : 0.001, max: 100_000, noNaN: true })
        .map(normaliseFigure)
        .filter((v) => v !== 0),
    ]),
  ),
  { requiredKeys: [] },
);
const sub = <T>(list: readonly T[]) => fc.subarray([...list]);
const filtersArb: fc.Arbitrary<MarketFilters> = fc
  .record({
    q: fc.option(fc.array(word, { minLength: 1, maxLength: 3 }).map((w) => w.join(" "))),
    category: fc.option(fc.constantFrom(...CATEGORIES)),
    currency: fc.constantFrom(...CURRENCY_CODES),
    prices: fc.tuple(fc.option(fc.integer({ min: 0, max: 50_000_000 })), fc.option(fc.integer({ min: 0, max: 50_000_000 }))),
    condition: sub(COSMETIC_GRADES),
    service: sub(SERVICE_STATES),
    mains: fc.option(fc.integer({ min: 90, max: 260 })),
    deliverTo: fc.option(fc.constantFrom("GB", "DE", "IE", "US", "JP")),
    seller: fc.option(fc.constantFrom(...SELLER_KINDS)),
    verified: fc.boolean(),
    figures: fc.constantFrom(...FIGURE_SOURCES),
    measured,
    sort: fc.constantFrom(...MARKET_SORTS),
    cursor: fc.option(fc.stringMatching(/^[A-Za-z0-9_-]{1,40}$/)),
    page: fc.integer({ min: 1, max: 10_000 }),
  })
  .map(({ prices, ...r }) => {
    const [lo, hi] = prices.map((p) => (p === null ? null : r.currency === "JPY" ? Math.floor(p / 100) : p));
    const measuredValues = { ...r.measured };
    if (measuredValues.gainMin !== undefined && measuredValues.gainMax !== undefined && measuredValues.gainMin > measuredValues.gainMax) {
      delete measuredValues.gainMax;
    }
    return {
      ...r,
      // A currency means something only beside a price bound (the canonical URL leaves it out otherwise).
      currency: lo === null && hi === null ? "EUR" : r.currency,
      measured: measuredValues,
      priceMinMinor: lo,
      priceMaxMinor: lo !== null && hi !== null && hi < lo ? null : hi,
      sort: r.sort === "relevance" && !r.q ? defaultSort(r.q) : r.sort,
    };
  });

describe("the canonical URL", () => {
  it("leaves out a currency that no price bound is in, and keeps one that is", () => {
    expect(marketFiltersToParams(parseMarketFilters(new URLSearchParams("category=turntables&currency=GBP")).filters).toString()).toBe(
      "category=turntables",
    );
    expect(marketFiltersToParams(parseMarketFilters(new URLSearchParams("priceMax=1500&currency=GBP")).filters).get("currency")).toBe(
      "GBP",
    );
  });

  it("reads back exactly what it wrote (fast-check)", () => {
    fc.assert(
      fc.property(filtersArb, (f) => {
        const { filters, issues } = parseMarketFilters(marketFiltersToParams(f), { strict: true });
        expect(issues).toEqual([]);
        expect(filters).toEqual(f);
      }),
      { numRuns: 400 },
    );
  });

  it("spells equal filters the same whatever order the parameters came in", () => {
    fc.assert(
      fc.property(filtersArb, fc.integer(), (f, seed) => {
        const params = [...marketFiltersToParams(f).entries()];
        const shuffled = params
          .map((p, i) => ({ p, k: (i * 7919 + seed) % 101 }))
          .sort((a, b) => a.k - b.k)
          .map((x) => x.p);
        const again = marketFiltersToParams(parseMarketFilters(new URLSearchParams(shuffled)).filters);
        expect(again.toString()).toBe(marketFiltersToParams(f).toString());
      }),
    );
  });

  it("leaves defaults out", () => {
    expect(marketFiltersToParams(DEFAULT_FILTERS).toString()).toBe("");
    expect(marketFiltersToParams({ ...DEFAULT_FILTERS, measured: { power8: 80, thd: 0.05 } }).toString()).toBe(
      "power8Min=80+W&thdMax=0.05+%25",
    );
  });
});
