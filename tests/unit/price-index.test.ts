import { describe, expect, it } from "vitest";
import { INDEX_MIN_SALES, LOW_PRICE_RATIO, indexFigures, indexKey, isFarBelow, medianMinor } from "@shared/price-index";

// The sold-price index's arithmetic. The median is the textbook one (the middle value of the sorted
// list, or the mean of the two middle values for an even count), rounded half up to a whole minor unit.
// Three sales before the index is shown and half the median for the price flag are common practice,
// not published figures.

describe("the median of minor units", () => {
  it("is the middle value of an odd count, in any order", () => {
    expect(medianMinor([500, 100, 300])).toBe(300);
    expect(medianMinor([7])).toBe(7);
  });
  it("is the mean of the two middle values of an even count, half a unit rounded up", () => {
    expect(medianMinor([100, 400, 200, 300])).toBe(250);
    expect(medianMinor([100, 201])).toBe(151);
  });
  it("refuses an empty list", () => {
    expect(() => medianMinor([])).toThrow();
  });
});

describe("the index figures", () => {
  const sale = (priceMinor: number, benchVerified = false) => ({ priceMinor, benchVerified });
  it("say nothing below three sales (common practice)", () => {
    expect(INDEX_MIN_SALES).toBe(3);
    expect(indexFigures([sale(100), sale(200)])).toBeNull();
    expect(indexFigures([sale(100), sale(200), sale(300)])).not.toBeNull();
  });
  it("split by the bench-verified mark, a side with no sales being null", () => {
    expect(indexFigures([sale(100), sale(300, true), sale(200, true)])).toEqual({
      all: { count: 3, medianMinor: 200, lowMinor: 100, highMinor: 300 },
      verified: { count: 2, medianMinor: 250, lowMinor: 200, highMinor: 300 },
      unverified: { count: 1, medianMinor: 100, lowMinor: 100, highMinor: 100 },
    });
    expect(indexFigures([sale(1), sale(2), sale(3)])?.verified).toBeNull();
  });
});

describe("the low-price check", () => {
  const figures = indexFigures([
    { priceMinor: 60_000, benchVerified: true },
    { priceMinor: 64_000, benchVerified: true },
    { priceMinor: 70_000, benchVerified: false },
  ])!;
  it("flags a price under half the median (common practice, not a published figure)", () => {
    expect(LOW_PRICE_RATIO).toBe(0.5);
    expect(isFarBelow(31_999, figures)).toBe(true);
  });
  it("leaves half the median and above alone", () => {
    expect(isFarBelow(32_000, figures)).toBe(false);
    expect(isFarBelow(50_000, figures)).toBe(false);
  });
});

describe("maker and model keys", () => {
  it("ignore case, outer spaces and runs of inner spaces", () => {
    expect(indexKey("  Carrowain ")).toBe("carrowain");
    expect(indexKey("WQ   46i")).toBe(indexKey("wq 46I"));
    expect(indexKey(null)).toBe("");
  });
});
