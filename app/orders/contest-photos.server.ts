import { z } from "zod";
import { idSchema } from "@shared/ids";
import { OrderContest } from "~/models/index.server";
import { deleteObject, getObjectBuffer, headObject, putObject } from "~/services/storage.server";
import { renderPhoto, UnreadableImage } from "~/photos/render.server";

// A contest's photos: the upload waits under contests/incoming/ (never served), then the
// 'contest-photo' job re-encodes it from its pixels through the listing photos' pipeline (upright, no
// byte of metadata: no camera, no place) to contests/clean/, and removes the upload. Only the clean
// copy is ever shown, through a short-lived link (contest-photo-links.server.ts), never by /media.

/** Private: never under the public media prefixes, so /media never serves anything here. */
export const CONTEST_PHOTO_PREFIX = "contests/";
export const CONTEST_INCOMING_PREFIX = `${CONTEST_PHOTO_PREFIX}incoming/`;
const CLEAN_PREFIX = `${CONTEST_PHOTO_PREFIX}clean/`;

/** Where the metadata-free copy of an uploaded contest photo goes (always a JPEG). */
export function cleanContestKey(uploadKey: string): string {
  const rest = uploadKey.startsWith(CONTEST_INCOMING_PREFIX)
    ? uploadKey.slice(CONTEST_INCOMING_PREFIX.length)
    : uploadKey.slice(CONTEST_PHOTO_PREFIX.length);
  return `${CLEAN_PREFIX}${rest.replace(/\.[a-z0-9]+$/i, "")}.jpg`;
}

const JobData = z.object({ orderId: idSchema("order") });

export type ContestPhotoOutcome = { cleaned: number; unreadable: number; missing: number };

/** The job: every photo of the order's contest that has no clean copy yet gets one. Safe to run twice. */
export async function cleanContestPhotos(data: unknown): Promise<ContestPhotoOutcome> {
  const { orderId } = JobData.parse(data);
  const contest = await OrderContest.findByPk(orderId, { attributes: ["orderId", "photoKeys"] });
  const outcome: ContestPhotoOutcome = { cleaned: 0, unreadable: 0, missing: 0 };
  for (const upload of contest?.photoKeys ?? []) {
    const clean = cleanContestKey(upload);
    if (await headObject(clean)) {
      await deleteObject(upload); // an earlier run wrote it but stopped before this clean-up
      continue;
    }
    const input = await getObjectBuffer(upload);
    if (!input) {
      outcome.missing++;
      continue;
    }
    try {
      const out = await renderPhoto(input, /\.png$/i.test(upload) ? "image/png" : "image/jpeg");
      await putObject(clean, out.sizes.zoom.body, { contentType: "image/jpeg" });
      outcome.cleaned++;
    } catch (error) {
      // Checked at upload, so this is a damaged file: it is dropped rather than kept with its metadata.
      if (!(error instanceof UnreadableImage)) throw error;
      outcome.unreadable++;
    }
    await deleteObject(upload);
  }
  return outcome;
}
