import type { SessionUser } from "~/auth/guards.server";
import { sellerSuspended } from "~/desk/user-desk.server";
import { HttpError, pageError } from "~/http/errors.server";
import { User } from "~/models/index.server";
import { orderFor } from "~/orders/queries.server";
import { resolveContest } from "~/orders/transitions.server";
import type { Clock } from "~/orders/clock.server";
import { CONTEST_REASON_LABELS } from "~/orders/contest-words";
import { isOneOf } from "@shared/one-of";
import { BuyerReadingsSchema } from "@shared/bench/remeasure-schema";
import type { Remeasurement } from "@shared/bench/remeasure";
import { readResolveForm, type FieldErrors } from "./order-forms";
import { auditTrail } from "~/desk/audit.server";
import { claimForViewer, CLAIM_MINUTES } from "~/desk/claims.server";
import type { ClaimState } from "~/desk/ui/ClaimBanner";
import { Capture } from "~/models/capture.server";
import { contestPhotoLinks, type ContestPhotoLink } from "~/orders/contest-photo-links.server";
import { deskThread } from "./desk-thread.server";
import { orderDetailView } from "./order-view.server";

// The desk's screen for one contested order: the buyer's evidence (reason, note, photos through
// short-lived links, captures, their readings against the listing's sheet), the seller's (the listing
// and its bench sheet), their conversation read-only, the claim, the decision and the order's trail.

export interface ContestCaptureView {
  id: string;
  fileName: string;
  status: "queued" | "running" | "done" | "failed";
  error: string | null;
  /** How many of its readings joined the comparison. */
  readings: number;
}

export interface ContestView {
  reason: string;
  note: string | null;
  comparison: Remeasurement | null;
  photoCount: number;
  /** Fresh short-lived links for this moderator (made on every load). */
  photos: ContestPhotoLink[];
  captureCount: number;
  captures: ContestCaptureView[];
  equipment: string | null;
  at: string;
  resolvedBy: string | null;
  resolutionNote: string | null;
}

function isRemeasurement(value: unknown): value is Remeasurement {
  return typeof value === "object" && value !== null && "rows" in value && Array.isArray(value.rows) && "counts" in value;
}

export async function deskOrderPage(moderator: Pick<SessionUser, "id" | "displayName" | "roles">, orderId: string, clock: Clock) {
  const detail = await orderFor(moderator.id, orderId, "moderator").catch(pageError);
  const subject = { type: "order", id: detail.order.id } as const;
  // Opening a contested order takes it for this moderator, unless another holds it.
  const claimed = detail.order.state === "contested" ? await claimForViewer(subject, moderator, clock) : null;
  const claim: ClaimState | null = claimed && (claimed.mine ? claimed : { ...claimed, until: claimed.until.toISOString() });
  const c = detail.contest;
  const peopleIds = [
    ...new Set(
      detail.events.map((e) => e.actorId).filter((id): id is string => !!id && id !== detail.order.buyerId && id !== detail.order.sellerId),
    ),
  ];
  if (c?.resolvedBy) peopleIds.push(c.resolvedBy);
  const people = peopleIds.length ? await User.findAll({ where: { id: peopleIds }, attributes: ["id", "displayName"] }) : [];
  const names = new Map(people.map((p) => [p.id, p.displayName]));
  const [view, trail, thread, photos, captureRows, suspended] = await Promise.all([
    orderDetailView(detail, "moderator", names),
    auditTrail(subject),
    deskThread(detail.order.listingId, detail.order.buyerId),
    c ? contestPhotoLinks(detail.order.id, moderator, clock) : [],
    c?.captureIds.length ? Capture.findAll({ where: { id: c.captureIds } }) : [],
    // A suspended seller's open orders run on, watched from here.
    sellerSuspended(detail.order.sellerId),
  ]);
  const stored = BuyerReadingsSchema.safeParse(c?.readings);
  const fromCapture = (id: string) => (stored.success ? stored.data.readings.filter((r) => r.captureId === id).length : 0);
  const captures: ContestCaptureView[] = captureRows.map((row) => ({
    id: row.id,
    fileName: row.fileName,
    status: row.status,
    error: row.status === "failed" ? row.errorMessage : null,
    readings: fromCapture(row.id),
  }));
  const readings = c?.readings as { equipment?: unknown } | null | undefined;
  const contest: ContestView | null = c
    ? {
        reason: isOneOf(Object.keys(CONTEST_REASON_LABELS), c.reason)
          ? CONTEST_REASON_LABELS[c.reason as keyof typeof CONTEST_REASON_LABELS]
          : c.reason,
        note: c.note,
        comparison: isRemeasurement(c.comparison) ? c.comparison : null,
        photoCount: c.photoKeys.length,
        photos,
        captureCount: c.captureIds.length,
        captures,
        equipment: typeof readings?.equipment === "string" ? readings.equipment : null,
        at: c.createdAt.toISOString(),
        resolvedBy: c.resolvedBy ? (names.get(c.resolvedBy) ?? "a moderator") : null,
        resolutionNote: c.resolutionNote,
      }
    : null;
  return {
    view,
    contest,
    refundableMinor: view.money.totalMinor - view.money.refundedMinor,
    claim,
    claimMinutes: CLAIM_MINUTES,
    trail,
    thread,
    sellerSuspended: suspended,
  };
}

export type ResolveResult = { ok: true } | { ok: false; status: number; errors: FieldErrors };

export async function resolveFromDesk(
  moderator: Pick<SessionUser, "id">,
  orderId: string,
  fields: Record<string, unknown>,
  clock: Clock,
): Promise<ResolveResult> {
  const { order } = await orderFor(moderator.id, orderId, "moderator").catch(pageError);
  const read = readResolveForm(fields, {
    currency: order.currency,
    totalMinor: order.priceMinor + order.deliveryMinor,
    refundedMinor: order.refundedMinor,
  });
  if (!read.ok) return { ok: false, status: 400, errors: read.errors };
  try {
    await resolveContest(orderId, moderator.id, { refundMinor: read.refundMinor, note: read.note }, clock);
    return { ok: true };
  } catch (e) {
    if (e instanceof HttpError && e.status === 404) return pageError(e);
    if (e instanceof HttpError && e.status < 500) return { ok: false, status: e.status, errors: { form: e.message } };
    throw e;
  }
}
