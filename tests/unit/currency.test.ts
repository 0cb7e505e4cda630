import { describe, expect, it } from "vitest";
import fc from "fast-check";
import { convertMinor, currencyForCountry, rateMillionths, readCurrency, showPrice, type Rates } from "@shared/currency";
import { MAX_PRICE_MAJOR } from "@shared/listing-input";
import { changeShare, isBigChange, normaliseRate, readRateForm } from "~/currencies/rate-form";

// The one conversion every approximate price goes through: integer minor units, the admin's rates
// as data, rounding half away from zero (as PostgreSQL's round() does for the euro column).

// The migration's starting table.
const STARTING: Record<string, string> = {
  EUR: "1",
  GBP: "0.86",
  USD: "1.08",
  CHF: "0.95",
  SEK: "11.4",
  NOK: "11.6",
  DKK: "7.46",
  PLN: "4.3",
  CZK: "25",
  CAD: "1.47",
  AUD: "1.65",
  JPY: "160",
};

const RATES: Rates = {
  EUR: { perEur: "1", minorDigits: 2 },
  GBP: { perEur: "0.86", minorDigits: 2 },
  JPY: { perEur: "160", minorDigits: 0 },
  CZK: { perEur: "25", minorDigits: 2 },
};

/** A rate as the table may hold it (0.001 … 100,000 per euro, six decimals), written as a decimal string. */
const rateText = fc.bigInt({ min: 1_000n, max: 100_000_000_000n }).map((m) => {
  const s = m.toString().padStart(7, "0");
  return `${s.slice(0, -6).replace(/^0+(?=\d)/, "")}.${s.slice(-6)}`;
});
const currencyPair = fc.record({
  from: fc.record({ perEur: rateText, minorDigits: fc.constantFrom(0, 2, 3) }),
  to: fc.record({ perEur: rateText, minorDigits: fc.constantFrom(0, 2, 3) }),
});
const amount = fc.integer({ min: 0, max: 100_000_000 });
const ratesOf = (p: { from: Rates[string]; to: Rates[string] }): Rates => ({ AAA: p.from, BBB: p.to });

describe("convertMinor", () => {
  it("gives the hand-worked figures", () => {
    // £1,200 at 0.86 GBP per euro is €1,395.348…: €1,395.35, or €1,395 as a whole-unit approximation.
    expect(convertMinor(120_000, "GBP", "EUR", RATES)).toBe(139_535);
    expect(convertMinor(120_000, "GBP", "EUR", RATES, { whole: true })).toBe(139_500);
    // €10 at 160 yen is ¥1,600; ¥1,599 is €9.99375 → €9.99; halves round up: ¥8 = €0.05.
    expect(convertMinor(1_000, "EUR", "JPY", RATES)).toBe(1_600);
    expect(convertMinor(1_599, "JPY", "EUR", RATES)).toBe(999);
    expect(convertMinor(8, "JPY", "EUR", RATES)).toBe(5);
    // Across two foreign currencies: £100 = 100 / 0.86 × 25 Kč = 2,906.976… Kč.
    expect(convertMinor(10_000, "GBP", "CZK", RATES)).toBe(290_698);
    expect(convertMinor(10_000, "GBP", "CZK", RATES, { whole: true })).toBe(290_700);
  });

  it("has no answer without a rate or for an unsafe amount", () => {
    expect(convertMinor(100, "GBP", "SEK", RATES)).toBeNull();
    expect(convertMinor(100, "XXX", "EUR", RATES)).toBeNull();
    expect(convertMinor(0.5, "GBP", "EUR", RATES)).toBeNull();
    expect(convertMinor(100, "GBP", "EUR", { ...RATES, GBP: { perEur: "0", minorDigits: 2 } })).toBeNull();
    // Beyond 2^53 a figure would print wrong: better none.
    expect(convertMinor(Number.MAX_SAFE_INTEGER, "EUR", "JPY", RATES)).toBeNull();
  });

  it("converts every price a listing may ask between the starting rates", () => {
    const table: Rates = Object.fromEntries(
      Object.entries(STARTING).map(([code, perEur]) => [code, { perEur, minorDigits: code === "JPY" ? 0 : 2 }]),
    );
    const codes = Object.keys(table);
    fc.assert(
      fc.property(
        fc.integer({ min: 0, max: MAX_PRICE_MAJOR * 100 }),
        fc.constantFrom(...codes),
        fc.constantFrom(...codes),
        (a, from, to) => {
          const got = convertMinor(a, from, to, table, { whole: true });
          return got !== null && got >= 0;
        },
      ),
    );
  });

  it("leaves an amount in its own currency as it is", () => {
    fc.assert(fc.property(amount, currencyPair, (a, p) => convertMinor(a, "AAA", "AAA", ratesOf(p)) === a));
  });

  it("never turns a price negative", () => {
    fc.assert(
      fc.property(amount, currencyPair, fc.boolean(), (a, p, whole) => {
        const got = convertMinor(a, "AAA", "BBB", ratesOf(p), { whole });
        // null only where the figure would pass 2^53 (a rate ten million times another's).
        return got === null
          ? a * 10 ** (p.to.minorDigits - p.from.minorDigits) * (Number(p.to.perEur) / Number(p.from.perEur)) > 2 ** 52
          : got >= 0;
      }),
    );
  });

  it("is within half a minor unit of the exact value", () => {
    fc.assert(
      fc.property(amount, currencyPair, (a, p) => {
        const got = convertMinor(a, "AAA", "BBB", ratesOf(p));
        fc.pre(got !== null);
        // exact = a · 10^(dTo − dFrom) · rTo / rFrom; |got − exact| ≤ ½ ⇔ |2·got·D − 2·N| ≤ D (integers).
        const N = BigInt(a) * rateMillionths(p.to.perEur)! * 10n ** BigInt(p.to.minorDigits);
        const D = rateMillionths(p.from.perEur)! * 10n ** BigInt(p.from.minorDigits);
        const twice = 2n * BigInt(got) * D - 2n * N;
        return (twice < 0n ? -twice : twice) <= D;
      }),
    );
  });

  it("comes back within rounding: half a unit of the other currency plus half of its own", () => {
    fc.assert(
      fc.property(amount, currencyPair, (a, p) => {
        const rates = ratesOf(p);
        const there = convertMinor(a, "AAA", "BBB", rates);
        fc.pre(there !== null);
        const back = convertMinor(there, "BBB", "AAA", rates)!;
        // One minor unit of BBB in minor units of AAA: 10^(dA − dB) · rA / rB.
        const unit = (10 ** (p.from.minorDigits - p.to.minorDigits) * Number(p.from.perEur)) / Number(p.to.perEur);
        return Math.abs(back - a) <= unit / 2 + 0.5 + 1e-9 * Math.max(1, a);
      }),
    );
  });

  it("rounds approximate figures to whole units, to the nearest one", () => {
    fc.assert(
      fc.property(amount, currencyPair, (a, p) => {
        const rates = ratesOf(p);
        const whole = convertMinor(a, "AAA", "BBB", rates, { whole: true });
        const exactish = convertMinor(a, "AAA", "BBB", rates);
        fc.pre(whole !== null && exactish !== null);
        const unit = 10 ** p.to.minorDigits;
        return whole % unit === 0 && Math.abs(whole - exactish) <= unit / 2;
      }),
    );
  });

  it("gives whole yen either way: a zero-digit currency has nothing finer", () => {
    fc.assert(
      fc.property(amount, (a) => {
        const plain = convertMinor(a, "GBP", "JPY", RATES)!;
        return Number.isInteger(plain) && convertMinor(a, "GBP", "JPY", RATES, { whole: true }) === plain;
      }),
    );
  });

  it("keeps the order of prices", () => {
    fc.assert(
      fc.property(amount, amount, currencyPair, (a, b, p) => {
        const [lo, hi] = a <= b ? [a, b] : [b, a];
        const rates = ratesOf(p);
        const [x, y] = [convertMinor(lo, "AAA", "BBB", rates), convertMinor(hi, "AAA", "BBB", rates)];
        fc.pre(x !== null && y !== null);
        return x <= y;
      }),
    );
  });
});

describe("rateMillionths", () => {
  it("reads decimal rates exactly and refuses zero and junk", () => {
    expect(rateMillionths("0.86")).toBe(860_000n);
    expect(rateMillionths("160")).toBe(160_000_000n);
    expect(rateMillionths("0.0000005")).toBe(1n);
    expect(rateMillionths("0.0000004")).toBeNull();
    expect(rateMillionths("0")).toBeNull();
    expect(rateMillionths("-1")).toBeNull();
    expect(rateMillionths("1e3")).toBeNull();
  });
});

describe("showPrice", () => {
  it("marks the buyer's figure as approximate only when the currencies differ", () => {
    expect(showPrice(120_000, "GBP", "EUR", RATES)).toEqual({ text: "£1,200", approx: "€1,395" });
    expect(showPrice(120_000, "GBP", "GBP", RATES)).toEqual({ text: "£1,200", approx: null });
    expect(showPrice(120_000, "GBP", "SEK", RATES)).toEqual({ text: "£1,200", approx: null });
    expect(showPrice(120_000, "GBP", null, null)).toEqual({ text: "£1,200", approx: null });
    expect(showPrice(50_000, "EUR", "JPY", RATES)).toEqual({ text: "€500", approx: "JP¥80,000" });
  });
});

describe("the display currency's first guess", () => {
  it("follows the country, with the euro for euro countries and the unknown", () => {
    expect(currencyForCountry("GB")).toBe("GBP");
    expect(currencyForCountry("ch")).toBe("CHF");
    expect(currencyForCountry("JP")).toBe("JPY");
    expect(currencyForCountry("DE")).toBe("EUR");
    expect(currencyForCountry("BR")).toBe("EUR");
    expect(currencyForCountry(null)).toBe("EUR");
  });
  it("reads only known codes", () => {
    expect(readCurrency(" gbp ")).toBe("GBP");
    expect(readCurrency("XAU")).toBeNull();
    expect(readCurrency(42)).toBeNull();
  });
});

describe("the admin's rate form", () => {
  const form = (fields: [string, string][]) => {
    const f = new FormData();
    for (const [k, v] of fields) f.append(k, v);
    return f;
  };

  it("reads each rate, spelt one way", () => {
    expect(
      readRateForm(
        form([
          ["rate.GBP", " 0.870 "],
          ["rate.JPY", "0158.5"],
          ["confirm", "yes"],
        ]),
      ),
    ).toEqual({
      ok: true,
      confirmed: true,
      changes: [
        { currency: "GBP", perEur: "0.87" },
        { currency: "JPY", perEur: "158.5" },
      ],
    });
  });

  it.each([
    ["", "Type the rate, e.g. 0.86."],
    ["0", "A rate must be above zero."],
    ["0.000000", "A rate must be above zero."],
    ["-0.86", "Type the rate as a plain number with a point, e.g. 0.86."],
    ["0,86", "Type the rate as a plain number with a point, e.g. 0.86."],
    ["1e3", "Type the rate as a plain number with a point, e.g. 0.86."],
    ["12345678", "Type the rate as a plain number with a point, e.g. 0.86."],
    ["0.8612345", "Use at most 6 decimals."],
  ])("refuses %j next to its field", (value, message) => {
    expect(readRateForm(form([["rate.GBP", value]]))).toEqual({ ok: false, errors: { GBP: message } });
  });

  it("refuses the base, unknown codes, repeated fields and an empty form", () => {
    expect(readRateForm(form([["rate.EUR", "1.1"]]))).toMatchObject({ ok: false, errors: { EUR: expect.stringContaining("base") } });
    expect(readRateForm(form([["rate.XAU", "0.001"]]))).toMatchObject({ ok: false, errors: { XAU: expect.stringContaining("Unknown") } });
    expect(
      readRateForm(
        form([
          ["rate.GBP", "0.86"],
          ["rate.GBP", "0.87"],
        ]),
      ),
    ).toEqual({ ok: false, errors: { GBP: "Give each rate once." } });
    expect(readRateForm(form([]))).toEqual({ ok: false, errors: { form: "Change at least one rate." } });
  });

  it("asks again for a change of more than a fifth, either way", () => {
    expect(isBigChange("0.86", "1.032")).toBe(false);
    expect(isBigChange("0.86", "1.032001")).toBe(true);
    expect(isBigChange("0.86", "0.688")).toBe(false);
    expect(isBigChange("0.86", "0.687999")).toBe(true);
    expect(changeShare("0.86", "1.2")).toBe("+40 %");
    expect(normaliseRate("007.500")).toBe("7.5");
  });
});
