import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { Listing, ListingPhoto } from "~/models/index.server";
import { ensureBucket, headObject } from "~/services/storage.server";
import { processPhoto } from "~/photos/process.server";
import { incomingKey, photoKeys } from "~/photos/access.server";
import { sceneJpeg } from "../support/photo-files";
import { arrange, listPhotos, makeDraft, makeSeller, photoObjectKeys, removePhoto, removeSellers, upload } from "./photos-support";

// Only the listing's seller may see or change its photos. Another seller gets the same 404 as for a
// listing that does not exist; nothing of the owner's changes.

let owner: Awaited<ReturnType<typeof makeSeller>>;
let other: Awaited<ReturnType<typeof makeSeller>>;
let listing: Listing;
const ids: string[] = [];

const notFound = { error: "not_found", message: "No listing of yours has that address." };

async function snapshot() {
  const rows = await ListingPhoto.findAll({ where: { listingId: listing.id }, order: [["position", "ASC"]], raw: true });
  return { rows, keys: await photoObjectKeys() };
}

beforeAll(async () => {
  await ensureBucket();
  owner = await makeSeller("owner");
  other = await makeSeller("other");
  listing = await makeDraft(owner.user.id);
  await makeDraft(other.user.id); // the other seller has listings of their own
  for (let i = 0; i < 3; i++) {
    const res = await upload(listing.id, await sceneJpeg(i + 1, 160, 120), `photo-${i}.jpg`, owner.cookie);
    ids.push((await res.json()).photo.id);
  }
  await processPhoto({ photoId: ids[0] });
}, 60_000);

afterAll(async () => {
  if (owner && other) await removeSellers([owner.user.id, other.user.id]);
});

describe("another seller", { timeout: 30_000 }, () => {
  it("cannot list the photos", async () => {
    const res = await listPhotos(listing.id, other.cookie);
    expect(res.status).toBe(404);
    expect(await res.json()).toEqual(notFound);
  });

  it("cannot upload to the listing, and nothing is stored", async () => {
    const before = await snapshot();
    const res = await upload(listing.id, await sceneJpeg(9, 160, 120), "mine.jpg", other.cookie);
    expect(res.status).toBe(404);
    expect(await res.json()).toEqual(notFound);
    expect(await snapshot()).toEqual(before);
  });

  it("cannot reorder or pick the cover", async () => {
    const before = await snapshot();
    const res = await arrange(listing.id, { order: [...ids].reverse(), coverId: ids[2] }, other.cookie);
    expect(res.status).toBe(404);
    expect(await res.json()).toEqual(notFound);
    expect(await snapshot()).toEqual(before);
  });

  it("cannot delete a photo, even naming it through a listing of their own", async () => {
    const before = await snapshot();
    const res = await removePhoto(listing.id, ids[0], other.cookie);
    expect(res.status).toBe(404);
    expect(await res.json()).toEqual(notFound);
    const theirs = await Listing.findOne({ where: { sellerId: other.user.id } });
    const sideways = await removePhoto(theirs!.id, ids[0], other.cookie);
    expect(sideways.status).toBe(404);
    expect((await sideways.json()).error).toBe("not_found");
    expect(await snapshot()).toEqual(before);
  });

  it("a visitor who is not signed in gets 401", async () => {
    expect((await listPhotos(listing.id)).status).toBe(401);
    expect((await upload(listing.id, await sceneJpeg(9, 64, 48), "x.jpg")).status).toBe(401);
    expect((await arrange(listing.id, { coverId: ids[1] })).status).toBe(401);
    expect((await removePhoto(listing.id, ids[1])).status).toBe(401);
  });
});

describe("the owner", { timeout: 30_000 }, () => {
  const order = async () =>
    (await (await listPhotos(listing.id, owner.cookie)).json()).photos.map((p: { id: string; isCover: boolean }) => [p.id, p.isCover]);

  it("reorders the photos and picks the cover", async () => {
    const res = await arrange(listing.id, { order: [ids[2], ids[0], ids[1]], coverId: ids[2] }, owner.cookie);
    expect(res.status).toBe(200);
    expect(await order()).toEqual([
      [ids[2], true],
      [ids[0], false],
      [ids[1], false],
    ]);
  });

  it("is told when the order leaves a photo out or names one twice", async () => {
    for (const bad of [
      [ids[0], ids[1]],
      [ids[0], ids[0], ids[1]],
    ]) {
      const res = await arrange(listing.id, { order: bad }, owner.cookie);
      expect(res.status).toBe(422);
      expect(await res.json()).toEqual({
        error: "bad_order",
        message:
          "The new order must name each of this listing's 3 photos exactly once. " +
          "Another window may have added or deleted one; reload and try again.",
      });
    }
    const res = await arrange(listing.id, { order: "first" }, owner.cookie);
    expect(res.status).toBe(400);
    expect(await res.json()).toMatchObject({
      error: "invalid",
      message: expect.stringMatching(/^order /),
      issues: [{ path: "order", message: expect.any(String) }],
    });
  });

  it("deletes a photo: row and every stored object go, the rest close up and the cover passes on", async () => {
    // ids[0] was processed: it has an original and three sizes in storage.
    await arrange(listing.id, { coverId: ids[0] }, owner.cookie);
    const photo = await ListingPhoto.findByPk(ids[0]);
    const keys = photoKeys(photo!).filter((k) => k !== incomingKey(photo!.id));
    expect(keys).toHaveLength(4);
    for (const key of keys) expect(await headObject(key)).not.toBeNull();

    const res = await removePhoto(listing.id, ids[0], owner.cookie);
    expect(res.status).toBe(200);
    expect(await ListingPhoto.findByPk(ids[0])).toBeNull();
    for (const key of keys) expect(await headObject(key)).toBeNull();
    const rest = await ListingPhoto.findAll({ where: { listingId: listing.id }, order: [["position", "ASC"]] });
    expect(rest.map((p) => [p.id, p.position, p.isCover])).toEqual([
      [ids[2], 0, true],
      [ids[1], 1, false],
    ]);

    const again = await removePhoto(listing.id, ids[0], owner.cookie);
    expect(again.status).toBe(404);
    expect((await again.json()).error).toBe("not_found");
  });
});
