import { describe, expect, it } from "vitest";
import fc from "fast-check";
import { canonicalAlertQuery, describeAlertQuery } from "~/alerts/filters";

// A spec alert stores the market's canonical query without position or order, and reads it back in words.

describe("an alert's stored query", () => {
  it("is the market's canonical spelling, without page, cursor or sort", () => {
    const { query, issues } = canonicalAlertQuery(
      new URLSearchParams("sort=price_asc&page=4&thdMax=-80dB&power8Min=80W&category=integrated-amplifiers&priceMax=1500&currency=gbp"),
    );
    expect(issues).toEqual([]);
    expect(query).toBe("category=integrated-amplifiers&priceMax=1500&currency=GBP&power8Min=80+W&thdMax=0.01+%25");
  });

  it("drops a value the market cannot read, with the market's message", () => {
    const { query, issues } = canonicalAlertQuery(new URLSearchParams("power8Min=lots&category=turntables"));
    expect(query).toBe("category=turntables");
    expect(issues.map((i) => i.param)).toEqual(["power8Min"]);
  });

  it("is a fixed point: saving a stored query again gives the same string", () => {
    const values = fc.constantFrom("80 W", "0.05 %", "-80 dB", "20 Hz", "4 ohm", "200 uV", "x", "", "1e3");
    const params = fc.constantFrom(
      "power8Min",
      "thdMax",
      "snrMin",
      "f3LowMax",
      "impedanceMinMin",
      "noiseMax",
      "priceMin",
      "priceMax",
      "q",
      "mains",
    );
    fc.assert(
      fc.property(fc.array(fc.tuple(params, values), { maxLength: 6 }), (pairs) => {
        const once = canonicalAlertQuery(new URLSearchParams(pairs)).query;
        expect(canonicalAlertQuery(new URLSearchParams(once)).query).toBe(once);
      }),
      { seed: 8, numRuns: 300 },
    );
  });
});

describe("an alert's filters in words", () => {
  it("names each filter the way the market's panel does", () => {
    expect(
      describeAlertQuery(
        "category=integrated-amplifiers&priceMax=1500&currency=GBP&condition=clean&mains=230&seller=workshop&power8Min=80+W&thdMax=0.05+%25",
      ),
    ).toEqual([
      "Integrated amplifiers",
      "Priced at most £1,500",
      "Condition: Clean",
      "Set for 230 V mains (or switchable)",
      "Sold by a workshop",
      "Power into 8 Ω, at least 80 W",
      "THD, at most 0.05 %",
      "Figures from bench-verified sheets",
    ]);
  });

  it("says so when there is no filter at all", () => {
    expect(describeAlertQuery("")).toEqual(["Every unit on the market"]);
  });
});
