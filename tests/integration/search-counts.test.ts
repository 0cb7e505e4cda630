import { afterAll, afterEach, describe, expect, it, vi } from "vitest";
import { Listing, type User } from "~/models/index.server";
import { countsQuery, searchListings, searchQuery, settleCounts } from "~/catalogue/search.server";
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
  const gates = (sql: string) => sql.match(/l\.bench_verified/g)?.length ?? 0;

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
