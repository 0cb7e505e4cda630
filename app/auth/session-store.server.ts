import { randomBytes } from "node:crypto";
import { Op, type Transaction } from "sequelize";
import { AccountSession } from "~/models/account-session.server";
import { User } from "~/models/user.server";
import { hashToken } from "~/auth/tokens.server";
import { clientAddress } from "~/auth/rate-limit.server";

// The sessions table: a row per signed-in browser, found by the SHA-256 of the token its cookie
// carries. session.server.ts puts the token in the cookie; the guards read the row.

export const SESSION_LIFETIME_MS = 14 * 24 * 60 * 60 * 1000;
// last_seen_at is written at most this often, so a page's several requests cost no extra writes.
export const LAST_SEEN_INTERVAL_MS = 60_000;
// Ended sessions stay listed in the database this long (for support questions), then go.
const KEEP_ENDED_MS = 30 * 24 * 60 * 60 * 1000;
const USER_AGENT_MAX = 256;
const TOKEN_SHAPE = /^[A-Za-z0-9_-]{43}$/;

export type ClientInfo = { address: string | null; userAgent: string | null };

export function clientInfo(request: Request): ClientInfo {
  const agent = request.headers.get("user-agent")?.trim().slice(0, USER_AGENT_MAX);
  return { address: clientAddress(request), userAgent: agent || null };
}

/** A new session: 256 random bits for the cookie, only their hash in the row. */
export async function createSessionRecord(
  userId: string,
  client: ClientInfo,
  transaction?: Transaction,
): Promise<{ token: string; record: AccountSession }> {
  const token = randomBytes(32).toString("base64url");
  const now = Date.now();
  const record = await AccountSession.create(
    {
      userId,
      tokenHash: hashToken(token),
      address: client.address,
      userAgent: client.userAgent,
      createdAt: new Date(now),
      expiresAt: new Date(now + SESSION_LIFETIME_MS),
    },
    { transaction },
  );
  const long = new Date(now - KEEP_ENDED_MS);
  await AccountSession.destroy({
    where: { userId, [Op.or]: [{ revokedAt: { [Op.lt]: long } }, { expiresAt: { [Op.lt]: long } }] },
    transaction,
  });
  return { token, record };
}

export type LiveSession = AccountSession & { user: User };

/** The unrevoked, unexpired session with this token, with its account (whatever the account's status). */
export async function findLiveSession(token: string): Promise<LiveSession | null> {
  if (!TOKEN_SHAPE.test(token)) return null;
  const record = await AccountSession.findOne({
    where: { tokenHash: hashToken(token), revokedAt: null, expiresAt: { [Op.gt]: new Date() } },
    include: [{ model: User, as: "user", required: true }],
  });
  return record && hasUser(record) ? record : null;
}

function hasUser(record: AccountSession): record is LiveSession {
  return record.user !== undefined;
}

/** Notes that the session was used (and from where), at most once a minute. */
export async function touchSession(record: AccountSession, client: ClientInfo): Promise<void> {
  if (Date.now() - record.lastSeenAt.getTime() < LAST_SEEN_INTERVAL_MS) return;
  await AccountSession.update(
    { lastSeenAt: new Date(), address: client.address ?? record.address },
    { where: { id: record.id, revokedAt: null } },
  );
}

/** Sign-out: ends the session this token belongs to. */
export async function revokeSessionToken(token: string): Promise<void> {
  if (!TOKEN_SHAPE.test(token)) return;
  await AccountSession.update({ revokedAt: new Date() }, { where: { tokenHash: hashToken(token), revokedAt: null } });
}

/** Ends one of the account's own sessions; false when it is not theirs or already ended. */
export async function revokeOwnSession(userId: string, sessionId: string): Promise<boolean> {
  const [count] = await AccountSession.update({ revokedAt: new Date() }, { where: { id: sessionId, userId, revokedAt: null } });
  return count > 0;
}

/** "Sign out everywhere else": every open session of the account but the one given. */
export async function revokeOtherSessions(userId: string, keepSessionId: string): Promise<number> {
  const [count] = await AccountSession.update(
    { revokedAt: new Date() },
    { where: { userId, revokedAt: null, id: { [Op.ne]: keepSessionId } } },
  );
  return count;
}

/** Every session of the account ends: a password reset, a suspension, a takeover by the address's owner. */
export async function revokeAllSessions(userId: string, transaction?: Transaction): Promise<number> {
  const [count] = await AccountSession.update({ revokedAt: new Date() }, { where: { userId, revokedAt: null }, transaction });
  return count;
}

/** The account's live sessions, most recently used first. */
export function listOpenSessions(userId: string): Promise<AccountSession[]> {
  return AccountSession.findAll({
    where: { userId, revokedAt: null, expiresAt: { [Op.gt]: new Date() } },
    order: [
      ["lastSeenAt", "DESC"],
      ["createdAt", "DESC"],
    ],
  });
}
