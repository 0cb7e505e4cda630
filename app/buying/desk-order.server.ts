import type { SessionUser } from "~/auth/guards.server";
import { HttpError, pageError } from "~/http/errors.server";
import { User } from "~/models/index.server";
import { orderFor } from "~/orders/queries.server";
import { resolveContest } from "~/orders/transitions.server";
import type { Clock } from "~/orders/clock.server";
import { CONTEST_REASON_LABELS } from "~/orders/contest-words";
import { isOneOf } from "@shared/one-of";
import type { Remeasurement } from "@shared/bench/remeasure";
import { readResolveForm, type FieldErrors } from "./order-forms";
import { orderDetailView } from "./order-view.server";

// The desk's screen for one contested order: the buyer's evidence (reason, note, their readings
// against the listing's sheet), the seller's (the listing and its bench sheet), and the decision.

export interface ContestView {
  reason: string;
  note: string | null;
  comparison: Remeasurement | null;
  photoCount: number;
  captureCount: number;
  equipment: string | null;
  at: string;
  resolvedBy: string | null;
  resolutionNote: string | null;
}

function isRemeasurement(value: unknown): value is Remeasurement {
  return typeof value === "object" && value !== null && "rows" in value && Array.isArray(value.rows) && "counts" in value;
}

export async function deskOrderPage(moderator: Pick<SessionUser, "id">, orderId: string) {
  const detail = await orderFor(moderator.id, orderId, "moderator").catch(pageError);
  const c = detail.contest;
  const peopleIds = [
    ...new Set(
      detail.events.map((e) => e.actorId).filter((id): id is string => !!id && id !== detail.order.buyerId && id !== detail.order.sellerId),
    ),
  ];
  if (c?.resolvedBy) peopleIds.push(c.resolvedBy);
  const people = peopleIds.length ? await User.findAll({ where: { id: peopleIds }, attributes: ["id", "displayName"] }) : [];
  const names = new Map(people.map((p) => [p.id, p.displayName]));
  const view = await orderDetailView(detail, "moderator", names);
  const readings = c?.readings as { equipment?: unknown } | null | undefined;
  const contest: ContestView | null = c
    ? {
        reason: isOneOf(Object.keys(CONTEST_REASON_LABELS), c.reason)
          ? CONTEST_REASON_LABELS[c.reason as keyof typeof CONTEST_REASON_LABELS]
          : c.reason,
        note: c.note,
        comparison: isRemeasurement(c.comparison) ? c.comparison : null,
        photoCount: c.photoKeys.length,
        captureCount: c.captureIds.length,
        equipment: typeof readings?.equipment === "string" ? readings.equipment : null,
        at: c.createdAt.toISOString(),
        resolvedBy: c.resolvedBy ? (names.get(c.resolvedBy) ?? "a moderator") : null,
        resolutionNote: c.resolutionNote,
      }
    : null;
  return { view, contest, refundableMinor: view.money.totalMinor - view.money.refundedMinor };
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
