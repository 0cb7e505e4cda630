import type { SessionUser } from "~/auth/guards.server";
import { pageError } from "~/http/errors.server";
import { acceptWithReadings, remeasureFiguresFor, submitContest } from "~/orders/contest.server";
import type { Clock } from "~/orders/clock.server";
import type { ListedFigure } from "@shared/bench/remeasure";

// The buyer's audition-window forms on /purchases/:orderId: accept (with their own figures, if they
// measured) and contest (reason, note, photos, figures). The contest module reads the body itself
// (photos stream to private storage); this turns its answer into the page's.

export function auditionFigures(listingId: string): Promise<ListedFigure[]> {
  return remeasureFiguresFor(listingId);
}

export type AuditionStep = { ok: true } | { ok: false; status: number; errors: Record<string, string>; values: Record<string, string> };

async function answer(run: () => ReturnType<typeof submitContest>): Promise<AuditionStep> {
  const done = await run().catch(pageError);
  if (done.ok) return { ok: true };
  // A refusal of the whole form (the window closed, a stale page) is a conflict; field errors are input.
  const status = Object.keys(done.errors).length === 1 && done.errors._form ? 409 : 400;
  return { ok: false, status, errors: done.errors, values: done.values };
}

export function acceptFromForm(user: Pick<SessionUser, "id">, orderId: string, request: Request, clock: Clock): Promise<AuditionStep> {
  return answer(() => acceptWithReadings(request, { orderId, buyerId: user.id }, clock));
}

export function contestFromForm(user: Pick<SessionUser, "id">, orderId: string, request: Request, clock: Clock): Promise<AuditionStep> {
  return answer(() => submitContest(request, { orderId, buyerId: user.id }, clock));
}
