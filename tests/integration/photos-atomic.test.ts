import { afterAll, beforeAll, describe, expect, it, vi } from "vitest";
import { ListingPhoto } from "~/models/index.server";
import { ensureBucket } from "~/services/storage.server";
import type { Listing } from "~/models/index.server";
import { twoToneJpeg } from "../support/photo-files";
import { makeDraft, makeSeller, photoObjectKeys, removeSellers, upload } from "./photos-support";

// The waiting object, the row and the job are made together: when the last step fails, the first
// two are undone. The queue is made to fail here; everything else is real.
const failing = vi.hoisted(() => ({ enqueue: false }));
vi.mock("~/services/jobs.server", async (original) => {
  const real = await original<typeof import("~/services/jobs.server")>();
  return {
    ...real,
    enqueue: async (...args: Parameters<typeof real.enqueue>) => {
      if (failing.enqueue) throw new Error("queue unavailable (test)");
      return real.enqueue(...args);
    },
  };
});

let seller: Awaited<ReturnType<typeof makeSeller>>;
let listing: Listing;

beforeAll(async () => {
  await ensureBucket();
  seller = await makeSeller("atomic");
  listing = await makeDraft(seller.user.id);
});
afterAll(async () => {
  if (seller) await removeSellers([seller.user.id]);
});

describe("an upload whose job cannot be queued", { timeout: 60_000 }, () => {
  it("answers 500 and leaves no row and no stored object", async () => {
    const keys = await photoObjectKeys();
    failing.enqueue = true;
    const res = await upload(listing.id, await twoToneJpeg(96, 64), "front.jpg", seller.cookie);
    failing.enqueue = false;
    expect(res.status).toBe(500);
    expect(await res.json()).toEqual({ error: "server_error", message: expect.stringContaining("try again") });
    expect(await ListingPhoto.count({ where: { listingId: listing.id } })).toBe(0);
    expect(await photoObjectKeys()).toEqual(keys);

    // The same file goes through once the queue is back.
    const again = await upload(listing.id, await twoToneJpeg(96, 64), "front.jpg", seller.cookie);
    expect(again.status).toBe(202);
    expect(await ListingPhoto.count({ where: { listingId: listing.id } })).toBe(1);
  });
});
