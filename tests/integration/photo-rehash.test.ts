import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { ListingPhoto } from "~/models/index.server";
import { ensureBucket, putObject, randomKey } from "~/services/storage.server";
import { getBoss } from "~/services/jobs.server";
import { rehashPhotos } from "~/photos/rehash.server";
import { dctHash } from "~/photos/perceptual-hash.server";
import { decodeSequentialJpeg } from "~/photos/jpeg-decode.server";
import { twoToneJpeg } from "../support/photo-files";
import { makeDraft, makeSeller, removeSellers } from "./photos-support";

// Photos stored before the hash changed scheme lost their hash in the migration; the photo-rehash
// job hashes them again from the stored thumbnail.

let seller: Awaited<ReturnType<typeof makeSeller>>;

beforeAll(async () => {
  await ensureBucket();
  await getBoss();
  seller = await makeSeller("rehash");
});

afterAll(async () => {
  if (seller) await removeSellers([seller.user.id]);
});

describe("the photo-rehash job", () => {
  it("hashes a ready photo without a hash from its thumbnail, and leaves one whose thumbnail is gone", async () => {
    const listing = await makeDraft(seller.user.id);
    const thumb = await twoToneJpeg(400, 300);
    const thumbKey = randomKey("photos/thumb", "jpg");
    await putObject(thumbKey, Buffer.from(thumb), { contentType: "image/jpeg" });
    const base = { listingId: listing.id, status: "ready" as const, contentType: "image/jpeg", byteSize: 1, width: 400, height: 300, error: null };
    const keys = (k: string) => ({ originalKey: `${k}/o`, listingKey: `${k}/l`, zoomKey: `${k}/z` });
    const stored = await ListingPhoto.create({ ...base, ...keys("it/rehash/a"), position: 0, thumbKey, phash: null });
    const lost = await ListingPhoto.create({ ...base, ...keys("it/rehash/b"), position: 1, thumbKey: "photos/thumb/it/gone.jpg", phash: null });
    const kept = await ListingPhoto.create({ ...base, ...keys("it/rehash/c"), position: 2, thumbKey, phash: "0123456789abcdef" });

    const outcome = await rehashPhotos({});
    expect(outcome.hashed).toBeGreaterThanOrEqual(1);
    expect((await stored.reload()).phash).toBe(dctHash(decodeSequentialJpeg(Buffer.from(thumb))));
    expect((await lost.reload()).phash).toBeNull();
    expect((await kept.reload()).phash).toBe("0123456789abcdef");
  });

  it("refuses a malformed hash in the database (the SQL match reads 16 hex digits)", async () => {
    const listing = await makeDraft(seller.user.id);
    await expect(
      ListingPhoto.create({
        listingId: listing.id,
        position: 0,
        status: "ready",
        originalKey: "it/rehash/x/o",
        thumbKey: null,
        listingKey: null,
        zoomKey: null,
        contentType: "image/jpeg",
        byteSize: 1,
        width: 1,
        height: 1,
        phash: "0".repeat(64),
        error: null,
      }),
    ).rejects.toThrow(/listing_photos_phash_hex/);
  });
});
