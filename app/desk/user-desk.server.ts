import { Op } from "sequelize";
import { z } from "zod";
import { sequelize } from "~/db.server";
import { Listing, Order, User } from "~/models/index.server";
import type { SessionUser } from "~/auth/guards.server";
import { holdsRole, normaliseRoles, ROLE_LABELS } from "~/auth/roles";
import { HttpError, refusal } from "~/http/errors.server";
import { queueWatchNotice } from "~/alerts/watch-notices.server";
import { systemClock, type Clock } from "~/orders/clock.server";
import { isId } from "@shared/ids";
import { LISTING_STATUS_LABELS, listingTitle, type ListingStatus } from "@shared/catalogue";
import { FINAL_STATES, ORDER_STATE_LABELS, type OrderState } from "@shared/orders";
import { auditTrail, recordAudit, type DeskSubject } from "./audit.server";
import { CLAIM_MINUTES, claimForViewer, releaseClaim, requireClaim } from "./claims.server";
import { queueDeskMail } from "./mail.server";
import { deskNotFound } from "./not-found.server";
import { NOTE_MAX } from "./listing-actions.server";

// /desk/users/:id: an account for moderators — its listings, its orders under way, its trail — and
// suspending or reinstating it. Suspending takes the account's live and held listings out of the
// market (withdrawn, each listed in the audit record's after) and ends its sign-ins (a suspended
// account's sessions count as none); orders already under way continue, watched by the desk.

const LISTED: ListingStatus[] = ["live", "held", "reserved", "draft", "withdrawn"];

export async function deskUserPage(moderator: { id: string; displayName: string }, userId: string, clock: Clock = systemClock) {
  if (!isId(userId)) deskNotFound("account");
  const user = await User.findByPk(userId);
  if (!user) deskNotFound("account");
  const subject: DeskSubject = { type: "user", id: user.id };
  const [claim, listings, orders, trail] = await Promise.all([
    claimForViewer(subject, moderator, clock),
    Listing.findAll({
      where: { sellerId: user.id, status: LISTED },
      attributes: ["id", "maker", "model", "status"],
      order: [["updatedAt", "DESC"]],
      limit: 50,
    }),
    Order.findAll<Order & { listing?: Listing | null }>({
      where: { state: { [Op.notIn]: [...FINAL_STATES] }, [Op.or]: [{ sellerId: user.id }, { buyerId: user.id }] },
      include: [{ model: Listing, as: "listing", attributes: ["maker", "model"] }],
      order: [["createdAt", "ASC"]],
      limit: 50,
    }),
    auditTrail(subject),
  ]);
  const roles = normaliseRoles(user.roles);
  return {
    account: {
      id: user.id,
      name: user.displayName,
      email: user.email,
      status: user.status,
      roles: roles.map((r) => ROLE_LABELS[r]),
      joined: user.createdAt.toISOString(),
      self: user.id === moderator.id,
    },
    listings: listings.map((l) => ({
      id: l.id,
      title: listingTitle(l.maker, l.model),
      status: LISTING_STATUS_LABELS[l.status as ListingStatus],
    })),
    orders: orders.map((o) => ({
      id: o.id,
      title: o.listing ? listingTitle(o.listing.maker, o.listing.model) : "A unit no longer listed",
      side: o.sellerId === user.id ? "selling" : "buying",
      state: ORDER_STATE_LABELS[o.state as OrderState],
    })),
    action: user.id === moderator.id ? null : user.status === "active" ? ("suspend_account" as const) : ("reinstate_account" as const),
    claim: claim.mine ? { mine: true as const } : { mine: false as const, by: claim.by, until: claim.until.toISOString() },
    claimMinutes: CLAIM_MINUTES,
    trail,
  };
}
export type DeskUserPage = Awaited<ReturnType<typeof deskUserPage>>;

const UserActionSchema = z.object({
  intent: z.enum(["suspend_account", "reinstate_account"], { message: "Choose what to do." }),
  note: z
    .string({ message: "Write a note: it goes on the trail and to the account's owner." })
    .trim()
    .min(1, "Write a note: it goes on the trail and to the account's owner.")
    .max(NOTE_MAX, `Keep the note under ${NOTE_MAX} characters.`),
});

export type UserActionErrors = Partial<Record<"note" | "intent" | "form", string>>;
export type UserActionResult =
  | { ok: true; intent: "suspend_account" | "reinstate_account"; withdrawn: number }
  | { ok: false; status: number; errors: UserActionErrors };

export async function actOnUser(
  moderator: Pick<SessionUser, "id" | "roles">,
  userId: string,
  fields: Record<string, unknown>,
  clock: Clock = systemClock,
): Promise<UserActionResult> {
  if (!isId(userId)) deskNotFound("account");
  const parsed = UserActionSchema.safeParse(fields);
  if (!parsed.success) {
    const errors: UserActionErrors = {};
    for (const issue of parsed.error.issues) errors[(issue.path[0] as keyof UserActionErrors | undefined) ?? "form"] ??= issue.message;
    return { ok: false, status: 400, errors };
  }
  const { intent, note } = parsed.data;
  try {
    const withdrawn = await sequelize.transaction(async (transaction) => {
      const user = await User.findByPk(userId, { transaction, lock: transaction.LOCK.UPDATE });
      if (!user) deskNotFound("account");
      const subject: DeskSubject = { type: "user", id: user.id };
      await requireClaim(subject, moderator.id, transaction, clock);
      if (user.id === moderator.id) throw refusal("item_state", "You cannot suspend or reinstate your own account.");
      // Only an admin may suspend someone who works the desk.
      if (intent === "suspend_account" && holdsRole(normaliseRoles(user.roles), "moderator") && !holdsRole(moderator.roles, "admin"))
        throw refusal("forbidden", "Only an admin can suspend a moderator's account.");
      const want = intent === "suspend_account" ? "active" : "suspended";
      if (user.status !== want)
        throw refusal("item_state", intent === "suspend_account" ? "This account is already suspended." : "This account is not suspended.");

      let ids: string[] = [];
      if (intent === "suspend_account") {
        const leaving = await Listing.findAll({
          where: { sellerId: user.id, status: ["live", "held"] },
          attributes: ["id", "status"],
          transaction,
          lock: transaction.LOCK.UPDATE,
        });
        ids = leaving.map((l) => l.id);
        if (ids.length) await Listing.update({ status: "withdrawn", heldReason: null }, { where: { id: ids }, transaction });
        for (const l of leaving) if (l.status === "live") await queueWatchNotice({ kind: "withdrawn", listingId: l.id }, transaction);
      }
      const before = { status: user.status };
      await user.update({ status: intent === "suspend_account" ? "suspended" : "active" }, { transaction });
      const after = intent === "suspend_account" ? { status: user.status, withdrawnListingIds: ids } : { status: user.status };
      const auditId = await recordAudit({ actorId: moderator.id, action: intent, subject, note, before, after }, transaction);
      await queueDeskMail(auditId, user.id, transaction);
      await releaseClaim(subject, transaction);
      return ids.length;
    });
    return { ok: true, intent, withdrawn };
  } catch (e) {
    if (e instanceof HttpError && e.status < 500 && e.status !== 404) return { ok: false, status: e.status, errors: { form: e.message } };
    throw e;
  }
}

/** For the desk's order page: the seller is suspended, so the order continues under watch. */
export async function sellerSuspended(sellerId: string): Promise<boolean> {
  return (await User.findByPk(sellerId, { attributes: ["status"] }))?.status === "suspended";
}
