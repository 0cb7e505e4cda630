import { BenchSheet } from "~/models/index.server";
import { HttpError, pageError } from "~/http/errors.server";
import { MiB } from "~/http/limited-stream.server";
import { readPageForm } from "~/http/body.server";
import { orderFor } from "~/orders/queries.server";
import { acceptUnit, contestOrder } from "~/orders/transitions.server";
import type { Clock } from "~/orders/clock.server";
import { CONTEST_NOTE_MAX, CONTEST_PHOTOS_MAX, CONTEST_REASONS } from "~/orders/contest-words";
import { readingsFromForm } from "~/orders/readings-form";
import { compareRemeasurement, remeasurableFigures, type ListedFigure } from "@shared/bench/remeasure";
import { BuyerReadingsSchema } from "@shared/bench/remeasure-schema";
import { isOneOf } from "@shared/one-of";
import type { SessionUser } from "~/auth/guards.server";

// The buyer's audition-window forms on /purchases/:orderId: accept (with their own figures, if they
// measured) and contest (reason, note, figures). The figures are compared with the listing's bench
// sheet here, and the comparison goes with the contest for the desk.

export async function auditionFigures(listingId: string): Promise<ListedFigure[]> {
  const sheet = await BenchSheet.findOne({ where: { listingId }, attributes: ["sheet"] });
  return remeasurableFigures(sheet?.sheet ?? null);
}

export type AuditionStep = { ok: true } | { ok: false; status: number; errors: Record<string, string>; values: Record<string, string> };

function valuesOf(form: FormData): Record<string, string> {
  const values: Record<string, string> = {};
  for (const [k, v] of form.entries()) if (typeof v === "string") values[k] = v.slice(0, CONTEST_NOTE_MAX);
  return values;
}

async function readings(form: FormData, listingId: string, required: boolean) {
  const sheet = await BenchSheet.findOne({ where: { listingId }, attributes: ["sheet"] });
  const figures = remeasurableFigures(sheet?.sheet ?? null);
  const get = (name: string) => {
    const v = form.get(name);
    return typeof v === "string" ? v : "";
  };
  const read = readingsFromForm(get, figures);
  if (Object.keys(read.errors).length) return { errors: read.errors };
  if (!read.buyer.readings.length) return required ? { errors: {} } : { buyer: null, comparison: null };
  const parsed = BuyerReadingsSchema.safeParse(read.buyer);
  if (!parsed.success) {
    const errors: Record<string, string> = {};
    for (const i of parsed.error.issues) {
      const index = typeof i.path[1] === "number" ? i.path[1] : -1;
      errors[read.fieldOf[index] ?? "_form"] ??= i.message;
    }
    return { errors };
  }
  return { buyer: parsed.data, comparison: compareRemeasurement(sheet?.sheet ?? null, parsed.data) };
}

async function transition(run: () => Promise<unknown>, values: Record<string, string>): Promise<AuditionStep> {
  try {
    await run();
    return { ok: true };
  } catch (e) {
    if (e instanceof HttpError && e.status === 404) return pageError(e);
    if (e instanceof HttpError && e.status < 500) return { ok: false, status: e.status, errors: { _form: e.message }, values };
    throw e;
  }
}

/** Accept inside the audition window; figures are optional, and checked when given. */
export async function acceptFromForm(
  user: Pick<SessionUser, "id">,
  orderId: string,
  request: Request,
  clock: Clock,
): Promise<AuditionStep> {
  const { order } = await orderFor(user.id, orderId, "buyer").catch(pageError);
  const form = await readPageForm(request);
  const values = valuesOf(form);
  const read = await readings(form, order.listingId, false);
  if ("errors" in read) return { ok: false, status: 400, errors: read.errors ?? {}, values };
  return transition(() => acceptUnit(order.id, user.id, clock), values);
}

/** Contest: a reason and a note are required; figures, when given, are compared with the sheet and kept. */
export async function contestFromForm(
  user: Pick<SessionUser, "id">,
  orderId: string,
  request: Request,
  clock: Clock,
): Promise<AuditionStep> {
  const { order } = await orderFor(user.id, orderId, "buyer").catch(pageError);
  const form = await readPageForm(request, { maxBytes: 8 * MiB, maxFileBytes: 6 * MiB, maxFiles: CONTEST_PHOTOS_MAX });
  const values = valuesOf(form);
  const errors: Record<string, string> = {};
  const reason = form.get("reason");
  if (!isOneOf(CONTEST_REASONS, reason)) errors.reason = "Choose what is wrong.";
  const note = typeof form.get("note") === "string" ? String(form.get("note")).trim() : "";
  if (note.length < 10) errors.note = "Say what is wrong in a sentence or two: the seller and the moderator read this.";
  else if (note.length > CONTEST_NOTE_MAX) errors.note = `Keep it under ${CONTEST_NOTE_MAX} characters.`;
  const read = await readings(form, order.listingId, false);
  if ("errors" in read) Object.assign(errors, read.errors);
  if (Object.keys(errors).length || "errors" in read || !isOneOf(CONTEST_REASONS, reason))
    return { ok: false, status: 400, errors, values };
  return transition(
    () =>
      contestOrder(order.id, user.id, { reason, note, readings: read.buyer ?? undefined, comparison: read.comparison ?? undefined }, clock),
    values,
  );
}
