import { z } from "zod";
import { QueryTypes } from "sequelize";
import { idSchema } from "@shared/ids";
import { sequelize } from "~/db.server";
import { getObjectBuffer } from "~/services/storage.server";
import { enqueue, QUEUES } from "~/services/jobs.server";
import { decodeSequentialJpeg } from "./jpeg-decode.server";
import { dctHash, PHASH_SCHEME } from "./perceptual-hash.server";

// The photo-rehash job: ready photos hashed by an older scheme (migration 20261231-0300) are hashed
// again from their thumbnail, the size the photo job hashes, in batches by id; each batch queues the
// next. Safe to run twice or side by side: only a row still on an older scheme is written.

const BATCH = 50;
const JobData = z.object({ after: idSchema("photo").optional() });

type Waiting = { id: string; thumbKey: string };

export async function rehashPhotos(data: unknown): Promise<{ hashed: number; skipped: number; next: string | null }> {
  const { after } = JobData.parse(data ?? {});
  const photos = await sequelize.query<Waiting>(
    `SELECT id, thumb_key AS "thumbKey" FROM listing_photos
      WHERE status = 'ready' AND phash_scheme < :scheme AND thumb_key IS NOT NULL ${after ? "AND id > :after" : ""}
      ORDER BY id LIMIT :limit`,
    { replacements: { scheme: PHASH_SCHEME, after: after ?? null, limit: BATCH }, type: QueryTypes.SELECT },
  );
  let hashed = 0;
  for (const photo of photos) {
    const thumb = await getObjectBuffer(photo.thumbKey);
    let phash: string;
    try {
      if (!thumb) throw new Error("thumbnail missing");
      phash = dctHash(decodeSequentialJpeg(thumb));
    } catch (error) {
      console.warn(`[photos] could not hash photo ${photo.id} again:`, error instanceof Error ? error.message : error);
      continue; // keeps its old hash, which the check ignores; the next batch starts after it
    }
    const [, rows] = await sequelize.query(
      `UPDATE listing_photos SET phash = :phash, phash_scheme = :scheme WHERE id = :id AND phash_scheme < :scheme`,
      { replacements: { phash, scheme: PHASH_SCHEME, id: photo.id }, type: QueryTypes.UPDATE },
    );
    hashed += rows;
  }
  const next = photos.length === BATCH ? photos[photos.length - 1].id : null;
  if (next) await enqueue(QUEUES.photoRehash, { after: next });
  return { hashed, skipped: photos.length - hashed, next };
}

/** Queued by the worker at start when some ready photo still has an older scheme's hash. */
export async function queuePhotoRehashIfNeeded(): Promise<boolean> {
  const [row] = await sequelize.query<{ waiting: boolean }>(
    `SELECT EXISTS (SELECT 1 FROM listing_photos WHERE status = 'ready' AND phash_scheme < :scheme) AS waiting`,
    { replacements: { scheme: PHASH_SCHEME }, type: QueryTypes.SELECT },
  );
  if (!row?.waiting) return false;
  await enqueue(QUEUES.photoRehash, {});
  return true;
}
