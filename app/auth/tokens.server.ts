import { createHash, randomBytes } from "node:crypto";
import type { Transaction } from "sequelize";
import { Op, QueryTypes } from "sequelize";
import { sequelize } from "~/db.server";
import { AccountToken, type TokenPurpose } from "~/models/account-token.server";

// One-time links: 256 random bits in the URL, only their SHA-256 in the database, so a leaked
// table cannot be turned back into working links.
export const TOKEN_LIFETIME_MINUTES: Record<TokenPurpose, number> = {
  verify_email: 24 * 60,
  reset_password: 60,
};

// A mailbox is not flooded: at most this many links of one kind per account per hour.
export const TOKENS_PER_HOUR = 3;

export function hashToken(token: string): string {
  return createHash("sha256").update(token).digest("hex");
}

const TOKEN_SHAPE = /^[A-Za-z0-9_-]{43}$/;

export async function issueToken(userId: string, purpose: TokenPurpose, transaction?: Transaction): Promise<string> {
  const token = randomBytes(32).toString("base64url");
  await AccountToken.create(
    {
      userId,
      purpose,
      tokenHash: hashToken(token),
      expiresAt: new Date(Date.now() + TOKEN_LIFETIME_MINUTES[purpose] * 60_000),
      usedAt: null,
    },
    { transaction },
  );
  return token;
}

export async function recentTokenCount(userId: string, purpose: TokenPurpose): Promise<number> {
  return AccountToken.count({
    where: { userId, purpose, createdAt: { [Op.gt]: new Date(Date.now() - 60 * 60_000) } },
  });
}

export type TokenState = { ok: true; userId: string } | { ok: false; reason: "unknown" | "expired" | "used" };

/** Looks a token up without using it (to decide what page to show). */
export async function inspectToken(token: string, purpose: TokenPurpose): Promise<TokenState> {
  if (!TOKEN_SHAPE.test(token)) return { ok: false, reason: "unknown" };
  const row = await AccountToken.findOne({ where: { tokenHash: hashToken(token), purpose } });
  if (!row) return { ok: false, reason: "unknown" };
  if (row.usedAt) return { ok: false, reason: "used" };
  if (row.expiresAt.getTime() <= Date.now()) return { ok: false, reason: "expired" };
  return { ok: true, userId: row.userId };
}

/**
 * Uses a token: one UPDATE marks it used only if it is unused and unexpired, so two clicks racing
 * each other cannot both succeed. Pass the transaction the token's effect is written in.
 */
export async function consumeToken(token: string, purpose: TokenPurpose, transaction?: Transaction): Promise<TokenState> {
  if (!TOKEN_SHAPE.test(token)) return { ok: false, reason: "unknown" };
  const rows = await sequelize.query<{ user_id: string }>(
    `UPDATE account_tokens SET used_at = now()
      WHERE token_hash = :hash AND purpose = :purpose AND used_at IS NULL AND expires_at > now()
      RETURNING user_id`,
    { replacements: { hash: hashToken(token), purpose }, type: QueryTypes.SELECT, transaction },
  );
  if (rows[0]) return { ok: true, userId: rows[0].user_id };
  const state = await inspectToken(token, purpose);
  return state.ok ? { ok: false, reason: "used" } : state;
}

/** After a reset, older links of that kind stop working too. */
export async function retireTokens(userId: string, purpose: TokenPurpose, transaction?: Transaction) {
  await AccountToken.update({ usedAt: new Date() }, { where: { userId, purpose, usedAt: null }, transaction });
}
