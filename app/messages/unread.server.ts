import { QueryTypes } from "sequelize";
import { sequelize } from "~/db.server";

/**
 * How many of the user's threads hold messages they have not read: the header's badge. One count
 * over the two partial indexes of the talk migration (the predicates below match theirs word for
 * word, so the planner can use them); the root loader calls it only for a signed-in user.
 */
export async function unreadCount(userId: string): Promise<number> {
  const [row] = await sequelize.query<{ n: string }>(
    `SELECT count(*) AS n FROM message_threads
      WHERE (buyer_id = :userId AND last_message_at > coalesce(buyer_read_at, '-infinity'::timestamptz))
         OR (seller_id = :userId AND last_message_at > coalesce(seller_read_at, '-infinity'::timestamptz))`,
    { replacements: { userId }, type: QueryTypes.SELECT },
  );
  return Number(row?.n ?? 0);
}
