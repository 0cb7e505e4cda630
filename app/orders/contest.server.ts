import { randomUUID } from "node:crypto";
import { z } from "zod";
import { Order } from "~/models/index.server";
import { readPageForm } from "~/http/body.server";
import { HttpError, pageError, refusal } from "~/http/errors.server";
import { mediaType } from "~/http/limited-stream.server";
import { readMultipart, splitHead, type FilePart } from "~/http/multipart.server";
import { deleteObject, putObjectStream } from "~/services/storage.server";
import { storedSheet } from "~/listings/bench.server";
import { inspectPhoto } from "~/photos/inspect.server";
import { PHOTO_LIMITS } from "~/photos/limits";
import { freeText } from "@shared/text";
import type { OrderState } from "@shared/orders";
import { isOneOf } from "@shared/one-of";
import { BuyerReadingsSchema } from "@shared/bench/remeasure-schema";
import { compareRemeasurement, remeasurableFigures, type BuyerReadings, type ListedFigure } from "@shared/bench/remeasure";
import type { BenchSheet } from "@shared/bench/schema";
import { systemClock, type Clock } from "./clock.server";
import { acceptUnit, contestOrder } from "./transitions.server";
import { stateRefusal } from "./step.server";
import { CONTEST_INCOMING_PREFIX } from "./contest-photos.server";
import { captureFrom, receiveCapture, type CaptureFile } from "./contest-capture-form.server";
import { CONTEST_CAPTURES_MAX, CONTEST_NOTE_MAX, CONTEST_PHOTOS_MAX, CONTEST_REASONS } from "./contest-words";
import { readingsFromForm, type FieldErrors } from "./readings-form";

// The buyer's side of the audition window: contesting (reason, note, private photos, their own figures
// typed or in a capture) and accepting with their own figures. Both compare the figures with the listing's bench sheet here,
// on the server, and hand the result to the order's transition, which stores it in its transaction.

export type AuditionFormResult = { ok: true; order: Order } | { ok: false; errors: FieldErrors; values: Record<string, string> };

export { CONTEST_PHOTO_PREFIX } from "./contest-photos.server";
/** Room for the boundaries and the text fields around the photos. */
const FORM_OVERHEAD = 256 * 1024;
const HEADER_BYTES = 256 * 1024;

/** The sheet's figures the buyer may re-measure, for the forms; a listing without a sheet offers none. */
export async function remeasureFiguresFor(listingId: string): Promise<ListedFigure[]> {
  return remeasurableFigures((await storedSheet(listingId)).sheet);
}

async function buyersOrder(orderId: string, buyerId: string): Promise<Order> {
  const order = await Order.findOne({ where: { id: orderId, buyerId } });
  if (!order) throw refusal("not_found", "There is no such order.");
  return order;
}

const contestFields = z.object({
  reason: z.string().refine((r) => isOneOf(CONTEST_REASONS, r), { message: "Choose what is wrong." }),
  note: freeText("Your note")
    .transform((s) => s.trim())
    .pipe(
      z
        .string()
        .min(10, { message: "Say in a sentence or two what is wrong (at least 10 characters)." })
        .max(CONTEST_NOTE_MAX, { message: `At most ${CONTEST_NOTE_MAX} characters.` }),
    ),
});

const OPEN: readonly OrderState[] = ["arrived", "audition"];

type Photo = { key: string } | { error: string } | null;
type Part = Photo | CaptureFile;

/** One photo: its header checked as it arrives, then streamed to a private key; a refused one is drained, not fatal. */
async function receivePhoto(part: FilePart, written: string[]): Promise<Photo> {
  if (!part.filename) {
    part.stream.resume(); // the empty part a file input sends when nothing was chosen
    return null;
  }
  const { head, complete, all } = await splitHead(part.stream, HEADER_BYTES);
  let checked;
  try {
    checked = await inspectPhoto(head, part.filename, { partial: !complete });
  } catch (e) {
    part.stream.resume();
    if (e instanceof HttpError) return { error: e.message };
    throw e;
  }
  const now = new Date();
  // Waits under incoming/ for the contest-photo job, which keeps only a metadata-free copy.
  const key = `${CONTEST_INCOMING_PREFIX}${now.getUTCFullYear()}/${String(now.getUTCMonth() + 1).padStart(2, "0")}/${randomUUID()}.${checked.ext}`;
  written.push(key);
  await putObjectStream(key, all, { contentType: checked.contentType });
  return { key };
}

function valuesOf(form: FormData): Record<string, string> {
  const out: Record<string, string> = {};
  for (const [k, v] of form.entries()) if (typeof v === "string" && k.length <= 64) out[k] = v.slice(0, 4000);
  return out;
}

/** The figures typed in the form, checked by the schema and compared with the sheet; null when none were typed. */
function remeasurementFrom(form: FormData, sheet: BenchSheet | null, errors: FieldErrors) {
  const figures = remeasurableFigures(sheet);
  const get = (name: string) => {
    const v = form.get(name);
    return typeof v === "string" ? v : "";
  };
  const typed = readingsFromForm(get, figures);
  Object.assign(errors, typed.errors);
  if (!typed.buyer.readings.length && !typed.buyer.equipment && !typed.buyer.measuredOn) return null;
  if (!typed.buyer.readings.length) {
    if (!Object.keys(typed.errors).length) errors._readings = "Enter at least one figure, or leave the measurement fields blank.";
    return null;
  }
  const parsed = BuyerReadingsSchema.safeParse(typed.buyer);
  if (!parsed.success) {
    for (const issue of parsed.error.issues) {
      const [head, index] = issue.path;
      const field = head === "readings" && typeof index === "number" ? typed.fieldOf[index] : typeof head === "string" ? head : "_readings";
      errors[field ?? "_readings"] ??= issue.message;
    }
    return null;
  }
  const readings: BuyerReadings = parsed.data;
  return { readings, comparison: compareRemeasurement(sheet, readings) };
}

/** A refusal of the order's state (the window closed meanwhile) goes beside the form; anything else up. */
function stateError(e: unknown): string {
  if (e instanceof HttpError && e.code === "order_state") return e.message;
  throw e;
}

/**
 * The contest form (multipart, `?intent=contest`): reason and note, up to CONTEST_PHOTOS_MAX photos
 * stored privately, the buyer's figures compared with the sheet, then contestOrder. Nothing is kept
 * when anything is refused: stored photos are deleted again.
 */
export async function submitContest(
  request: Request,
  { orderId, buyerId }: { orderId: string; buyerId: string },
  clock: Clock = systemClock,
): Promise<AuditionFormResult> {
  const order = await buyersOrder(orderId, buyerId);
  // Refused before any photo is stored; the transition checks again under its row lock.
  if (!OPEN.includes(order.state))
    return {
      ok: false,
      errors: { _form: stateRefusal(order, "it can no longer be contested.").message },
      values: {},
    };
  const written: string[] = [];
  try {
    let form: FormData;
    const photos: Part[] = [];
    if (mediaType(request) === "multipart/form-data") {
      try {
        const read = await readMultipart<Part>(request, {
          maxBytes: (CONTEST_PHOTOS_MAX + CONTEST_CAPTURES_MAX) * PHOTO_LIMITS.maxBytes + FORM_OVERHEAD,
          // A minute of stereo 24-bit audio at 48 kHz is about 17 MB: one limit serves photos and captures.
          maxFileBytes: PHOTO_LIMITS.maxBytes,
          maxFiles: CONTEST_PHOTOS_MAX + CONTEST_CAPTURES_MAX,
          tooManyFiles: () =>
            refusal("bad_request", `Send at most ${CONTEST_PHOTOS_MAX} photos and ${CONTEST_CAPTURES_MAX} capture with a contest.`),
          onFile: (part) => (part.field === "capture" ? receiveCapture(part, written) : receivePhoto(part, written)),
        });
        form = read.fields;
        photos.push(...read.files);
      } catch (e) {
        pageError(e);
      }
    } else form = await readPageForm(request);

    const errors: FieldErrors = {};
    const fields = contestFields.safeParse({ reason: form.get("reason") ?? "", note: form.get("note") ?? "" });
    if (!fields.success) for (const i of fields.error.issues) errors[String(i.path[0] ?? "_form")] ??= i.message;
    const photoErrors = photos.flatMap((p) => (p && "error" in p ? [p.error] : []));
    if (photoErrors.length) errors.photos = photoErrors.join(" ");
    if (photos.filter((p) => p && "capture" in p).length > CONTEST_CAPTURES_MAX)
      errors.capture = `Send at most ${CONTEST_CAPTURES_MAX} capture with a contest.`;
    const captures = captureFrom(form, photos, errors);
    const sheet = (await storedSheet(order.listingId)).sheet;
    const measured = remeasurementFrom(form, sheet, errors);

    if (!fields.success || Object.keys(errors).length) return await undo(written, { ok: false, errors, values: valuesOf(form) });
    const photoKeys = photos.flatMap((p) => (p && "key" in p ? [p.key] : []));
    // The capture's own figures join the comparison once the worker has analysed it (contest-captures.server.ts).
    try {
      const after = await contestOrder(
        orderId,
        buyerId,
        {
          reason: fields.data.reason,
          note: fields.data.note,
          readings: measured?.readings ?? null,
          photoKeys,
          captures,
          comparison: measured?.comparison ?? null,
        },
        clock,
      );
      return { ok: true, order: after };
    } catch (e) {
      return await undo(written, { ok: false, errors: { _form: stateError(e) }, values: valuesOf(form) });
    }
  } catch (e) {
    await undo(written, null);
    throw e;
  }
}

async function undo<T>(keys: string[], result: T): Promise<T> {
  for (const key of keys) await deleteObject(key).catch((e) => console.error(`[contest] could not remove ${key}:`, e));
  keys.length = 0;
  return result;
}

/**
 * Accepting the unit (`?intent=accept`), with the buyer's own figures if they typed any: compared with
 * the sheet and stored with the acceptance in acceptUnit's transaction.
 */
export async function acceptWithReadings(
  request: Request,
  { orderId, buyerId }: { orderId: string; buyerId: string },
  clock: Clock = systemClock,
): Promise<AuditionFormResult> {
  const order = await buyersOrder(orderId, buyerId);
  const form = await readPageForm(request);
  const errors: FieldErrors = {};
  const sheet = (await storedSheet(order.listingId)).sheet;
  const measured = remeasurementFrom(form, sheet, errors);
  if (Object.keys(errors).length) return { ok: false, errors, values: valuesOf(form) };
  try {
    return { ok: true, order: await acceptUnit(orderId, buyerId, clock, measured ?? undefined) };
  } catch (e) {
    return { ok: false, errors: { _form: stateError(e) }, values: valuesOf(form) };
  }
}
