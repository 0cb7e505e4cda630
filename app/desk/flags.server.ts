import { Op, type Transaction } from "sequelize";
import { DeskFlag, User } from "~/models/index.server";
import type { FlagKind } from "~/models/desk-flag.server";

// Flags: the photo check (copied_photo, details { photoId, matchesPhotoId, distance }), the price
// check (low_price, details: the sold-price index) and people's reports (report, a reason code and a
// note) each raise one; the desk shows open ones and a moderator resolves them (dismissed, or as part
// of removing the listing).

export type { FlagKind };

export interface RaiseFlag {
  kind: FlagKind;
  listingId?: string | null;
  threadId?: string | null;
  reporterId?: string | null;
  /** A short code: a report's reason, or what the check found. */
  reason: string;
  note?: string | null;
  details?: Record<string, unknown>;
}

export async function raiseFlag(f: RaiseFlag, transaction?: Transaction): Promise<DeskFlag> {
  if (!f.listingId && !f.threadId) throw new Error("a flag needs a listing or a thread");
  return DeskFlag.create(
    {
      kind: f.kind,
      listingId: f.listingId ?? null,
      threadId: f.threadId ?? null,
      reporterId: f.reporterId ?? null,
      reason: f.reason,
      note: f.note ?? null,
      details: f.details ?? {},
      resolvedAt: null,
      resolvedBy: null,
      resolution: null,
    },
    { transaction },
  );
}

/** A listing's open flags, oldest first, with the reporter's name. */
export async function openFlags(listingId: string, transaction?: Transaction): Promise<DeskFlag[]> {
  return DeskFlag.findAll({
    where: { listingId, resolvedAt: { [Op.is]: null } },
    include: [{ model: User, as: "reporter", attributes: ["id", "displayName"] }],
    order: [
      ["createdAt", "ASC"],
      ["id", "ASC"],
    ],
    transaction,
  });
}

/**
 * Close an open flag with the moderator's resolution (a short code: `dismissed`, `listing_removed`…).
 * Returns the flag as it was, or null when it was already resolved (or never existed); the row is
 * locked so two resolutions cannot both pass.
 */
export async function resolveFlag(
  flagId: string,
  moderatorId: string,
  resolution: string,
  transaction: Transaction,
): Promise<DeskFlag | null> {
  const flag = await DeskFlag.findByPk(flagId, { transaction, lock: transaction.LOCK.UPDATE });
  if (!flag || flag.resolvedAt) return null;
  await flag.update({ resolvedAt: new Date(), resolvedBy: moderatorId, resolution }, { transaction });
  return flag;
}

/** Resolve every open flag on a listing at once (removing it settles them all); returns how many. */
export async function resolveListingFlags(
  listingId: string,
  moderatorId: string,
  resolution: string,
  transaction: Transaction,
): Promise<number> {
  const [count] = await DeskFlag.update(
    { resolvedAt: new Date(), resolvedBy: moderatorId, resolution },
    { where: { listingId, resolvedAt: { [Op.is]: null } }, transaction },
  );
  return count;
}
