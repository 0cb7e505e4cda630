import { Op, type WhereOptions } from "sequelize";
import { sequelize } from "~/db.server";
import { User, type AccountStatus } from "~/models/user.server";
import { normaliseRoles, type Role } from "~/auth/roles";
import type { SessionUser } from "~/auth/guards.server";
import { revokeAllSessions } from "~/auth/session-store.server";

// Admin work on accounts. Callers have already passed requireRole(request, "admin").

export const ACCOUNTS_PER_PAGE = 50;

export interface AccountRow {
  id: string;
  email: string;
  displayName: string;
  roles: Role[];
  status: AccountStatus;
  emailVerified: boolean;
  createdAt: string;
  lastSignInAt: string | null;
}

export async function listAccounts({ query, page }: { query?: string; page: number }) {
  const q = query?.trim();
  const like = q ? `%${q.replace(/[\\%_]/g, (c) => `\\${c}`)}%` : null;
  const where: WhereOptions<User> = like ? { [Op.or]: [{ email: { [Op.iLike]: like } }, { displayName: { [Op.iLike]: like } }] } : {};
  const { rows, count } = await User.findAndCountAll({
    where,
    order: [
      ["createdAt", "DESC"],
      ["id", "ASC"],
    ],
    limit: ACCOUNTS_PER_PAGE,
    offset: (page - 1) * ACCOUNTS_PER_PAGE,
  });
  return {
    accounts: rows.map((u): AccountRow => ({
      id: u.id,
      email: u.email,
      displayName: u.displayName,
      roles: normaliseRoles(u.roles),
      status: u.status,
      emailVerified: u.emailVerifiedAt !== null,
      createdAt: u.createdAt.toISOString(),
      lastSignInAt: u.lastSignInAt?.toISOString() ?? null,
    })),
    total: count,
    pageCount: Math.max(1, Math.ceil(count / ACCOUNTS_PER_PAGE)),
  };
}

export type AdminResult = { ok: true; message: string } | { ok: false; message: string };

export async function setAccountRoles(actor: SessionUser, userId: string, roles: readonly Role[]): Promise<AdminResult> {
  const next = normaliseRoles(roles);
  if (userId === actor.id && !next.includes("admin")) {
    return { ok: false, message: "You cannot remove your own admin role. Ask another admin to do it." };
  }
  return sequelize.transaction(async (transaction) => {
    const user = await User.findByPk(userId, { transaction, lock: transaction.LOCK.UPDATE });
    if (!user) return { ok: false, message: "That account no longer exists." };
    await user.update({ roles: next }, { transaction });
    return { ok: true, message: `Roles of ${user.displayName} saved.` };
  });
}

/** Suspending ends the account's sessions at once (all revoked) and blocks sign-in. */
export async function setAccountStatus(actor: SessionUser, userId: string, status: AccountStatus): Promise<AdminResult> {
  if (userId === actor.id && status !== "active") return { ok: false, message: "You cannot suspend your own account." };
  return sequelize.transaction(async (transaction) => {
    const user = await User.findByPk(userId, { transaction, lock: transaction.LOCK.UPDATE });
    if (!user) return { ok: false, message: "That account no longer exists." };
    if (user.status === status) return { ok: true, message: `${user.displayName} is already ${status}.` };
    await user.update({ status }, { transaction });
    if (status !== "active") await revokeAllSessions(user.id, transaction);
    return {
      ok: true,
      message:
        status === "suspended" ? `${user.displayName} is suspended and signed out everywhere.` : `${user.displayName} is active again.`,
    };
  });
}
