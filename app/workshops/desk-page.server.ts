import { data } from "react-router";
import { HttpError, pageError } from "~/http/errors.server";
import type { SessionUser } from "~/auth/guards.server";
import { auditTrail } from "~/desk/audit.server";
import { claimForViewer, CLAIM_MINUTES } from "~/desk/claims.server";
import type { ClaimState } from "~/desk/ui/ClaimBanner";
import { systemClock, type Clock } from "~/orders/clock.server";
import { idSchema } from "@shared/ids";
import { decideApplication, DecisionForm, workshopForDesk, workshopSubject } from "./desk.server";

// /desk/workshops/:id, the server side: the application with its signed document link, the claim
// (opening the page takes the item when it is free) and the trail; the decision form's action.

export type DecisionErrors = Partial<Record<"decision" | "note" | "_form", string>>;

function workshopId(raw: string | undefined): string {
  const id = idSchema("workshop").safeParse(raw);
  if (!id.success) throw data({ message: "There is no such workshop.", error: "not_found" }, { status: 404 });
  return id.data;
}

export async function deskWorkshopPage(moderator: SessionUser, rawId: string | undefined, clock: Clock = systemClock) {
  const id = workshopId(rawId);
  try {
    const view = await workshopForDesk(id, moderator.id, clock);
    const subject = workshopSubject(id);
    // Only a waiting application is an item to take; a decided one is read-only history.
    const [claimed, trail] = await Promise.all([
      view.workshop.status === "applied" ? claimForViewer(subject, { id: moderator.id, displayName: moderator.displayName }, clock) : null,
      auditTrail(subject),
    ]);
    const claim: ClaimState | null = !claimed
      ? null
      : claimed.mine
        ? { mine: true }
        : { mine: false, by: claimed.by, until: claimed.until.toISOString() };
    return { ...view, claim, claimMinutes: CLAIM_MINUTES, trail };
  } catch (e) {
    pageError(e);
  }
}

export async function decideFromDesk(
  moderator: SessionUser,
  rawId: string | undefined,
  fields: Record<string, FormDataEntryValue>,
  clock: Clock = systemClock,
): Promise<{ ok: true } | { ok: false; status: number; errors: DecisionErrors }> {
  const id = workshopId(rawId);
  const parsed = DecisionForm.safeParse({ decision: fields.decision, note: typeof fields.note === "string" ? fields.note : "" });
  if (!parsed.success) {
    const errors: DecisionErrors = {};
    for (const i of parsed.error.issues)
      errors[i.path[0] === "decision" ? "decision" : i.path[0] === "note" ? "note" : "_form"] ??= i.message;
    return { ok: false, status: 400, errors };
  }
  try {
    await decideApplication(id, moderator.id, parsed.data, clock);
    return { ok: true };
  } catch (e) {
    // Taken by another moderator, or decided meanwhile: said beside the form, nothing written.
    if (e instanceof HttpError && e.status === 409) return { ok: false, status: 409, errors: { _form: e.message } };
    if (e instanceof Response && e.status === 409) return { ok: false, status: 409, errors: { _form: await refusalText(e) } };
    pageError(e);
  }
}

async function refusalText(response: Response): Promise<string> {
  try {
    const body: unknown = await response.clone().json();
    if (body && typeof body === "object" && "message" in body && typeof body.message === "string") return body.message;
  } catch {
    // not JSON: fall through
  }
  return "Another moderator has taken this item.";
}
