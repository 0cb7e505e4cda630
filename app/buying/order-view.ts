// What the buying pages show of an order (isomorphic types; built in order-view.server.ts from the
// order, its events, ledger and contest, for one viewer).

export type OrderViewer = "buyer" | "seller" | "moderator";

export interface OrderEventView {
  id: string;
  fromState: string | null;
  toState: string;
  /** The new state in our words. */
  label: string;
  /** Who did it, from the viewer's side: "You", "The seller", "A moderator", "Loadline", "The payment provider". */
  actor: string;
  note: string | null;
  at: string;
}

export interface OrderMoneyView {
  currency: string;
  priceMinor: number;
  /** The price came from an accepted offer. */
  fromOffer: boolean;
  deliveryMinor: number;
  totalMinor: number;
  /** Fixed at release; null before. */
  feeMinor: number | null;
  refundedMinor: number;
  /** What reaches the seller: price and delivery less fee and refunds, once released. */
  sellerNetMinor: number | null;
}

export interface OrderDelivery {
  method: string;
  methodLabel: string;
  zoneLabel: string;
  carrier: string | null;
  trackingNumber: string | null;
  handlingDays: number | null;
  reservedUntil: string | null;
  shipBy: string | null;
  shippedAt: string | null;
  arrivedAt: string | null;
  auditionEndsAt: string | null;
  releasedAt: string | null;
  closedAt: string | null;
}

export interface OrderListingView {
  id: string;
  title: string;
  thumbUrl: string | null;
  heavy: boolean;
  weightG: number | null;
  weightText: string | null;
  /** Everything but passive loudspeakers plugs into the wall. */
  mainsPowered: boolean;
}

export interface OrderSummaryView {
  id: string;
  /** The first block of the id, for people to quote ("Order 3f9c2a1b"). */
  ref: string;
  state: string;
  stateLabel: string;
  listing: OrderListingView;
  counterpart: string;
  next: { text: string; owedBy: string; yours: boolean } | null;
  money: OrderMoneyView;
  createdAt: string;
  updatedAt: string;
}

export interface OrderDetailView extends OrderSummaryView {
  viewer: OrderViewer;
  buyerName: string;
  sellerName: string;
  delivery: OrderDelivery;
  events: OrderEventView[];
  threadHref: string | null;
}

export const orderRef = (id: string) => id.slice(0, 8);
