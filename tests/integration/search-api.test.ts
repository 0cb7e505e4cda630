import { afterAll, beforeAll, describe, expect, it } from "vitest";
import * as listings from "~/routes/api.v1.listings";
import * as one from "~/routes/api.v1.listings.$id";
import type { User } from "~/models/index.server";
import { createAmplifierListing, FIXTURE_SERIAL, makeUser, removeFixtureUsers, type AmplifierFixture } from "../support/listing-fixtures";
import { routeArgs } from "../support/route-args";
import { signedInCookie } from "../support/sessions";

// GET /api/v1/listings and GET /api/v1/listings/:id as the server calls them: the filters as query
// parameters with every refusal naming its parameter, only live units in the results, and the public
// view of one unit that never shows its serial number or postcode (its owner still gets the editor's view).

const BASE = "http://127.0.0.1";

function get(path: string, cookie?: string) {
  return new Request(`${BASE}${path}`, { headers: { Accept: "application/json", ...(cookie ? { Cookie: cookie } : {}) } });
}
async function read(response: Response) {
  return { status: response.status, headers: response.headers, text: await response.clone().text(), body: await response.json() };
}
const search = async (qs: string) => read(await listings.loader(routeArgs(get(`/api/v1/listings?${qs}`), {})));
const unit = async (id: string, cookie?: string) => read(await one.loader(routeArgs(get(`/api/v1/listings/${id}`, cookie), { id })));

let live: AmplifierFixture;
let held: AmplifierFixture;
let draft: AmplifierFixture;
let sold: AmplifierFixture;
let buyer: User;
let buyerCookie: string;

beforeAll(async () => {
  live = await createAmplifierListing({ label: "search-live" });
  held = await createAmplifierListing({ label: "search-held", status: "held" });
  draft = await createAmplifierListing({ label: "search-draft", status: "draft" });
  sold = await createAmplifierListing({ label: "search-sold", status: "sold" });
  buyer = await makeUser("search-buyer");
  buyerCookie = await signedInCookie(buyer);
}, 60_000);

afterAll(async () => {
  await removeFixtureUsers([live?.seller, held?.seller, draft?.seller, sold?.seller, buyer].filter(Boolean));
});

describe("GET /api/v1/listings", () => {
  it("answers a page of live units with the total, a cursor and the counts, cacheable by anyone", async () => {
    const res = await search("category=integrated-amplifiers&limit=2");
    expect(res.status).toBe(200);
    expect(res.headers.get("Cache-Control")).toMatch(/^public, max-age=\d+/);
    expect(res.body.items).toHaveLength(2);
    expect(res.body.total).toBeGreaterThan(2);
    expect(res.body.nextCursor).toEqual(expect.any(String));
    expect(res.body.counts.category.integrated_amplifier).toBe(res.body.total);

    const next = await search(`category=integrated-amplifiers&limit=2&cursor=${res.body.nextCursor}`);
    expect(next.status).toBe(200);
    expect(next.body.counts).toEqual(res.body.counts);
    expect(next.body.items.map((i: { id: string }) => i.id)).not.toContain(res.body.items[0].id);
  });

  it("never shows a held, draft or sold unit, nor a serial number or postcode", async () => {
    const res = await search("category=integrated-amplifiers&limit=100&figures=measured");
    const shown = res.body.items.map((i: { id: string }) => i.id);
    expect(shown).toContain(live.listing.id);
    for (const hidden of [held, draft, sold]) expect(shown).not.toContain(hidden.listing.id);
    expect(res.text).not.toContain(FIXTURE_SERIAL);
    expect(res.text).not.toContain("99901");
  });

  it.each([
    ["power8Min=lots", "power8Min"],
    ["thdMax=0.05%20W", "thdMax"],
    ["category=jukeboxes", "category"],
    ["sort=cheapest", "sort"],
    ["minPower=80", "minPower"],
    ["limit=0", "limit"],
    ["limit=101", "limit"],
    ["page=2", "page"],
    ["cursor=not%20base64", "cursor"],
    ["cursor=WyJuZXdlc3QiLCJ4Il0", "cursor"], // ["newest","x"]: well formed, not ours
    // ["newest","2026-02-31 10:00:00+00",uuid]: a date that is not one
    ["cursor=WyJuZXdlc3QiLCIyMDI2LTAyLTMxIDEwOjAwOjAwKzAwIiwiM2YxYzJhNGUtMDAwMC00MDAwLTgwMDAtMDAwMDAwMDAwMDAwIl0", "cursor"],
    // ["price_asc","1e999",uuid]: a number past what the column holds
    ["sort=price_asc&cursor=WyJwcmljZV9hc2MiLCIxZTk5OSIsIjNmMWMyYTRlLTAwMDAtNDAwMC04MDAwLTAwMDAwMDAwMDAwMCJd", "cursor"],
    ["figures=rated", "figures"],
  ])("%s is a 400 naming %s", async (qs, param) => {
    const res = await search(qs);
    expect(res.status).toBe(400);
    expect(res.body).toMatchObject({ error: "invalid", message: expect.stringContaining(param) });
    expect(res.body.issues).toEqual([{ path: param, message: expect.any(String) }]);
  });

  it("refuses a cursor from another sort", async () => {
    const first = await search("limit=1");
    const res = await search(`sort=price_asc&limit=1&cursor=${first.body.nextCursor}`);
    expect(res.status).toBe(400);
    expect(res.body.issues[0].path).toBe("cursor");
  });
});

describe("GET /api/v1/listings/:id", () => {
  it("shows anyone a live unit's public view, without its serial number or postcode", async () => {
    for (const cookie of [undefined, buyerCookie]) {
      const res = await unit(live.listing.id, cookie);
      expect(res.status).toBe(200);
      expect(res.body.listing).toMatchObject({ id: live.listing.id, status: "live", title: "Tallowmere Audio Ostry 60" });
      expect(res.body).not.toHaveProperty("viewer");
      expect(res.text).not.toContain(FIXTURE_SERIAL);
      expect(res.text).not.toContain("99901");
      expect(res.headers.get("Cache-Control")).toMatch(/^public/);
      expect(res.headers.get("Vary")).toBe("Cookie");
    }
    expect((await unit(sold.listing.id)).body.listing.status).toBe("sold");
  });

  it("gives the owner the editor's view, serial number included, never cached", async () => {
    const res = await unit(live.listing.id, await signedInCookie(live.seller));
    expect(res.status).toBe(200);
    expect(res.body.listing).toMatchObject({ id: live.listing.id, serialNumber: FIXTURE_SERIAL });
    expect(res.body.checklist).toEqual(expect.any(Array));
    expect(res.headers.get("Cache-Control")).toBe("no-store");
  });

  it("is not found for a held or draft unit (anonymous: sign in), nor for an id that does not exist", async () => {
    for (const hidden of [held, draft]) {
      expect((await unit(hidden.listing.id, buyerCookie)).status).toBe(404);
      expect((await unit(hidden.listing.id)).status).toBe(401);
    }
    expect((await unit("3f1c2a4e-0000-4000-8000-000000000000", buyerCookie)).status).toBe(404);
    expect((await unit("not-an-id", buyerCookie)).status).toBe(404);
  });
});
