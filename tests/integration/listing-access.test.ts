import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { createDraft, saveCondition, saveItem, withdrawListing } from "~/listings/drafts.server";
import { saveBenchSheet } from "~/listings/bench.server";
import { ListingNotFound } from "~/listings/errors.server";
import { publishListing } from "~/listings/publish.server";
import { addRestorationEntry } from "~/listings/restoration.server";
import { editorData } from "~/listings/view.server";
import { loader as apiLoader, action as apiAction } from "~/routes/api.v1.listings.$id";
import { loader as editorLoader } from "~/routes/sell/editor";
import { action as itemAction } from "~/routes/sell/item";
import { action as benchAction } from "~/routes/sell/bench";
import { loader as sellLoader } from "~/routes/sell/index";
import { exampleIntegratedAmplifierSheet } from "@shared/bench";
import { AMP_ITEM, BASE, call, cleanUp, makeAccount, reload, type Seller } from "./listing-support";
import { routeArgs } from "../support/route-args";

// A seller's drafts are theirs alone: another account gets "not found" from the services, the pages and
// the API alike, and nothing changes.

let owner: Seller;
let other: Seller;
let draftId: string;

beforeAll(async () => {
  owner = await makeAccount("owner");
  other = await makeAccount("other");
  const draft = await createDraft(owner.session, "integrated_amplifier");
  draftId = draft.id;
  await saveItem(draftId, owner.user.id, AMP_ITEM);
});
afterAll(cleanUp);

const args = routeArgs;
const get = (path: string, cookie?: string) => new Request(`${BASE}${path}`, { headers: cookie ? { Cookie: cookie } : {} });
const patch = (id: string, body: unknown, cookie?: string) =>
  new Request(`${BASE}/api/v1/listings/${id}`, {
    method: "PATCH",
    headers: { "Content-Type": "application/json", ...(cookie ? { Cookie: cookie } : {}) },
    body: JSON.stringify(body),
  });
const post = (path: string, fields: Record<string, string>, cookie: string) =>
  new Request(`${BASE}${path}`, {
    method: "POST",
    headers: { Cookie: cookie, "Content-Type": "application/x-www-form-urlencoded" },
    body: new URLSearchParams(fields),
  });

describe("through the services", () => {
  it("someone else's draft is not found, for reading and for every change", async () => {
    const attempts = [
      () => editorData(draftId, other.session),
      () => saveItem(draftId, other.user.id, { priceMinor: 100 }),
      () => saveCondition(draftId, other.user.id, { cosmeticGrade: "rough" }),
      () => saveBenchSheet(draftId, other.user.id, exampleIntegratedAmplifierSheet()),
      () =>
        addRestorationEntry(draftId, other.user.id, {
          doneOn: "2025-01-01",
          work: "x",
          parts: [],
          technician: null,
          readingsBefore: [],
          readingsAfter: [],
        }),
      () => publishListing(draftId, other.session),
      () => withdrawListing(draftId, other.user.id),
    ];
    for (const attempt of attempts) await expect(attempt()).rejects.toBeInstanceOf(ListingNotFound);
    const { listing, sheet, entries } = await reload(draftId);
    expect(listing.priceMinor).toBe(AMP_ITEM.priceMinor);
    expect(listing.cosmeticGrade).toBeNull();
    expect(sheet).toBeNull();
    expect(entries).toBe(0);
  });

  it("a malformed id is simply not found", async () => {
    await expect(editorData("not-a-uuid", owner.session)).rejects.toBeInstanceOf(ListingNotFound);
  });
});

describe("through the API", () => {
  it("answers the owner with everything, the serial number included", async () => {
    const res = await call(() => apiLoader(args(get(`/api/v1/listings/${draftId}`, owner.cookie), { id: draftId })));
    expect(res.status).toBe(200);
    expect(res.body.listing).toMatchObject({ id: draftId, status: "draft", priceMinor: 125_000, serialNumber: "HS1207734" });
    expect(res.body.checklist.length).toBeGreaterThan(5);
  });

  it("answers another seller 404 for GET and PATCH, and nothing changes", async () => {
    const read = await call(() => apiLoader(args(get(`/api/v1/listings/${draftId}`, other.cookie), { id: draftId })));
    expect(read.status).toBe(404);
    expect(read.body.error).toBe("not_found");
    expect(JSON.stringify(read.body)).not.toContain("HS1207734");
    const write = await call(() => apiAction(args(patch(draftId, { item: { priceMinor: 1 } }, other.cookie), { id: draftId })));
    expect(write.status).toBe(404);
    expect((await reload(draftId)).listing.priceMinor).toBe(125_000);
  });

  it("asks a visitor who is not signed in to sign in", async () => {
    const res = await call(() => apiLoader(args(get(`/api/v1/listings/${draftId}`), { id: draftId })));
    expect(res.status).toBe(401);
  });

  it("saves the owner's PATCH (what autosave sends), and refuses bad input with paths, saving none of it", async () => {
    const ok = await call(() =>
      apiAction(
        args(patch(draftId, { item: { priceMinor: 99_900 }, condition: { cosmeticGrade: "lived_in" } }, owner.cookie), { id: draftId }),
      ),
    );
    expect(ok.status).toBe(200);
    expect(ok.body.listing).toMatchObject({ priceMinor: 99_900, cosmeticGrade: "lived_in" });
    const bad = await call(() =>
      apiAction(
        args(patch(draftId, { item: { priceMinor: 50_000 }, condition: { cosmeticGrade: "mint" } }, owner.cookie), { id: draftId }),
      ),
    );
    expect(bad.status).toBe(400);
    expect(bad.body.issues.map((i: { path: string }) => i.path)).toEqual(["condition.cosmeticGrade"]);
    // The valid item part of the refused body was not kept: one transaction for the whole PATCH.
    expect((await reload(draftId)).listing.priceMinor).toBe(99_900);
    const unknown = await call(() => apiAction(args(patch(draftId, { price: 5 }, owner.cookie), { id: draftId })));
    expect(unknown.status).toBe(400);
  });
});

describe("through the pages", () => {
  it("the editor is a 404 page for another seller, and their form posts change nothing", async () => {
    const page = await call(() => editorLoader(args(get(`/sell/${draftId}`, other.cookie), { id: draftId })));
    expect(page.status).toBe(404);
    const item = await call(() =>
      itemAction(
        args(post(`/sell/${draftId}/item`, { category: "integrated_amplifier", maker: "Stolen", price: "1" }, other.cookie), {
          id: draftId,
        }),
      ),
    );
    expect(item.status).toBe(404);
    const bench = await call(() => benchAction(args(post(`/sell/${draftId}/bench`, { rows: "0" }, other.cookie), { id: draftId })));
    expect(bench.status).toBe(404);
    expect((await reload(draftId)).listing.maker).toBe(AMP_ITEM.maker);
  });

  it("the seller's list shows only their own listings", async () => {
    const mine = await call(() => sellLoader(args(get("/sell", owner.cookie), {})));
    const theirs = await call(() => sellLoader(args(get("/sell", other.cookie), {})));
    expect(mine.body.page.rows.map((l: { id: string }) => l.id)).toContain(draftId);
    expect(theirs.body.page.rows.map((l: { id: string }) => l.id)).not.toContain(draftId);
  });

  it("the owner's form post saves without JavaScript: the typed price lands in minor units", async () => {
    const res = await call(() =>
      itemAction(
        args(
          post(
            `/sell/${draftId}/item`,
            {
              category: "integrated_amplifier",
              maker: "Harrowgate Sound",
              model: "120-HG",
              price: "1,180",
              currency: "EUR",
              country: "DE",
              intent: "save",
            },
            owner.cookie,
          ),
          { id: draftId },
        ),
      ),
    );
    expect(res.status).toBe(200);
    expect(res.body).toMatchObject({ ok: true });
    expect((await reload(draftId)).listing.priceMinor).toBe(118_000);
    const bad = await call(() =>
      itemAction(
        args(post(`/sell/${draftId}/item`, { category: "integrated_amplifier", price: "twelve", currency: "EUR" }, owner.cookie), {
          id: draftId,
        }),
      ),
    );
    expect(bad.status).toBe(400);
    expect(bad.body.errors.price).toMatch(/not a price/);
    expect((await reload(draftId)).listing.priceMinor).toBe(118_000);
  });
});
