import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { QueryTypes } from "sequelize";
import { sequelize } from "~/db.server";
import { ListingPhoto } from "~/models/index.server";
import { ensureBucket, putObject, randomKey } from "~/services/storage.server";
import { getBoss } from "~/services/jobs.server";
import { rehashPhotos } from "~/photos/rehash.server";
import { dctHash } from "~/photos/perceptual-hash.server";
import { decodeSequentialJpeg } from "~/photos/jpeg-decode.server";
import { twoToneJpeg } from "../support/photo-files";
import { makeDraft, makeSeller, removeSellers } from "./photos-support";

// Photos stored before the hash changed scheme are marked scheme 1 by the migration; the
// photo-rehash job hashes them again from the stored thumbnail.

let seller: Awaited<ReturnType<typeof makeSeller>>;

beforeAll(async () => {
  await ensureBucket();
  await getBoss();
  seller = await makeSeller("rehash");
});

afterAll(async () => {
  if (seller) await removeSellers([seller.user.id]);
});

async function readyPhoto(listingId: string, position: number, thumbKey: string, phash: string) {
  const k = `it/rehash/${listingId}/${position}`;
  return ListingPhoto.create({
    listingId,
    position,
    status: "ready",
    originalKey: `${k}/o`,
    thumbKey,
    listingKey: `${k}/l`,
    zoomKey: `${k}/z`,
    contentType: "image/jpeg",
    byteSize: 1,
    width: 400,
    height: 300,
    phash,
    error: null,
  });
}

const schemeOf = async (id: string) =>
  (
    await sequelize.query<{ s: number }>(`SELECT phash_scheme AS s FROM listing_photos WHERE id = :id`, {
      replacements: { id },
      type: QueryTypes.SELECT,
    })
  )[0].s;

describe("the photo-rehash job", () => {
  it("hashes a photo of the old scheme again from its thumbnail, and leaves one whose thumbnail is gone", async () => {
    const listing = await makeDraft(seller.user.id);
    const thumb = await twoToneJpeg(400, 300);
    const thumbKey = randomKey("photos/thumb", "jpg");
    await putObject(thumbKey, Buffer.from(thumb), { contentType: "image/jpeg" });
    const stored = await readyPhoto(listing.id, 0, thumbKey, "ffff000000000000");
    const lost = await readyPhoto(listing.id, 1, "photos/thumb/it/gone.jpg", "ffff000000000001");
    const kept = await readyPhoto(listing.id, 2, thumbKey, "0123456789abcdef");
    expect(await schemeOf(kept.id)).toBe(2); // new rows are the current scheme
    await sequelize.query(`UPDATE listing_photos SET phash_scheme = 1 WHERE id IN (:ids)`, { replacements: { ids: [stored.id, lost.id] } });

    const outcome = await rehashPhotos({});
    expect(outcome.hashed).toBeGreaterThanOrEqual(1);
    expect((await stored.reload()).phash).toBe(dctHash(decodeSequentialJpeg(Buffer.from(thumb))));
    expect(await schemeOf(stored.id)).toBe(2);
    expect((await lost.reload()).phash).toBe("ffff000000000001");
    expect(await schemeOf(lost.id)).toBe(1);
    expect((await kept.reload()).phash).toBe("0123456789abcdef");
  });

  it("refuses a malformed hash in the database (the SQL match reads 16 hex digits)", async () => {
    const listing = await makeDraft(seller.user.id);
    await expect(readyPhoto(listing.id, 0, "photos/thumb/it/x.jpg", "0".repeat(64))).rejects.toThrow(/listing_photos_phash_hex/);
  });
});
