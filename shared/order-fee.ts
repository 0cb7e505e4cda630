// The platform fee on the amount released to a seller: a percentage (basis points) with a minimum per
// currency, never more than the amount itself. Integer minor units throughout; the percentage is
// rounded half up to the nearest minor unit (every amount is positive, so half up = half away from zero).

export interface FeeRule {
  feeBasisPoints: number;
  /** Per currency code, in that currency's minor units; a currency missing here has no minimum. */
  feeMinimumMinor: Record<string, number>;
}

export function platformFeeMinor(grossMinor: number, currency: string, rule: FeeRule): number {
  if (!Number.isSafeInteger(grossMinor) || grossMinor < 0) throw new RangeError(`not an amount in minor units: ${grossMinor}`);
  if (grossMinor === 0) return 0;
  // Integer arithmetic: (gross × bp + 5000) ÷ 10000, floored, is gross × bp / 10000 rounded half up.
  const percentage = Math.floor((grossMinor * rule.feeBasisPoints + 5000) / 10000);
  const minimum = rule.feeMinimumMinor[currency] ?? 0;
  return Math.min(grossMinor, Math.max(percentage, minimum));
}
