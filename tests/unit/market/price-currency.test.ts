import { describe, expect, it } from "vitest";
import { priceCurrency } from "~/catalogue/ui/FilterPanel";

// The price bounds' currency must be read the way the server reads a link (marketCurrency): otherwise
// "up to 1,500" typed by a buyer in pounds would be searched in euros.
describe("the currency the market's price bounds are typed in", () => {
  const p = (s: string) => new URLSearchParams(s);
  it("is the one the link names", () => {
    expect(priceCurrency(p("currency=gbp&priceMax=1500"), "USD")).toBe("GBP");
  });
  it("is euros for bounds the link gives without a currency, whatever the buyer's own", () => {
    expect(priceCurrency(p("priceMax=1500"), "GBP")).toBe("EUR");
  });
  it("is the buyer's display currency when the link has no bounds", () => {
    expect(priceCurrency(p("category=turntables"), "GBP")).toBe("GBP");
  });
  it("falls back to euros for an unknown or missing display currency", () => {
    expect(priceCurrency(p(""), null)).toBe("EUR");
    expect(priceCurrency(p("currency=XYZ"), "ABC")).toBe("EUR");
  });
});
