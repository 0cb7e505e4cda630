import { Link } from "react-router";
import { Badge, type Tone } from "~/components/Badge";
import { Card } from "~/components/Card";
import { Price } from "~/components/Price";
import { cx } from "~/components/cx";
import { momentText } from "@shared/dates";
import type { OrderDetailView, OrderEventView, OrderMoneyView, OrderSummaryView, OrderViewer } from "../order-view";
import { Minus, Money } from "./Money";

// Pieces every order page shares: the state badge, the next step and who owes it, the money, the
// timeline, and the list row of /purchases and /sales.

const STATE_TONES: Record<string, Tone> = {
  reserved: "neutral",
  funded: "walnut",
  shipped: "walnut",
  arrived: "walnut",
  audition: "brass",
  released: "trace",
  contested: "fault",
  refunded: "neutral",
  cancelled: "neutral",
};

export function StateBadge({ state, label }: { state: string; label: string }) {
  return (
    <Badge tone={STATE_TONES[state] ?? "neutral"} className="font-semibold">
      <span data-testid="order-state" data-state={state}>
        {label}
      </span>
    </Badge>
  );
}

/** States in which the buyer's money has not (or never) reached escrow. */
const UNPAID_STATES: readonly string[] = ["reserved", "cancelled"];

/** "2 Dec 2026, 14:05 UTC" in the figures face, with a machine-readable datetime. */
export function When({ iso, className }: { iso: string; className?: string }) {
  return (
    <time dateTime={iso} className={cx("figures whitespace-nowrap", className)}>
      {momentText(iso)}
    </time>
  );
}

export function NextStep({ next }: { next: OrderSummaryView["next"] }) {
  if (!next) return null;
  return (
    <section
      aria-labelledby="next-step"
      className={cx(
        "space-y-1 rounded-panel border px-4 py-3 sm:px-5",
        next.yours ? "border-walnut/40 bg-walnut-wash" : "border-rule-strong bg-card",
      )}
    >
      <h2 id="next-step" className="font-sans text-xs font-semibold uppercase tracking-[0.14em] text-brass-ink">
        Next step · {next.yours ? "yours" : next.owedBy}
      </h2>
      <p className="text-[0.9375rem] text-ink" data-testid="next-step">
        {next.text}
      </p>
    </section>
  );
}

export function MoneyPanel({ money, viewer, state }: { money: OrderMoneyView; viewer: OrderViewer; state: string }) {
  // Before the provider has confirmed the payment nothing has been paid: the total is what is owed.
  const paid = !UNPAID_STATES.includes(state);
  const c = money.currency;
  const row = "flex items-baseline justify-between gap-4 py-1.5";
  return (
    <Card className="space-y-2" aria-labelledby="money-heading">
      <h2 id="money-heading" className="text-lg">
        Money
      </h2>
      <dl className="divide-y divide-rule/70 text-sm">
        <div className={row}>
          <dt className="text-ink-soft">{money.fromOffer ? "Price (accepted offer)" : "Price"}</dt>
          <dd>
            <Money minor={money.priceMinor} currency={c} />
          </dd>
        </div>
        <div className={row}>
          <dt className="text-ink-soft">Delivery</dt>
          <dd>
            <Money minor={money.deliveryMinor} currency={c} free="no charge" />
          </dd>
        </div>
        <div className={cx(row, "font-semibold")}>
          <dt>{paid ? (viewer === "buyer" ? "You paid" : "Buyer paid") : viewer === "buyer" ? "To pay" : "Buyer to pay"}</dt>
          <dd className="text-right">
            <Price minor={money.totalMinor} currency={c} layout="stacked" />
          </dd>
        </div>
        {money.refundedMinor > 0 ? (
          <div className={row}>
            <dt className="text-ink-soft">{viewer === "buyer" ? "Refunded to you" : "Refunded to the buyer"}</dt>
            <dd>
              <Minus minor={money.refundedMinor} currency={c} />
            </dd>
          </div>
        ) : null}
        {viewer !== "buyer" ? (
          <div className={row}>
            <dt className="text-ink-soft">Platform fee</dt>
            <dd>
              {money.feeMinor === null ? (
                <span className="text-ink-faint">fixed at release</span>
              ) : (
                <Minus minor={money.feeMinor} currency={c} />
              )}
            </dd>
          </div>
        ) : null}
        {viewer !== "buyer" && money.sellerNetMinor !== null ? (
          <div className={cx(row, "font-semibold")}>
            <dt>{viewer === "seller" ? "Paid out to you" : "Paid out to the seller"}</dt>
            <dd>
              <Money minor={money.sellerNetMinor} currency={c} />
            </dd>
          </div>
        ) : null}
      </dl>
      <p className="text-xs text-ink-faint">
        {viewer === "buyer"
          ? "The payment provider holds your money until you accept the unit or your audition window closes."
          : "The buyer's money is held by the payment provider until the audition window closes or the buyer accepts."}
      </p>
    </Card>
  );
}

export function Timeline({ events }: { events: OrderEventView[] }) {
  return (
    <section aria-labelledby="timeline-heading" className="space-y-3">
      <h2 id="timeline-heading" className="text-lg">
        Timeline
      </h2>
      <ol className="relative space-y-4 border-l border-rule-strong pl-5" data-testid="timeline">
        {events.map((e) => (
          <li key={e.id} className="relative">
            <span aria-hidden="true" className="absolute -left-[1.6rem] top-1.5 size-2.5 rounded-full border-2 border-paper bg-walnut" />
            <p className="text-sm">
              <span className="font-semibold text-ink">{e.label}</span> <span className="text-ink-soft">· {e.actor}</span>
            </p>
            <p className="text-xs text-ink-faint">
              <When iso={e.at} />
            </p>
            {e.note ? <p className="mt-1 whitespace-pre-line text-sm text-ink-soft">{e.note}</p> : null}
          </li>
        ))}
      </ol>
    </section>
  );
}

/** One order in /purchases or /sales. */
export function OrderRow({ order, base }: { order: OrderSummaryView; base: "/purchases" | "/sales" }) {
  return (
    <li>
      <Link
        to={`${base}/${order.id}`}
        className="flex gap-3 rounded-panel border border-rule bg-card p-3 no-underline shadow-panel hover:border-walnut/50 sm:gap-4 sm:p-4"
      >
        {order.listing.thumbUrl ? (
          <img
            src={order.listing.thumbUrl}
            alt=""
            width={80}
            height={60}
            className="h-15 w-20 shrink-0 rounded-md border border-rule object-cover"
          />
        ) : (
          <span aria-hidden="true" className="h-15 w-20 shrink-0 rounded-md border border-rule bg-sunk" />
        )}
        <span className="min-w-0 flex-1 space-y-1">
          <span className="flex flex-wrap items-center gap-x-2 gap-y-1">
            <span className="font-serif text-lg font-semibold leading-snug text-ink">{order.listing.title}</span>
            <StateBadge state={order.state} label={order.stateLabel} />
          </span>
          <span className="block text-sm text-ink-soft">
            {base === "/purchases" ? "From" : "To"} {order.counterpart} ·{" "}
            <Money minor={order.money.totalMinor} currency={order.money.currency} />
          </span>
          {order.next ? (
            <span className={cx("block text-sm", order.next.yours ? "font-medium text-walnut-deep" : "text-ink-faint")}>
              {order.next.yours ? "Your move: " : `Waiting for ${order.next.owedBy}: `}
              {order.next.text}
            </span>
          ) : null}
        </span>
      </Link>
    </li>
  );
}

/** The top of an order page: the unit, the state and the other side. */
export function OrderHead({ order, backTo }: { order: OrderDetailView; backTo: { href: string; label: string } }) {
  return (
    <header className="space-y-4 border-b border-rule pb-6">
      <nav aria-label="Breadcrumb" className="text-sm text-ink-faint">
        <Link to={backTo.href} className="no-underline hover:text-walnut">
          {backTo.label}
        </Link>
        <span aria-hidden="true"> / </span>
        <span className="figures">Order {order.ref}</span>
      </nav>
      <div className="flex gap-4">
        {order.listing.thumbUrl ? (
          <img
            src={order.listing.thumbUrl}
            alt=""
            width={112}
            height={84}
            className="h-21 w-28 shrink-0 rounded-md border border-rule object-cover max-sm:hidden"
          />
        ) : null}
        <div className="min-w-0 space-y-2">
          <h1 className="text-[1.75rem] leading-tight sm:text-[2.25rem]">
            <Link to={`/listings/${order.listing.id}`} className="no-underline hover:text-walnut-deep">
              {order.listing.title}
            </Link>
          </h1>
          <p className="flex flex-wrap items-center gap-2 text-sm text-ink-soft">
            <StateBadge state={order.state} label={order.stateLabel} />
            <span>
              {order.viewer === "buyer"
                ? `Bought from ${order.sellerName}`
                : order.viewer === "seller"
                  ? `Sold to ${order.buyerName}`
                  : `${order.buyerName} bought from ${order.sellerName}`}
            </span>
          </p>
        </div>
      </div>
    </header>
  );
}
