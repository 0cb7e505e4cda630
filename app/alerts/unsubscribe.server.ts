import { randomBytes } from "node:crypto";
import { QueryTypes } from "sequelize";
import { sequelize } from "~/db.server";
import { env } from "~/env.server";
import { hashToken } from "~/auth/tokens.server";

// Unsubscribe links: every notice carries a fresh random token; only its SHA-256 is stored. The link
// works without signing in (the token is the authority, so a mail client's one-click POST works too);
// opening it only shows what it would stop, and the POST stops it, so link scanners stop nothing.

export const UNSUBSCRIBE_LIFETIME_DAYS = 365;
const TOKEN_SHAPE = /^[A-Za-z0-9_-]{43}$/;

/** What a link stops: the watch notices, one spec alert's mail, or all of the buyer's spec alerts. */
export type MailList = { kind: "watch" } | { kind: "alert"; alertId: string } | { kind: "alerts" };

export async function issueUnsubscribeUrl(userId: string, list: MailList, now = new Date()): Promise<string> {
  const token = randomBytes(32).toString("base64url");
  await sequelize.query(
    `INSERT INTO unsubscribe_tokens (token_hash, user_id, list, alert_id, created_at, expires_at)
     VALUES (:hash, :userId, :list, :alertId, :now, :expires)`,
    {
      replacements: {
        hash: hashToken(token),
        userId,
        list: list.kind,
        alertId: list.kind === "alert" ? list.alertId : null,
        now,
        expires: new Date(now.getTime() + UNSUBSCRIBE_LIFETIME_DAYS * 86_400_000),
      },
    },
  );
  return new URL(`/unsubscribe/${token}`, env().appUrl).href;
}

export type UnsubscribeTarget =
  { kind: "watch"; stopped: boolean } | { kind: "alert"; alertName: string; stopped: boolean } | { kind: "alerts"; stopped: boolean };

interface TokenRow {
  user_id: string;
  list: MailList["kind"];
  alert_id: string | null;
  alert_name: string | null;
  alert_off: boolean | null;
  watch_off: boolean;
  alerts_on: number;
}

async function findToken(token: string): Promise<TokenRow | null> {
  if (!TOKEN_SHAPE.test(token)) return null;
  const [row] = await sequelize.query<TokenRow>(
    `SELECT t.user_id, t.list, t.alert_id, a.name AS alert_name, a.frequency = 'off' AS alert_off,
            u.watch_mail_stopped_at IS NOT NULL AS watch_off,
            (SELECT count(*)::int FROM spec_alerts o WHERE o.user_id = t.user_id AND o.frequency <> 'off') AS alerts_on
       FROM unsubscribe_tokens t
       JOIN users u ON u.id = t.user_id
       LEFT JOIN spec_alerts a ON a.id = t.alert_id
      WHERE t.token_hash = :hash AND t.expires_at > now()`,
    { replacements: { hash: hashToken(token) }, type: QueryTypes.SELECT },
  );
  return row ?? null;
}

function target(row: TokenRow): UnsubscribeTarget {
  switch (row.list) {
    case "watch":
      return { kind: "watch", stopped: row.watch_off };
    case "alert":
      return { kind: "alert", alertName: row.alert_name ?? "", stopped: !!row.alert_off };
    case "alerts":
      return { kind: "alerts", stopped: row.alerts_on === 0 };
  }
}

/** What a token would stop, or null for a token that is unknown, malformed or expired (a deleted alert's too). */
export async function inspectUnsubscribe(token: string): Promise<UnsubscribeTarget | null> {
  const row = await findToken(token);
  return row ? target(row) : null;
}

/** Stops what the token names; the same link used twice changes nothing more. Null: no such link. */
export async function unsubscribe(token: string): Promise<UnsubscribeTarget | null> {
  const row = await findToken(token);
  if (!row) return null;
  const replacements = { userId: row.user_id, alertId: row.alert_id };
  if (row.list === "watch")
    await sequelize.query(`UPDATE users SET watch_mail_stopped_at = now() WHERE id = :userId AND watch_mail_stopped_at IS NULL`, {
      replacements,
    });
  else
    await sequelize.query(
      `UPDATE spec_alerts SET frequency = 'off', updated_at = now()
        WHERE user_id = :userId AND frequency <> 'off' AND (CAST(:alertId AS uuid) IS NULL OR id = :alertId)`,
      { replacements },
    );
  return { ...target(row), stopped: true };
}

/** A signed-in buyer turns the watch notices back on (from /watching). */
export async function setWatchMail(userId: string, on: boolean): Promise<void> {
  await sequelize.query(
    `UPDATE users SET watch_mail_stopped_at = ${on ? "NULL" : "coalesce(watch_mail_stopped_at, now())"} WHERE id = :userId`,
    {
      replacements: { userId },
    },
  );
}

export async function watchMailOn(userId: string): Promise<boolean> {
  const [row] = await sequelize.query<{ on: boolean }>(`SELECT watch_mail_stopped_at IS NULL AS on FROM users WHERE id = :userId`, {
    replacements: { userId },
    type: QueryTypes.SELECT,
  });
  return row?.on ?? true;
}

/** Expired links are dropped by the daily digest run. */
export async function pruneUnsubscribeTokens(now = new Date()): Promise<void> {
  await sequelize.query(`DELETE FROM unsubscribe_tokens WHERE expires_at <= :now`, { replacements: { now } });
}
