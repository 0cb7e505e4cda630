import { QueryTypes, type Transaction } from "sequelize";
import { sequelize } from "~/db.server";
import { Capture } from "~/models/capture.server";
import { Order, OrderContest } from "~/models/index.server";
import { storedSheet } from "~/listings/bench.server";
import { enqueue, QUEUES } from "~/services/jobs.server";
import type { CaptureConditions } from "@shared/bench/analysis";
import type { Reading } from "@shared/bench/schema";
import { compareRemeasurement, remeasurableFigures, type BuyerReading, type BuyerReadings } from "@shared/bench/remeasure";
import { BuyerReadingsSchema, MAX_BUYER_READINGS } from "@shared/bench/remeasure-schema";

// A contest's captures: a WAV the buyer recorded of the unit, streamed to storage with the contest
// form and analysed by the bench's own capture job. Its readings then join the buyer's typed figures
// and the whole is compared with the listing's sheet again, exactly as typed figures are.

/** A capture file received with the contest form, stored and waiting for its row. */
export interface ContestCaptureUpload {
  key: string;
  fileName: string;
  byteSize: number;
  conditions: CaptureConditions;
}

/** The rows and analysis jobs for the contest's captures, in the contest's transaction; their ids. */
export async function createContestCaptures(ownerId: string, uploads: readonly ContestCaptureUpload[], tx: Transaction): Promise<string[]> {
  const ids: string[] = [];
  for (const u of uploads) {
    const capture = await Capture.create(
      {
        ownerId,
        kind: u.conditions.kind,
        fileName: u.fileName,
        contentType: "audio/wav",
        conditions: u.conditions,
        format: { file: "wav" },
        byteSize: u.byteSize,
        storageKey: u.key,
      },
      { transaction: tx },
    );
    await enqueue(QUEUES.captureAnalyze, { captureId: capture.id }, { transaction: tx });
    ids.push(capture.id);
  }
  return ids;
}

/** A reading the capture job wrote, as a figure the buyer measured (from that capture). */
function asBuyerReading(r: Reading, captureId: string): BuyerReading {
  return {
    quantity: r.quantity,
    value: r.value,
    unit: r.unit,
    ...(r.channel ? { channel: r.channel } : {}),
    conditions: r.conditions,
    origin: "capture",
    captureId,
    ...(r.note ? { note: r.note.slice(0, 500) } : {}),
  };
}

function storedReadings(value: unknown): BuyerReadings | null {
  const parsed = BuyerReadingsSchema.safeParse(value);
  return parsed.success ? parsed.data : null;
}

/**
 * After a capture's analysis: if it belongs to a contest not yet decided, the contest's figures become
 * the typed ones plus every finished capture's (only quantities the sheet has a figure for: the rest
 * could not be compared with anything), and the comparison is made again. Safe to run twice.
 */
export async function contestCaptureFinished(captureId: string): Promise<boolean> {
  const [found] = await sequelize.query<{ order_id: string }>(
    `SELECT order_id FROM order_contests WHERE $1::uuid = ANY (capture_ids) AND resolved_at IS NULL`,
    { bind: [captureId], type: QueryTypes.SELECT },
  );
  if (!found) return false;
  return sequelize.transaction(async (transaction) => {
    const contest = await OrderContest.findByPk(found.order_id, { transaction, lock: transaction.LOCK.UPDATE });
    if (!contest || contest.resolvedAt) return false;
    const order = await Order.findByPk(contest.orderId, { attributes: ["id", "listingId"], transaction, rejectOnEmpty: true });
    const { sheet } = await storedSheet(order.listingId, transaction);
    const known = new Set(remeasurableFigures(sheet).map((f) => f.quantity));
    const before = storedReadings(contest.readings);
    const typed = (before?.readings ?? []).filter((r) => r.origin !== "capture");
    const captures = await Capture.findAll({ where: { id: contest.captureIds, status: "done" }, transaction });
    const measured = captures.flatMap((c) => (c.readings ?? []).filter((r) => known.has(r.quantity)).map((r) => asBuyerReading(r, c.id)));
    const readings = [...typed, ...measured].slice(0, MAX_BUYER_READINGS);
    if (!readings.length) return false;
    const all: BuyerReadings = { ...before, readings };
    await contest.update({ readings: all, comparison: compareRemeasurement(sheet, all) }, { transaction });
    return true;
  });
}
