import { randomUUID } from "node:crypto";
import { plainPng } from "../support/photo-files";
import type { Fixtures } from "./support/matrix-fixtures";
import { apiOwnerOnly, apiSignedIn, everyone, ownerOnly, signedIn, type Entry, type Outcome } from "./support/matrix";
import { certifiedDemoUnit } from "./support/certificate-fixture";

// Who may reach what: every route in app/routes.ts, keyed by its URL pattern, with what each persona
// (anonymous, buyer, the owner of the listing in the URL, another seller, workshop, moderator, admin)
// must get. The roles nest: admin ⊇ moderator; every account is a buyer. Someone else's draft, photo
// or capture is a 404, never a 403, so an id reveals nothing. Write probes carry a body that gets past
// input checks where it can, so a refusal comes from authorization and not from the form.

const draft = (f: Fixtures) => ({ id: f.draft.id });
const desk = { anonymous: "sign-in", moderator: "ok", admin: "ok", others: 403 } as const;
const workshopOnly = (o: Outcome) => ({ anonymous: "sign-in", workshop: o, others: 403 }) as const;
const apiWorkshopOnly = (o: Outcome) => ({ anonymous: 401, workshop: o, others: 403 }) as const;
const form = (fields: Record<string, string>) => () => ({ form: fields });
const LOG_ENTRY = { intent: "add", doneOn: "2025-02-20", work: "Cleaned the input selector.", technician: "Bench 1" };
const png = await plainPng(32, 24);
const certified = await certifiedDemoUnit();
const sellers = { anonymous: "sign-in", owner: "ok", seller: "ok", workshop: "ok", others: 403 } as const;
const photoUpload = () => {
  const multipart = new FormData();
  multipart.set("photo", new Blob([new Uint8Array(png)], { type: "image/png" }), "front.png");
  return { multipart };
};

const applicationWithoutDocument = () => {
  const multipart = new FormData();
  for (const [k, v] of Object.entries({
    businessName: "Matrix Probe Bench",
    address: "Werkhof 3",
    town: "Fenwold",
    country: "DE",
    registrationNumber: "MP-1",
  }))
    multipart.set(k, v);
  return { multipart };
};

export const MATRIX: Record<string, Entry> = {
  "/": { cases: [{ get: everyone("ok") }] },
  "/market": { cases: [{ get: everyone("ok") }] },
  "/media/*": {
    cases: [
      { name: "a live listing's photo size", params: (f) => ({ "*": f.media.public }), get: everyone("ok") },
      // Originals keep their metadata (location, serial numbers on labels): never served.
      { name: "an original", params: (f) => ({ "*": f.media.original }), get: everyone(404) },
    ],
  },

  // Accounts and sign-in: open to all; a signed-in visitor is sent on from the forms they do not need.
  "/sign-up": { cases: [{ get: { anonymous: "ok", others: { to: "/account" } }, post: { body: form({}), expect: everyone(400) } }] },
  "/sign-in": { cases: [{ get: { anonymous: "ok", others: { to: "/" } }, post: { body: form({}), expect: everyone(400) } }] },
  "/sign-out": { cases: [{ get: { anonymous: { to: "/" }, others: "ok" }, post: { expect: everyone({ to: "/" }), fresh: true } }] },
  "/verify-email/:token": {
    cases: [{ params: () => ({ token: "no-such-token" }), get: everyone(410), post: { expect: everyone(410) } }],
  },
  "/forgot-password": { cases: [{ get: everyone("ok"), post: { body: form({}), expect: everyone(400) } }] },
  "/reset-password/:token": {
    cases: [{ params: () => ({ token: "no-such-token" }), get: everyone(410), post: { body: form({}), expect: everyone(400) } }],
  },
  "/auth/oauth": {
    cases: [
      {
        get: everyone({ to: "/sign-in" }),
        writes: { POST: { body: form({ redirectTo: "/market" }), expect: everyone({ to: /\/authorize\?/ }) } },
      },
    ],
  },
  "/auth/oauth/callback": { cases: [{ get: everyone({ to: /^\/sign-in\?oauth=/ }) }] },
  "/account": { cases: [{ get: signedIn("ok"), post: { body: form({ intent: "matrix-probe" }), expect: signedIn(400) } }] },
  // Applying as a workshop: any account; the probe's application has no document, so it is refused at the form.
  "/account/workshop": { cases: [{ get: signedIn("ok"), post: { body: applicationWithoutDocument, expect: signedIn(400) } }] },

  // Roles: the desk for moderators (and admins, who hold everything a moderator may do), accounts for admins.
  "/admin/users": {
    cases: [
      {
        get: { anonymous: "sign-in", admin: "ok", others: 403 },
        post: { body: form({ intent: "matrix-probe" }), expect: { anonymous: "sign-in", admin: 400, others: 403 } },
      },
    ],
  },
  "/desk": { cases: [{ get: desk }] },

  // Currencies: the rate table is the admin's alone (moderators included in the 403s); anyone may
  // choose the currency approximate prices are shown in.
  "/admin/rates": {
    cases: [
      {
        get: { anonymous: "sign-in", admin: "ok", others: 403 },
        post: { body: form({ "rate.GBP": "not a rate" }), expect: { anonymous: "sign-in", admin: 400, others: 403 } },
      },
    ],
  },
  // Buying. The checkout is any account's (the fixture unit has no delivery to offer, so the probe's
  // order is refused before anything is reserved); an order is its buyer's on /purchases and its
  // seller's on /sales, a 404 for everyone else; the desk's order screen is for moderators; the
  // marketplace settings are the admin's.
  "/checkout/:listingId": {
    cases: [
      {
        params: (f) => ({ listingId: f.live.id }),
        get: signedIn("ok"),
        post: { body: form({ zone: "domestic", deliveryMethod: "parcel" }), expect: signedIn(400) },
      },
      { name: "a draft", params: (f) => ({ listingId: f.draft.id }), get: signedIn(404) },
    ],
  },
  "/purchases": { cases: [{ get: signedIn("ok") }] },
  "/purchases/:orderId": {
    cases: [
      {
        params: (f) => ({ orderId: f.order.id }),
        get: { anonymous: "sign-in", buyer: "ok", others: 404 },
        post: { body: form({ intent: "matrix-probe" }), expect: { anonymous: "sign-in", buyer: 400, others: 404 } },
      },
    ],
  },
  "/sales": { cases: [{ get: { anonymous: "sign-in", owner: "ok", seller: "ok", workshop: "ok", others: 403 } }] },
  "/sales/:orderId": {
    cases: [
      {
        params: (f) => ({ orderId: f.order.id }),
        get: ownerOnly(),
        post: { body: form({ intent: "ship", carrier: "", trackingNumber: "" }), expect: ownerOnly(400) },
      },
    ],
  },
  "/desk/orders/:orderId": {
    cases: [
      {
        params: (f) => ({ orderId: f.order.id }),
        get: desk,
        post: {
          body: form({ resolution: "release", note: "" }),
          expect: { anonymous: "sign-in", moderator: 400, admin: 400, others: 403 },
        },
      },
    ],
  },
  // Workshop applications on the desk, and their documents: only through a link signed for the
  // moderator who opens it, so a bare address is a 404 even for the desk.
  "/desk/workshops/:id": {
    cases: [
      {
        params: (f) => ({ id: f.workshopApplication.workshopId }),
        get: desk,
        post: { body: form({ decision: "verify", note: "" }), expect: { anonymous: "sign-in", moderator: 400, admin: 400, others: 403 } },
      },
    ],
  },
  "/desk/documents/:id": {
    cases: [{ params: (f) => ({ id: f.workshopApplication.id }), get: { anonymous: "sign-in", moderator: 404, admin: 404, others: 403 } }],
  },
  // A contest's photo opens only through a short-lived link signed for its viewer: without one it is
  // the same 404 for everyone signed in (links are tested in tests/integration/orders-contest-evidence.test.ts).
  "/orders/:orderId/contest-photos/:n": {
    cases: [{ params: (f) => ({ orderId: f.order.id, n: "0" }), get: { anonymous: "sign-in", others: 404 } }],
  },
  // Reputation: public pages of sellers and workshops; the review of an order by its buyer, the answer
  // by its seller (anyone else: 404); hiding a review on the desk.
  "/sellers/:id": {
    cases: [
      { name: "a seller with a live unit", params: (f) => ({ id: f.users.owner.id }), get: everyone("ok") },
      { name: "a buyer-only account", params: (f) => ({ id: f.users.buyer.id }), get: everyone(404) },
    ],
  },
  "/workshops/:slug": {
    cases: [
      { name: "a demo workshop", params: () => ({ slug: "corrowmere-audio-bench" }), get: everyone("ok") },
      { name: "no such workshop", params: () => ({ slug: "no-such-workshop" }), get: everyone(404) },
    ],
  },
  "/purchases/:orderId/review": {
    cases: [
      {
        params: (f) => ({ orderId: f.order.id }),
        get: { anonymous: "sign-in", buyer: "ok", others: 404 },
        post: { body: form({ rating: "", body: "" }), expect: { anonymous: "sign-in", buyer: 400, others: 404 } },
      },
    ],
  },
  "/sales/:orderId/review": {
    cases: [{ params: (f) => ({ orderId: f.order.id }), get: ownerOnly(), post: { body: form({ answer: "" }), expect: ownerOnly(400) } }],
  },
  "/desk/reviews/:id": {
    cases: [
      {
        params: (f) => ({ id: f.review.id }),
        get: desk,
        post: { body: form({ note: "" }), expect: { anonymous: "sign-in", moderator: 400, admin: 400, others: 403 } },
      },
    ],
  },
  // The review desk's item pages: moderators and admins only; a note is required, so an empty one is a 400.
  "/desk/listings/:id": {
    cases: [
      {
        params: (f) => ({ id: f.held.id }),
        get: desk,
        post: {
          body: form({ intent: "clear_hold", note: "" }),
          expect: { anonymous: "sign-in", moderator: 400, admin: 400, others: 403 },
        },
      },
      {
        name: "no such listing",
        params: () => ({ id: randomUUID() }),
        get: { anonymous: "sign-in", moderator: 404, admin: 404, others: 403 },
      },
    ],
  },
  "/desk/users/:id": {
    cases: [
      {
        params: (f) => ({ id: f.users.owner.id }),
        get: desk,
        post: {
          body: form({ intent: "suspend_account", note: "" }),
          expect: { anonymous: "sign-in", moderator: 400, admin: 400, others: 403 },
        },
      },
    ],
  },
  "/admin/settings": {
    cases: [
      {
        get: { anonymous: "sign-in", admin: "ok", others: 403 },
        post: { body: form({ feePercent: "not a fee" }), expect: { anonymous: "sign-in", admin: 400, others: 403 } },
      },
    ],
  },
  "/currency": {
    cases: [
      {
        get: everyone({ to: "/" }),
        writes: { POST: { body: form({ currency: "GBP", returnTo: "/market" }), expect: everyone({ to: "/market" }) } },
      },
    ],
  },

  // The public listing page: live for everyone; held for its seller and the desk; a draft for its seller only.
  "/listings/:id": {
    cases: [
      {
        name: "live",
        params: (f) => ({ id: f.live.id }),
        get: everyone("ok"),
        post: { body: form({ intent: "unwatch" }), expect: signedIn("ok") },
      },
      {
        name: "held",
        params: (f) => ({ id: f.held.id }),
        get: { owner: "ok", moderator: "ok", admin: "ok", others: 404 },
        post: {
          body: form({ intent: "unwatch" }),
          expect: { anonymous: "sign-in", owner: "ok", moderator: "ok", admin: "ok", others: 404 },
        },
      },
      {
        name: "draft",
        params: draft,
        get: { owner: "ok", others: 404 },
        post: { body: form({ intent: "unwatch" }), expect: { anonymous: "sign-in", owner: "ok", others: 404 } },
      },
      { name: "no such listing", params: () => ({ id: randomUUID() }), get: everyone(404) },
    ],
  },

  // Compare: public and the same for everyone (only live and sold units are shown). Its action keeps the
  // visitor's own compare list in a cookie, signed in or not, and sends a plain form back where it came from.
  "/compare": {
    cases: [
      {
        get: everyone("ok"),
        post: {
          body: (f) => ({ form: { intent: "remove", listingId: f.live.id, returnTo: "/market" } }),
          expect: everyone({ to: "/market" }),
        },
      },
    ],
  },

  // The watch list: any account; the form's fallback unwatches without JavaScript.
  "/watching": {
    cases: [
      {
        get: signedIn("ok"),
        post: { body: (f) => ({ form: { intent: "unwatch", listingId: f.live.id } }), expect: signedIn("ok") },
      },
    ],
  },

  // Spec alerts: any account saves and manages its own; someone else's alert is a 404. The unsubscribe
  // link needs no account (its token is the authority): a live token works for anyone, any other is a 404.
  "/alerts": {
    cases: [
      {
        get: signedIn("ok"),
        post: { body: (f) => ({ form: { intent: "rename", alertId: f.alert.id, name: "Matrix alert" } }), expect: ownerOnly("ok") },
      },
    ],
  },
  "/alerts/new": {
    cases: [{ get: signedIn("ok"), post: { body: form({ name: "", frequency: "instant", query: "" }), expect: signedIn(400) } }],
  },
  "/unsubscribe/:token": {
    cases: [
      {
        name: "live token",
        params: (f) => ({ token: f.unsubscribeToken }),
        get: everyone("ok"),
        post: { body: form({}), expect: everyone("ok") },
      },
      {
        name: "unknown token",
        params: () => ({ token: "A".repeat(43) }),
        get: everyone(404),
        post: { body: form({}), expect: everyone(404) },
      },
    ],
  },

  // Conversations: a thread is its buyer's and its seller's (the owner of the listing); anyone else gets
  // a 404, as for a thread that does not exist. Asking about your own unit is refused (409).
  "/messages": {
    cases: [
      {
        get: signedIn("ok"),
        post: {
          body: (f) => ({ form: { intent: "ask", listingId: f.live.id } }),
          expect: { anonymous: "sign-in", owner: 409, others: { to: /^\/messages\/[0-9a-f-]{36}$/ } },
        },
      },
    ],
  },
  "/messages/:threadId": {
    cases: [
      {
        params: (f) => ({ threadId: f.thread.id }),
        get: { anonymous: "sign-in", buyer: "ok", owner: "ok", others: 404 },
        post: {
          body: form({ intent: "send", body: "Is the left channel's bias adjustable?" }),
          expect: { anonymous: "sign-in", buyer: { to: "/messages/:threadId" }, owner: { to: "/messages/:threadId" }, others: 404 },
        },
      },
      { name: "no such thread", params: () => ({ threadId: randomUUID() }), get: signedIn(404) },
    ],
  },
  // Reports: any account reports a public listing that is not its own (its seller gets a 403, a listing the
  // public cannot see is a 404); a conversation only by its two sides. The desk reads a reported
  // conversation; its action dismisses a report with a note.
  "/listings/:id/report": {
    cases: [
      {
        params: (f) => ({ id: f.live.id }),
        get: { anonymous: "sign-in", owner: 403, others: "ok" },
        post: { body: form({ reason: "", note: "" }), expect: { anonymous: "sign-in", owner: 403, others: 400 } },
      },
      { name: "a draft", params: (f) => ({ id: f.draft.id }), get: signedIn(404) },
    ],
  },
  "/messages/:threadId/report": {
    cases: [
      {
        params: (f) => ({ threadId: f.thread.id }),
        get: { anonymous: "sign-in", buyer: "ok", owner: "ok", others: 404 },
        post: { body: form({ reason: "", note: "" }), expect: { anonymous: "sign-in", buyer: 400, owner: 400, others: 404 } },
      },
    ],
  },
  "/desk/threads/:id": {
    cases: [
      {
        params: (f) => ({ id: f.thread.id }),
        get: desk,
        post: { body: form({ flagId: "", note: "" }), expect: { anonymous: "sign-in", moderator: 400, admin: 400, others: 403 } },
      },
    ],
  },
  "/api/v1/threads": {
    cases: [
      {
        get: apiSignedIn("ok"),
        writes: { POST: { body: (f) => ({ json: { listingId: f.live.id } }), expect: { anonymous: 401, owner: 409, others: 201 } } },
      },
    ],
  },
  "/api/v1/threads/:id/messages": {
    cases: [
      {
        params: (f) => ({ id: f.thread.id }),
        get: { anonymous: 401, buyer: "ok", owner: "ok", others: 404 },
        writes: {
          POST: {
            body: () => ({ json: { body: "Does it come with the manual?" } }),
            expect: { anonymous: 401, buyer: 201, owner: 201, others: 404 },
          },
        },
      },
    ],
  },
  // Offers: the buyer persona already has one open (409 for a second); the owner cannot offer on their own unit.
  "/api/v1/offers": {
    cases: [
      {
        get: everyone(405),
        writes: {
          POST: {
            body: (f) => ({ json: { listingId: f.live.id, amountMinor: 40_000, currency: "EUR" } }),
            expect: { anonymous: 401, owner: 409, buyer: 409, others: 201 },
          },
        },
      },
    ],
  },
  // Answering: the side it was made to (the owner) may accept; the buyer who made it may not (403);
  // anyone else gets a 404. The owner's acceptance closes the offer, so it runs last.
  "/api/v1/offers/:id": {
    cases: [
      {
        params: (f) => ({ id: f.offer.id }),
        get: everyone(405),
        writes: {
          POST: {
            body: () => ({ json: { action: "accept" } }),
            expect: { anonymous: 401, buyer: 403, owner: "ok", others: 404 },
            last: true,
          },
        },
      },
    ],
  },

  // The seller's path. Any account may start selling; the editor is the owner's alone.
  "/sell": {
    cases: [
      {
        get: signedIn("ok"),
        // A draft cannot be withdrawn, so the owner is told so (200 with a message); nobody else may try.
        post: { body: (f) => ({ form: { intent: "withdraw", confirm: "yes", ids: f.draft.id } }), expect: ownerOnly("ok") },
      },
    ],
  },
  "/sell/new": { cases: [{ get: signedIn("ok"), post: { body: form({ category: "not-a-category" }), expect: signedIn(400) } }] },
  // The frame's index only forwards to the first step, for any id (the step then decides), so it reveals
  // nothing. A visitor may be sent there or straight to sign in: the frame's and the index's loaders race.
  "/sell/:id": {
    cases: [{ params: draft, get: { anonymous: { anyOf: ["sign-in", { to: "/sell/:id/item" }] }, others: { to: "/sell/:id/item" } } }],
  },
  "/sell/:id/item": {
    cases: [
      {
        name: "draft",
        params: draft,
        get: ownerOnly(),
        post: { body: form({ category: "integrated_amplifier", maker: "" }), expect: ownerOnly() },
      },
      // The desk reads a held listing on its public page; editing it stays the seller's.
      { name: "held", params: (f) => ({ id: f.held.id }), get: ownerOnly() },
    ],
  },
  "/sell/:id/condition": {
    cases: [
      {
        params: draft,
        get: ownerOnly(),
        post: { body: form({ cosmeticGrade: "clean", serviceState: "serviced_measured", conditionNote: "" }), expect: ownerOnly() },
      },
    ],
  },
  "/sell/:id/restoration": {
    // A new log entry: the owner is sent back to the log; nobody else gets that far.
    cases: [
      {
        params: draft,
        get: ownerOnly(),
        post: { body: form(LOG_ENTRY), expect: ownerOnly({ to: /^\/sell\/[0-9a-f-]{36}\/restoration\?added=[0-9a-f-]{36}$/ }) },
      },
    ],
  },
  "/sell/:id/photos": { cases: [{ params: draft, get: ownerOnly() }] },
  // An empty sheet is a sheet (saved and checked).
  "/sell/:id/bench": { cases: [{ params: draft, get: ownerOnly(), post: { body: form({}), expect: ownerOnly() } }] },
  // Publishing a bare draft: the owner is told what is missing (400).
  "/sell/:id/review": { cases: [{ params: draft, get: ownerOnly(), post: { body: form({ intent: "publish" }), expect: ownerOnly(400) } }] },

  // The API: 401 without an account, 404 for what is not yours (as for what does not exist).
  "/api/v1/listings/:id": {
    cases: [
      {
        name: "draft",
        params: draft,
        get: apiOwnerOnly(),
        writes: { PATCH: { body: () => ({ json: { condition: { conditionNote: "Matrix probe." } } }), expect: apiOwnerOnly() } },
      },
      // A live unit: its owner gets the editor's view (serial number included), everyone else the public view.
      { name: "live", params: (f) => ({ id: f.live.id }), get: everyone("ok") },
      // Held: the owner's; anyone else signed in gets 404, as for an id that does not exist.
      { name: "held", params: (f) => ({ id: f.held.id }), get: apiOwnerOnly() },
      { name: "no such listing", params: () => ({ id: randomUUID() }), get: apiSignedIn(404) },
    ],
  },
  // Search: the market's listings for anyone. Read-only: writes get apiRoute's 405.
  "/api/v1/listings": {
    cases: [{ get: everyone("ok"), writes: { POST: { body: () => ({ json: {} }), expect: everyone(405) } } }],
  },
  // Watching: any account, for what it may see. The seller's own unit and a unit that is not for sale
  // are refused with 409; someone else's draft or held unit is a 404, as for one that does not exist.
  // Read-only: writes get apiRoute's 405.
  "/api/v1/watches": {
    cases: [{ get: apiSignedIn("ok"), writes: { POST: { body: () => ({ json: {} }), expect: everyone(405) } } }],
  },
  "/api/v1/watches/:listingId": {
    cases: [
      {
        name: "live",
        params: (f) => ({ listingId: f.live.id }),
        get: everyone(405),
        writes: { PUT: { expect: { anonymous: 401, owner: 409, others: "ok" } }, DELETE: { expect: apiSignedIn("ok") } },
      },
      {
        name: "held",
        params: (f) => ({ listingId: f.held.id }),
        writes: {
          PUT: { expect: { anonymous: 401, owner: 409, moderator: 409, admin: 409, others: 404 } },
          DELETE: { expect: { anonymous: 401, owner: "ok", moderator: "ok", admin: "ok", others: 404 } },
        },
      },
      {
        name: "draft",
        params: (f) => ({ listingId: f.draft.id }),
        writes: { PUT: { expect: { anonymous: 401, owner: 409, others: 404 } }, DELETE: { expect: apiOwnerOnly() } },
      },
      { name: "no such listing", params: () => ({ listingId: randomUUID() }), writes: { PUT: { expect: apiSignedIn(404) } } },
    ],
  },
  "/api/v1/listings/:id/photos": {
    cases: [
      {
        params: draft,
        get: apiOwnerOnly(),
        writes: {
          POST: { body: photoUpload, expect: apiOwnerOnly(202) },
          PATCH: { body: (f) => ({ json: { coverId: f.photo.id } }), expect: apiOwnerOnly() },
        },
      },
    ],
  },
  "/api/v1/listings/:id/photos/:photoId": {
    cases: [
      {
        params: (f) => ({ id: f.draft.id, photoId: f.photo.id }),
        get: everyone(405),
        writes: { DELETE: { expect: apiOwnerOnly(), last: true } },
      },
    ],
  },
  // Read-only: its action (apiRoute's) answers every write with 405 in the API's one shape.
  "/api/v1/captures/:id": {
    cases: [
      {
        params: (f) => ({ id: f.capture.id }),
        get: apiOwnerOnly(),
        writes: { POST: { body: () => ({ json: {} }), expect: everyone(405) } },
      },
    ],
  },
  // The owner may queue again a capture that failed on our side; the fixture's capture did not (409).
  "/api/v1/captures/:id/retry": {
    cases: [
      {
        params: (f) => ({ id: f.capture.id }),
        get: everyone(405),
        writes: { POST: { body: () => ({ json: {} }), expect: apiOwnerOnly(409) } },
      },
    ],
  },
  // Any account may have a capture analysed; a form without a file is refused after the door.
  "/api/v1/captures/analyze": {
    cases: [{ get: everyone(405), writes: { POST: { body: () => ({ multipart: new FormData() }), expect: apiSignedIn(400) } } }],
  },
  "/api/v1/bench-sheets/check": {
    cases: [{ get: everyone(405), writes: { POST: { body: () => ({ json: {} }), expect: everyone(400) } } }],
  },
  // Authenticated by its signature, not a session: unsigned is 400 for everyone.
  "/api/v1/webhooks/stripe": {
    cases: [
      { get: everyone(405), writes: { POST: { body: () => ({ json: { type: "payment_intent.succeeded" } }), expect: everyone(400) } } },
    ],
  },
  // The workshop's inventory: any account reads its own units; an action on a unit that is not yours is a
  // 404 (the draft cannot be withdrawn, so its owner gets 409).
  "/api/v1/inventory": {
    cases: [
      {
        get: apiSignedIn("ok"),
        writes: { POST: { body: (f) => ({ json: { action: "withdraw", ids: [f.draft.id] } }), expect: apiOwnerOnly(409) } },
      },
    ],
  },
  "/sell/inventory.csv": { cases: [{ get: signedIn("ok") }] },
  // Working in bulk: workshops only (any other account 403), each its own imports and templates
  // (another's, like a missing one, 404). The import's two files hold no one's data: open to all.
  "/sell/import": {
    cases: [{ get: workshopOnly("ok"), post: { body: () => ({ multipart: new FormData() }), expect: workshopOnly(400) } }],
  },
  "/sell/import/template.csv": { cases: [{ get: everyone("ok") }] },
  "/sell/import/example.csv": { cases: [{ get: everyone("ok") }] },
  "/sell/import/:id": { cases: [{ name: "no such import", params: () => ({ id: randomUUID() }), get: workshopOnly(404) }] },
  "/api/v1/imports": {
    cases: [
      { get: apiWorkshopOnly("ok"), writes: { POST: { body: () => ({ multipart: new FormData() }), expect: apiWorkshopOnly(400) } } },
    ],
  },
  // Read-only: writes get apiRoute's 405.
  "/api/v1/imports/:id": {
    cases: [
      {
        name: "no such import",
        params: () => ({ id: randomUUID() }),
        get: apiWorkshopOnly(404),
        writes: { POST: { body: () => ({ json: {} }), expect: everyone(405) } },
      },
    ],
  },
  "/sell/templates": {
    cases: [{ get: workshopOnly("ok"), post: { body: form({ intent: "add", title: "", work: "" }), expect: workshopOnly(400) } }],
  },
  "/api/v1/restoration-templates": {
    cases: [{ get: apiWorkshopOnly("ok"), writes: { POST: { body: () => ({ json: {} }), expect: apiWorkshopOnly(400) } } }],
  },
  "/api/v1/restoration-templates/:id": {
    cases: [
      {
        name: "no such template",
        params: () => ({ id: randomUUID() }),
        get: apiWorkshopOnly(404),
        writes: {
          PUT: {
            body: () => ({ json: { title: "Matrix probe", work: "Cleaned the controls.", parts: [] } }),
            expect: apiWorkshopOnly(404),
          },
          DELETE: { expect: apiWorkshopOnly(404) },
        },
      },
    ],
  },
  "/healthz": { cases: [{ get: everyone("ok") }] },
  // Liveness and readiness for load balancers.
  "/healthz/live": { cases: [{ get: everyone("ok") }] },
  "/healthz/ready": { cases: [{ get: everyone("ok") }] },
  // Bench certificates: the PDF for whoever may open a bench-verified unit's page (a unit without a
  // bench sheet has none, not even for its seller); the page and JSON its QR code leads to, for anyone.
  "/listings/:id/certificate.pdf": {
    cases: [
      { name: "a bench-verified demo unit", params: () => ({ id: certified.listingId }), get: everyone("ok") },
      { name: "a live unit without a bench sheet", params: (f) => ({ id: f.live.id }), get: everyone(404) },
      { name: "a draft", params: draft, get: everyone(404) },
      { name: "no such listing", params: () => ({ id: randomUUID() }), get: everyone(404) },
    ],
  },
  "/certificates/:id": {
    cases: [
      { name: "a certificate", params: () => ({ id: certified.certificateId }), get: everyone("ok") },
      { name: "no such certificate", params: () => ({ id: randomUUID() }), get: everyone(404) },
    ],
  },
  "/api/v1/certificates/:id": {
    cases: [
      {
        name: "a certificate",
        params: () => ({ id: certified.certificateId }),
        get: everyone("ok"),
        writes: { POST: { body: () => ({ json: {} }), expect: everyone(405) } },
      },
      { name: "no such certificate", params: () => ({ id: randomUUID() }), get: everyone(404) },
    ],
  },
  // The money view: sellers (workshops included) see their own ledger's months; no one else's is reachable.
  "/sales/money": { cases: [{ get: sellers }] },
  "/sales/money.csv": { cases: [{ get: sellers }] },
  "/api/v1/sales/money": {
    cases: [
      {
        get: { anonymous: 401, owner: "ok", seller: "ok", workshop: "ok", others: 403 },
        writes: { POST: { body: () => ({ json: {} }), expect: everyone(405) } },
      },
    ],
  },
  // Deleting a draft: its seller alone (the probe does not confirm, so the fixture stays: 400); a
  // published listing is never deleted (409), and someone else's is a 404 as ever.
  "/sell/:id/delete": {
    cases: [
      { name: "draft", params: draft, get: ownerOnly(), post: { body: form({}), expect: ownerOnly(400) } },
      {
        name: "live",
        params: (f) => ({ id: f.live.id }),
        get: ownerOnly(),
        post: { body: form({ confirm: "yes" }), expect: ownerOnly(409) },
      },
    ],
  },
};
