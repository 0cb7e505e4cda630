import { QueryTypes } from "sequelize";
import { sequelize } from "~/db.server";

/**
 * The header's count: one count over the two partial indexes of the talk migration. The predicates
 * match theirs word for word, so the planner can use them (tests/integration/messages-unread checks
 * the plan).
 */
export const UNREAD_COUNT_SQL = `SELECT count(*) AS n FROM message_threads
  WHERE (buyer_id = $1 AND last_message_at > coalesce(buyer_read_at, '-infinity'::timestamptz))
     OR (seller_id = $1 AND last_message_at > coalesce(seller_read_at, '-infinity'::timestamptz))`;

/** How many of the user's threads hold messages they have not read. The root loader calls it only for a signed-in user. */
export async function unreadCount(userId: string): Promise<number> {
  const [row] = await sequelize.query<{ n: string }>(UNREAD_COUNT_SQL, { bind: [userId], type: QueryTypes.SELECT });
  return Number(row?.n ?? 0);
}
