import { randomBytes } from "node:crypto";
import { BenchSheet, Listing, ListingPhoto, RestorationEntry, User, Workshop } from "~/models/index.server";
import { Capture } from "~/models/capture.server";
import { signedInCookie } from "../support/sessions";
import type { SessionUser } from "~/auth/guards.server";
import { normaliseRoles, type Role } from "~/auth/roles";
import { createDraft, saveCondition, saveItem } from "~/listings/drafts.server";
import { addRestorationEntry } from "~/listings/restoration.server";
import { ListingInputError } from "~/listings/errors.server";
import type { BenchSheet as Sheet, Reading } from "@shared/bench";
import { analyseSine, type SineAnalysis } from "@shared/bench/analysis";
import { toneSamples } from "../support/capture-files";
import { isData } from "../support/route-args";

// Shared by the listing suites: accounts with session cookies, a listing filled in step by step as a
// seller would, captures as the analysis job leaves them, and clean-up.

export const RUN = randomBytes(4).toString("hex");
const made: string[] = [];

export type Seller = { user: User; session: SessionUser; cookie: string };

export async function makeAccount(label: string, roles: Role[] = ["seller"], opts: { verified?: boolean } = {}): Promise<Seller> {
  const user = await User.create({
    email: `listing-it-${RUN}-${label}@example.test`,
    displayName: `Listing test ${label}`,
    passwordHash: null,
    roles: normaliseRoles(roles),
    emailVerifiedAt: opts.verified === false ? null : new Date(),
    lastSignInAt: null,
  });
  made.push(user.id);
  const cookie = await signedInCookie(user);
  return {
    user,
    cookie,
    session: {
      id: user.id,
      email: user.email,
      displayName: user.displayName,
      roles: normaliseRoles(user.roles),
      emailVerified: opts.verified !== false,
    },
  };
}

/** A workshop account with its workshop, an applicant (not verified), at `place` (Kellbach, Germany unless told). */
export async function makeWorkshopAccount(
  label: string,
  place: { name?: string; country?: string; region?: string; town?: string } = {},
): Promise<Seller & { workshop: Workshop }> {
  const shop = await makeAccount(label, ["workshop"]);
  const workshop = await Workshop.create({
    ownerId: shop.user.id,
    name: place.name ?? `Bench ${label}`,
    slug: `bench-${label}-${RUN}`,
    about: null,
    country: place.country ?? "DE",
    region: place.region ?? "Ostmark",
    town: place.town ?? "Kellbach",
    verificationStatus: "applied",
    verifiedAt: null,
  });
  return { ...shop, workshop };
}

export async function cleanUp() {
  const listings = await Listing.findAll({ where: { sellerId: made }, attributes: ["id"] });
  await Listing.destroy({ where: { id: listings.map((l) => l.id) } });
  await Capture.destroy({ where: { ownerId: made } });
  await Workshop.destroy({ where: { ownerId: made } });
  await User.destroy({ where: { id: made } });
}

/** What a seller fills in for a restored integrated amplifier, as the item step stores it. */
export const AMP_ITEM = {
  maker: "Harrowgate Sound",
  model: "120-HG Integrated",
  yearFrom: 1978,
  yearTo: 1981,
  serialNumber: "HS1207734",
  mainsVoltageV: 230,
  mainsFrequencyHz: 50 as const,
  mainsSwitchable: true,
  weightG: 14_200,
  priceMinor: 125_000,
  currency: "EUR" as const,
  offersWelcome: true,
  country: "DE" as const,
  region: "Brelland",
  town: "Oskerfeld",
  postcode: "10115",
  shippingOptions: [{ method: "parcel" as const, prices: { domestic: 4500, nearby: 9000 } }],
  handlingDays: 3,
};

/** A draft with item, condition, one log entry and a ready photo: everything but the bench sheet. */
export async function readyDraft(seller: Seller): Promise<Listing> {
  const listing = await createDraft(seller.session, "integrated_amplifier");
  await saveItem(listing.id, seller.user.id, AMP_ITEM);
  await saveCondition(listing.id, seller.user.id, {
    cosmeticGrade: "clean",
    serviceState: "serviced_measured",
    conditionNote: "Faint mark on the lid.",
  });
  await addRestorationEntry(listing.id, seller.user.id, {
    doneOn: "2025-02-20",
    work: "Replaced main filter capacitors and set bias.",
    parts: [{ part: "Filter capacitor 10 000 µF 63 V", quantity: 2, reference: "C401, C402" }],
    technician: "Bench 2",
    readingsBefore: [{ quantity: "DC offset, left", value: 48, unit: "mV", conditions: "at idle, inputs shorted" }],
    readingsAfter: [{ quantity: "DC offset, left", value: 4, unit: "mV", conditions: "at idle, inputs shorted" }],
  });
  await ListingPhoto.create({
    listingId: listing.id,
    position: 0,
    isCover: true,
    status: "ready",
    originalKey: `it/${RUN}/${listing.id}/o`,
    thumbKey: `it/${RUN}/${listing.id}/t`,
    listingKey: `it/${RUN}/${listing.id}/l`,
    zoomKey: `it/${RUN}/${listing.id}/z`,
    contentType: "image/jpeg",
    byteSize: 1000,
    width: 1200,
    height: 800,
    phash: randomBytes(8).toString("hex"), // equal hashes across sellers would read as a copied photo
    error: null,
  });
  return (await Listing.scope("withSerial").findByPk(listing.id))!;
}

const SCALE = { kind: "volts-per-full-scale", volts: 40, basis: "peak" } as const;
let tone: SineAnalysis | undefined;
/** A real analysis for the stored captures to carry; these suites look only at their readings. */
function toneAnalysis(): SineAnalysis {
  tone ??= analyseSine(
    [toneSamples({ sampleRate: 48_000, seconds: 0.25, f0: 1000, peak: 0.5 })],
    48_000,
    { scale: SCALE, fundamentalHz: 1000 },
    ["mono"],
  );
  return tone;
}

/** A finished capture owning these readings, as the analysis job stores it. */
export async function makeCapture(ownerId: string, readings: Omit<Reading, "captureId">[]): Promise<Capture> {
  const capture = await Capture.create({
    ownerId,
    kind: "sine",
    fileName: "output-1k.wav",
    contentType: "audio/wav",
    byteSize: 96_044,
    storageKey: `it/${RUN}/${randomBytes(6).toString("hex")}.wav`,
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
  });
  await capture.update({
    status: "done",
    analysis: toneAnalysis(),
    readings: readings.map((r): Reading => ({ ...r, origin: "capture", captureId: capture.id })),
    finishedAt: new Date(),
  });
  return capture;
}

/** The sheet with each demo capture id replaced by a real capture of this seller's holding the same readings. */
export async function withOwnCaptures(sheet: Sheet, ownerId: string): Promise<Sheet> {
  const groups = new Map<string, Reading[]>();
  for (const r of sheet.readings) if (r.origin === "capture") groups.set(r.captureId!, [...(groups.get(r.captureId!) ?? []), r]);
  const ids = new Map<string, string>();
  for (const [demoId, readings] of groups) ids.set(demoId, (await makeCapture(ownerId, readings)).id);
  return { ...sheet, readings: sheet.readings.map((r) => (r.origin === "capture" ? { ...r, captureId: ids.get(r.captureId!)! } : r)) };
}

export async function reload(id: string) {
  const listing = (await Listing.scope("withSerial").findByPk(id))!;
  const sheet = await BenchSheet.findOne({ where: { listingId: id } });
  const entries = await RestorationEntry.count({ where: { listingId: id } });
  return { listing, sheet, entries };
}

export const BASE = "http://127.0.0.1";

/** Calls a route module's loader or action the way the server does; thrown responses are returned. */
export async function call(run: () => Promise<unknown>): Promise<{ status: number; body: any }> {
  try {
    const out = await run();
    if (out instanceof Response) return { status: out.status, body: await out.json().catch(() => null) };
    if (isData(out)) return { status: out.init?.status ?? 200, body: out.data };
    return { status: 200, body: out };
  } catch (thrown) {
    if (thrown instanceof Response) return { status: thrown.status, body: await thrown.json().catch(() => null) };
    if (isData(thrown)) return { status: thrown.init?.status ?? 500, body: thrown.data };
    throw thrown;
  }
}

/** The ListingInputError a call must end in; anything else fails the test. */
export async function inputError(call: Promise<unknown>): Promise<ListingInputError> {
  const outcome = await call.then(
    () => undefined,
    (e: unknown) => e,
  );
  if (outcome instanceof ListingInputError) return outcome;
  throw new Error(`expected a ListingInputError, got ${outcome instanceof Error ? outcome.message : "success"}`);
}
