import { HttpError, pageError } from "~/http/errors.server";
import type { Clock } from "~/orders/clock.server";
import { acceptWithReadings, remeasureFiguresFor, submitContest, type AuditionFormResult } from "~/orders/contest.server";
import type { ListedFigure } from "@shared/bench/remeasure";
import type { SessionUser } from "~/auth/guards.server";

// The buyer's audition-window forms on /purchases/:orderId: accept (with their own figures, if they
// measured) and contest (reason, note, private photos, figures). The work is app/orders/contest.server.ts:
// it compares the figures with the listing's bench sheet and stores them with the transition.

export function auditionFigures(listingId: string): Promise<ListedFigure[]> {
  return remeasureFiguresFor(listingId);
}

export type AuditionStep = { ok: true } | { ok: false; status: number; errors: Record<string, string>; values: Record<string, string> };

async function step(run: () => Promise<AuditionFormResult>): Promise<AuditionStep> {
  let done: AuditionFormResult;
  try {
    done = await run();
  } catch (e) {
    // Someone else's order is the same 404 page as a missing one; a refused body is its error page.
    if (e instanceof HttpError) return pageError(e);
    throw e;
  }
  if (done.ok) return { ok: true };
  // A refusal of the order's state lands on `_form` (409); anything else is a field the buyer can fix.
  const status = done.errors._form && Object.keys(done.errors).length === 1 ? 409 : 400;
  return { ok: false, status, errors: done.errors, values: done.values };
}

/** Accept inside the audition window; figures are optional, checked when given and kept with the order. */
export function acceptFromForm(user: Pick<SessionUser, "id">, orderId: string, request: Request, clock: Clock): Promise<AuditionStep> {
  return step(() => acceptWithReadings(request, { orderId, buyerId: user.id }, clock));
}

/** Contest: a reason and a note are required; photos and figures, when given, are kept for the desk. */
export function contestFromForm(user: Pick<SessionUser, "id">, orderId: string, request: Request, clock: Clock): Promise<AuditionStep> {
  return step(() => submitContest(request, { orderId, buyerId: user.id }, clock));
}
