// An order's words, for pages and mails alike (no zod, no server code). The states are Loadline's own;
// the database's CHECK constraint lists the same ones (db/migrations/20261230-0100-orders.ts).
import { momentText } from "./dates";

export const ORDER_STATES = [
  "reserved",
  "funded",
  "shipped",
  "arrived",
  "audition",
  "released",
  "contested",
  "refunded",
  "cancelled",
] as const;
export type OrderState = (typeof ORDER_STATES)[number];

export const ORDER_STATE_LABELS: Record<OrderState, string> = {
  reserved: "Reserved",
  funded: "Paid, held in escrow",
  shipped: "Shipped",
  arrived: "Arrived",
  audition: "Audition window",
  released: "Released to the seller",
  contested: "Contested",
  refunded: "Refunded",
  cancelled: "Cancelled",
};

/** States in which the order holds its unit (no other buyer can reserve it). */
export const HOLDING_STATES: readonly OrderState[] = ["reserved", "funded", "shipped", "arrived", "audition", "contested"];
/** States after which nothing more happens to the order (a refund or transfer may still be on its way). */
export const FINAL_STATES: readonly OrderState[] = ["released", "refunded", "cancelled"];

export const ACTOR_KINDS = ["buyer", "seller", "moderator", "system", "provider"] as const;
export type ActorKind = (typeof ACTOR_KINDS)[number];

export const LEDGER_KINDS = ["buyer_payment", "platform_fee", "seller_payable", "transfer", "refund"] as const;
export type LedgerKind = (typeof LEDGER_KINDS)[number];

export const LEDGER_KIND_LABELS: Record<LedgerKind, string> = {
  buyer_payment: "Buyer's payment into escrow",
  platform_fee: "Loadline's fee",
  seller_payable: "Owed to the seller",
  transfer: "Paid out to the seller",
  refund: "Refunded to the buyer",
};

/** Ledger accounts. A positive amount adds to the account's balance; each movement's amounts sum to zero. */
export const LEDGER_ACCOUNTS = ["buyer", "escrow", "platform_fees", "seller_payable", "seller_paid"] as const;
export type LedgerAccount = (typeof LEDGER_ACCOUNTS)[number];

/** The deadlines an order runs on, each a deferred 'order-deadline' job. */
export const DEADLINE_KINDS = ["reservation", "ship_by", "arrival", "audition"] as const;
export type DeadlineKind = (typeof DEADLINE_KINDS)[number];

export type OrderViewer = "buyer" | "seller" | "moderator";
export type OwedBy = "buyer" | "seller" | "moderator" | "provider" | "nobody";

/** What `nextStep` needs of an order (dates as Date or their ISO text, as loaders send them). */
export interface OrderStepView {
  state: OrderState;
  reservedUntil?: Date | string | null;
  shipBy?: Date | string | null;
  auditionEndsAt?: Date | string | null;
  refundedMinor?: number;
  transferId?: string | null;
}

function when(value: Date | string | null | undefined): string {
  return value ? ` by ${momentText(value)}` : "";
}

/** The order's next step and who owes it, worded for the one looking. */
export function nextStep(order: OrderStepView, viewer: OrderViewer): { text: string; owedBy: OwedBy } {
  const mine = (who: OwedBy) => who === viewer;
  switch (order.state) {
    case "reserved":
      return {
        owedBy: "buyer",
        text: mine("buyer")
          ? `Pay${when(order.reservedUntil)} to keep the unit; after that it returns to the market.`
          : `Waiting for the buyer to pay${when(order.reservedUntil)}.`,
      };
    case "funded":
      return {
        owedBy: "seller",
        text: mine("seller")
          ? `Ship the unit and enter the carrier and tracking number${when(order.shipBy)}, or the order is cancelled and the buyer refunded.`
          : `Waiting for the seller to ship${when(order.shipBy)}. The payment is held until you have auditioned the unit.`,
      };
    case "shipped":
      return {
        owedBy: "buyer",
        text: mine("buyer")
          ? "Confirm arrival when the unit reaches you; that opens your audition window."
          : "On its way. Waiting for the buyer to confirm arrival.",
      };
    case "arrived":
    case "audition":
      return {
        owedBy: "buyer",
        text: mine("buyer")
          ? `Audition the unit: accept it, or contest with your reasons and readings${when(order.auditionEndsAt)}. With no action the payment is released to the seller.`
          : `The buyer is auditioning the unit${when(order.auditionEndsAt)}; with no contest the payment is then released.`,
      };
    case "contested":
      return {
        owedBy: "moderator",
        text: mine("moderator")
          ? "Weigh both sides' evidence and release the payment or refund it in whole or part, with a note."
          : "A moderator is looking at the contest; both sides hear the decision by e-mail.",
      };
    case "released":
      return order.transferId
        ? { owedBy: "nobody", text: "Complete: the seller has been paid." }
        : { owedBy: "provider", text: "The payment is on its way to the seller's payout account." };
    case "refunded":
      return { owedBy: "nobody", text: "Closed with a refund to the buyer." };
    case "cancelled":
      return { owedBy: "nobody", text: (order.refundedMinor ?? 0) > 0 ? "Cancelled; the buyer was refunded." : "Cancelled." };
  }
}
