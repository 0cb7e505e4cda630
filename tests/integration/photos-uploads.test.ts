import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { ListingPhoto } from "~/models/index.server";
import { ensureBucket, getObjectBuffer, headObject, putObject } from "~/services/storage.server";
import { getBoss } from "~/services/jobs.server";
import { processPhoto } from "~/photos/process.server";
import { incomingKey } from "~/photos/access.server";
import type { Listing } from "~/models/index.server";
import { routeArgs } from "../support/route-args";
import {
  GPS_MARK,
  bandColour,
  bilevelPng,
  interlacedPngBomb,
  plainPng,
  jpegHeaderMarkers,
  mp3Audio,
  oversizeJpeg,
  svgWithScript,
  textFile,
  twoToneJpeg,
  withExif,
} from "../support/photo-files";
import { jobsFor, listPhotos, makeDraft, makeSeller, photoJobCount, photoObjectKeys, removeSellers, upload } from "./photos-support";

// Uploads through the route with the real database, queue and object-storage stand-in. The job
// handler is called directly rather than through a worker.

let seller: Awaited<ReturnType<typeof makeSeller>>;
let listing: Listing;

beforeAll(async () => {
  await ensureBucket();
  await getBoss(); // the queue's tables exist before the first count
  seller = await makeSeller("uploads");
  listing = await makeDraft(seller.user.id);
});

afterAll(async () => {
  if (seller) await removeSellers([seller.user.id]);
});

describe("bad uploads are refused and leave nothing behind", { timeout: 60_000 }, () => {
  const cases: [string, () => Promise<Uint8Array> | Uint8Array, string, number, string, RegExp][] = [
    ["a text file renamed .jpg", textFile, "front.jpg", 415, "unsupported_type", /is really a text file/],
    ["a 60-megapixel PNG", () => bilevelPng(10_000, 6_000), "scan.png", 422, "too_many_pixels", /60\.0 megapixels/],
    [
      "a truncated JPEG (small enough to be checked whole as it arrives)",
      async () => (await twoToneJpeg(400, 300)).subarray(0, 4000),
      "cut.jpg",
      422,
      "truncated_file",
      /cut short/,
    ],
    ["a 30 MB file", () => oversizeJpeg(30 * 1024 * 1024), "huge.jpg", 413, "file_too_large", /at most 20 MB/],
    ["an empty file", () => new Uint8Array(0), "empty.jpg", 422, "empty_file", /is empty/],
    ["an SVG with a script", svgWithScript, "badge.png", 415, "unsupported_type", /an SVG drawing with a script in it/],
    ["a WAV that is really an MP3", () => mp3Audio(), "tone.wav", 415, "unsupported_type", /is really an MP3 audio file/],
  ];

  for (const [what, make, name, status, code, message] of cases) {
    it(`${what}: ${status} ${code}`, async () => {
      const keysBefore = await photoObjectKeys();
      const jobsBefore = await photoJobCount();

      const res = await upload(listing.id, await make(), name, seller.cookie);

      expect(res.status).toBe(status);
      const body = await res.json();
      expect(body).toEqual({ error: code, message: expect.stringMatching(message) });
      expect(await ListingPhoto.count({ where: { listingId: listing.id } })).toBe(0);
      expect(await photoObjectKeys()).toEqual(keysBefore);
      expect(await photoJobCount()).toBe(jobsBefore);
    });
  }

  it("a larger truncated JPEG passes the header check as it streams in; the job walks the whole file and marks it failed", async () => {
    const draft = await makeDraft(seller.user.id);
    // Comment segments ahead of the image push its end past the first 256 KB the upload reads.
    const jpeg = await twoToneJpeg(400, 300);
    const comment = Buffer.concat([Buffer.from([0xff, 0xfe, 0xff, 0xff]), Buffer.alloc(0xfffd, 0x20)]);
    const padded = Buffer.concat([jpeg.subarray(0, 2), ...Array.from({ length: 5 }, () => comment), jpeg.subarray(2)]);
    const res = await upload(draft.id, padded.subarray(0, padded.length - 500), "cut.jpg", seller.cookie);
    expect(res.status).toBe(202);
    const { photo } = await res.json();
    expect(await processPhoto({ photoId: photo.id })).toBe("failed");
    const row = await ListingPhoto.findByPk(photo.id);
    expect(row).toMatchObject({ status: "failed", thumbKey: null, listingKey: null, zoomKey: null });
    expect(row!.error).toMatch(/is a JPEG photo, but it looks cut short/);
    expect(await headObject(incomingKey(photo.id))).toBeNull();
  });

  it("a request with no file, or with two, is refused", async () => {
    const none = new FormData();
    none.append("note", "no photo here");
    const { action } = await import("~/routes/api.v1.listings.$id.photos");
    const res = await action(
      routeArgs(
        new Request(`http://127.0.0.1/api/v1/listings/${listing.id}/photos`, {
          method: "POST",
          body: none,
          headers: { Cookie: seller.cookie },
        }),
        { id: listing.id },
      ),
    );
    expect(res.status).toBe(400);
    expect((await res.json()).error).toBe("no_file");

    const two = new FormData();
    const jpeg = await twoToneJpeg(64, 48);
    two.append("photo", new Blob([new Uint8Array(jpeg)]), "a.jpg");
    two.append("photo", new Blob([new Uint8Array(jpeg)]), "b.jpg");
    const res2 = await action(
      routeArgs(
        new Request(`http://127.0.0.1/api/v1/listings/${listing.id}/photos`, {
          method: "POST",
          body: two,
          headers: { Cookie: seller.cookie },
        }),
        { id: listing.id },
      ),
    );
    expect(res2.status).toBe(400);
    expect((await res2.json()).error).toBe("one_file_only");
    expect(await ListingPhoto.count({ where: { listingId: listing.id } })).toBe(0);
  });
});

describe("a good photo", { timeout: 120_000 }, () => {
  it("is accepted at once (202, processing), then the job makes it upright, metadata-free, in three sizes with a hash", async () => {
    // Stored 1300 × 650 with EXIF orientation 6 and a GPS position: shows as 650 × 1300.
    const jpeg = withExif(await twoToneJpeg(1300, 650), { orientation: 6, gps: true });
    const res = await upload(listing.id, jpeg, "amp-front.jpg", seller.cookie);
    expect(res.status).toBe(202);
    const { photo } = await res.json();
    expect(photo).toMatchObject({ status: "processing", position: 0, isCover: true, urls: null });

    // Row, waiting object and job exist together.
    expect(await headObject(incomingKey(photo.id))).not.toBeNull();
    expect(await jobsFor(photo.id)).toBe(1);
    const polled = await (await listPhotos(listing.id, seller.cookie)).json();
    expect(polled.photos.map((p: { id: string; status: string }) => [p.id, p.status])).toEqual([[photo.id, "processing"]]);

    expect(await processPhoto({ photoId: photo.id })).toBe("ready");

    const row = await ListingPhoto.findByPk(photo.id);
    expect(row).toMatchObject({ status: "ready", width: 650, height: 1300, contentType: "image/jpeg", error: null });
    expect(row!.phash).toMatch(/^[0-9a-f]{16}$/);
    expect(await headObject(incomingKey(photo.id))).toBeNull(); // the waiting upload is gone

    const latitude = Buffer.alloc(24);
    GPS_MARK.latitude.forEach((v, i) => {
      latitude.writeUInt32BE(v, i * 8);
      latitude.writeUInt32BE(1, i * 8 + 4);
    });
    expect(jpeg.includes(latitude)).toBe(true);
    const expected: Record<string, [number, number]> = {
      originalKey: [650, 1300],
      zoomKey: [650, 1300], // under 2400 px: not enlarged
      listingKey: [600, 1200],
      thumbKey: [200, 400],
    };
    for (const [column, [w, h]] of Object.entries(expected)) {
      const key = row![column as "originalKey"];
      const stored = await getObjectBuffer(key);
      expect(stored, column).not.toBeNull();
      expect(
        jpegHeaderMarkers(stored!).filter((m) => /^E[1-9A-F]$|^FE$/.test(m)),
        column,
      ).toEqual([]);
      expect(stored!.includes(latitude), column).toBe(false);
      const sof = stored!.indexOf(Buffer.from([0xff, 0xc0]));
      expect([stored!.readUInt16BE(sof + 7), stored!.readUInt16BE(sof + 5)], column).toEqual([w, h]);
    }
    // Red (the stored left edge) is now at the top.
    const thumb = await getObjectBuffer(row!.thumbKey!);
    expect((await bandColour(thumb!, 0.1)).red).toBeGreaterThan(150);
    expect((await bandColour(thumb!, 0.9)).blue).toBeGreaterThan(150);

    const ready = await (await listPhotos(listing.id, seller.cookie)).json();
    expect(ready.photos[0]).toMatchObject({
      id: photo.id,
      status: "ready",
      width: 650,
      height: 1300,
      urls: {
        thumb: `/media/${row!.thumbKey}`,
        listing: `/media/${row!.listingKey}`,
        zoom: `/media/${row!.zoomKey}`,
      },
    });

    // A retried job changes nothing and writes nothing new.
    const keys = await photoObjectKeys();
    expect(await processPhoto({ photoId: photo.id })).toBe("already-done");
    expect(await photoObjectKeys()).toEqual(keys);
  });

  it("that turns out damaged is marked failed with a readable error and leaves no objects", async () => {
    const res = await upload(listing.id, await twoToneJpeg(120, 80), "second.jpg", seller.cookie);
    expect(res.status).toBe(202);
    const { photo } = await res.json();
    // Replace the waiting upload with a JPEG that has no image in it (the header check at upload passed already).
    await putObject(incomingKey(photo.id), Buffer.from([0xff, 0xd8, 0xff, 0xd9]), { contentType: "image/jpeg" });
    const before = await photoObjectKeys();

    expect(await processPhoto({ photoId: photo.id })).toBe("failed");

    const row = await ListingPhoto.findByPk(photo.id);
    expect(row).toMatchObject({ status: "failed", thumbKey: null, listingKey: null, zoomKey: null });
    expect(row!.error).toMatch(/is a JPEG photo, but it is damaged: it has no frame header/);
    before.delete(incomingKey(photo.id));
    expect(await photoObjectKeys()).toEqual(before);
    const listed = await (await listPhotos(listing.id, seller.cookie)).json();
    expect(listed.photos[1]).toMatchObject({ status: "failed", error: row!.error, urls: null, isCover: false });
  });

  it("that is an image bomb (an interlaced PNG whose data inflates to 1 GiB) is marked failed, saying why, and leaves no objects", async () => {
    const res = await upload(listing.id, await plainPng(64, 64), "bomb.png", seller.cookie);
    expect(res.status).toBe(202);
    const { photo } = await res.json();
    // The job meets the bomb as it would if a check at upload had been missed.
    await putObject(incomingKey(photo.id), interlacedPngBomb(), { contentType: "image/png" });
    const before = await photoObjectKeys();

    expect(await processPhoto({ photoId: photo.id })).toBe("failed");

    const row = await ListingPhoto.findByPk(photo.id);
    expect(row).toMatchObject({ status: "failed", thumbKey: null, listingKey: null, zoomKey: null });
    expect(row!.error).toBe(
      "The photo could not be decoded: its image data unpacks to more than the 64 × 64 pixels its header gives. " +
        "Export the photo again and upload the new file.",
    );
    before.delete(incomingKey(photo.id));
    expect(await photoObjectKeys()).toEqual(before);
  });

  it("a job for a photo deleted while queued only removes the waiting upload", async () => {
    const res = await upload(listing.id, await twoToneJpeg(120, 80), "third.jpg", seller.cookie);
    const { photo } = await res.json();
    await ListingPhoto.destroy({ where: { id: photo.id } });
    expect(await processPhoto({ photoId: photo.id })).toBe("gone");
    expect(await headObject(incomingKey(photo.id))).toBeNull();
  });
});

describe("the 24-photo limit", { timeout: 120_000 }, () => {
  it("refuses the 25th photo with a clear message and stores nothing for it", async () => {
    const full = await makeDraft(seller.user.id);
    const small = await twoToneJpeg(48, 32);
    for (let i = 0; i < 24; i++) {
      expect((await upload(full.id, small, `p${i}.jpg`, seller.cookie)).status).toBe(202);
    }
    const keys = await photoObjectKeys();
    const res = await upload(full.id, small, "p24.jpg", seller.cookie);
    expect(res.status).toBe(422);
    expect(await res.json()).toEqual({
      error: "too_many_photos",
      message: "This listing already has 24 photos, the most a listing can have. Delete one to make room.",
    });
    expect(await ListingPhoto.count({ where: { listingId: full.id } })).toBe(24);
    expect(await photoObjectKeys()).toEqual(keys);
    const positions = (await ListingPhoto.findAll({ where: { listingId: full.id }, order: [["position", "ASC"]] })).map((p) => p.position);
    expect(positions).toEqual(Array.from({ length: 24 }, (_, i) => i));
  });
});
