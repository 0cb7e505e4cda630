import { randomBytes, randomUUID } from "node:crypto";
import { Op } from "sequelize";
import { Listing, ListingPhoto, User, Workshop, WorkshopApplication } from "~/models/index.server";
import { Capture } from "~/models/capture.server";
import { Watch } from "~/models/watch.server";
import { SpecAlert } from "~/models/spec-alert.server";
import { MessageThread } from "~/models/message-thread.server";
import { Offer } from "~/models/offer.server";
import { Order } from "~/models/order.server";
import { Review } from "~/models/review.server";
import { issueUnsubscribeUrl } from "~/alerts/unsubscribe.server";
import { hashPassword } from "~/auth/password.server";
import type { Role } from "~/auth/roles";
import type { ListingStatus } from "@shared/catalogue";
import { analyseSine } from "@shared/bench/analysis";
import { toneSamples } from "../../support/capture-files";
import { Agent, signIn } from "./http";

const SCALE = { kind: "volts-per-full-scale", volts: 40, basis: "peak" } as const;

// The people and records the authorization matrix and the fuzz test ask about: one account per role,
// made straight in the database with a known password and then signed in over HTTP through the
// real form (so the suites do not care how sessions are kept), and the owner's listings in each state.

export const PERSONAS = ["anonymous", "buyer", "owner", "seller", "workshop", "moderator", "admin"] as const;
export type Persona = (typeof PERSONAS)[number];

/** What each persona holds. `owner` owns every fixture record; `seller` is another seller. */
const ROLES_OF: Record<Exclude<Persona, "anonymous">, Role[]> = {
  buyer: ["buyer"],
  owner: ["buyer", "seller"],
  seller: ["buyer", "seller"],
  workshop: ["buyer", "workshop"],
  moderator: ["buyer", "moderator"],
  // The admin role alone: whatever a moderator may do must come from the role hierarchy.
  admin: ["buyer", "admin"],
};

export interface Fixtures {
  run: string;
  password: string;
  users: Record<Exclude<Persona, "anonymous">, User>;
  /** The owner's listings: a bare draft (with one photo), one held for the desk, one live. */
  draft: Listing;
  held: Listing;
  live: Listing;
  photo: ListingPhoto;
  capture: Capture;
  /** A ready photo of a live demo listing (its public size key and its private original key). */
  media: { public: string; original: string };
  /** The owner's spec alert, and an unsubscribe link's token for it. */
  alert: SpecAlert;
  unsubscribeToken: string;
  /** The buyer's conversation with the owner about the live listing, and the buyer's open offer in it. */
  thread: MessageThread;
  offer: Offer;
  /** The buyer's paid order of another of the owner's units (the owner is its seller). */
  order: Order;
  /** A workshop waiting for the desk (its applicant is none of the personas) and its application. */
  workshopApplication: WorkshopApplication;
  /** The buyer's review of that order (made straight in the database). */
  review: Review;
}

async function listing(sellerId: string, status: ListingStatus): Promise<Listing> {
  const published = status !== "draft";
  return Listing.create({
    sellerId,
    status,
    category: "integrated_amplifier",
    maker: published ? "Fenwold Acoustics" : null,
    model: published ? `FA-${status}` : null,
    priceMinor: published ? 48_000 : null,
    currency: "EUR",
    country: published ? "DE" : null,
    cosmeticGrade: published ? "clean" : null,
    serviceState: published ? "serviced_measured" : null,
    publishedAt: published ? new Date() : null,
    heldReason: status === "held" ? "Power into 4 Ω is implausible for these rails." : null,
  });
}

export async function makeFixtures(label: string): Promise<Fixtures> {
  const run = randomBytes(4).toString("hex");
  const password = `matrix-${randomBytes(6).toString("hex")}`;
  const passwordHash = await hashPassword(password);
  const account = (persona: keyof typeof ROLES_OF) =>
    User.create({
      email: `${label}-${run}-${persona}@example.test`,
      displayName: `${label} ${persona}`,
      passwordHash,
      roles: ROLES_OF[persona],
      emailVerifiedAt: new Date(),
      lastSignInAt: null,
    });
  const users = {
    buyer: await account("buyer"),
    owner: await account("owner"),
    seller: await account("seller"),
    workshop: await account("workshop"),
    moderator: await account("moderator"),
    admin: await account("admin"),
  };
  const ownerId = users.owner.id;
  const [draft, held, live] = [await listing(ownerId, "draft"), await listing(ownerId, "held"), await listing(ownerId, "live")];
  const photo = await ListingPhoto.create({
    listingId: draft.id,
    position: 0,
    isCover: true,
    status: "ready",
    originalKey: `originals/photos/matrix/${run}/${randomUUID()}.jpg`,
    thumbKey: `photos/thumb/matrix/${run}/${randomUUID()}.jpg`,
    listingKey: `photos/listing/matrix/${run}/${randomUUID()}.jpg`,
    zoomKey: `photos/zoom/matrix/${run}/${randomUUID()}.jpg`,
    contentType: "image/jpeg",
    byteSize: 1000,
    width: 1200,
    height: 800,
    phash: randomBytes(8).toString("hex"), // equal hashes across sellers would read as a copied photo
    error: null,
  });
  const capture = await Capture.create({
    ownerId,
    kind: "sine",
    status: "done",
    fileName: "output-1k.wav",
    contentType: "audio/wav",
    byteSize: 96_044,
    storageKey: `captures/matrix/${run}/${randomUUID()}.wav`,
    format: {
      file: "wav",
      container: "RIFF",
      encoding: "pcm",
      bitDepth: 24,
      channels: 1,
      sampleRate: 48_000,
      frames: 48_000,
      durationS: 1,
    },
    conditions: { kind: "sine", scale: SCALE, weighting: "unweighted", window: "blackman-harris-7" },
    // A real analysis of a clean tone: the stored columns are read through their schemas.
    analysis: analyseSine(
      [toneSamples({ sampleRate: 48_000, seconds: 0.25, f0: 1000, peak: 0.5 })],
      48_000,
      { scale: SCALE, fundamentalHz: 1000 },
      ["mono"],
    ),
    readings: [],
    finishedAt: new Date(),
  });
  const demoPhoto = await ListingPhoto.findOne({
    where: { status: "ready", listingKey: { [Op.ne]: null } },
    include: [{ model: Listing, as: "listing", where: { status: "live" }, attributes: [] }],
  });
  if (!demoPhoto?.listingKey) throw new Error("The demo scenario has no ready photo of a live listing: is the seed loaded?");
  const media = { public: demoPhoto.listingKey, original: demoPhoto.originalKey };
  const alert = await SpecAlert.create({ userId: ownerId, name: "Matrix alert", query: "category=turntables", frequency: "instant" });
  const unsubscribeToken = new URL(await issueUnsubscribeUrl(ownerId, { kind: "alert", alertId: alert.id })).pathname.split("/").pop()!;
  // The live unit takes offers, so an offer API probe can get past the listing's own refusals.
  await live.update({ offersWelcome: true });
  const thread = await MessageThread.create({
    listingId: live.id,
    buyerId: users.buyer.id,
    sellerId: ownerId,
    buyerReadAt: new Date(),
    sellerReadAt: null,
    lastMessageAt: new Date(),
  });
  const offer = await Offer.create({
    listingId: live.id,
    buyerId: users.buyer.id,
    sellerId: ownerId,
    threadId: thread.id,
    amountMinor: 42_000,
    currency: "EUR",
    madeBy: "buyer",
    parentOfferId: null,
    expiresAt: new Date(Date.now() + 48 * 3_600_000),
    acceptedAt: null,
    checkoutUntil: null,
    decidedAt: null,
  });
  // Made straight in the database (no provider behind it): paid and waiting for the owner to ship.
  const sold = await listing(ownerId, "reserved");
  const order = await Order.create({
    listingId: sold.id,
    buyerId: users.buyer.id,
    sellerId: ownerId,
    state: "funded",
    currency: "EUR",
    priceMinor: 48_000,
    deliveryMinor: 0,
    deliveryMethod: "collection",
    deliveryZone: "domestic",
    reservedUntil: new Date(Date.now() + 30 * 60_000),
    fundedAt: new Date(),
    shipBy: new Date(Date.now() + 3 * 86_400_000),
  });
  const applicant = await User.create({
    email: `${label}-${run}-applicant@example.test`,
    displayName: `${label} applicant`,
    passwordHash: null,
    roles: ["buyer", "seller"],
    emailVerifiedAt: new Date(),
    lastSignInAt: null,
  });
  const applying = await Workshop.create({
    ownerId: applicant.id,
    name: `Matrix Bench ${run}`,
    slug: `matrix-bench-${label.toLowerCase().replace(/[^a-z0-9]+/g, "-")}-${run}`,
    about: null,
    country: "DE",
    region: null,
    town: "Fenwold",
    verifiedAt: null,
  });
  const workshopApplication = await WorkshopApplication.create({
    workshopId: applying.id,
    applicantId: applicant.id,
    businessName: applying.name,
    address: "Werkhof 3",
    registrationNumber: `MB-${run}`,
    // No object behind it: every probe is refused before the document would be read.
    documentKey: `workshop-documents/matrix/${run}/${randomUUID()}.pdf`,
    documentType: "application/pdf",
    documentName: "register.pdf",
    documentBytes: 1000,
  });
  const review = await Review.create({ orderId: order.id, sellerId: ownerId, buyerId: users.buyer.id, rating: 4, body: "Matrix review." });
  return {
    run,
    password,
    users,
    draft,
    held,
    live,
    photo,
    capture,
    media,
    alert,
    unsubscribeToken,
    thread,
    offer,
    order,
    workshopApplication,
    review,
  };
}

/** A signed-in agent per persona (anonymous: no cookie). */
export async function signInAll(f: Fixtures): Promise<Record<Persona, Agent>> {
  return {
    anonymous: new Agent("anonymous"),
    buyer: await signInAs(f, "buyer"),
    owner: await signInAs(f, "owner"),
    seller: await signInAs(f, "seller"),
    workshop: await signInAs(f, "workshop"),
    moderator: await signInAs(f, "moderator"),
    admin: await signInAs(f, "admin"),
  };
}

export function signInAs(f: Fixtures, persona: Exclude<Persona, "anonymous">): Promise<Agent> {
  return signIn(persona, f.users[persona].email, f.password);
}

export async function removeFixtures(f: Fixtures | undefined) {
  if (!f) return;
  const ids = Object.values(f.users).map((u) => u.id);
  await Watch.destroy({ where: { userId: ids } });
  // Orders are never deleted (their timeline is append-only): their units and people stay behind.
  const kept = (await Order.findAll({ where: { [Op.or]: [{ buyerId: ids }, { sellerId: ids }] } })).flatMap((o) => [
    o.listingId,
    o.buyerId,
    o.sellerId,
  ]);
  await Listing.destroy({ where: { sellerId: ids, id: { [Op.notIn]: kept.length ? kept : [randomUUID()] } } });
  await Capture.destroy({ where: { ownerId: ids } });
  await User.destroy({ where: { id: { [Op.in]: ids, [Op.notIn]: kept.length ? kept : [randomUUID()] } } });
}
