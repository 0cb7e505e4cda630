// The bench step's capture upload as a plain form (no JavaScript): the same path as the capture API
// (submitCapture: the upload streamed to storage, its header and stated conditions checked with
// app/bench/capture-form.server.ts, row and job in one transaction), then a short wait for the
// analysis; once it is done its readings join the saved sheet the way the editor folds them in the
// browser (shared/bench-form/capture-fold.ts).
import { awaitCapture, findOwnCapture, submitCapture } from "~/bench/capture-api.server";
import type { Capture } from "~/models/capture.server";
import { BenchSheet } from "~/models/index.server";
import { describeReading, readingSchema, sweepSchema } from "@shared/bench";
import { foldCapture } from "@shared/bench-form/capture-fold";
import { readSheetState, sheetToState } from "@shared/bench-form/state";
import { z } from "zod";
import { ownListing, assertEditable } from "./access.server";
import type { PostedCaptureView } from "~/sell/bench/capture-kinds";
import { saveBenchSheet } from "./bench.server";

/** How long the page waits for the analysis before showing "still analysing" (the API's longest wait). */
const WAIT_SECONDS = 8;

export async function postCaptureForm(request: Request, listingId: string, sellerId: string): Promise<{ captureId: string }> {
  const listing = await ownListing(listingId, sellerId);
  assertEditable(listing);
  const { id } = await submitCapture(request, sellerId, { listingId: listing.id });
  const finished = await awaitCapture(id, WAIT_SECONDS);
  if (finished?.status === "done") await addToSheet(listing.id, sellerId, finished);
  return { captureId: id };
}

/** A finished capture of the seller's that is not on the sheet yet goes onto it (the "add" button after a long analysis). */
export async function addCaptureToSheet(listingId: string, sellerId: string, captureId: unknown): Promise<boolean> {
  await ownListing(listingId, sellerId);
  const capture = await findOwnCapture(captureId, sellerId);
  if (!capture || capture.status !== "done") return false;
  await addToSheet(listingId, sellerId, capture);
  return true;
}

const Readings = z.array(readingSchema);

async function addToSheet(listingId: string, sellerId: string, capture: Capture) {
  const listing = await ownListing(listingId, sellerId);
  const row = await BenchSheet.findOne({ where: { listingId } });
  const readings = Readings.safeParse(capture.readings ?? []);
  const sweep = capture.sweep ? sweepSchema.safeParse(capture.sweep) : null;
  const state = foldCapture(sheetToState(row?.sheet ?? null, listing.category), {
    id: capture.id,
    fileName: capture.fileName,
    readings: readings.success ? readings.data : [],
    ...(sweep?.success ? { sweep: sweep.data } : {}),
  });
  const read = readSheetState(state);
  if (read.sheet) await saveBenchSheet(listingId, sellerId, read.sheet);
}

/** What the bench step shows of the capture just posted (`?capture=<id>`), or null if it is not the seller's. */
export async function postedCapture(listingId: string, sellerId: string, captureId: string | null): Promise<PostedCaptureView | null> {
  if (!captureId) return null;
  const capture = await findOwnCapture(captureId, sellerId);
  if (!capture) return null;
  const row = await BenchSheet.findOne({ where: { listingId } });
  const sheet = row?.sheet;
  const onSheet =
    !!sheet && (sheet.readings.some((r) => r.captureId === capture.id) || sheet.sweeps.some((s) => s.captureId === capture.id));
  const readings = Readings.safeParse(capture.readings ?? []);
  const sweep = capture.sweep ? sweepSchema.safeParse(capture.sweep) : null;
  return {
    id: capture.id,
    fileName: capture.fileName,
    status: capture.status,
    readings: readings.success ? readings.data.map(describeReading) : [],
    sweepPoints: sweep?.success ? sweep.data.points.length : null,
    message: capture.status === "failed" ? capture.errorMessage : null,
    onSheet,
  };
}
