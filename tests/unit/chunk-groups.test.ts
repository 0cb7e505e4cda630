import { describe, expect, it } from "vitest";
import { groupOf, pagesLoading } from "../../scripts/chunk-groups";

// The browser build's chunk groups: a module goes with the public pages that load it at once.

const R = "?__react-router-build-client-route";
const graph: Record<string, { isEntry: boolean; importers: string[] }> = {
  "/x/node_modules/@react-router/dev/dist/config/defaults/entry.client.tsx": { isEntry: true, importers: [] },
  [`/x/app/root.tsx${R}`]: { isEntry: true, importers: [] },
  [`/x/app/routes/home.tsx${R}`]: { isEntry: true, importers: [] },
  [`/x/app/routes/market.tsx${R}`]: { isEntry: true, importers: [] },
  [`/x/app/routes/listings/listing.tsx${R}`]: { isEntry: true, importers: [] },
  [`/x/app/routes/sell/bench.tsx${R}`]: { isEntry: true, importers: [] },
  "/x/app/components/SiteChrome.tsx": { isEntry: false, importers: [`/x/app/root.tsx${R}`] },
  "/x/app/components/Button.tsx": { isEntry: false, importers: ["/x/app/components/SiteChrome.tsx", `/x/app/routes/sell/bench.tsx${R}`] },
  "/x/app/components/ListingCard.tsx": {
    isEntry: false,
    importers: [`/x/app/routes/home.tsx${R}`, "/x/app/catalogue/ui/MarketResults.tsx"],
  },
  "/x/app/catalogue/ui/MarketResults.tsx": { isEntry: false, importers: [`/x/app/routes/market.tsx${R}`] },
  "/x/shared/bench/units.ts": { isEntry: false, importers: ["/x/app/catalogue/ui/MarketResults.tsx", `/x/app/routes/sell/bench.tsx${R}`] },
  "/x/app/sell/bench/Editor.tsx": { isEntry: false, importers: [`/x/app/routes/sell/bench.tsx${R}`, `/x/app/routes/sell/review.tsx${R}`] },
  "/x/node_modules/zod/v4/core/schemas.js": { isEntry: false, importers: [`/x/app/root.tsx${R}`, `/x/app/routes/sell/bench.tsx${R}`] },
};
const info = (id: string) => graph[id] ?? null;

describe("the public pages' chunk groups", () => {
  it("follows imports up to the route modules: the root's reach every page", () => {
    expect([...pagesLoading("/x/app/components/Button.tsx", info).pages].sort()).toEqual(["home", "listing", "market"]);
    expect([...pagesLoading("/x/app/components/ListingCard.tsx", info).pages].sort()).toEqual(["home", "market"]);
  });

  it("names a group by the pages, and leaves one route's own modules, other routes' modules and libraries alone", () => {
    expect(groupOf("/x/app/components/Button.tsx", info)).toBe("pages-home-market-listing");
    expect(groupOf("/x/app/components/ListingCard.tsx", info)).toBe("pages-home-market");
    expect(groupOf("/x/shared/bench/units.ts", info)).toBe("pages-market");
    // Only the market's route reaches it: it stays in that route's chunk.
    expect(groupOf("/x/app/catalogue/ui/MarketResults.tsx", info)).toBeNull();
    expect(groupOf("/x/app/components/SiteChrome.tsx", info)).toBeNull();
    expect(groupOf("/x/app/sell/bench/Editor.tsx", info)).toBeNull();
    expect(groupOf("/x/node_modules/zod/v4/core/schemas.js", info)).toBeNull();
  });
});
