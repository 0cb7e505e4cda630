import { randomUUID } from "node:crypto";
import type { Transaction } from "sequelize";
import { sequelize } from "~/db.server";
import { ListingPhoto } from "~/models/index.server";
import { deleteObject, putObject, randomKey } from "~/services/storage.server";
import { QUEUES, enqueue } from "~/services/jobs.server";
import { photoKeyPrefix } from "~/catalogue/media-url";
import { PHOTO_LIMITS, formatBytes, type PhotoView } from "./limits";
import { PhotoRefusal } from "./refusal.server";
import { inspectPhoto } from "./inspect.server";
import { incomingKey, ownedListing, photoView } from "./access.server";

// One photo per request (so the browser can show a progress bar per file). The checks run first;
// then the waiting object, the row and the job are made together or not at all.

/** Room for the multipart boundaries and headers around one file. */
const FORM_OVERHEAD = 64 * 1024;

export type UploadedFile = { name: string; bytes: Uint8Array };

/** The single file of a multipart request, read with a hard cap so nobody can make us buffer more. */
export async function readSinglePhoto(request: Request): Promise<UploadedFile> {
  const type = request.headers.get("Content-Type") ?? "";
  if (!/^multipart\/form-data;/i.test(type)) {
    throw new PhotoRefusal("bad_request", "Send the photo as multipart/form-data with the file in the field “photo”.");
  }
  const limit = PHOTO_LIMITS.maxBytes + FORM_OVERHEAD;
  const tooLarge = (size?: number) =>
    new PhotoRefusal(
      "file_too_large",
      `${size ? `This upload is ${formatBytes(size)}` : "This upload is too large"}; ` +
        `photos may be at most ${formatBytes(PHOTO_LIMITS.maxBytes)}.`,
    );
  const declared = Number(request.headers.get("Content-Length") ?? NaN);
  if (declared > limit) throw tooLarge(declared);

  const chunks: Uint8Array[] = [];
  let total = 0;
  const reader = request.body?.getReader();
  if (!reader) throw new PhotoRefusal("no_file", "The request carried no photo.");
  for (;;) {
    const { done, value } = await reader.read();
    if (done) break;
    total += value.byteLength;
    if (total > limit) {
      await reader.cancel().catch(() => {});
      throw tooLarge();
    }
    chunks.push(value);
  }

  let form: FormData;
  try {
    form = await new Response(Buffer.concat(chunks), { headers: { "Content-Type": type } }).formData();
  } catch {
    throw new PhotoRefusal("bad_request", "The upload could not be read as a form; try again.");
  }
  const files = [...form.values()].filter((v): v is File => typeof v !== "string");
  if (files.length === 0) throw new PhotoRefusal("no_file", "Choose a photo to upload (field “photo”).");
  if (files.length > 1) {
    throw new PhotoRefusal("one_file_only", "Send one photo per request; each gets its own progress and answer.");
  }
  const file = files[0];
  return { name: file.name, bytes: new Uint8Array(await file.arrayBuffer()) };
}

/** Checks the file, stores it for processing and queues the job; answers the new photo's state. */
export async function acceptPhoto(listingId: string, sellerId: string, file: UploadedFile): Promise<PhotoView> {
  // Cheap refusals first: not theirs, or closed.
  await ownedListing(listingId, sellerId, { forChange: true });
  const checked = await inspectPhoto(file.bytes, file.name);

  const id = randomUUID();
  const waiting = incomingKey(id);
  let stored = false;
  try {
    const photo = await sequelize.transaction(async (transaction) => {
      // The lock serialises uploads to one listing, so the count and the next position hold.
      await ownedListing(listingId, sellerId, { transaction, lock: true, forChange: true });
      const existing = await ListingPhoto.findAll({
        where: { listingId },
        attributes: ["id", "isCover"],
        transaction,
      });
      if (existing.length >= PHOTO_LIMITS.maxPhotos) {
        throw new PhotoRefusal(
          "too_many_photos",
          `This listing already has ${PHOTO_LIMITS.maxPhotos} photos, the most a listing can have. ` +
            "Delete one to make room.",
        );
      }
      const created = await ListingPhoto.create(
        {
          id,
          listingId,
          position: existing.length,
          isCover: !existing.some((p) => p.isCover),
          status: "processing",
          originalKey: randomKey(photoKeyPrefix("original"), checked.ext),
          thumbKey: null,
          listingKey: null,
          zoomKey: null,
          contentType: checked.contentType,
          byteSize: checked.byteSize,
          width: null,
          height: null,
          phash: null,
          error: null,
        },
        { transaction },
      );
      await putObject(waiting, file.bytes, { contentType: checked.contentType, contentLength: checked.byteSize });
      stored = true;
      // Queued on the same connection: the job exists exactly when the row does.
      await enqueue(QUEUES.photoProcess, { photoId: id }, { db: transactionDb(transaction) });
      return created;
    });
    return photoView(photo);
  } catch (error) {
    if (stored) {
      await deleteObject(waiting).catch((e) => console.error(`[photos] could not remove ${waiting}:`, e));
    }
    throw error;
  }
}

type PgClient = { query(text: string, values?: unknown[]): Promise<{ rows: unknown[] }> };

// pg-boss accepts any executor; this one runs its insert inside our open transaction.
function transactionDb(transaction: Transaction) {
  const client = (transaction as unknown as { connection?: PgClient }).connection;
  if (!client || typeof client.query !== "function") throw new Error("the transaction has no connection");
  return { executeSql: (text: string, values: unknown[]) => client.query(text, values) };
}

/** The route's whole job: ownership before reading the body, then the file, then acceptance. */
export async function uploadPhoto(request: Request, listingId: string, sellerId: string): Promise<PhotoView> {
  await ownedListing(listingId, sellerId, { forChange: true });
  return acceptPhoto(listingId, sellerId, await readSinglePhoto(request));
}
