import { z } from "zod";
import { sequelize } from "~/db.server";
import { DeskFlag, Listing, User } from "~/models/index.server";
import { Message } from "~/models/message.server";
import { MessageThread } from "~/models/message-thread.server";
import { Offer } from "~/models/offer.server";
import { HttpError, refusal } from "~/http/errors.server";
import type { SessionUser } from "~/auth/guards.server";
import { auditTrail, recordAudit, type DeskSubject } from "~/desk/audit.server";
import { claimForViewer, CLAIM_MINUTES, releaseClaim, requireClaim } from "~/desk/claims.server";
import { resolveFlag } from "~/desk/flags.server";
import type { ClaimState } from "~/desk/ui/ClaimBanner";
import { systemClock, type Clock } from "~/orders/clock.server";
import { listingTitle } from "@shared/catalogue";
import { isId } from "@shared/ids";
import { formatPrice } from "@shared/money";
import { freeText } from "@shared/text";
import { REPORT_REASON_LABELS } from "./words";

// /desk/threads/:id: a reported conversation for moderators, read-only (messages as they were
// stored, masked where they were), its reports and its trail; a report is dismissed with a note.

export const threadSubject = (id: string): DeskSubject => ({ type: "thread", id });

export interface DeskThreadLine {
  id: string;
  at: string;
  who: string;
  side: "buyer" | "seller";
  text: string;
  kind: "message" | "offer";
  masked: boolean;
}

export interface DeskReport {
  id: string;
  reason: string;
  note: string | null;
  reporter: string;
  at: string;
  resolution: string | null;
}

export async function deskThreadPage(moderator: SessionUser, rawId: unknown, clock: Clock = systemClock) {
  const thread = isId(rawId) ? await MessageThread.findByPk(rawId) : null;
  if (!thread) throw refusal("not_found", "There is no such conversation.");
  const [listing, buyer, seller, messages, offers, flags] = await Promise.all([
    Listing.findByPk(thread.listingId, { attributes: ["id", "maker", "model", "status"] }),
    User.findByPk(thread.buyerId, { attributes: ["id", "displayName"] }),
    User.findByPk(thread.sellerId, { attributes: ["id", "displayName"] }),
    Message.findAll({ where: { threadId: thread.id }, order: [["createdAt", "ASC"]], limit: 500 }),
    Offer.findAll({ where: { threadId: thread.id }, order: [["createdAt", "ASC"]], limit: 200 }),
    DeskFlag.findAll({
      where: { threadId: thread.id, kind: "report" },
      include: [{ model: User, as: "reporter", attributes: ["displayName"] }],
      order: [["createdAt", "ASC"]],
    }),
  ]);
  const name = (id: string) => (id === thread.buyerId ? (buyer?.displayName ?? "the buyer") : (seller?.displayName ?? "the seller"));
  const side = (id: string): "buyer" | "seller" => (id === thread.buyerId ? "buyer" : "seller");
  const lines: DeskThreadLine[] = [
    ...messages.map((m) => ({
      id: m.id,
      at: m.createdAt.toISOString(),
      who: name(m.senderId),
      side: side(m.senderId),
      text: m.body,
      kind: "message" as const,
      masked: m.masked,
    })),
    ...offers.map((o) => {
      const by = o.madeBy === "buyer" ? thread.buyerId : thread.sellerId;
      return {
        id: o.id,
        at: o.createdAt.toISOString(),
        who: name(by),
        side: side(by),
        text: `${o.parentOfferId ? "Counter-offer" : "Offer"} of ${formatPrice(o.amountMinor, o.currency)} (${o.state})`,
        kind: "offer" as const,
        masked: false,
      };
    }),
  ].sort((a, b) => a.at.localeCompare(b.at));
  const reports = flags.map((f): DeskReport => ({
    id: f.id,
    reason: REPORT_REASON_LABELS[f.reason] ?? f.reason,
    note: f.note,
    reporter: f.reporter?.displayName ?? "a former account",
    at: f.createdAt.toISOString(),
    resolution: f.resolution,
  }));
  const open = reports.some((r) => r.resolution === null);
  const subject = threadSubject(thread.id);
  const [claimed, trail] = await Promise.all([
    open ? claimForViewer(subject, { id: moderator.id, displayName: moderator.displayName }, clock) : null,
    auditTrail(subject),
  ]);
  const claim: ClaimState | null = !claimed
    ? null
    : claimed.mine
      ? { mine: true }
      : { mine: false, by: claimed.by, until: claimed.until.toISOString() };
  return {
    thread: {
      id: thread.id,
      listing: listing ? { id: listing.id, title: listingTitle(listing.maker, listing.model), status: listing.status } : null,
      buyer: buyer ? { id: buyer.id, name: buyer.displayName } : null,
      seller: seller ? { id: seller.id, name: seller.displayName } : null,
    },
    lines,
    reports,
    claim,
    claimMinutes: CLAIM_MINUTES,
    trail,
  };
}

const DismissForm = z.object({
  flagId: z.string().refine(isId, { message: "Choose a report." }),
  note: freeText("The note")
    .transform((s) => s.trim())
    .pipe(
      z
        .string()
        .min(5, { message: "Write a note for the trail (at least 5 characters)." })
        .max(2000, { message: "At most 2000 characters." }),
    ),
});

export type DismissErrors = Partial<Record<"note" | "_form", string>>;

/** Dismisses one open report of the conversation, under the moderator's claim, with its audit record. */
export async function dismissThreadReport(
  moderator: SessionUser,
  rawId: unknown,
  fields: Record<string, FormDataEntryValue>,
  clock: Clock = systemClock,
): Promise<{ ok: true } | { ok: false; status: number; errors: DismissErrors }> {
  if (!isId(rawId)) throw refusal("not_found", "There is no such conversation.");
  const parsed = DismissForm.safeParse({ flagId: fields.flagId, note: typeof fields.note === "string" ? fields.note : "" });
  if (!parsed.success) {
    const errors: DismissErrors = {};
    for (const i of parsed.error.issues) errors[i.path[0] === "note" ? "note" : "_form"] ??= i.message;
    return { ok: false, status: 400, errors };
  }
  try {
    await sequelize.transaction(async (transaction) => {
      const subject = threadSubject(rawId);
      await requireClaim(subject, moderator.id, transaction, clock);
      const flag = await DeskFlag.findOne({ where: { id: parsed.data.flagId, threadId: rawId, kind: "report" }, transaction });
      if (!flag) throw refusal("not_found", "There is no such report.");
      const closed = await resolveFlag(flag.id, moderator.id, "dismissed", transaction);
      if (!closed) throw refusal("conflict", "That report was dealt with meanwhile.");
      await recordAudit(
        {
          actorId: moderator.id,
          action: "dismiss_flag",
          subject,
          note: parsed.data.note,
          before: { flagId: flag.id, reason: flag.reason, resolution: null },
          after: { flagId: flag.id, resolution: "dismissed" },
        },
        transaction,
      );
      await releaseClaim(subject, transaction);
    });
    return { ok: true };
  } catch (e) {
    if (e instanceof HttpError && e.status === 409) return { ok: false, status: 409, errors: { _form: e.message } };
    throw e;
  }
}
