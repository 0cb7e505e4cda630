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

/** Hours an offer stays open when the marketplace settings say nothing. */
export const DEFAULT_OFFER_HOURS = 48;
/** Hours an accepted offer's price holds for checkout when the settings say nothing. */
export const DEFAULT_OFFER_CHECKOUT_HOURS = 24;
