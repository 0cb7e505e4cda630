import { afterAll, beforeAll, describe, expect, it } from "vitest";
import fc from "fast-check";
import { Listing, User } from "~/models/index.server";
import { searchListings } from "~/catalogue/search.server";
import { parseMarketFilters, MARKET_SORTS, type MarketFilters } from "@shared/market-filters";
import { CATEGORIES } from "@shared/catalogue";
import { blankListing } from "../support/blank-listing";
import { makeUser } from "../support/listing-fixtures";

// Words typed into the market's search box, and the cursor that pages through any result: a set of
// units made here (their own maker names, so nothing else in the database matches), some sharing a
// price and a publish time so the order has ties to break.

let seller: User;
const RUN = Math.random().toString(36).slice(2, 8);
const MAKER = `Zeffrane${RUN}`;
const SAME_TIME = new Date("2026-11-30T10:00:00.123456Z");

async function unit(model: string, extra: Partial<Parameters<typeof blankListing>[2]> = {}) {
  return Listing.create(
    blankListing(seller.id, "integrated_amplifier", {
      status: "live",
      maker: MAKER,
      model,
      priceMinor: 50_000,
      currency: "EUR",
      country: "GB",
      cosmeticGrade: "clean",
      serviceState: "serviced_measured",
      publishedAt: SAME_TIME,
      ...extra,
    }),
  );
}

let monitorModel: Listing;
let monitorNote: Listing;
let accented: Listing;

beforeAll(async () => {
  seller = await makeUser(`search-text-${RUN}`, ["buyer", "seller"]);
  monitorModel = await unit("Quellin Monitor 4", { conditionNote: "Clean unit, both channels measured." });
  // Newer than the model match: ranking, not the tie-break, must put the model match first.
  monitorNote = await unit("Quellin 5", {
    conditionNote: "Used as a studio monitor amplifier for years.",
    publishedAt: new Date(SAME_TIME.getTime() + 60_000),
  });
  accented = await unit("Brésil 7", { conditionNote: "Réglé et mesuré à l'atelier; façade impeccable." });
  for (let i = 0; i < 9; i++) await unit(`Tie ${i}`, { priceMinor: i < 6 ? 40_000 : 45_000, publishedAt: SAME_TIME });
});

afterAll(async () => {
  await Listing.destroy({ where: { sellerId: seller.id } });
  await seller.destroy();
});

const search = (qs: string, limit = 50) => {
  const { filters, issues } = parseMarketFilters(new URLSearchParams(qs), { strict: true });
  expect(issues).toEqual([]);
  return searchListings(filters, { limit });
};
const titles = async (qs: string) => (await search(qs)).items.map((i) => i.model);

describe("text search", () => {
  it("matches a word's prefix in the maker, the model and the description", async () => {
    expect(await titles(`q=${MAKER.slice(0, 8)} quel`)).toEqual(expect.arrayContaining(["Quellin Monitor 4", "Quellin 5"]));
    expect(await titles(`q=${MAKER} tie`)).toHaveLength(9);
    expect(await titles(`q=${MAKER} studio`)).toEqual(["Quellin 5"]);
  });

  it("matches whatever accents are typed or left out", async () => {
    expect(await titles(`q=${MAKER} bresil`)).toEqual(["Brésil 7"]);
    expect(await titles(`q=${MAKER} regle facade`)).toEqual(["Brésil 7"]);
    expect(await titles(`q=${MAKER} mésuré`)).toEqual(["Brésil 7"]);
  });

  it("matches a word's other forms through its stem (measuring, measured)", async () => {
    expect(await titles(`q=${MAKER} measuring`)).toEqual(["Quellin Monitor 4"]);
  });

  it("ranks a match in the model above one in the description", async () => {
    expect(await titles(`q=${MAKER} monitor`)).toEqual(["Quellin Monitor 4", "Quellin 5"]);
    // One word alone (no nearness to weigh): the weight of where it was found decides.
    const ours = [monitorModel.id, monitorNote.id];
    const ranked = (await search("q=monitor", 100)).items.map((i) => i.id).filter((id) => ours.includes(id));
    expect(ranked).toEqual(ours);
    expect((await search(`q=${MAKER} monitor&sort=newest`)).items.map((i) => i.id)).toEqual([monitorNote.id, monitorModel.id]);
  });

  it("finds nothing for words nothing has, and never a draft", async () => {
    expect(await titles(`q=${MAKER} xylophone`)).toEqual([]);
    await accented.update({ status: "draft", publishedAt: null });
    try {
      expect(await titles(`q=${MAKER} bresil`)).toEqual([]);
    } finally {
      await accented.update({ status: "live", publishedAt: SAME_TIME });
    }
  });
});

describe("price bounds", () => {
  it("hold exactly in the listing's own currency, though euro cents are coarser than öre", async () => {
    // At 11.4 SEK to the euro, 1000.00 and 1000.05 SEK are the same euro cent.
    const [at, over] = [
      await unit("Kronor 1", { priceMinor: 100_000, currency: "SEK" }),
      await unit("Kronor 2", { priceMinor: 100_005, currency: "SEK" }),
    ];
    try {
      const ids = (await search(`q=${MAKER} kronor&priceMax=1000&currency=SEK`)).items.map((i) => i.id);
      expect(ids).toEqual([at.id]);
      const from = (await search(`q=${MAKER} kronor&priceMin=1000.05&currency=SEK`)).items.map((i) => i.id);
      expect(from).toEqual([over.id]);
    } finally {
      await Listing.destroy({ where: { id: [at.id, over.id] } });
    }
  });
});

describe("cursor pages", () => {
  it("concatenate to the whole result in order, without a repeat, for every sort and page size (fast-check)", async () => {
    const arb = fc.record({
      sort: fc.constantFrom(...MARKET_SORTS),
      limit: fc.integer({ min: 1, max: 7 }),
      category: fc.constantFrom(...CATEGORIES),
      ours: fc.boolean(),
    });
    await fc.assert(
      fc.asyncProperty(arb, async ({ sort, limit, category, ours }) => {
        const base: Partial<MarketFilters> = {
          sort,
          category: ours ? "integrated_amplifier" : category,
          q: ours || sort === "relevance" ? MAKER : null,
        };
        const f = { ...parseMarketFilters(new URLSearchParams()).filters, ...base };
        const whole = await searchListings(f, { limit: 100 });
        expect(whole.nextCursor).toBeNull();
        const seen: string[] = [];
        let cursor: string | null = null;
        let pages = 0;
        do {
          const page = await searchListings(f, { cursor, limit });
          seen.push(...page.items.map((i) => i.id));
          expect(page.total).toBe(whole.total);
          expect(page.items.length).toBeLessThanOrEqual(limit);
          cursor = page.nextCursor;
          pages++;
        } while (cursor && pages < 200);
        expect(seen).toEqual(whole.items.map((i) => i.id));
        expect(new Set(seen).size).toBe(seen.length);
        expect(seen.length).toBe(whole.total);
      }),
      { numRuns: 20, seed: 8 },
    );
  });
});
