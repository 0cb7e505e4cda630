import { Op, type Transaction } from "sequelize";
import { isId } from "@shared/ids";
import { MessageThread } from "~/models/message-thread.server";
import { refusal } from "~/http/errors.server";
import type { ThreadRole } from "./types";

// A thread is its buyer's and its seller's: anyone else, a missing thread and a malformed id all get
// the same 404.

export interface ThreadAccess {
  thread: MessageThread;
  role: ThreadRole;
}

export async function threadFor(
  userId: string,
  threadId: unknown,
  options: { transaction?: Transaction; lock?: boolean } = {},
): Promise<ThreadAccess> {
  const thread = isId(threadId)
    ? await MessageThread.findOne({
        where: { id: threadId, [Op.or]: [{ buyerId: userId }, { sellerId: userId }] },
        transaction: options.transaction,
        ...(options.lock && options.transaction ? { lock: options.transaction.LOCK.UPDATE } : {}),
      })
    : null;
  if (!thread) throw refusal("not_found", "There is no conversation here.");
  return { thread, role: thread.buyerId === userId ? "buyer" : "seller" };
}
