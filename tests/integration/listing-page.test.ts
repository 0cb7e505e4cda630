import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { BenchSheet, Listing, type User } from "~/models/index.server";
import { Watch } from "~/models/watch.server";
import { action, loader } from "~/routes/listings/listing";
import type { ListingPageData } from "~/listings/types";
import { FIXTURE_SERIAL, createAmplifierListing, makeUser, removeFixtureUsers, type AmplifierFixture } from "../support/listing-fixtures";
import { isData, routeArgs } from "../support/route-args";
import { signedInCookie } from "../support/sessions";

// The listing page's loader and its watch action, called as the server calls them, against the real
// database: who may see which listing, that the serial number never leaves the server, and watching.

const BASE = "http://127.0.0.1";

type Outcome = { status: number; body?: ListingPageData & { initialPhoto: number }; location?: string | null; headers?: Headers };

/** Runs a loader or action and reads what came back or was thrown: data(), a Response, or a plain object. */
async function run(fn: () => Promise<unknown>): Promise<Outcome> {
  let value: unknown;
  try {
    value = await fn();
  } catch (thrown) {
    value = thrown;
  }
  if (value instanceof Response) return { status: value.status, location: value.headers.get("Location"), headers: value.headers };
  if (isData(value)) {
    return { status: value.init?.status ?? 200, body: value.data as Outcome["body"], headers: new Headers(value.init?.headers) };
  }
  return { status: 200, body: value as Outcome["body"] };
}

function open(id: string, cookie?: string, init: { zone?: string; lang?: string } = {}) {
  const url = new URL(`${BASE}/listings/${id}`);
  if (init.zone) url.searchParams.set("zone", init.zone);
  const headers: Record<string, string> = {};
  if (cookie) headers.Cookie = cookie;
  if (init.lang) headers["Accept-Language"] = init.lang;
  const request = new Request(url, { headers });
  return run(() => loader(routeArgs(request, { id })));
}

function watchPost(id: string, intent: string, cookie?: string) {
  const body = new URLSearchParams({ intent });
  const headers: Record<string, string> = { "Content-Type": "application/x-www-form-urlencoded", Origin: BASE };
  if (cookie) headers.Cookie = cookie;
  const request = new Request(`${BASE}/listings/${id}`, { method: "POST", body, headers });
  return run(() => action(routeArgs(request, { id })));
}

let live: AmplifierFixture;
let held: AmplifierFixture;
let draft: AmplifierFixture;
let buyer: User;
let moderator: User;
const cookies: Record<string, string> = {};

beforeAll(async () => {
  live = await createAmplifierListing({ label: "live" });
  held = await createAmplifierListing({ label: "held", status: "held", heldReason: "4 Ω power three times the 8 Ω power." });
  draft = await createAmplifierListing({ label: "draft", status: "draft" });
  buyer = await makeUser("buyer");
  moderator = await makeUser("moderator", ["buyer", "moderator"]);
  cookies.buyer = await signedInCookie(buyer);
  cookies.moderator = await signedInCookie(moderator);
  cookies.liveSeller = await signedInCookie(live.seller);
  cookies.heldSeller = await signedInCookie(held.seller);
  cookies.draftSeller = await signedInCookie(draft.seller);
}, 60_000);

afterAll(async () => {
  await removeFixtureUsers([live.seller, held.seller, draft.seller, buyer, moderator].filter(Boolean));
});

describe("who sees a listing", () => {
  it("a live listing opens for anyone, signed in or not", async () => {
    for (const cookie of [undefined, cookies.buyer, cookies.moderator, cookies.liveSeller]) {
      const res = await open(live.listing.id, cookie);
      expect(res.status).toBe(200);
      expect(res.body!.listing.title).toBe("Tallowmere Audio Ostry 60");
    }
  });

  it("a held listing is a 404 to the public and to other buyers", async () => {
    expect((await open(held.listing.id)).status).toBe(404);
    expect((await open(held.listing.id, cookies.buyer)).status).toBe(404);
    expect((await open(held.listing.id, cookies.liveSeller)).status).toBe(404);
  });

  it("a held listing opens for its seller and a moderator, with the state and the desk's reason", async () => {
    for (const cookie of [cookies.heldSeller, cookies.moderator]) {
      const res = await open(held.listing.id, cookie);
      expect(res.status).toBe(200);
      expect(res.body!.listing.status).toBe("held");
      expect(res.body!.listing.heldReason).toBe("4 Ω power three times the 8 Ω power.");
      expect(res.body!.viewer.canWatch).toBe(false);
    }
  });

  it("a draft opens for its seller only: not the public, not other buyers, not the desk", async () => {
    expect((await open(draft.listing.id, cookies.draftSeller)).status).toBe(200);
    for (const cookie of [undefined, cookies.buyer, cookies.moderator, cookies.liveSeller]) {
      expect((await open(draft.listing.id, cookie)).status).toBe(404);
    }
  });

  it("an unknown or malformed id is a plain 404", async () => {
    expect((await open("3f1b7a9e-0000-4000-8000-000000000000")).status).toBe(404);
    expect((await open("not-a-listing")).status).toBe(404);
  });

  it("the page is never stored in a shared cache (it differs per viewer)", async () => {
    const res = await open(live.listing.id);
    expect(res.headers?.get("Cache-Control")).toContain("private");
  });
});

describe("what the page carries", () => {
  it("never the serial number: not from the listing, not from the bench sheet's equipment, for any viewer", async () => {
    // The fixture stores the serial in both places; prove it is really there first.
    const withSerial = await Listing.scope("withSerial").findByPk(live.listing.id);
    expect(withSerial!.serialNumber).toBe(FIXTURE_SERIAL);
    const sheet = await BenchSheet.findOne({ where: { listingId: live.listing.id } });
    expect(JSON.stringify(sheet!.sheet)).toContain(FIXTURE_SERIAL);

    for (const [id, cookie] of [
      [live.listing.id, undefined],
      [live.listing.id, cookies.liveSeller],
      [held.listing.id, cookies.moderator],
      [draft.listing.id, cookies.draftSeller],
    ] as const) {
      const res = await open(id, cookie);
      expect(res.status).toBe(200);
      const json = JSON.stringify(res.body);
      expect(json).not.toContain(FIXTURE_SERIAL);
      expect(json).not.toContain("serialNumber");
      expect(json).not.toContain("99901"); // the postcode
      expect(json).not.toContain("@example.test"); // nobody's e-mail address
      expect(json).not.toContain("originals/"); // originals may carry a camera's location
      expect(res.body!.listing.unit.serialOnFile).toBe(true);
    }
  });

  it("says no serial number is on file when the seller's is blank or only spaces", async () => {
    for (const blank of [null, "   "]) {
      await Listing.scope("withSerial").update({ serialNumber: blank }, { where: { id: draft.listing.id } });
      const res = await open(draft.listing.id, cookies.draftSeller);
      expect(res.body!.listing.unit.serialOnFile).toBe(false);
    }
    await Listing.scope("withSerial").update({ serialNumber: FIXTURE_SERIAL }, { where: { id: draft.listing.id } });
    expect((await open(draft.listing.id, cookies.draftSeller)).body!.listing.unit.serialOnFile).toBe(true);
  });

  it("the key figures lead with power into 8 Ω and 4 Ω, distortion at rated power and bandwidth, each with unit and conditions", async () => {
    const { body } = await open(live.listing.id);
    const figures = Object.fromEntries(body!.keyFigures.map((f) => [f.key, f]));
    expect(body!.keyFigures.map((f) => f.key).slice(0, 3)).toEqual(["power8", "power4", "distortion"]);
    // The weaker channel is the honest headline (example sheet: left 66 W, right 65 W into 8 Ω).
    expect(figures.power8).toMatchObject({ value: "65", unit: "W" });
    expect(figures.power8.conditions).toContain("into 8 Ω");
    expect(figures.power8.conditions).toContain("0.1 % THD");
    expect(figures.power4).toMatchObject({ value: "96", unit: "W" });
    expect(figures.distortion).toMatchObject({ unit: "%", fromCapture: true });
    expect(figures.distortion.conditions).toContain("at 60 W");
    expect(figures.bandwidthHigh).toMatchObject({ value: "95", unit: "kHz" });
    expect(body!.listing.benchVerified).toBe(true);
  });

  it("the bench sheet marks capture figures and gives every rule with its outcome and explanation", async () => {
    const { body } = await open(live.listing.id);
    const bench = body!.bench!;
    const thd = bench.readings.filter((r) => r.quantity === "THD" && r.basis === "measured");
    expect(thd.every((r) => r.fromCapture && r.captureNote === "from a sine capture (WAV, 48 kHz, 24-bit)")).toBe(true);
    expect(bench.readings.find((r) => r.quantity === "Output power" && r.basis === "rated")?.fromCapture).toBe(false);
    expect(bench.checks.length).toBeGreaterThan(5);
    expect(new Set(bench.checks.map((c) => c.ruleId)).size).toBe(bench.checks.length);
    for (const c of bench.checks) {
      expect(c.explanation.length).toBeGreaterThan(20);
      expect(c.findings.length).toBeGreaterThan(0);
    }
    expect(bench.checks.some((c) => c.usesCapture)).toBe(true);
  });

  it("plots the harmonic spectrum from the seller's captures in dB re the fundamental, and the response re 1 kHz", async () => {
    const { body } = await open(live.listing.id);
    const [spectrum] = body!.plots.spectra;
    expect(spectrum.fundamentalHz).toBe(1000);
    expect(spectrum.channels.map((c) => c.key)).toEqual(["left", "right"]);
    // The fixture's left capture has H3 at 0.011 % of the fundamental: 20·log10(0.00011) = −79.2 dB.
    expect(spectrum.bars.find((b) => b.order === 3)!.levels.left).toBeCloseTo(-79.2, 0);
    const [response] = body!.plots.responses;
    expect(response.points.find((p) => p.f === 1000)!.level).toBe(0);
    expect(response.points.at(-1)!.level).toBeCloseTo(-3.0, 1);
  });

  it("a sheet cannot borrow another account's capture for its plots", async () => {
    const other = await createAmplifierListing({ label: "borrower" });
    try {
      const row = await BenchSheet.findOne({ where: { listingId: other.listing.id } });
      const sheet = structuredClone(row!.sheet!);
      for (const r of sheet.readings) if (r.captureId === other.captures.left.id) r.captureId = live.captures.left.id;
      await row!.update({ sheet });
      const { body } = await open(other.listing.id);
      // Only its own right-channel capture is plotted.
      expect(body!.plots.spectra[0].channels.map((c) => c.key)).toEqual(["right"]);
    } finally {
      await removeFixtureUsers([other.seller]);
    }
  });

  it("opens shipping on the visitor's zone from their language, and a chosen zone wins", async () => {
    const fromAustria = await open(live.listing.id, undefined, { lang: "de-AT,de;q=0.9" });
    expect(fromAustria.body!.shipping.zone).toBe("nearby");
    expect(fromAustria.body!.shipping.zoneGuessedFrom).toBe("Austria");
    const fromGermany = await open(live.listing.id, undefined, { lang: "de-DE" });
    expect(fromGermany.body!.shipping.zone).toBe("domestic");
    const chosen = await open(live.listing.id, undefined, { lang: "de-DE", zone: "worldwide" });
    expect(chosen.body!.shipping.zone).toBe("worldwide");
    const parcel = chosen.body!.shipping.options.find((o) => o.method === "parcel")!;
    expect(parcel.prices).toEqual({ domestic: { minor: 3900, text: "€39" }, nearby: { minor: 6900, text: "€69" } });
  });

  it("a unit of 30 kg or more goes by freight only and says two people must lift it", async () => {
    const heavy = await createAmplifierListing({ label: "heavy", weightG: 34_500 });
    try {
      const { body } = await open(heavy.listing.id);
      expect(body!.shipping.heavy).toBe(true);
      expect(body!.shipping.parcelWithheld).toBe(true);
      expect(body!.shipping.options.map((o) => o.method)).toEqual(["collection", "freight"]);
      const light = await open(live.listing.id);
      expect(light.body!.shipping.heavy).toBe(false);
    } finally {
      await removeFixtureUsers([heavy.seller]);
    }
  });

  it("names the verified workshop and where it is", async () => {
    const { body } = await open(live.listing.id);
    expect(body!.seller).toMatchObject({ kind: "workshop", verifiedWorkshop: true, place: "Altmarkhafen, Vorland, Germany" });
    expect(body!.restoration.map((e) => e.doneOn)).toEqual(["2025-02-20", "2025-03-14"]);
    expect(body!.restoration[0].readings).toEqual([
      { quantity: "DC offset, left", before: "48 mV", after: "4 mV", conditions: "no input, 8 Ω load" },
    ]);
  });
});

describe("watching", () => {
  const watches = (userId: string, listingId: string) => Watch.count({ where: { userId, listingId } });

  it("a visitor who is not signed in is sent to sign in and back to the listing", async () => {
    const res = await watchPost(live.listing.id, "watch");
    expect(res.status).toBe(302);
    expect(res.location).toBe(`/sign-in?redirectTo=${encodeURIComponent(`/listings/${live.listing.id}`)}`);
  });

  it("a signed-in buyer watches and unwatches; sending either twice changes nothing more", async () => {
    expect((await watchPost(live.listing.id, "watch", cookies.buyer)).body).toEqual({ watching: true });
    expect((await watchPost(live.listing.id, "watch", cookies.buyer)).body).toEqual({ watching: true });
    expect(await watches(buyer.id, live.listing.id)).toBe(1);
    expect((await open(live.listing.id, cookies.buyer)).body!.viewer).toMatchObject({ watching: true, canWatch: true });

    expect((await watchPost(live.listing.id, "unwatch", cookies.buyer)).body).toEqual({ watching: false });
    expect((await watchPost(live.listing.id, "unwatch", cookies.buyer)).body).toEqual({ watching: false });
    expect(await watches(buyer.id, live.listing.id)).toBe(0);
    expect((await open(live.listing.id, cookies.buyer)).body!.viewer.watching).toBe(false);
  });

  it("two watch requests at once still leave one row", async () => {
    await Promise.all([watchPost(live.listing.id, "watch", cookies.moderator), watchPost(live.listing.id, "watch", cookies.moderator)]);
    expect(await watches(moderator.id, live.listing.id)).toBe(1);
    await watchPost(live.listing.id, "unwatch", cookies.moderator);
  });

  it("nobody can watch a listing they cannot see, and a seller cannot watch their own", async () => {
    expect((await watchPost(held.listing.id, "watch", cookies.buyer)).status).toBe(404);
    expect((await watchPost(draft.listing.id, "watch", cookies.buyer)).status).toBe(404);
    const own = await watchPost(live.listing.id, "watch", cookies.liveSeller);
    expect(own.status).toBe(409);
    expect(await watches(live.seller.id, live.listing.id)).toBe(0);
  });

  it("refuses an unknown intent with a reason", async () => {
    const res = await watchPost(live.listing.id, "buy", cookies.buyer);
    expect(res.status).toBe(400);
    expect(res.body).toMatchObject({ path: "intent" });
  });
});
