import type { BuyerReadings, Remeasurement } from "@shared/bench/remeasure";
import { holdsRole } from "~/auth/roles";
import { refusal } from "~/http/errors.server";
import { Order, OrderContest, User } from "~/models/index.server";
import { OrderRemeasurement } from "~/models/order-remeasurement.server";
import type { Clock } from "./clock.server";
import { queueRefund, releaseToSeller, setListingStatus } from "./money.server";
import { runStep, type Actor } from "./step.server";
import { recordAudit } from "~/desk/audit.server";
import { releaseClaim, requireClaim } from "~/desk/claims.server";
import { enqueue, QUEUES } from "~/services/jobs.server";
import { createContestCaptures, type ContestCaptureUpload } from "./contest-captures.server";

// The audition window's transitions: the buyer accepts or contests, the window closes on schedule, a
// moderator resolves a contest. Same rules as the rest of the state machine (transitions.server.ts).

const system: Actor = { id: null, kind: "system" };

const auditionOver = (order: Order, now: Date) => !!order.auditionEndsAt && now >= order.auditionEndsAt;

/** The buyer's own figures entered with an acceptance, and their comparison with the bench sheet. */
export interface AcceptRemeasurement {
  readings: BuyerReadings;
  comparison: Remeasurement;
}

/** The buyer is satisfied before the window closes: the money is released to the seller (with their figures, if they measured). */
export function acceptUnit(orderId: string, buyerId: string, clock: Clock, remeasurement?: AcceptRemeasurement): Promise<Order> {
  return runStep(
    orderId,
    {
      actor: { id: buyerId, kind: "buyer" },
      side: "buyer",
      from: ["arrived", "audition"],
      to: "released",
      apply: async (order, { tx, now }) => {
        if (remeasurement) await OrderRemeasurement.create({ orderId: order.id, ...remeasurement, enteredAt: now }, { transaction: tx });
        await releaseToSeller(order, 0, now, tx);
      },
      mail: ["buyer", "seller"],
    },
    clock,
  );
}

export interface ContestInput {
  reason: string;
  note?: string | null;
  readings?: unknown;
  photoKeys?: string[];
  /** Capture files received with the contest form: their rows and analysis jobs are made with the contest. */
  captures?: ContestCaptureUpload[];
  /** The outcome of compareRemeasurement, computed by the contest's caller. */
  comparison?: unknown;
}

/** The buyer contests within the audition window; the money stays held for a moderator. */
export function contestOrder(orderId: string, buyerId: string, contest: ContestInput, clock: Clock): Promise<Order> {
  return runStep(
    orderId,
    {
      actor: { id: buyerId, kind: "buyer" },
      side: "buyer",
      from: ["arrived", "audition"],
      to: "contested",
      refuse: (order, now) => (auditionOver(order, now) ? "the audition window has closed." : null),
      apply: async (order, { tx, now }) => {
        const captureIds = await createContestCaptures(buyerId, contest.captures ?? [], tx);
        await OrderContest.create(
          {
            orderId: order.id,
            reason: contest.reason,
            note: contest.note ?? null,
            readings: contest.readings ?? null,
            photoKeys: contest.photoKeys ?? [],
            captureIds,
            comparison: contest.comparison ?? null,
            createdAt: now,
          },
          { transaction: tx },
        );
        // The photos are kept only as metadata-free copies, made by the worker.
        if (contest.photoKeys?.length) await enqueue(QUEUES.contestPhoto, { orderId: order.id }, { transaction: tx });
      },
      note: contest.reason,
      mail: ["buyer", "seller"],
    },
    clock,
  );
}

/** The audition window ran out with no contest: the money is released. */
export function closeAudition(orderId: string, clock: Clock): Promise<Order> {
  return runStep(
    orderId,
    {
      actor: system,
      from: ["audition"],
      to: "released",
      refuse: (order, now) => (auditionOver(order, now) ? null : "the audition window is still open."),
      apply: (order, { tx, now }) => releaseToSeller(order, 0, now, tx),
      note: "The audition window closed without a contest.",
      mail: ["buyer", "seller"],
    },
    clock,
  );
}

export interface Resolution {
  /** 0 releases everything to the seller; the order's total refunds it in whole; between, in part. */
  refundMinor: number;
  note: string;
}

/**
 * A moderator's decision on a contested order, with a required note: only while they hold the desk's
 * claim on it, and written to the order's audit trail (release_order / refund_order) in the same step.
 */
export async function resolveContest(orderId: string, moderatorId: string, resolution: Resolution, clock: Clock): Promise<Order> {
  const moderator = await User.findByPk(moderatorId);
  if (!moderator || !holdsRole(moderator.roles, "moderator")) throw refusal("forbidden", "Only a moderator can resolve a contest.");
  const note = resolution.note.trim();
  if (!note)
    throw refusal("invalid", "Give a note with the decision.", { issues: [{ path: "note", message: "Give a note with the decision." }] });
  const refund = resolution.refundMinor;
  return runStep(
    orderId,
    {
      actor: { id: moderatorId, kind: "moderator" },
      from: ["contested"],
      to: refund === 0 ? "released" : "refunded",
      refuse: (order) =>
        Number.isSafeInteger(refund) && refund >= 0 && refund <= order.totalMinor
          ? null
          : `a refund must be between 0 and the order's total (${order.totalMinor}).`,
      apply: async (order, { tx, now }) => {
        // The desk's rule: only the moderator holding the order acts on it (409 item_taken otherwise).
        const subject = { type: "order", id: order.id } as const;
        await requireClaim(subject, moderatorId, tx, clock);
        const before = { state: order.state, refundedMinor: order.refundedMinor };
        await OrderContest.update(
          { resolvedBy: moderatorId, resolutionNote: note, resolvedAt: now },
          { where: { orderId: order.id }, transaction: tx },
        );
        await queueRefund(order, refund, tx);
        if (refund < order.totalMinor) await releaseToSeller(order, refund, now, tx);
        else {
          order.closedAt = now;
          // Refunded in whole: the unit goes back to its seller, who may list it again.
          await setListingStatus(order.listingId, "withdrawn", tx);
        }
        await recordAudit(
          {
            actorId: moderatorId,
            action: refund === 0 ? "release_order" : "refund_order",
            subject,
            note,
            before,
            after: { state: refund === 0 ? "released" : "refunded", refundMinor: refund, currency: order.currency },
          },
          tx,
        );
        await releaseClaim(subject, tx);
      },
      note,
      mail: ["buyer", "seller"],
    },
    clock,
  );
}

/** PAYMENTS paid the seller: the transfer is recorded once (the same transfer again is harmless). */
