import { describe, expect, it } from "vitest";
import { areNeighbours, countryFromAcceptLanguage, parseZone, zoneFor } from "~/listings/zones";
import { canViewListing, type Viewer } from "~/listings/visibility";

describe("the visitor's country from Accept-Language (RFC 9110 §12.5.4 weights)", () => {
  it("takes the region of the most preferred tag", () => {
    expect(countryFromAcceptLanguage("de-AT,de;q=0.9,en;q=0.8")).toBe("AT");
    expect(countryFromAcceptLanguage("en;q=0.5, fr-CA;q=0.9")).toBe("CA");
  });
  it("falls back to the home country of a bare language only where there is an obvious one", () => {
    expect(countryFromAcceptLanguage("nl")).toBe("NL");
    expect(countryFromAcceptLanguage("en")).toBeNull();
    expect(countryFromAcceptLanguage("*")).toBeNull();
    expect(countryFromAcceptLanguage(null)).toBeNull();
  });
  it("ignores tags the browser refuses (q=0)", () => {
    expect(countryFromAcceptLanguage("de-CH;q=0, it-IT;q=0.4")).toBe("IT");
  });
});

describe("shipping zone relative to the seller's country", () => {
  it("is domestic in the same country, nearby across a border, worldwide otherwise (borders: common knowledge)", () => {
    expect(zoneFor("DE", "DE")).toBe("domestic");
    expect(zoneFor("DE", "AT")).toBe("nearby");
    expect(zoneFor("AT", "DE")).toBe("nearby");
    expect(zoneFor("DE", "ES")).toBe("worldwide");
    expect(zoneFor("GB", "IE")).toBe("nearby");
  });
  it("opens on domestic when the visitor's country is unknown (they can change it)", () => {
    expect(zoneFor("DE", null)).toBe("domestic");
  });
  it("neighbours are symmetric", () => {
    expect(areNeighbours("pl", "de")).toBe(areNeighbours("DE", "PL"));
  });
  it("reads only known zone names from the URL", () => {
    expect(parseZone("nearby")).toBe("nearby");
    expect(parseZone("mars")).toBeNull();
  });
});

describe("who may open a listing's page", () => {
  const seller: Viewer = { id: "s", roles: ["buyer", "workshop"] };
  const buyer: Viewer = { id: "b", roles: ["buyer"] };
  const moderator: Viewer = { id: "m", roles: ["buyer", "moderator"] };
  const view = (status: Parameters<typeof canViewListing>[0], viewer: Viewer | null) => canViewListing(status, "s", viewer);

  it("live and sold units are public", () => {
    for (const status of ["live", "sold"] as const) {
      expect([null, buyer, seller, moderator].map((v) => view(status, v))).toEqual([true, true, true, true]);
    }
  });
  it("a held unit is for its seller and the review desk only", () => {
    expect([null, buyer, seller, moderator].map((v) => view("held", v))).toEqual([false, false, true, true]);
  });
  it("a draft is the seller's alone, not even the desk's", () => {
    expect([null, buyer, seller, moderator].map((v) => view("draft", v))).toEqual([false, false, true, false]);
  });
  it("withdrawn and removed units leave the public market", () => {
    for (const status of ["withdrawn", "removed"] as const) {
      expect([null, buyer, seller, moderator].map((v) => view(status, v))).toEqual([false, false, true, true]);
    }
  });
});
