import { sequelize } from "~/db.server";
import { User } from "~/models/user.server";
import { findAccountByEmail, normaliseEmail } from "~/auth/accounts.server";
import { hashPassword } from "~/auth/password.server";
import { consumeToken, issueToken, recentTokenCount, retireTokens, TOKENS_PER_HOUR } from "~/auth/tokens.server";
import { sendPasswordResetEmail } from "~/auth/emails.server";
import { queueAccountMail } from "~/auth/account-mail.server";
import { revokeAllSessions } from "~/auth/session-store.server";

/**
 * "Forgot password": one job queued for any address, with or without an account, so neither the
 * answer nor the time it takes tells a stranger which addresses have one. The worker decides.
 */
export async function requestPasswordReset(email: string): Promise<void> {
  await queueAccountMail({ kind: "password-reset", email: normaliseEmail(email) });
}

/** The worker's half: a reset link when an active account uses the address, at most three an hour; else nothing. */
export async function mailPasswordReset(email: string): Promise<void> {
  const user = await findAccountByEmail(email);
  if (!user || user.status !== "active") return;
  if ((await recentTokenCount(user.id, "reset_password")) >= TOKENS_PER_HOUR) return;
  await sequelize.transaction(async (transaction) => {
    const token = await issueToken(user.id, "reset_password", transaction);
    await sendPasswordResetEmail(user, token);
  });
}

export type ResetResult = { ok: true; user: User } | { ok: false; reason: "unknown" | "expired" | "used" | "suspended" };

/**
 * Sets a new password from a reset link. The link proves the mailbox, so the address counts as
 * verified; every open session ends (the route then starts a fresh one) and older reset links stop working.
 */
export async function resetPassword(token: string, password: string): Promise<ResetResult> {
  const passwordHash = await hashPassword(password);
  return sequelize.transaction(async (transaction): Promise<ResetResult> => {
    const state = await consumeToken(token, "reset_password", transaction);
    if (!state.ok) return state;
    const user = await User.findByPk(state.userId, { transaction, lock: transaction.LOCK.UPDATE });
    if (!user) return { ok: false, reason: "unknown" };
    await user.update(
      {
        passwordHash,
        emailVerifiedAt: user.emailVerifiedAt ?? new Date(),
        lastSignInAt: user.status === "active" ? new Date() : user.lastSignInAt,
      },
      { transaction },
    );
    await retireTokens(user.id, "reset_password", transaction);
    await revokeAllSessions(user.id, transaction);
    if (user.status !== "active") return { ok: false, reason: "suspended" };
    return { ok: true, user };
  });
}
