import { randomUUID } from "node:crypto";
import { sequelize } from "~/db.server";
import { ListingPhoto } from "~/models/index.server";
import { readMultipart, splitHead, type FilePart } from "~/http/multipart.server";
import { refusal } from "~/http/errors.server";
import { deleteObject, putObjectStream, randomKey } from "~/services/storage.server";
import { QUEUES, enqueue } from "~/services/jobs.server";
import { photoKeyPrefix } from "~/catalogue/media-url";
import { PHOTO_LIMITS, formatBytes, type PhotoView } from "./limits";
import { PhotoRefusal } from "./refusal.server";
import { inspectPhoto, type InspectedPhoto } from "./inspect.server";
import { incomingKey, ownedListing, photoView } from "./access.server";

// One photo per request (so the browser can show a progress bar per file). The upload streams to
// storage while its first bytes are checked (the real type, the pixel count and the memory its
// processing needs, from the header); the row and the job are then made together, or the stored
// upload is removed again. The photo job walks the whole file before it decodes anything.

/** Room for the multipart boundaries and headers around one file. */
const FORM_OVERHEAD = 64 * 1024;
/** Enough for the type and, in all but odd files, the dimensions (JPEG frame headers follow the metadata). */
const HEADER_BYTES = 256 * 1024;

// The 413 closes the connection, so the rest of an oversized upload is not read.
const tooLarge = (size?: number) =>
  refusal(
    "file_too_large",
    `${size ? `This upload is ${formatBytes(size)}` : "This upload is too large"}; photos may be at most ${formatBytes(PHOTO_LIMITS.maxBytes)}.`,
    { headers: { Connection: "close" } },
  );

type Received = { id: string; key: string; checked: InspectedPhoto; bytes: number };

/** The route's whole job: ownership (and room) before reading the body, then the file, then acceptance. */
export async function uploadPhoto(request: Request, listingId: string, sellerId: string): Promise<PhotoView> {
  await ownedListing(listingId, sellerId, { forChange: true });
  await assertRoom(listingId);
  const written: string[] = [];
  try {
    const { files } = await readMultipart(request, {
      maxBytes: PHOTO_LIMITS.maxBytes + FORM_OVERHEAD,
      maxFileBytes: PHOTO_LIMITS.maxBytes,
      maxFiles: 1,
      maxFields: 20,
      tooLarge,
      fileTooLarge: () => tooLarge(),
      tooManyFiles: () => new PhotoRefusal("one_file_only", "Send one photo per request; each gets its own progress and answer."),
      onFile: (part) => receive(part, written),
    });
    if (files.length === 0) throw new PhotoRefusal("no_file", "Choose a photo to upload (field “photo”).");
    return await accept(listingId, sellerId, files[0]);
  } catch (error) {
    for (const key of written) await deleteObject(key).catch((e) => console.error(`[photos] could not remove ${key}:`, e));
    throw error;
  }
}

async function assertRoom(listingId: string): Promise<void> {
  const count = await ListingPhoto.count({ where: { listingId } });
  if (count >= PHOTO_LIMITS.maxPhotos) {
    throw new PhotoRefusal(
      "too_many_photos",
      `This listing already has ${PHOTO_LIMITS.maxPhotos} photos, the most a listing can have. Delete one to make room.`,
    );
  }
}

/** The header checked as it arrives, then the whole file streamed to where it waits for the job. */
async function receive(part: FilePart, written: string[]): Promise<Received> {
  const { head, complete, all } = await splitHead(part.stream, HEADER_BYTES);
  // A small file is here whole and gets every check at once; a larger one gets the rest in the job.
  const checked = await inspectPhoto(head, part.filename, { partial: !complete });
  const id = randomUUID();
  const key = incomingKey(id);
  written.push(key);
  const { bytes } = await putObjectStream(key, all, { contentType: checked.contentType });
  return { id, key, checked, bytes };
}

async function accept(listingId: string, sellerId: string, file: Received): Promise<PhotoView> {
  const photo = await sequelize.transaction(async (transaction) => {
    // The lock serialises uploads to one listing, so the count and the next position hold.
    await ownedListing(listingId, sellerId, { transaction, lock: true, forChange: true });
    const existing = await ListingPhoto.findAll({ where: { listingId }, attributes: ["id", "isCover"], transaction });
    if (existing.length >= PHOTO_LIMITS.maxPhotos) {
      throw new PhotoRefusal(
        "too_many_photos",
        `This listing already has ${PHOTO_LIMITS.maxPhotos} photos, the most a listing can have. Delete one to make room.`,
      );
    }
    const created = await ListingPhoto.create(
      {
        id: file.id,
        listingId,
        position: existing.length,
        isCover: !existing.some((p) => p.isCover),
        status: "processing",
        originalKey: randomKey(photoKeyPrefix("original"), file.checked.ext),
        thumbKey: null,
        listingKey: null,
        zoomKey: null,
        contentType: file.checked.contentType,
        byteSize: file.bytes,
        width: null,
        height: null,
        phash: null,
        error: null,
      },
      { transaction },
    );
    // Queued in the same transaction: the job exists exactly when the row does.
    await enqueue(QUEUES.photoProcess, { photoId: file.id }, { transaction });
    return created;
  });
  return photoView(photo);
}
