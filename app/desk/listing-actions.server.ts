import { z } from "zod";
import { sequelize } from "~/db.server";
import { Listing } from "~/models/index.server";
import type { SessionUser } from "~/auth/guards.server";
import { HttpError, refusal } from "~/http/errors.server";
import { queueAlertMatching } from "~/alerts/matching.server";
import { queueWatchNotice } from "~/alerts/watch-notices.server";
import { systemClock, type Clock } from "~/orders/clock.server";
import { idSchema, isId } from "@shared/ids";
import type { ListingStatus } from "@shared/catalogue";
import { recordAudit, type DeskSubject } from "./audit.server";
import { releaseClaim, requireClaim } from "./claims.server";
import { resolveFlag, resolveListingFlags } from "./flags.server";
import { queueDeskMail } from "./mail.server";
import { deskNotFound } from "./not-found.server";

// A moderator's actions on a listing, each with a required note. One transaction each: the listing's
// row lock, the claim (requireClaim: another moderator's claim refuses with item_taken), the state
// check, the change, the audit record and the mail to the person affected. Nothing half-done.

export const LISTING_INTENTS = ["clear_hold", "ask_changes", "remove_listing", "dismiss_flag"] as const;
export type ListingIntent = (typeof LISTING_INTENTS)[number];

export const NOTE_MAX = 2000;

/** What may be done to a listing in each state (the page shows these; the action checks again under the lock). */
const ALLOWED: Record<ListingIntent, readonly ListingStatus[]> = {
  clear_hold: ["held"],
  ask_changes: ["held", "live"],
  remove_listing: ["held", "live", "draft", "withdrawn"],
  dismiss_flag: ["draft", "held", "live", "reserved", "sold", "withdrawn", "removed"],
};

export function listingActions(status: ListingStatus, hasOpenFlags: boolean): ListingIntent[] {
  return LISTING_INTENTS.filter((i) => ALLOWED[i].includes(status) && (i !== "dismiss_flag" || hasOpenFlags));
}

const ActionSchema = z.object({
  intent: z.enum(LISTING_INTENTS, { message: "Choose what to do." }),
  note: z
    .string({ message: "Write a note: it goes on the trail and to the seller." })
    .trim()
    .min(1, "Write a note: it goes on the trail and to the seller.")
    .max(NOTE_MAX, `Keep the note under ${NOTE_MAX} characters.`),
  flagId: idSchema("flag").optional(),
});

export type ActionErrors = Partial<Record<"note" | "intent" | "flagId" | "form", string>>;
export type ActionResult = { ok: true; intent: ListingIntent } | { ok: false; status: number; errors: ActionErrors };

const STATE_WORDS: Record<ListingIntent, string> = {
  clear_hold: "Only a held listing can be cleared",
  ask_changes: "Changes can be asked only of a held or live listing",
  remove_listing: "A listing a buyer holds or has bought cannot be removed",
  dismiss_flag: "",
};

export async function actOnListing(
  moderator: Pick<SessionUser, "id">,
  listingId: string,
  fields: Record<string, unknown>,
  clock: Clock = systemClock,
): Promise<ActionResult> {
  if (!isId(listingId)) deskNotFound("listing");
  const parsed = ActionSchema.safeParse({ ...fields, flagId: fields.flagId || undefined });
  if (!parsed.success) {
    const errors: ActionErrors = {};
    for (const issue of parsed.error.issues) {
      const key = (issue.path[0] as keyof ActionErrors | undefined) ?? "form";
      errors[key] ??= issue.message;
    }
    return { ok: false, status: 400, errors };
  }
  const { intent, note, flagId } = parsed.data;
  if (intent === "dismiss_flag" && !flagId) return { ok: false, status: 400, errors: { flagId: "Choose the flag to dismiss." } };
  try {
    await sequelize.transaction(async (transaction) => {
      const listing = await Listing.findByPk(listingId, { transaction, lock: transaction.LOCK.UPDATE });
      if (!listing) deskNotFound("listing");
      const subject: DeskSubject = { type: "listing", id: listing.id };
      await requireClaim(subject, moderator.id, transaction, clock);
      if (!ALLOWED[intent].includes(listing.status))
        throw refusal("item_state", `${STATE_WORDS[intent]}; this one is ${listing.status} now.`);
      const before = { status: listing.status, heldReason: listing.heldReason, reviewNote: listing.reviewNote ?? null };

      if (intent === "dismiss_flag") {
        const flag = await resolveFlag(flagId!, moderator.id, "dismissed", transaction);
        if (!flag || flag.listingId !== listing.id)
          throw refusal("item_state", "That flag is already resolved, or belongs to another listing.");
        const auditId = await recordAudit(
          {
            actorId: moderator.id,
            action: "dismiss_flag",
            subject,
            note,
            before: { flagId: flag.id, kind: flag.kind, reason: flag.reason },
            after: { resolution: "dismissed" },
          },
          transaction,
        );
        if (flag.kind === "report" && flag.reporterId) await queueDeskMail(auditId, flag.reporterId, transaction);
        return;
      }

      const wasLive = listing.status === "live";
      if (intent === "clear_hold") {
        await listing.update({ status: "live", heldReason: null, reviewNote: null }, { transaction });
        // A held unit is matched against spec alerts when it reaches the market.
        await queueAlertMatching(listing.id, transaction);
      } else if (intent === "ask_changes") {
        await listing.update({ status: "draft", heldReason: null, reviewNote: note }, { transaction });
      } else {
        await listing.update({ status: "removed", heldReason: null }, { transaction });
        await resolveListingFlags(listing.id, moderator.id, "listing_removed", transaction);
      }
      if (wasLive && intent !== "clear_hold") await queueWatchNotice({ kind: "withdrawn", listingId: listing.id }, transaction);
      const after = { status: listing.status, heldReason: listing.heldReason, reviewNote: listing.reviewNote ?? null };
      const auditId = await recordAudit({ actorId: moderator.id, action: intent, subject, note, before, after }, transaction);
      await queueDeskMail(auditId, listing.sellerId, transaction);
      await releaseClaim(subject, transaction);
    });
    return { ok: true, intent };
  } catch (e) {
    if (e instanceof HttpError && e.status < 500) return { ok: false, status: e.status, errors: { form: e.message } };
    throw e;
  }
}
