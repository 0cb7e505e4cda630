import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { DeskFlag, Listing, ListingPhoto } from "~/models/index.server";
import { publishListing } from "~/listings/publish.server";
import { resolveFlag } from "~/desk/flags.server";
import { sequelize } from "~/db.server";
import { COPIED_PHOTO_HELD_REASON, copiedPhotoMatches, holdLiveListingIfCopied } from "~/photos/copied.server";
import { copiedPhotoPair } from "~/desk/copied-photo-pair.server";
import { PHOTO_MATCH_MAX_DISTANCE } from "~/photos/perceptual-hash.server";
import { saveBenchSheet } from "~/listings/bench.server";
import { exampleIntegratedAmplifierSheet } from "@shared/bench";
import { cleanUp, makeAccount, readyDraft, withOwnCaptures, type Seller } from "./listing-support";

// The copied-photo check on real PostgreSQL: publishing with a photo whose hash is within the match
// distance of a photo on another seller's listing holds the listing and raises a copied_photo flag.
// Hashes are set by hand here; the hash itself is proved on real photos in tests/unit/photos.

afterAll(cleanUp);

/** A hash `bits` bits away from `hash` (the lowest bits flipped). */
function flip(hash: string, bits: number): string {
  const mask = bits === 0 ? 0n : (1n << BigInt(bits)) - 1n;
  return (BigInt(`0x${hash}`) ^ mask).toString(16).padStart(16, "0");
}

const ORIGINAL = "9c3a5e71b2d40f86";

async function photoOf(listing: Listing) {
  return (await ListingPhoto.findOne({ where: { listingId: listing.id } }))!;
}

async function draftWithHash(seller: Seller, phash: string) {
  const draft = await readyDraft(seller);
  await saveBenchSheet(draft.id, seller.user.id, await withOwnCaptures(exampleIntegratedAmplifierSheet(), seller.user.id));
  await ListingPhoto.update({ phash }, { where: { listingId: draft.id } });
  return draft;
}

async function flagsOn(listingId: string) {
  return DeskFlag.findAll({ where: { listingId, kind: "copied_photo" }, order: [["createdAt", "ASC"]] });
}

let first: Seller;
let original: Listing;
let firstCopy: Listing;

beforeAll(async () => {
  first = await makeAccount("photo-owner");
  original = await draftWithHash(first, ORIGINAL);
  expect((await publishListing(original.id, first.session)).listing.status).toBe("live");
});

describe("publishing with a photo that matches another seller's", () => {
  it(`holds the listing and flags the pair when the hashes differ in ${PHOTO_MATCH_MAX_DISTANCE} bits (the match distance)`, async () => {
    const copier = await makeAccount("copier");
    const draft = await draftWithHash(copier, flip(ORIGINAL, PHOTO_MATCH_MAX_DISTANCE));
    const { listing } = await publishListing(draft.id, copier.session);
    firstCopy = listing;
    expect(listing.status).toBe("held");
    expect(listing.heldReason).toBe(COPIED_PHOTO_HELD_REASON);
    expect(listing.publishedAt).not.toBeNull();
    const flags = await flagsOn(draft.id);
    expect(flags).toHaveLength(1);
    expect(flags[0]).toMatchObject({ reason: "photo_match", resolvedAt: null });
    expect(flags[0].details).toEqual({
      photoId: (await photoOf(draft)).id,
      matchesPhotoId: (await photoOf(original)).id,
      distance: PHOTO_MATCH_MAX_DISTANCE,
    });
  });

  it("lets a listing whose photo is one bit further go live, with no flag", async () => {
    const other = await makeAccount("neighbour");
    const draft = await draftWithHash(other, flip(ORIGINAL, PHOTO_MATCH_MAX_DISTANCE + 1));
    expect((await publishListing(draft.id, other.session)).listing.status).toBe("live");
    expect(await flagsOn(draft.id)).toHaveLength(0);
  });

  it("lets a seller reuse their own photo", async () => {
    const draft = await draftWithHash(first, ORIGINAL);
    expect((await publishListing(draft.id, first.session)).listing.status).toBe("live");
    expect(await flagsOn(draft.id)).toHaveLength(0);
  });

  it("ignores photos on listings buyers never saw (a draft, a held listing)", async () => {
    const unseen = await makeAccount("unseen");
    const hidden = await draftWithHash(unseen, "0f0f0f0f0f0f0f0f");
    const held = await draftWithHash(unseen, "f0f0f0f0f0f0f0f0");
    await Listing.update(
      { status: "held", heldReason: "Bench check: held in this test.", publishedAt: new Date() },
      { where: { id: held.id } },
    );
    const later = await makeAccount("later");
    for (const hash of ["0f0f0f0f0f0f0f0f", "f0f0f0f0f0f0f0f0"]) {
      const draft = await draftWithHash(later, hash);
      expect((await publishListing(draft.id, later.session)).listing.status).toBe("live");
    }
    expect((await Listing.findByPk(hidden.id))!.status).toBe("draft");
  });

  it("holds again on a second publish while the flag is open, without a second flag; not once a moderator dismissed it", async () => {
    const copier = await makeAccount("copier-again");
    const draft = await draftWithHash(copier, flip(ORIGINAL, 3));
    expect((await publishListing(draft.id, copier.session)).listing.status).toBe("held");
    // Back to draft (as asking for changes does) and published again, photo unchanged.
    await Listing.update({ status: "draft" }, { where: { id: draft.id } });
    expect((await publishListing(draft.id, copier.session)).listing.status).toBe("held");
    const flags = await flagsOn(draft.id);
    expect(flags).toHaveLength(1);

    const moderator = await makeAccount("photo-moderator", ["moderator"]);
    await sequelize.transaction((t) => resolveFlag(flags[0].id, moderator.user.id, "dismissed", t));
    await Listing.update({ status: "draft" }, { where: { id: draft.id } });
    const { listing } = await publishListing(draft.id, copier.session);
    expect(listing.status).toBe("live");
    expect(listing.heldReason).toBeNull();
    expect(await flagsOn(draft.id)).toHaveLength(1);
  });

  it("finds the closest match per photo (distance counted in SQL as in code)", async () => {
    const another = await makeAccount("closest");
    const near = await draftWithHash(another, flip(ORIGINAL, 2));
    await publishListing(near.id, another.session); // held: it copies the original
    const probe = await makeAccount("probe");
    const draft = await draftWithHash(probe, flip(ORIGINAL, 1));
    const matches = await copiedPhotoMatches(draft.id, probe.user.id);
    // The held copy is not a source; the live original is, 1 bit away.
    expect(matches).toEqual([
      { photoId: (await photoOf(draft)).id, matchesPhotoId: (await photoOf(original)).id, matchesListingId: original.id, distance: 1 },
    ]);
  });
});

describe("a photo added to a live listing", () => {
  it("takes the listing to the desk when it matches another seller's photo", async () => {
    const seller = await makeAccount("late-photo");
    const draft = await draftWithHash(seller, "123456789abcdef0");
    expect((await publishListing(draft.id, seller.session)).listing.status).toBe("live");
    const added = await ListingPhoto.create({
      listingId: draft.id,
      position: 1,
      status: "ready",
      originalKey: `it/late/${draft.id}/o`,
      thumbKey: `it/late/${draft.id}/t`,
      listingKey: `it/late/${draft.id}/l`,
      zoomKey: `it/late/${draft.id}/z`,
      contentType: "image/jpeg",
      byteSize: 1000,
      width: 1200,
      height: 800,
      phash: ORIGINAL,
      error: null,
    });
    expect(await holdLiveListingIfCopied(draft.id, added.id)).toBe(true);
    const listing = (await Listing.findByPk(draft.id))!;
    expect(listing.status).toBe("held");
    expect(listing.heldReason).toBe(COPIED_PHOTO_HELD_REASON);
    expect((await flagsOn(draft.id)).map((f) => f.details)).toEqual([
      { photoId: added.id, matchesPhotoId: (await photoOf(original)).id, distance: 0 },
    ]);
    // Run again (a retried job): nothing more happens.
    expect(await holdLiveListingIfCopied(draft.id, added.id)).toBe(false);
    expect(await flagsOn(draft.id)).toHaveLength(1);
  });
});

describe("the desk's pair", () => {
  it("reads both photos with their listings' titles and sellers from a flag's details", async () => {
    const flag = await DeskFlag.findOne({ where: { kind: "copied_photo", listingId: firstCopy.id } });
    const pair = await copiedPhotoPair(flag!.details);
    expect(pair).toMatchObject({
      distance: PHOTO_MATCH_MAX_DISTANCE,
      photo: { sellerName: "Listing test copier", listingTitle: "Harrowgate Sound 120-HG Integrated", listingStatus: "Held for review" },
      original: { sellerName: "Listing test photo-owner", listingId: original.id, imageUrl: expect.stringMatching(/^\/media\/it\//) },
    });
    expect(await copiedPhotoPair({ photoId: "nope" })).toBeNull();
  });
});
