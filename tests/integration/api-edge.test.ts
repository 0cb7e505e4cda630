import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { ListObjectsV2Command } from "@aws-sdk/client-s3";
import { env } from "~/env.server";
import { Capture } from "~/models/capture.server";
import { Listing, ListingPhoto } from "~/models/index.server";
import { createDraft } from "~/listings/drafts.server";
import { ERROR_CODES } from "~/http/errors.server";
import { createStorageClient, ensureBucket } from "~/services/storage.server";
import * as benchCheck from "~/routes/api.v1.bench-sheets.check";
import * as analyze from "~/routes/api.v1.captures.analyze";
import * as captureRoute from "~/routes/api.v1.captures.$id";
import * as listingApi from "~/routes/api.v1.listings.$id";
import * as photosApi from "~/routes/api.v1.listings.$id.photos";
import * as photoApi from "~/routes/api.v1.listings.$id.photos.$photoId";
import * as webhook from "~/routes/api.v1.webhooks.stripe";
import * as signIn from "~/routes/account/sign-in";
import * as signUp from "~/routes/account/sign-up";
import * as forgotPassword from "~/routes/account/forgot-password";
import * as oauthStart from "~/routes/account/oauth-start";
import * as resetPassword from "~/routes/account/reset-password";
import * as signOut from "~/routes/account/sign-out";
import * as itemStep from "~/routes/sell/item";
import { answer, chunkedRequest, countingBody, MiB, multipartFrame } from "../support/bodies";
import { twoToneJpeg } from "../support/photo-files";
import { cleanUp, makeAccount, type Seller } from "./listing-support";
import { routeArgs } from "../support/route-args";

// The API's edge against the real database and storage stand-in: bodies stop at their limits,
// client mistakes are 4xx in the one error shape (never 500), state-changing API calls from another
// origin are refused, and every route answers refusals alike.

const BASE = "http://127.0.0.1";
const CHUNK = 64 * 1024;
let owner: Seller;
let stranger: Seller;
let listingId: string;

type Module = { loader?: (args: never) => unknown; action?: (args: never) => unknown };
const call = (mod: Module, request: Request, params: Record<string, string> = {}) => {
  const fn = request.method === "GET" || request.method === "HEAD" ? mod.loader : mod.action;
  if (!fn) throw new Error(`no handler for ${request.method}`);
  // A route module's handler takes its own params' type; any of them is called the same way here.
  return answer(() => fn(routeArgs(request, params) as never));
};

async function storedKeys(prefix: string): Promise<string[]> {
  const out = await createStorageClient().send(new ListObjectsV2Command({ Bucket: env().s3.bucket, Prefix: prefix }));
  return (out.Contents ?? []).map((o) => o.Key!).sort();
}

beforeAll(async () => {
  await ensureBucket();
  owner = await makeAccount("edge-owner");
  stranger = await makeAccount("edge-stranger");
  listingId = (await createDraft(owner.session, "integrated_amplifier")).id;
});
afterAll(cleanUp);

describe("bodies are read through one limited stream (chunked, no Content-Length)", { timeout: 120_000 }, () => {
  it("40 MiB to the bench-sheet check: 413 after about 512 KB", async () => {
    const body = countingBody(40 * MiB, { head: '{"category":"integrated_amplifier","notes":"' });
    const res = await call(
      benchCheck,
      chunkedRequest(`${BASE}/api/v1/bench-sheets/check`, "POST", body, { "Content-Type": "application/json" }),
    );
    expect(res.status).toBe(413);
    expect(res.body).toEqual({ error: "too_large", message: "A bench sheet may be at most 512 KB." });
    expect(body.pulled()).toBeLessThanOrEqual(512 * 1024 + 2 * CHUNK);
  });

  it("40 MiB PATCH to a listing: 413 after about 600 KB", async () => {
    const body = countingBody(40 * MiB, { head: '{"benchSheet":{"notes":"' });
    const request = chunkedRequest(`${BASE}/api/v1/listings/${listingId}`, "PATCH", body, {
      "Content-Type": "application/json",
      Cookie: owner.cookie,
    });
    const res = await call(listingApi, request, { id: listingId });
    expect(res.status).toBe(413);
    expect(res.body.error).toBe("too_large");
    expect(body.pulled()).toBeLessThanOrEqual(600 * 1024 + 2 * CHUNK);
  });

  it("120 MiB capture: 413 once the file passes 50 MB, and nothing is stored", async () => {
    const before = await storedKeys("captures/");
    const rows = await Capture.count({ where: { ownerId: owner.user.id } });
    const frame = multipartFrame("file", "sweep.csv", "text/csv");
    const body = countingBody(120 * MiB, { head: `${frame.head}frequency,level\n`, tail: frame.tail, fill: 0x30 });
    const request = chunkedRequest(`${BASE}/api/v1/captures/analyze?wait=0`, "POST", body, {
      "Content-Type": frame.contentType,
      Cookie: owner.cookie,
    });
    const res = await call(analyze, request);
    expect(res.status).toBe(413);
    expect(res.body).toEqual({ error: "file_too_large", message: "The file is over 50 MB; captures are limited to 50 MB." });
    expect(body.pulled()).toBeLessThanOrEqual(50 * MiB + 64 * 1024 + 2 * CHUNK);
    expect(await storedKeys("captures/")).toEqual(before);
    expect(await Capture.count({ where: { ownerId: owner.user.id } })).toBe(rows);
  });

  it("120 MiB photo: 413 once the file passes 20 MB, and nothing is stored", async () => {
    const jpeg = await twoToneJpeg(64, 48);
    const frame = multipartFrame("photo", "front.jpg", "image/jpeg");
    // A real JPEG header and scan whose end never comes: the header check passes, the size does not.
    const head = Buffer.concat([Buffer.from(frame.head), jpeg.subarray(0, jpeg.length - 2)]);
    const body = countingBody(120 * MiB, { head, tail: frame.tail });
    const request = chunkedRequest(`${BASE}/api/v1/listings/${listingId}/photos`, "POST", body, {
      "Content-Type": frame.contentType,
      Cookie: owner.cookie,
    });
    const res = await call(photosApi, request, { id: listingId });
    expect(res.status).toBe(413);
    expect(res.body).toEqual({ error: "file_too_large", message: "This upload is too large; photos may be at most 20 MB." });
    expect(body.pulled()).toBeLessThanOrEqual(20 * MiB + 64 * 1024 + 2 * CHUNK);
    expect(await ListingPhoto.count({ where: { listingId } })).toBe(0);
    expect(await storedKeys("incoming/")).toEqual([]);
  });

  it("100 MiB to the payments webhook: 413 after 64 KB", async () => {
    const body = countingBody(100 * MiB, { head: '{"id":"evt_big","data":"' });
    const res = await call(
      webhook,
      chunkedRequest(`${BASE}/api/v1/webhooks/stripe`, "POST", body, {
        "Content-Type": "application/json",
        "Stripe-Signature": "t=1,v1=00",
      }),
    );
    expect(res.status).toBe(413);
    expect(res.body).toEqual({ error: "too_large", message: "A webhook event may be at most 64 KB." });
    expect(body.pulled()).toBeLessThanOrEqual(64 * 1024 + 2 * CHUNK);
  });
});

describe("client mistakes are 400, 405 or 415, never 500", () => {
  it("a NUL in benchSheet.notes through PATCH: 400 naming the field", async () => {
    const request = new Request(`${BASE}/api/v1/listings/${listingId}`, {
      method: "PATCH",
      headers: { "Content-Type": "application/json", Cookie: owner.cookie },
      body: JSON.stringify({ benchSheet: { category: "integrated_amplifier", readings: [], notes: "a\u0000b" } }),
    });
    const res = await call(listingApi, request, { id: listingId });
    expect(res.status).toBe(400);
    expect(res.body).toEqual({
      error: "invalid",
      message: "The field “benchSheet.notes” contains a NUL character (U+0000), which text cannot hold; remove it and send it again.",
      issues: [{ path: "benchSheet.notes", message: "contains a NUL character (U+0000), which text cannot hold" }],
    });
  });

  it("a right-to-left override in the model through PATCH: 400 beside item.model", async () => {
    const request = new Request(`${BASE}/api/v1/listings/${listingId}`, {
      method: "PATCH",
      headers: { "Content-Type": "application/json", Cookie: owner.cookie },
      body: JSON.stringify({ item: { model: "120-HG\u202exe.tab" } }),
    });
    const res = await call(listingApi, request, { id: listingId });
    expect(res.status).toBe(400);
    expect(res.body.issues).toEqual([{ path: "item.model", message: expect.stringContaining("U+202E") }]);
  });

  it("the item form's collection note with a NUL: 400 naming the field", async () => {
    const form = new URLSearchParams({
      category: "integrated_amplifier",
      currency: "EUR",
      collection: "on",
      collectionNote: "by\u0000appointment",
    });
    const request = new Request(`${BASE}/sell/${listingId}/item`, { method: "POST", body: form, headers: { Cookie: owner.cookie } });
    const res = await call(itemStep, request, { id: listingId });
    expect(res.status).toBe(400);
    expect(res.body.message).toContain("“collectionNote”");
  });

  it("GET on the webhook: 405 in the one shape", async () => {
    const res = await call(webhook, new Request(`${BASE}/api/v1/webhooks/stripe`));
    expect(res.status).toBe(405);
    expect(res.headers.get("Allow")).toBe("POST");
    expect(res.body).toEqual({ error: "method_not_allowed", message: "Use POST here." });
  });

  const bodies: [string, () => RequestInit, number][] = [
    ["JSON", () => ({ body: '{"email":"a@example.test","password":"x"}', headers: { "Content-Type": "application/json" } }), 415],
    ["text/plain", () => ({ body: "email=a@example.test", headers: { "Content-Type": "text/plain" } }), 415],
    [
      "broken multipart",
      () => ({
        body: '--x\r\nContent-Disposition: form-data; name="email"\r\n\r\na@b',
        headers: { "Content-Type": "multipart/form-data; boundary=x" },
      }),
      400,
    ],
    ["multipart without a boundary", () => ({ body: "email=a", headers: { "Content-Type": "multipart/form-data" } }), 400],
  ];
  const forms: [string, Module, Record<string, string>][] = [
    ["/sign-in", signIn, {}],
    ["/sign-up", signUp, {}],
    ["/forgot-password", forgotPassword, {}],
    ["/auth/oauth", oauthStart, {}],
    ["/reset-password/not-a-token", resetPassword, { token: "not-a-token" }],
  ];
  for (const [path, mod, params] of forms) {
    it(`anonymous ${path} posted as JSON, text/plain or broken multipart: 415 or 400 with a message`, async () => {
      for (const [what, init, status] of bodies) {
        const res = await call(mod, new Request(`${BASE}${path}`, { method: "POST", ...init() }), params);
        expect([what, res.status]).toEqual([what, status]);
        expect(res.body.message).toEqual(expect.any(String));
      }
    });
  }
});

describe("forms read by the body reader still reach the sign-in strategies", () => {
  it("a well-formed sign-in signs in, and a well-formed /auth/oauth goes to the provider", async () => {
    const form = (fields: Record<string, string>) => ({ method: "POST", body: new URLSearchParams(fields), headers: { Origin: BASE } });
    const signedIn = await call(
      signIn,
      new Request(`${BASE}/sign-in`, form({ email: "seller@loadline.test", password: "bench-demo-2026", redirectTo: "/sell" })),
    );
    expect(signedIn.status).toBe(302);
    expect(signedIn.headers.get("Location")).toBe("/sell");
    const oauth = await call(oauthStart, new Request(`${BASE}/auth/oauth`, form({ redirectTo: "/sell" })));
    expect(oauth.status).toBe(302);
    expect(oauth.headers.get("Location")).toMatch(/\/authorize\?.*response_type=code/);
  });
});

describe("state-changing API calls from another origin are refused", () => {
  const foreign = [
    ["a page on another port (same site)", { "Sec-Fetch-Site": "same-site", Origin: "http://127.0.0.1:4000" }],
    ["another site", { "Sec-Fetch-Site": "cross-site", Origin: "https://elsewhere.example" }],
    ["an Origin alone", { Origin: "http://127.0.0.1:4000" }],
    ["a no-cors POST from a sandboxed frame", { Origin: "null" }],
  ] as const;

  it("a photo and a capture posted with no-cors multipart from elsewhere: 403 cross_origin, nothing made", async () => {
    const jpeg = await twoToneJpeg(64, 48);
    for (const [what, headers] of foreign) {
      const photo = new FormData();
      photo.append("photo", new Blob([new Uint8Array(jpeg)], { type: "image/jpeg" }), "front.jpg");
      const up = await call(
        photosApi,
        new Request(`${BASE}/api/v1/listings/${listingId}/photos`, {
          method: "POST",
          body: photo,
          headers: { ...headers, Cookie: owner.cookie },
        }),
        { id: listingId },
      );
      expect([what, up.status, up.body.error]).toEqual([what, 403, "cross_origin"]);
      const capture = new FormData();
      capture.append("file", new Blob(["frequency,level\n20,0\n1000,0\n20000,0\n"], { type: "text/csv" }), "sweep.csv");
      const cap = await call(
        analyze,
        new Request(`${BASE}/api/v1/captures/analyze?wait=0`, {
          method: "POST",
          body: capture,
          headers: { ...headers, Cookie: owner.cookie },
        }),
      );
      expect([what, cap.status, cap.body.error]).toEqual([what, 403, "cross_origin"]);
    }
    expect(await ListingPhoto.count({ where: { listingId } })).toBe(0);
    expect(await Capture.count({ where: { ownerId: owner.user.id } })).toBe(0);
  });

  it("PATCH a listing, arrange or delete photos, check a sheet: 403 from elsewhere", async () => {
    const headers = {
      "Sec-Fetch-Site": "same-site",
      Origin: "http://127.0.0.1:4000",
      Cookie: owner.cookie,
      "Content-Type": "application/json",
    };
    const cases: [Module, Request, Record<string, string>][] = [
      [
        listingApi,
        new Request(`${BASE}/api/v1/listings/${listingId}`, { method: "PATCH", headers, body: '{"item":{"model":"X"}}' }),
        { id: listingId },
      ],
      [
        photosApi,
        new Request(`${BASE}/api/v1/listings/${listingId}/photos`, { method: "PATCH", headers, body: '{"order":[]}' }),
        { id: listingId },
      ],
      [
        photoApi,
        new Request(`${BASE}/api/v1/listings/${listingId}/photos/${listingId}`, { method: "DELETE", headers }),
        { id: listingId, photoId: listingId },
      ],
      [benchCheck, new Request(`${BASE}/api/v1/bench-sheets/check`, { method: "POST", headers, body: "{}" }), {}],
    ];
    for (const [mod, request, params] of cases) {
      const res = await call(mod, request, params);
      expect([request.method, res.status, res.body.error]).toEqual([request.method, 403, "cross_origin"]);
    }
    expect((await Listing.findByPk(listingId))!.model).not.toBe("X");
  });

  it("the same calls from our own pages, or from a tool that sends no Origin, go through", async () => {
    const ours = { "Sec-Fetch-Site": "same-origin", Origin: BASE, Cookie: owner.cookie, "Content-Type": "application/json" };
    const res = await call(
      listingApi,
      new Request(`${BASE}/api/v1/listings/${listingId}`, { method: "PATCH", headers: ours, body: '{"item":{"model":"120-HG"}}' }),
      { id: listingId },
    );
    expect(res.status).toBe(200);
    const tool = await call(
      listingApi,
      new Request(`${BASE}/api/v1/listings/${listingId}`, {
        method: "PATCH",
        headers: { Cookie: owner.cookie, "Content-Type": "application/json" },
        body: '{"item":{"model":"121-HG"}}',
      }),
      { id: listingId },
    );
    expect(tool.status).toBe(200);
    // Reading is never refused: a GET changes nothing.
    const read = await call(
      listingApi,
      new Request(`${BASE}/api/v1/listings/${listingId}`, { headers: { "Sec-Fetch-Site": "cross-site", Cookie: owner.cookie } }),
      { id: listingId },
    );
    expect(read.status).toBe(200);
  });

  it("the webhook takes any origin (its signature authenticates it); page forms share the rule", async () => {
    const hook = await call(
      webhook,
      new Request(`${BASE}/api/v1/webhooks/stripe`, {
        method: "POST",
        headers: { "Sec-Fetch-Site": "cross-site", "Stripe-Signature": "t=1,v1=00" },
        body: "{}",
      }),
    );
    expect(hook.body.error).toBe("invalid_signature");
    const out = await call(
      signOut,
      new Request(`${BASE}/sign-out`, { method: "POST", headers: { "Sec-Fetch-Site": "same-site", Cookie: owner.cookie } }),
    );
    expect(out.status).toBe(403);
  });
});

describe("one error shape on every API route", () => {
  const isOneShape = (body: Record<string, unknown>) =>
    Object.keys(body).every((k) => ["error", "message", "issues"].includes(k)) &&
    typeof body.message === "string" &&
    Object.hasOwn(ERROR_CODES, String(body.error));

  it("401 when signed out, 404 for someone else's record, 405 for a method the route does not take", async () => {
    const id = listingId;
    const routes: [Module, string, string[], string[], Record<string, string>][] = [
      [analyze, "/api/v1/captures/analyze", ["POST"], ["GET", "PUT"], {}],
      [captureRoute, `/api/v1/captures/${id}`, ["GET"], ["POST", "DELETE"], { id }],
      [listingApi, `/api/v1/listings/${id}`, ["GET", "PATCH"], ["POST", "DELETE"], { id }],
      [photosApi, `/api/v1/listings/${id}/photos`, ["GET", "POST", "PATCH"], ["PUT", "DELETE"], { id }],
      [photoApi, `/api/v1/listings/${id}/photos/${id}`, ["DELETE"], ["GET", "POST"], { id, photoId: id }],
      [benchCheck, "/api/v1/bench-sheets/check", [], ["GET", "PATCH"], {}],
      [webhook, "/api/v1/webhooks/stripe", [], ["GET", "PUT"], {}],
    ];
    for (const [mod, path, guarded, refused, params] of routes) {
      for (const method of guarded) {
        const anon = await call(mod, new Request(`${BASE}${path}`, { method }), params);
        expect([method, path, anon.status]).toEqual([method, path, 401]);
        expect(isOneShape(anon.body)).toBe(true);
        if (method === "GET" || method === "DELETE") {
          const other = await call(mod, new Request(`${BASE}${path}`, { method, headers: { Cookie: stranger.cookie } }), params);
          expect([method, path, other.status, other.body.error]).toEqual([method, path, 404, "not_found"]);
          expect(isOneShape(other.body)).toBe(true);
        }
      }
      for (const method of refused) {
        const res = await call(mod, new Request(`${BASE}${path}`, { method }), params);
        expect([method, path, res.status]).toEqual([method, path, 405]);
        expect(res.headers.get("Allow")).toBeTruthy();
        expect(isOneShape(res.body)).toBe(true);
      }
    }
  });
});
