import { describe, expect, it } from "vitest";
import { platformFeeMinor, type FeeRule } from "@shared/order-fee";

// The platform fee: a percentage in basis points with a per-currency minimum, never more than the amount
// released, rounded half up to a whole minor unit. Expected values worked by hand below, not by the code.

const rule: FeeRule = { feeBasisPoints: 800, feeMinimumMinor: { EUR: 350, GBP: 300, JPY: 500 } };

describe("the platform fee, worked examples at 8 % with a minimum", () => {
  it.each([
    // gross, currency, fee, working
    [48_000, "EUR", 3_840, "€480.00 × 8 % = €38.40, above the €3.50 minimum"],
    [12_345, "EUR", 988, "€123.45 × 8 % = €9.876 → €9.88 (rounded half up)"],
    [4_375, "EUR", 350, "€43.75 × 8 % = €3.50 exactly = the minimum"],
    [2_000, "EUR", 350, "€20.00 × 8 % = €1.60, below the minimum: €3.50"],
    [200, "EUR", 200, "€2.00: the €3.50 minimum would exceed it, so the fee is the whole €2.00"],
    [0, "EUR", 0, "nothing released, no fee"],
    [3_000, "GBP", 300, "£30.00 × 8 % = £2.40, below the £3.00 minimum"],
    [120_000, "JPY", 9_600, "¥120,000 × 8 % = ¥9,600 (no minor unit below the yen)"],
    [5_000, "JPY", 500, "¥5,000 × 8 % = ¥400, below the ¥500 minimum"],
    [1, "CHF", 0, "0.01 × 8 % = 0.0008, rounds to 0; CHF has no minimum in this rule"],
  ])("%i %s → %i (%s)", (gross, currency, fee) => {
    expect(platformFeeMinor(gross, currency, rule)).toBe(fee);
  });
});

describe("rounding half up", () => {
  const quarter: FeeRule = { feeBasisPoints: 250, feeMinimumMinor: {} };
  it.each([
    [4_020, 101, "40.20 × 2.5 % = 1.005 → 1.01"],
    [4_060, 102, "40.60 × 2.5 % = 1.015 → 1.02"],
    [4_019, 100, "40.19 × 2.5 % = 1.00475 → 1.00"],
    [4_021, 101, "40.21 × 2.5 % = 1.00525 → 1.01"],
  ])("%i at 2.5 %% → %i (%s)", (gross, fee) => {
    expect(platformFeeMinor(gross, "SEK", quarter)).toBe(fee);
  });
});

describe("what it refuses", () => {
  it("a negative or fractional amount", () => {
    expect(() => platformFeeMinor(-1, "EUR", rule)).toThrow(RangeError);
    expect(() => platformFeeMinor(10.5, "EUR", rule)).toThrow(RangeError);
  });
});
