import { Op, type Transaction } from "sequelize";
import { z } from "zod";
import { listingTitle } from "@shared/catalogue";
import { idSchema } from "@shared/ids";
import { sequelize } from "~/db.server";
import { Listing, User } from "~/models/index.server";
import { Message } from "~/models/message.server";
import { MessageThread } from "~/models/message-thread.server";
import { enqueueOnce, QUEUES } from "~/services/jobs.server";
import { sendTalkMail } from "./talk-mail.server";

// One e-mail per burst of messages: the first message queues a 'message-mail' job a few minutes
// ahead, keyed by thread and recipient; while it waits, later messages queue nothing (the queue is
// 'short'). When it runs it sends what the recipient has neither read nor been mailed yet, and
// records how far it mailed, so a retried or doubled job sends nothing twice.

export const MESSAGE_MAIL_DELAY_SECONDS = 5 * 60;

export const MessageMailJobSchema = z.object({ threadId: idSchema("thread"), recipientId: idSchema("user") });
export type MessageMailJob = z.infer<typeof MessageMailJobSchema>;

export async function queueMessageMail(threadId: string, recipientId: string, transaction: Transaction): Promise<void> {
  await enqueueOnce(QUEUES.messageMail, { threadId, recipientId } satisfies MessageMailJob, {
    transaction,
    singletonKey: `thread:${threadId}:${recipientId}`,
    startAfter: MESSAGE_MAIL_DELAY_SECONDS,
  });
}

/** The job: mail the recipient the messages they have not read and were not mailed. Returns how many. */
export async function deliverMessageMail(data: unknown): Promise<number> {
  const job = MessageMailJobSchema.parse(data);
  return sequelize.transaction(async (transaction) => {
    const thread = await MessageThread.findByPk(job.threadId, { transaction, lock: transaction.LOCK.UPDATE });
    if (!thread || (thread.buyerId !== job.recipientId && thread.sellerId !== job.recipientId)) return 0;
    const side = thread.buyerId === job.recipientId ? "buyer" : "seller";
    const marks = side === "buyer" ? [thread.buyerReadAt, thread.buyerMailedAt] : [thread.sellerReadAt, thread.sellerMailedAt];
    const since = marks.reduce<Date | null>((a, b) => (b && (!a || b > a) ? b : a), null);
    const waiting = await Message.findAll({
      where: { threadId: thread.id, senderId: { [Op.ne]: job.recipientId }, ...(since ? { createdAt: { [Op.gt]: since } } : {}) },
      order: [["createdAt", "ASC"]],
      limit: 20,
      transaction,
    });
    if (waiting.length === 0) return 0;
    const [recipient, sender, listing] = await Promise.all([
      User.findByPk(job.recipientId, { attributes: ["email", "displayName", "status"], transaction }),
      User.findByPk(side === "buyer" ? thread.sellerId : thread.buyerId, { attributes: ["displayName"], transaction }),
      Listing.findByPk(thread.listingId, { attributes: ["maker", "model"], transaction }),
    ]);
    if (!recipient || recipient.status !== "active") return 0;
    const last = waiting[waiting.length - 1].createdAt;
    await MessageThread.update(side === "buyer" ? { buyerMailedAt: last } : { sellerMailedAt: last }, {
      where: { id: thread.id },
      transaction,
    });
    const title = listingTitle(listing?.maker, listing?.model);
    const who = sender?.displayName ?? "The other side";
    // Sent inside the transaction: a failed send rolls the mark back and the job's retry tries again.
    await sendTalkMail({
      to: recipient.email,
      subject: waiting.length === 1 ? `A message about the ${title}` : `${waiting.length} messages about the ${title}`,
      greeting: `Hello ${recipient.displayName},`,
      paragraphs: [`${who} wrote to you about the ${title}.`],
      quotes: waiting.map((m) => ({ who, text: m.body })),
      link: { label: "Answer on Loadline", path: `/messages/${thread.id}` },
    });
    return waiting.length;
  });
}
