import { afterAll, beforeAll, describe, expect, it } from "vitest";
import type { User } from "~/models/index.server";
import { Listing } from "~/models/index.server";
import { Watch } from "~/models/watch.server";
import * as one from "~/routes/api.v1.watches.$listingId";
import * as list from "~/routes/api.v1.watches";
import { createAmplifierListing, makeUser, removeFixtureUsers, type AmplifierFixture } from "../support/listing-fixtures";
import { routeArgs } from "../support/route-args";
import { signedInCookie } from "../support/sessions";

// The watch API called as the server calls it, against the real database: watch, list, unwatch, and
// the refusals (anonymous, someone else's draft, the seller's own unit, a unit no longer for sale).

const BASE = "http://127.0.0.1";

function request(method: "PUT" | "DELETE" | "GET", path: string, cookie?: string) {
  const headers: Record<string, string> = { Origin: BASE, Accept: "application/json" };
  if (cookie) headers.Cookie = cookie;
  return new Request(`${BASE}${path}`, { method, headers });
}
async function read(response: Response) {
  return { status: response.status, body: await response.json() };
}
const watch = async (id: string, cookie?: string) =>
  read(await one.action(routeArgs(request("PUT", `/api/v1/watches/${id}`, cookie), { listingId: id })));
const unwatch = async (id: string, cookie?: string) =>
  read(await one.action(routeArgs(request("DELETE", `/api/v1/watches/${id}`, cookie), { listingId: id })));
const watchList = async (cookie?: string) => read(await list.loader(routeArgs(request("GET", "/api/v1/watches", cookie), {})));

let older: AmplifierFixture;
let newer: AmplifierFixture;
let draft: AmplifierFixture;
let buyer: User;
let cookie: string;

beforeAll(async () => {
  older = await createAmplifierListing({ label: "watch-older" });
  newer = await createAmplifierListing({ label: "watch-newer" });
  draft = await createAmplifierListing({ label: "watch-draft", status: "draft" });
  buyer = await makeUser("watcher");
  cookie = await signedInCookie(buyer);
}, 60_000);

afterAll(async () => {
  await removeFixtureUsers([older?.seller, newer?.seller, draft?.seller, buyer].filter(Boolean));
});

describe("the watch API", () => {
  it("watches, lists newest watch first, and unwatches; repeating either changes nothing", async () => {
    expect(await watch(older.listing.id, cookie)).toEqual({ status: 200, body: { listingId: older.listing.id, watching: true } });
    expect((await watch(newer.listing.id, cookie)).status).toBe(200);
    expect((await watch(newer.listing.id, cookie)).status).toBe(200);
    // The second watch of `newer` must not count twice nor reorder anything.
    await Watch.update({ createdAt: new Date(Date.now() - 60_000) }, { where: { userId: buyer.id, listingId: older.listing.id } });

    const listed = await watchList(cookie);
    expect(listed.status).toBe(200);
    expect(listed.body.watches.map((w: { listingId: string }) => w.listingId)).toEqual([newer.listing.id, older.listing.id]);
    expect(listed.body.watches[0].listing).toMatchObject({ id: newer.listing.id, title: "Tallowmere Audio Ostry 60" });
    expect(listed.body.watches[0].listing).not.toHaveProperty("serialNumber");

    expect(await unwatch(newer.listing.id, cookie)).toEqual({ status: 200, body: { listingId: newer.listing.id, watching: false } });
    expect((await unwatch(newer.listing.id, cookie)).status).toBe(200);
    expect((await watchList(cookie)).body.watches.map((w: { listingId: string }) => w.listingId)).toEqual([older.listing.id]);
  });

  it("someone else's draft is a 404, as a listing that does not exist, and nothing is saved", async () => {
    const res = await watch(draft.listing.id, cookie);
    expect(res).toEqual({ status: 404, body: { error: "not_found", message: expect.any(String) } });
    expect(await Watch.count({ where: { userId: buyer.id, listingId: draft.listing.id } })).toBe(0);
    expect((await watch("not-an-id", cookie)).status).toBe(404);
  });

  it("the seller's own unit and a unit no longer for sale are refused with 409", async () => {
    const own = await watch(older.listing.id, await signedInCookie(older.seller));
    expect(own).toEqual({ status: 409, body: { error: "conflict", message: "This is your own listing." } });
    await Listing.update({ status: "sold" }, { where: { id: newer.listing.id } });
    try {
      expect((await watch(newer.listing.id, cookie)).body.error).toBe("conflict");
    } finally {
      await Listing.update({ status: "live" }, { where: { id: newer.listing.id } });
    }
  });

  it("a watched unit that leaves the public market leaves the list", async () => {
    await watch(newer.listing.id, cookie);
    await Listing.update({ status: "withdrawn" }, { where: { id: newer.listing.id } });
    try {
      expect((await watchList(cookie)).body.watches.map((w: { listingId: string }) => w.listingId)).not.toContain(newer.listing.id);
    } finally {
      await Listing.update({ status: "live" }, { where: { id: newer.listing.id } });
    }
  });

  it("anonymous callers get 401 in the one error shape", async () => {
    for (const res of [await watch(older.listing.id), await unwatch(older.listing.id), await watchList()]) {
      expect(res).toEqual({ status: 401, body: { error: "unauthenticated", message: expect.any(String) } });
    }
  });
});
