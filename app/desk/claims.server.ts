import { QueryTypes, type Transaction } from "sequelize";
import { sequelize } from "~/db.server";
import { refusal } from "~/http/errors.server";
import { systemClock, type Clock } from "~/orders/clock.server";
import type { DeskSubject } from "./audit.server";
import { timeOfDayText } from "@shared/dates";

// Claims keep two moderators from acting on one item: opening an item's page takes it for
// CLAIM_MINUTES (or renews one's own claim); an action takes the claim again inside its own
// transaction with one INSERT … ON CONFLICT DO UPDATE … WHERE, which locks the claim's row, so of two
// moderators racing only one gets a row back. A claim left alone lapses and anyone may take it.

export const CLAIM_MINUTES = 15;
const CLAIM_MS = CLAIM_MINUTES * 60_000;

export type ClaimView = { mine: true } | { mine: false; by: string; until: Date };

interface ClaimRow {
  moderator_id: string;
}

/** Take (or renew) the claim unless someone else holds an unexpired one; the row comes back only when taken. */
async function take(subject: DeskSubject, moderatorId: string, now: Date, transaction?: Transaction): Promise<boolean> {
  const rows = await sequelize.query<ClaimRow>(
    `INSERT INTO desk_claims (subject_type, subject_id, moderator_id, claimed_at, expires_at)
     VALUES (:type, :id, :moderatorId, :now, :until)
     ON CONFLICT (subject_type, subject_id) DO UPDATE
       SET moderator_id = EXCLUDED.moderator_id, claimed_at = EXCLUDED.claimed_at, expires_at = EXCLUDED.expires_at
       WHERE desk_claims.moderator_id = EXCLUDED.moderator_id OR desk_claims.expires_at <= EXCLUDED.claimed_at
     RETURNING moderator_id`,
    {
      replacements: { type: subject.type, id: subject.id, moderatorId, now, until: new Date(now.getTime() + CLAIM_MS) },
      type: QueryTypes.SELECT,
      transaction,
    },
  );
  return rows.length === 1;
}

/** Who holds the item now (another moderator's unexpired claim), or null. */
export async function claimHolder(
  subject: DeskSubject,
  clock: Clock = systemClock,
  transaction?: Transaction,
): Promise<{ moderatorId: string; by: string; until: Date } | null> {
  const [row] = await sequelize.query<{ moderator_id: string; display_name: string; expires_at: Date }>(
    `SELECT c.moderator_id, u.display_name, c.expires_at FROM desk_claims c JOIN users u ON u.id = c.moderator_id
     WHERE c.subject_type = :type AND c.subject_id = :id AND c.expires_at > :now`,
    { replacements: { type: subject.type, id: subject.id, now: clock.now() }, type: QueryTypes.SELECT, transaction },
  );
  return row ? { moderatorId: row.moderator_id, by: row.display_name, until: new Date(row.expires_at) } : null;
}

/** Opening an item's page: claim it when free, lapsed or already ours; otherwise say who has it. */
export async function claimForViewer(
  subject: DeskSubject,
  moderator: { id: string; displayName: string },
  clock: Clock = systemClock,
): Promise<ClaimView> {
  const now = clock.now();
  if (await take(subject, moderator.id, now)) return { mine: true };
  const holder = await claimHolder(subject, clock);
  // Lapsed between the two statements: try once more rather than show a stale holder.
  if (!holder) return (await take(subject, moderator.id, now)) ? { mine: true } : { mine: false, by: "another moderator", until: now };
  return holder.moderatorId === moderator.id ? { mine: true } : { mine: false, by: holder.by, until: holder.until };
}

/**
 * Inside an action's transaction: hold the item (taking it when free or lapsed) or refuse with
 * 409 `item_taken` naming who has it. The claim's row stays locked until the transaction ends.
 */
export async function requireClaim(
  subject: DeskSubject,
  moderatorId: string,
  transaction: Transaction,
  clock: Clock = systemClock,
): Promise<void> {
  if (await take(subject, moderatorId, clock.now(), transaction)) return;
  const holder = await claimHolder(subject, clock, transaction);
  const who = holder ? `${holder.by} until ${timeOfDayText(holder.until)}` : "another moderator";
  throw refusal("item_taken", `Taken by ${who}: only they can act on it for now.`);
}

/** After a successful action the item is done with; the next one to open it starts afresh. */
export async function releaseClaim(subject: DeskSubject, transaction: Transaction): Promise<void> {
  await sequelize.query(`DELETE FROM desk_claims WHERE subject_type = :type AND subject_id = :id`, {
    replacements: { type: subject.type, id: subject.id },
    transaction,
  });
}
