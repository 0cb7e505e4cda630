import { Message } from "~/models/message.server";
import { MessageThread } from "~/models/message-thread.server";
import { Offer } from "~/models/offer.server";
import type { OfferState } from "@shared/offers";

// The buyer–seller conversation about a contested order's unit, read-only for the desk: messages as
// they were stored (masked where they were masked), and the offers between the two. Reading it marks
// nothing read for either side.

export type DeskThreadItem =
  | { kind: "message"; id: string; at: string; from: "buyer" | "seller"; body: string; masked: boolean }
  | { kind: "offer"; id: string; at: string; from: "buyer" | "seller"; amountMinor: number; currency: string; state: OfferState };

export interface DeskThread {
  id: string;
  items: DeskThreadItem[];
}

export async function deskThread(listingId: string, buyerId: string): Promise<DeskThread | null> {
  const thread = await MessageThread.findOne({ where: { listingId, buyerId } });
  if (!thread) return null;
  const [messages, offers] = await Promise.all([
    Message.findAll({ where: { threadId: thread.id }, order: [["createdAt", "ASC"]], limit: 500 }),
    Offer.findAll({ where: { listingId, buyerId }, order: [["createdAt", "ASC"]] }),
  ]);
  const items: DeskThreadItem[] = [
    ...messages.map((m): DeskThreadItem => ({
      kind: "message",
      id: m.id,
      at: m.createdAt.toISOString(),
      from: m.senderId === buyerId ? "buyer" : "seller",
      body: m.body,
      masked: m.masked,
    })),
    ...offers.map((o): DeskThreadItem => ({
      kind: "offer",
      id: o.id,
      at: o.createdAt.toISOString(),
      from: o.madeBy,
      amountMinor: o.amountMinor,
      currency: o.currency,
      state: o.state,
    })),
  ].sort((a, b) => a.at.localeCompare(b.at));
  return { id: thread.id, items };
}
