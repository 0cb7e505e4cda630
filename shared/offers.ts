// Offers in Loadline's words (isomorphic, no zod): who made one and where it stands.

export const OFFER_STATES = ["open", "accepted", "declined", "countered", "expired", "withdrawn", "used"] as const;
export type OfferState = (typeof OFFER_STATES)[number];

export type OfferParty = "buyer" | "seller";

export const OFFER_STATE_LABELS: Record<OfferState, string> = {
  open: "Waiting for an answer",
  accepted: "Accepted",
  declined: "Declined",
  countered: "Answered with a counter-offer",
  expired: "Expired",
  withdrawn: "Withdrawn",
  used: "Bought at this price",
};

export type OfferActionName = "accept" | "decline" | "counter" | "withdraw";

/**
 * What one side may do with an offer now: the side that did not make an open offer answers it (the
 * seller may also counter; a buyer answers a counter by accepting or declining, or makes a new
 * offer after), the side that made it may withdraw it. Nothing once it is no longer open.
 */
export function offerActions(
  offer: { state: OfferState; madeBy: OfferParty; expiresAt: Date },
  side: OfferParty,
  now: Date,
): OfferActionName[] {
  if (offer.state !== "open" || offer.expiresAt.getTime() <= now.getTime()) return [];
  if (offer.madeBy === side) return ["withdraw"];
  return side === "seller" ? ["accept", "decline", "counter"] : ["accept", "decline"];
}
