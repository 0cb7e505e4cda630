import { randomUUID } from "node:crypto";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import fc from "fast-check";
import { Listing, type User } from "~/models/index.server";
import { action, loader } from "~/routes/compare";
import { ensureBucket } from "~/services/storage.server";
import type { Comparison } from "~/compare/types";
import { seedDemo } from "../../db/seeds/demo";
import { createAmplifierListing, makeUser, removeFixtureUsers, type AmplifierFixture } from "../support/listing-fixtures";
import { isData, routeArgs } from "../support/route-args";
import { signedInCookie } from "../support/sessions";

// The compare page and its list, called as the server calls them against the real database: only
// live and sold units are shown, to everyone alike; bad, unknown and too many ids get a clear answer.

const BASE = "http://127.0.0.1";

type PageBody = { problem: { message: string; first: string | null } | null; comparison: Comparison | null; list: string[] };
type Outcome = { status: number; body?: unknown; location?: string | null; headers: Headers };

async function run(fn: () => Promise<unknown>): Promise<Outcome> {
  let value: unknown;
  try {
    value = await fn();
  } catch (thrown) {
    value = thrown;
  }
  if (value instanceof Response) return { status: value.status, location: value.headers.get("Location"), headers: value.headers };
  if (isData(value)) return { status: value.init?.status ?? 200, body: value.data, headers: new Headers(value.init?.headers) };
  return { status: 200, body: value, headers: new Headers() };
}

function open(query: string, cookie?: string) {
  const request = new Request(`${BASE}/compare${query}`, { headers: cookie ? { Cookie: cookie } : {} });
  return run(() => loader(routeArgs(request, {})));
}
const page = (o: Outcome) => o.body as PageBody;

function post(fields: Record<string, string>, cookie?: string, origin = BASE) {
  const headers: Record<string, string> = { "Content-Type": "application/x-www-form-urlencoded", Origin: origin };
  if (cookie) headers.Cookie = cookie;
  const request = new Request(`${BASE}/compare`, { method: "POST", body: new URLSearchParams(fields), headers });
  return run(() => action(routeArgs(request, {})));
}

/** The compare cookie a Set-Cookie header carries, as the browser would send it back. */
function cookieFrom(o: Outcome): string {
  const set = o.headers.get("Set-Cookie") ?? "";
  return set.split(";")[0];
}

let live: AmplifierFixture;
let sold: AmplifierFixture;
let held: AmplifierFixture;
let draft: AmplifierFixture;
let buyer: User;

beforeAll(async () => {
  await ensureBucket();
  await seedDemo(); // the demo amplifiers below; a no-op when the test stack has loaded them
  live = await createAmplifierListing({ label: "cmp-live" });
  sold = await createAmplifierListing({ label: "cmp-sold", status: "sold" });
  held = await createAmplifierListing({ label: "cmp-held", status: "held" });
  draft = await createAmplifierListing({ label: "cmp-draft", status: "draft" });
  buyer = await makeUser("cmp-buyer");
}, 240_000);

afterAll(async () => {
  await removeFixtureUsers([live, sold, held, draft].map((f) => f.seller).concat(buyer));
});

describe("/compare?ids=", () => {
  it("shows live and sold units in the order asked, and names the rest only as no longer available", async () => {
    const o = await open(`?ids=${held.listing.id},${live.listing.id}&ids=${draft.listing.id},${sold.listing.id}`);
    expect(o.status).toBe(200);
    const c = page(o).comparison!;
    expect(c.units.map((u) => [u.id, u.status])).toEqual([
      [live.listing.id, "live"],
      [sold.listing.id, "sold"],
    ]);
    expect(c.unavailable).toEqual([held.listing.id, draft.listing.id]);
  });

  it("says the same about a held unit, a draft and an id that never existed, to its seller too", async () => {
    const asSeller = await signedInCookie(held.seller);
    const bodies = await Promise.all(
      [held.listing.id, draft.listing.id, randomUUID()].map(async (id) => {
        const o = await open(`?ids=${live.listing.id},${id}`, asSeller);
        expect(o.status).toBe(200);
        return JSON.stringify(page(o).comparison).replaceAll(id, "<asked>");
      }),
    );
    expect(new Set(bodies).size).toBe(1);
    expect(bodies[0]).not.toContain("Held");
  });

  it("refuses more than four units with a clear message and a link to the first four", async () => {
    const ids = Array.from({ length: 6 }, () => randomUUID());
    const o = await open(`?ids=${ids.join(",")}`);
    expect(o.status).toBe(400);
    expect(page(o).problem).toEqual({
      message: "Up to 4 units can be compared side by side; this link names 6. Remove some and try again.",
      first: `/compare?ids=${ids.slice(0, 4).join(",")}`,
    });
    expect(page(o).comparison).toBeNull();
  });

  it("names what is not a listing id, and counts repeats once", async () => {
    const o = await open(`?ids=${live.listing.id},not-an-id,,%3Cscript%3E`);
    expect(o.status).toBe(400);
    expect(page(o).problem!.message).toMatch(/not a listing: “not-an-id”, “<script>”\./);
    const upper = await open(`?ids=${live.listing.id},${live.listing.id.toUpperCase()}, ${live.listing.id}`);
    expect(page(upper).comparison!.units.map((u) => u.id)).toEqual([live.listing.id]);
  });

  it("answers any query with the page or a 400, never an error", async () => {
    await fc.assert(
      fc.asyncProperty(fc.array(fc.string({ maxLength: 60 }), { maxLength: 6 }), async (values) => {
        const q = new URLSearchParams(values.map((v) => ["ids", v]));
        const o = await open(`?${q}`);
        expect([200, 302, 400]).toContain(o.status);
      }),
      { seed: 23, numRuns: 40 },
    );
  });

  it("opens the visitor's own list when the link names no units", async () => {
    const empty = await open("");
    expect(empty.status).toBe(200);
    expect(page(empty).comparison!.units).toEqual([]);
    const added = await post({ intent: "add", listingId: live.listing.id });
    const o = await open("", cookieFrom(added));
    expect(o.status).toBe(302);
    expect(o.location).toBe(`/compare?ids=${live.listing.id}`);
  });
});

describe("the figures side by side", () => {
  it("three demo amplifiers: every measured row, the stronger power marked, conditions beside each figure", async () => {
    const models = ["WQ 46i", "WQ 72i", "Velt 120 Studio"];
    const rows = await Listing.findAll({ where: { model: models, status: "live" }, attributes: ["id", "model"] });
    const ids = models.map((m) => rows.find((r) => r.model === m)!.id);
    const c = page(await open(`?ids=${ids.join(",")}`)).comparison!;
    expect(c.units.map((u) => u.title)).toEqual(["Carrowain WQ 46i", "Carrowain WQ 72i", "Vantrell Velt 120 Studio"]);
    expect(c.mixedKinds).toBeNull();
    const row = (key: string) => c.groups.flatMap((g) => g.rows).find((r) => r.key === key)!;
    expect(row("power8").cells.map((x) => [x!.value, x!.unit, x!.stronger])).toEqual([
      ["65", "W", false],
      ["106", "W", false],
      ["127", "W", true],
    ]);
    expect(row("power8").cells[0]!.conditions).toMatch(/^into 8 Ω, 1 kHz, 0\.1 % THD, both channels driven/);
    expect(row("power8").judgement).toEqual({ kind: "stronger", strongest: [2] });
    // SNR re each amplifier's own rated power: not set against each other, and the page says why.
    expect(row("snr").judgement).toEqual({ kind: "not_comparable", differ: ["output level"] });
    expect(row("snr").note).toMatch(/^Not ranked: the output level differs/);
    expect(c.groups.map((g) => g.title)).toEqual(["Power", "Distortion and noise", "Frequency response"]);
    expect(c.responses.flat!.series.map((s) => s.label)).toEqual(c.units.map((u) => u.title));
    expect(c.responses.riaa).toBeNull();
  });

  it("phono stages: their RIAA deviation overlaid, and the one without a sweep named", async () => {
    const models = ["Tellis Phono I MM", "Tellis Phono II MC", "WQ 5ph"];
    const rows = await Listing.findAll({ where: { model: models, status: "live" }, attributes: ["id", "model"] });
    const ids = models.map((m) => rows.find((r) => r.model === m)!.id);
    const c = page(await open(`?ids=${ids.join(",")}`)).comparison!;
    expect(c.responses.flat).toBeNull();
    expect(c.responses.riaa!.series.map((s) => s.label)).toEqual(["Calvorne Tellis Phono I MM", "Calvorne Tellis Phono II MC"]);
    // Deviation from the curve, not the curve itself: a few tenths of a dB, not tens.
    for (const s of c.responses.riaa!.series) expect(Math.max(...s.points.map((p) => Math.abs(p.db)))).toBeLessThan(2);
    expect(c.responses.without).toEqual(["Carrowain WQ 5ph"]);
    const riaa = c.groups.flatMap((g) => g.rows).find((r) => r.key === "riaaDeviation")!;
    expect(riaa.cells.map((x) => x === null)).toEqual([false, false, true]);
  });

  it("says when the units are of different kinds, and marks nothing across them", async () => {
    const rows = await Listing.findAll({ where: { model: ["WQ 46i", "XQ/55 Three-Head"], status: "live" }, attributes: ["id", "model"] });
    const c = page(await open(`?ids=${rows.map((r) => r.id).join(",")}`)).comparison!;
    expect(c.mixedKinds?.sort()).toEqual(["Integrated amplifier", "Tape deck"]);
    const snr = c.groups.flatMap((g) => g.rows).find((r) => r.key === "snr")!;
    expect(snr.judgement).toMatchObject({ kind: "not_comparable", differ: expect.arrayContaining(["kind of unit"]) });
    expect(snr.cells.some((x) => x?.stronger)).toBe(false);
  });
});

describe("the compare list", () => {
  it("adds, keeps order, refuses a fifth, removes and clears", async () => {
    const demo = await Listing.findAll({ where: { status: "live", category: "turntable" }, attributes: ["id"], limit: 3 });
    let cookie = "";
    for (const id of [live.listing.id, sold.listing.id, ...demo.map((d) => d.id)].slice(0, 4)) {
      const o = await post({ intent: "add", listingId: id }, cookie);
      expect(o.status).toBe(200);
      cookie = cookieFrom(o);
    }
    const fifth = await post({ intent: "add", listingId: demo[2].id }, cookie);
    expect(fifth.status).toBe(409);
    expect(fifth.body).toEqual({
      ok: false,
      reason: "You are comparing 4 units already, the most that fit side by side. Remove one first.",
    });
    const removed = await post({ intent: "remove", listingId: sold.listing.id }, cookie);
    expect(removed.body).toEqual({ ok: true, ids: [live.listing.id, demo[0].id, demo[1].id] });
    const cleared = await post({ intent: "clear" }, cookieFrom(removed));
    expect(cleared.body).toEqual({ ok: true, ids: [] });
    expect(cleared.headers.get("Set-Cookie")).toMatch(/Max-Age=0/i);
  });

  it("refuses a held unit, a draft and an unknown id with one answer", async () => {
    const answers = await Promise.all(
      [held.listing.id, draft.listing.id, randomUUID()].map((id) => post({ intent: "add", listingId: id })),
    );
    for (const a of answers) {
      expect(a.status).toBe(404);
      expect(a.body).toEqual({ ok: false, reason: "That unit is no longer available to compare." });
    }
  });

  it("sends a plain form back where it came from, only on this site", async () => {
    const back = await post({ intent: "add", listingId: live.listing.id, returnTo: "/market?category=integrated-amplifiers" });
    expect(back.status).toBe(302);
    expect(back.location).toBe("/market?category=integrated-amplifiers");
    expect(back.headers.get("Set-Cookie")).toMatch(/loadline_compare=/);
    const away = await post({ intent: "add", listingId: live.listing.id, returnTo: "//elsewhere.example/x" });
    expect(away.location).toBe(`/compare?ids=${live.listing.id}`);
    // A refusal comes back as a one-time notice on the page the form was on.
    const refused = await post({ intent: "add", listingId: draft.listing.id, returnTo: "/market" });
    expect(refused.status).toBe(302);
    expect(refused.location).toBe("/market");
  });

  it("refuses bad input with the field named, and another site's form", async () => {
    expect((await post({ intent: "add" })).body).toEqual({ ok: false, reason: "Say which unit.", path: "listingId" });
    expect((await post({ intent: "add", listingId: "nope" })).body).toMatchObject({ ok: false, path: "listingId" });
    expect((await post({ intent: "swap", listingId: live.listing.id })).body).toMatchObject({ ok: false, path: "intent" });
    expect((await post({ intent: "clear" }, undefined, "https://elsewhere.example")).status).toBe(403);
  });

  it("ignores a cookie that does not hold listing ids", async () => {
    const o = await open("", "loadline_compare=bm90LWpzb24");
    expect(o.status).toBe(200);
    expect(page(o).list).toEqual([]);
    const signedIn = await signedInCookie(buyer);
    expect((await open("", signedIn)).status).toBe(200);
  });
});
