import { z } from "zod";
import { idSchema } from "@shared/ids";
import { ListingPhoto } from "~/models/index.server";
import { deleteObject, deleteObjects, getObjectBuffer, putObject, randomKey } from "~/services/storage.server";
import { QUEUES, getBoss } from "~/services/jobs.server";
import { photoKeyPrefix } from "~/catalogue/media-url";
import { incomingKey } from "./access.server";
import { renderPhoto, UnreadableImage } from "./render.server";
import { inspectPhoto } from "./inspect.server";
import { PhotoRefusal } from "./refusal.server";
import { holdLiveListingIfCopied } from "./copied.server";

// The photo-process job: the upload waiting under incoming/ becomes an upright, metadata-free original
// and three sizes under fresh random keys, then the photo is ready. Safe to run twice: the derived
// keys are written to the row before any object, so a retry overwrites rather than orphans them.

const JobData = z.object({ photoId: idSchema("photo") });

export type ProcessOutcome = "ready" | "failed" | "gone" | "already-done";

export async function processPhoto(data: unknown, jobId?: string): Promise<ProcessOutcome> {
  const { photoId } = JobData.parse(data);
  const waiting = incomingKey(photoId);
  const photo = await ListingPhoto.findByPk(photoId);

  if (!photo) {
    await deleteObject(waiting); // deleted while queued: the delete route removed the rest
    return "gone";
  }
  if (photo.status !== "processing") {
    await deleteObject(waiting); // an earlier run finished but was stopped before this clean-up
    if (photo.status === "ready") await holdLiveListingIfCopied(photo.listingId, photo.id);
    return "already-done";
  }

  const input = await getObjectBuffer(waiting);
  if (!input) {
    await markFailed(photo, "The uploaded file was lost before it could be processed; delete this photo and upload it again.");
    return "failed";
  }
  // The upload checked only the header as it streamed in; the whole file's structure is walked here.
  try {
    await inspectPhoto(input);
  } catch (error) {
    if (!(error instanceof PhotoRefusal)) throw error;
    await markFailed(photo, error.message);
    return "failed";
  }

  // Keys are chosen once and remembered, so every attempt writes the same objects.
  if (!photo.thumbKey || !photo.listingKey || !photo.zoomKey) {
    await photo.update({
      thumbKey: randomKey(photoKeyPrefix("thumb"), "jpg"),
      listingKey: randomKey(photoKeyPrefix("listing"), "jpg"),
      zoomKey: randomKey(photoKeyPrefix("zoom"), "jpg"),
    });
  }
  const keys = { original: photo.originalKey, thumb: photo.thumbKey!, listing: photo.listingKey!, zoom: photo.zoomKey! };

  try {
    const type = photo.contentType === "image/png" ? "image/png" : "image/jpeg";
    const out = await renderPhoto(input, type);
    await putObject(keys.original, out.original.body, { contentType: out.original.contentType });
    for (const size of ["thumb", "listing", "zoom"] as const) {
      await putObject(keys[size], out.sizes[size].body, { contentType: out.sizes[size].contentType });
    }
    // Only a row still waiting becomes ready; one deleted meanwhile must not keep its objects.
    const [updated] = await ListingPhoto.update(
      {
        status: "ready",
        width: out.original.width,
        height: out.original.height,
        phash: out.phash,
        contentType: out.original.contentType,
        byteSize: out.original.body.length,
        error: null,
      },
      { where: { id: photoId, status: "processing" } },
    );
    if (updated === 0) {
      await deleteObjects(Object.values(keys));
      await deleteObject(waiting);
      return "gone";
    }
  } catch (error) {
    if (error instanceof UnreadableImage) {
      await markFailed(photo, error.message);
      return "failed";
    }
    // Storage or database trouble: clear what this attempt wrote, then let pg-boss retry, unless this
    // was the last attempt, in which case the seller is told.
    await deleteObjects(Object.values(keys)).catch((e) => console.error("[photos] clean-up failed:", e));
    if (await isLastAttempt(jobId)) {
      await markFailed(photo, "The photo could not be processed because storage was unavailable; delete it and upload it again.");
      return "failed";
    }
    throw error;
  }

  // A photo added to a live listing is checked now (drafts are checked when they are published); if
  // this throws, the retry finds the photo ready and checks again.
  await holdLiveListingIfCopied(photo.listingId, photoId);
  await deleteObject(waiting); // if this throws, the retry finds the photo ready and tries again
  return "ready";
}

async function markFailed(photo: ListingPhoto, message: string) {
  const written = [photo.originalKey, photo.thumbKey, photo.listingKey, photo.zoomKey].filter((k): k is string => !!k);
  await deleteObjects(written);
  await ListingPhoto.update(
    { status: "failed", error: message, thumbKey: null, listingKey: null, zoomKey: null },
    { where: { id: photo.id, status: "processing" } },
  );
  await deleteObject(incomingKey(photo.id));
}

// Without a job id (a direct call) there is no retry to wait for.
async function isLastAttempt(jobId: string | undefined): Promise<boolean> {
  if (!jobId) return true;
  try {
    const boss = await getBoss();
    const job = await boss.getJobById(QUEUES.photoProcess, jobId);
    return !job || job.retryCount >= job.retryLimit;
  } catch {
    return true;
  }
}
