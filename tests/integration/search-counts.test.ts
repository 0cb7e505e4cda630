import { afterAll, afterEach, describe, expect, it, vi } from "vitest";
import { sequelize } from "~/db.server";
import { Listing, type User } from "~/models/index.server";
import { countsQuery, searchListings, searchQuery, settleCounts } from "~/catalogue/search.server";
import { CARD_COLUMNS } from "~/catalogue/card-rows.server";
import { parseMarketFilters, type MarketFilters } from "@shared/market-filters";
import { createAmplifierListing, removeFixtureUsers } from "../support/listing-fixtures";

// The panel's counts are kept per filter set: after a live listing changes, the kept counts are still
// served while a background recount (at most one per interval per filter set) brings them up to date.

const filters = (qs: string): MarketFilters => parseMarketFilters(new URLSearchParams(qs), { strict: true }).filters;
const liveAmps = () => Listing.count({ where: { status: "live", category: "integrated_amplifier" } });
const sellers: User[] = [];

afterEach(() => vi.restoreAllMocks());
afterAll(async () => {
  await removeFixtureUsers(sellers);
});

describe("kept counts", () => {
  it("serve the last counts after a change, and recount in the background at most once per interval", async () => {
    const amps = filters("category=integrated-amplifiers");
    const first = await searchListings(amps, { limit: 1 });
    expect(first.total).toBe(await liveAmps()); // a filter set never counted waits for its counts

    const added = await createAmplifierListing({ label: "counts-swr" });
    sellers.push(added.seller);
    const now = await liveAmps();
    expect(now).toBe(first.total + 1);

    // Within the interval: the kept counts, and no recount started.
    expect((await searchListings(amps, { limit: 1 })).total).toBe(first.total);
    await settleCounts();
    expect((await searchListings(amps, { limit: 1 })).total).toBe(first.total);

    // Past the interval: this request still gets the kept counts, and starts the recount.
    const realNow = Date.now();
    vi.spyOn(Date, "now").mockReturnValue(realNow + 16_000);
    expect((await searchListings(amps, { limit: 1 })).total).toBe(first.total);
    await settleCounts();
    const after = await searchListings(amps, { limit: 1 });
    expect(after.total).toBe(now);
    expect(after.counts.category.integrated_amplifier).toBe(now);

    // Another filter set, never counted, gets counts made at once.
    expect((await searchListings(filters("category=integrated-amplifiers&verified=1"), { limit: 1 })).total).toBe(
      await Listing.count({ where: { status: "live", category: "integrated_amplifier", benchVerified: true } }),
    );
  });
});

describe("the figures gate", () => {
  // The cards' own columns (joined onto the page) include the mark itself: only the filtering counts.
  const gates = (sql: string) => sql.replace(CARD_COLUMNS, "").match(/l\.bench_verified/g)?.length ?? 0;

  it("goes into the page query once however many measured filters are set, and into each measured count", () => {
    const both = filters("power8Min=80 W&thdMax=0.05 %&dampingMin=40");
    expect(gates(searchQuery(both).sql)).toBe(1);
    expect(gates(searchQuery(filters("power8Min=80 W&thdMax=0.05 %&figures=measured")).sql)).toBe(0);
    // verified=1 asks for the same column: once in all.
    expect(gates(searchQuery(filters("power8Min=80 W&thdMax=0.05 %&verified=1")).sql)).toBe(1);
    // A count leaves one measured filter out at a time, so each keeps its own copy of the gate.
    expect(countsQuery(both).sql).toMatch(/\(l\.bench_verified AND l\.power_8ohm_w >= \$\d+::float8\) AS d0/);
  });
});

describe("the market epoch", () => {
  it("is read at most once a second per process", async () => {
    const seen: string[] = [];
    const options = (sequelize as unknown as { options: { logging: unknown } }).options;
    const before = options.logging;
    options.logging = (sql: string) => void (sql.includes("market_epoch") && seen.push(sql));
    try {
      const at = Date.now() + 60_000;
      const clock = vi.spyOn(Date, "now").mockReturnValue(at);
      const amps = filters("category=integrated-amplifiers");
      await searchListings(amps, { limit: 1 });
      clock.mockReturnValue(at + 999);
      await searchListings(amps, { limit: 1 });
      expect(seen.length).toBe(1);
      clock.mockReturnValue(at + 1_000);
      await searchListings(amps, { limit: 1 });
      expect(seen.length).toBe(2);
    } finally {
      options.logging = before;
    }
  });
});

describe("the cards", () => {
  it("read a bench sheet only for a lead figure not kept", async () => {
    const seen: string[] = [];
    const options = (sequelize as unknown as { options: { logging: unknown } }).options;
    const before = options.logging;
    options.logging = (sql: string) => void seen.push(sql);
    try {
      const amps = filters("category=integrated-amplifiers");
      const first = await searchListings(amps, { limit: 50 });
      expect(first.items.some((i) => i.keyFigure)).toBe(true);
      const sheets = () => seen.filter((sql) => /"sheet"/.test(sql));
      expect(sheets().length).toBe(1);
      seen.length = 0;
      const again = await searchListings(amps, { limit: 50 });
      expect(again.items.map((i) => i.keyFigure)).toEqual(first.items.map((i) => i.keyFigure));
      expect(sheets()).toEqual([]);
    } finally {
      options.logging = before;
    }
  });
});
