import { Op, QueryTypes, type Transaction } from "sequelize";
import { isId } from "@shared/ids";
import { listingTitle } from "@shared/catalogue";
import { maskContactDetails } from "@shared/contact-mask";
import { offerActions } from "@shared/offers";
import { sequelize } from "~/db.server";
import { Listing, User } from "~/models/index.server";
import { Message } from "~/models/message.server";
import { MessageThread } from "~/models/message-thread.server";
import { Offer } from "~/models/offer.server";
import { refusal } from "~/http/errors.server";
import { threadFor } from "./access.server";
import { buyerHasPaid } from "./sale.server";
import { queueMessageMail } from "./message-mail.server";
import { systemClock, type Clock } from "~/orders/clock.server";
import type { Conversation, ConversationItem, ThreadRole, ThreadSummary } from "./types";

// Threads: one per listing and buyer, with the listing's seller. Opening one is idempotent (the
// unique pair); sending a message moves the thread's last_message_at and the sender's own read mark,
// so the header's count needs no per-message rows.

/** The buyer's thread about a listing, made on first ask. Only a unit for sale can be asked about. */
export async function openThread(buyerId: string, listingId: unknown, transaction?: Transaction): Promise<MessageThread> {
  const listing = isId(listingId) ? await Listing.findByPk(listingId, { attributes: ["id", "status", "sellerId"], transaction }) : null;
  const existing = listing ? await MessageThread.findOne({ where: { listingId: listing.id, buyerId }, transaction }) : null;
  if (existing) return existing;
  if (!listing || listing.status !== "live") throw refusal("not_found", "There is no unit for sale here to ask about.");
  if (listing.sellerId === buyerId) throw refusal("conflict", "This is your own listing.");
  await MessageThread.bulkCreate(
    [{ listingId: listing.id, buyerId, sellerId: listing.sellerId, buyerReadAt: null, sellerReadAt: null, lastMessageAt: null }],
    {
      ignoreDuplicates: true,
      transaction,
    },
  );
  const thread = await MessageThread.findOne({ where: { listingId: listing.id, buyerId }, transaction });
  if (!thread) throw new Error("the thread just made is missing");
  return thread;
}

/** The thread between a listing's buyer and its seller, if they have one (for links from an order's page). */
export async function threadIdFor(listingId: string, buyerId: string): Promise<string | null> {
  const thread = await MessageThread.findOne({ where: { listingId, buyerId }, attributes: ["id"] });
  return thread?.id ?? null;
}

const SNIPPET = 140;

/** The user's threads, those with something unread first, then the latest first. */
export async function threadList(userId: string): Promise<ThreadSummary[]> {
  const threads = await MessageThread.findAll({
    // A seller sees a thread once something is in it; a buyer sees the ones they opened too.
    where: { [Op.or]: [{ buyerId: userId }, { sellerId: userId, lastMessageAt: { [Op.ne]: null } }] },
    order: [["lastMessageAt", "DESC NULLS LAST"]],
    limit: 200,
  });
  if (threads.length === 0) return [];
  const [listings, users, lasts] = await Promise.all([
    Listing.findAll({ where: { id: threads.map((t) => t.listingId) }, attributes: ["id", "maker", "model"] }),
    User.findAll({ where: { id: threads.flatMap((t) => [t.buyerId, t.sellerId]) }, attributes: ["id", "displayName"] }),
    sequelize.query<{ thread_id: string; body: string }>(
      `SELECT DISTINCT ON (thread_id) thread_id, body FROM messages WHERE thread_id IN (:ids) ORDER BY thread_id, created_at DESC`,
      { replacements: { ids: threads.map((t) => t.id) }, type: QueryTypes.SELECT },
    ),
  ]);
  const listingById = new Map(listings.map((l) => [l.id, l]));
  const nameById = new Map(users.map((u) => [u.id, u.displayName]));
  const lastById = new Map(lasts.map((m) => [m.thread_id, m.body]));
  const summaries = threads.map((t): ThreadSummary => {
    const role: ThreadRole = t.buyerId === userId ? "buyer" : "seller";
    const listing = listingById.get(t.listingId);
    const last = lastById.get(t.id) ?? null;
    return {
      id: t.id,
      listingId: t.listingId,
      listingTitle: listingTitle(listing?.maker, listing?.model),
      role,
      otherName: nameById.get(role === "buyer" ? t.sellerId : t.buyerId) ?? "",
      lastMessageAt: t.lastMessageAt?.toISOString() ?? null,
      lastBody: last && last.length > SNIPPET ? `${last.slice(0, SNIPPET - 1)}…` : last,
      unread: isUnread(t, role),
    };
  });
  // Stable: the latest-first order stays within each group.
  return [...summaries.filter((s) => s.unread), ...summaries.filter((s) => !s.unread)];
}

function isUnread(t: MessageThread, role: ThreadRole): boolean {
  const mark = role === "buyer" ? t.buyerReadAt : t.sellerReadAt;
  return t.lastMessageAt !== null && (mark === null || t.lastMessageAt > mark);
}

/** Marks the thread read for the viewer up to `now`. */
export async function markRead(thread: MessageThread, role: ThreadRole, now: Date): Promise<void> {
  const field = role === "buyer" ? "buyerReadAt" : "sellerReadAt";
  const current = thread[field];
  if (current && current >= now) return;
  await MessageThread.update({ [field]: now }, { where: { id: thread.id } });
  thread[field] = now;
}

/** The thread as the viewer sees it (404 for anyone not in it), marked read for them. */
export async function conversation(userId: string, threadId: unknown, clock: Clock = systemClock): Promise<Conversation> {
  const now = clock.now();
  const { thread, role } = await threadFor(userId, threadId);
  const [listing, other, messages, offers, paid] = await Promise.all([
    Listing.findByPk(thread.listingId, { attributes: ["id", "maker", "model", "status", "priceMinor", "currency", "offersWelcome"] }),
    User.findByPk(role === "buyer" ? thread.sellerId : thread.buyerId, { attributes: ["id", "displayName"] }),
    Message.findAll({ where: { threadId: thread.id }, order: [["createdAt", "ASC"]], limit: 500 }),
    Offer.findAll({ where: { listingId: thread.listingId, buyerId: thread.buyerId }, order: [["createdAt", "ASC"]] }),
    buyerHasPaid(thread.listingId, thread.buyerId),
  ]);
  if (!listing) throw refusal("not_found", "There is no conversation here.");
  const otherName = other?.displayName ?? "";
  const items: ConversationItem[] = [
    ...messages.map((m): ConversationItem => ({
      kind: "message",
      id: m.id,
      at: m.createdAt.toISOString(),
      fromMe: m.senderId === userId,
      senderName: m.senderId === userId ? "You" : otherName,
      body: m.body,
      masked: m.masked,
    })),
    ...offers.map((o): ConversationItem => ({
      kind: "offer",
      id: o.id,
      at: o.createdAt.toISOString(),
      fromMe: o.madeBy === role,
      madeBy: o.madeBy,
      amountMinor: o.amountMinor,
      currency: o.currency,
      state: o.state,
      expiresAt: o.expiresAt.toISOString(),
      checkoutUntil: o.checkoutUntil?.toISOString() ?? null,
      actions: offerActions(o, role, now),
    })),
  ].sort((a, b) => a.at.localeCompare(b.at));
  const openOrAccepted = offers.some(
    (o) => (o.state === "open" && o.expiresAt > now) || (o.state === "accepted" && o.checkoutUntil && o.checkoutUntil > now),
  );
  await markRead(thread, role, now);
  return {
    thread: {
      id: thread.id,
      listingId: listing.id,
      listingTitle: listingTitle(listing.maker, listing.model),
      listingHref: `/listings/${listing.id}`,
      listingStatus: listing.status,
      priceMinor: listing.priceMinor,
      currency: listing.currency,
      role,
      otherName,
      canOffer: role === "buyer" && listing.status === "live" && listing.offersWelcome && !openOrAccepted,
      masking: !paid,
    },
    items,
  };
}

export interface SentMessage {
  id: string;
  body: string;
  masked: boolean;
  at: string;
}

/**
 * Sends a message in a thread the sender is part of. Before the buyer has paid, contact details are
 * masked in what is stored (the other side never receives them); the recipient's mail is queued to
 * go a little later, once per burst.
 */
export async function sendMessage(senderId: string, threadId: unknown, body: string, clock: Clock = systemClock): Promise<SentMessage> {
  const now = clock.now();
  return sequelize.transaction(async (transaction) => {
    const { thread, role } = await threadFor(senderId, threadId, { transaction, lock: true });
    const paid = await buyerHasPaid(thread.listingId, thread.buyerId, transaction);
    const shown = paid ? { text: body, masked: false } : maskContactDetails(body);
    const message = await Message.create(
      { threadId: thread.id, senderId, body: shown.text, masked: shown.masked, createdAt: now },
      { transaction },
    );
    await touchThread(thread, role, now, transaction);
    await queueMessageMail(thread.id, role === "buyer" ? thread.sellerId : thread.buyerId, transaction);
    return { id: message.id, body: message.body, masked: message.masked, at: now.toISOString() };
  });
}

/** Something new in the thread from `role`'s side (a message or an offer step): the other side has unread. */
export async function touchThread(thread: MessageThread, role: ThreadRole, now: Date, transaction: Transaction): Promise<void> {
  const latest = thread.lastMessageAt && thread.lastMessageAt > now ? thread.lastMessageAt : now;
  await MessageThread.update(
    { lastMessageAt: latest, ...(role === "buyer" ? { buyerReadAt: latest } : { sellerReadAt: latest }) },
    { where: { id: thread.id }, transaction },
  );
}
