// The background analysis of one capture (queue "capture-analyze"), in the worker: the web process
// only streamed the file to storage and read its header. Here the whole file is read and checked
// (length, clipping, silence, a CSV's rows) and analysed. A file refused on the way ends the capture
// as failed with the same code and sentence the API would give, and its stored file is removed;
// anything else (storage or database trouble) is thrown so pg-boss retries the job — until the last
// attempt, which ends the capture as failed with a reason, its file kept so the seller can retry.
import { z } from "zod";
import { captureConditionsSchema } from "@shared/bench/analysis";
import { idSchema } from "@shared/ids";
import { Capture } from "~/models/capture.server";
import { deleteObject, getObjectBuffer } from "~/services/storage.server";
import { analyseCapture, CaptureError } from "./captures.server";

const JobData = z.object({ captureId: idSchema("capture") });
export type CaptureJobData = z.infer<typeof JobData>;

/** The first run and the queue's two retries (retryLimit in app/services/jobs.server.ts). */
export const CAPTURE_JOB_ATTEMPTS = 3;
/** The code of a capture that failed on our side, not for what its file holds: it may be queued again. */
export const RETRYABLE_FAILURE = "analysis_failed";

export async function analyseCaptureJob(data: unknown): Promise<{ status: string }> {
  const capture = await Capture.findByPk(JobData.parse(data).captureId);
  // Gone, or already finished by an earlier attempt: nothing to do.
  if (!capture || capture.status === "done" || capture.status === "failed") return { status: capture?.status ?? "missing" };
  await capture.update({ status: "running", startedAt: new Date(), attempts: capture.attempts + 1 });
  try {
    return await analyse(capture);
  } catch (e) {
    if (capture.attempts < CAPTURE_JOB_ATTEMPTS) {
      await capture.update({ status: "queued" }).catch(() => undefined);
      throw e;
    }
    console.error(`[captures] ${capture.id} failed on its last attempt`, e);
    await capture.update({
      status: "failed",
      errorCode: RETRYABLE_FAILURE,
      errorMessage: `The bench could not finish analysing this capture after ${capture.attempts} attempts: storage or database trouble on our side, not a fault in the file. Its file is kept; try again.`,
      finishedAt: new Date(),
    });
    return { status: "failed" };
  }
}

async function analyse(capture: Capture): Promise<{ status: string }> {
  const bytes = capture.storageKey ? await getObjectBuffer(capture.storageKey) : null;
  if (!bytes) {
    await capture.update({
      status: "failed",
      errorCode: "file_lost",
      errorMessage: "The stored capture file could not be found.",
      finishedAt: new Date(),
    });
    return { status: "failed" };
  }

  try {
    const conditions = captureConditionsSchema.parse(capture.conditions);
    const result = analyseCapture(
      new Uint8Array(bytes.buffer, bytes.byteOffset, bytes.byteLength),
      capture.fileName,
      conditions,
      capture.id,
    );
    await capture.update({
      status: "done",
      format: result.format,
      analysis: result.analysis,
      readings: result.readings,
      sweep: result.kind === "sweep" ? result.sweep : null,
      errorCode: null,
      errorMessage: null,
      finishedAt: new Date(),
    });
    return { status: "done" };
  } catch (e) {
    if (!(e instanceof CaptureError)) throw e;
    const key = capture.storageKey;
    await capture.update({ status: "failed", errorCode: e.code, errorMessage: e.message, storageKey: null, finishedAt: new Date() });
    // The row no longer points at the file, so a failed delete leaves no half-state the app relies on.
    if (key) await deleteObject(key).catch((err) => console.error(`[captures] could not remove refused file ${key}`, err));
    return { status: "failed" };
  }
}
