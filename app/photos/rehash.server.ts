import { z } from "zod";
import { Op } from "sequelize";
import { idSchema } from "@shared/ids";
import { ListingPhoto } from "~/models/index.server";
import { getObjectBuffer } from "~/services/storage.server";
import { enqueue, QUEUES } from "~/services/jobs.server";
import { decodeSequentialJpeg } from "./jpeg-decode.server";
import { dctHash } from "./perceptual-hash.server";

// The photo-rehash job: ready photos without a hash (those stored before the hash changed scheme)
// are hashed from their thumbnail, the size the photo job hashes, in batches by id; each batch
// queues the next. Safe to run twice or side by side: a hash is only written where none is.

const BATCH = 50;
const JobData = z.object({ after: idSchema("photo").optional() });

export async function rehashPhotos(data: unknown): Promise<{ hashed: number; skipped: number; next: string | null }> {
  const { after } = JobData.parse(data ?? {});
  const photos = await ListingPhoto.findAll({
    where: { status: "ready", phash: null, thumbKey: { [Op.ne]: null }, ...(after ? { id: { [Op.gt]: after } } : {}) },
    order: [["id", "ASC"]],
    limit: BATCH,
  });
  let hashed = 0;
  for (const photo of photos) {
    const thumb = await getObjectBuffer(photo.thumbKey!);
    let phash: string;
    try {
      if (!thumb) throw new Error("thumbnail missing");
      phash = dctHash(decodeSequentialJpeg(thumb));
    } catch (error) {
      console.warn(`[photos] could not hash photo ${photo.id} again:`, error instanceof Error ? error.message : error);
      continue; // left without a hash: it matches nothing, and the next batch starts after it
    }
    const [n] = await ListingPhoto.update({ phash }, { where: { id: photo.id, phash: null } });
    hashed += n;
  }
  const next = photos.length === BATCH ? photos[photos.length - 1].id : null;
  if (next) await enqueue(QUEUES.photoRehash, { after: next });
  return { hashed, skipped: photos.length - hashed, next };
}

/** Queued by the worker at start when some ready photo has no hash. */
export async function queuePhotoRehashIfNeeded(): Promise<boolean> {
  const waiting = await ListingPhoto.count({ where: { status: "ready", phash: null, thumbKey: { [Op.ne]: null } } });
  if (!waiting) return false;
  await enqueue(QUEUES.photoRehash, {});
  return true;
}
