import type { OfferParty, OfferState } from "@shared/offers";

// What the messages pages and the threads API send to the browser (isomorphic: no server imports).

export type ThreadRole = "buyer" | "seller";

export interface ThreadSummary {
  id: string;
  listingId: string;
  listingTitle: string;
  role: ThreadRole;
  otherName: string;
  lastMessageAt: string | null;
  /** The latest message as the viewer may see it (masked when it was), cut short. */
  lastBody: string | null;
  unread: boolean;
}

export type OfferAction = "accept" | "decline" | "counter" | "withdraw";

export interface MessageItem {
  kind: "message";
  id: string;
  at: string;
  fromMe: boolean;
  senderName: string;
  body: string;
  masked: boolean;
}

export interface OfferItem {
  kind: "offer";
  id: string;
  at: string;
  fromMe: boolean;
  madeBy: OfferParty;
  amountMinor: number;
  currency: string;
  state: OfferState;
  expiresAt: string;
  checkoutUntil: string | null;
  /** What the viewer may do with it now. */
  actions: OfferAction[];
}

export type ConversationItem = MessageItem | OfferItem;

export interface ThreadHead {
  id: string;
  listingId: string;
  listingTitle: string;
  listingHref: string;
  listingStatus: string;
  priceMinor: number | null;
  currency: string;
  role: ThreadRole;
  otherName: string;
  /** Whether the viewer (the buyer) may make an offer here now. */
  canOffer: boolean;
  /** Whether messages sent now are masked (no funded order yet). */
  masking: boolean;
}

export interface Conversation {
  thread: ThreadHead;
  items: ConversationItem[];
}
