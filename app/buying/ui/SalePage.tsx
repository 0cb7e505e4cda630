import type { OrderDetailView } from "../order-view";
import { DeliveryPanel } from "./DeliveryPanel";
import { ActionCard, ShipForm, type OrderActionData } from "./OrderActions";
import { MoneyPanel, NextStep, OrderHead, Timeline, When } from "./OrderParts";
import { ReviewLinkCard } from "~/reputation/ui/ReviewLinkCard";

// The seller's order page: the ship form while it is theirs to ship, otherwise what the buyer is
// doing and when the money comes; the timeline; money (fee and payout) and delivery at the side.

export function SalePage({ order, result }: { order: OrderDetailView; result: OrderActionData | null }) {
  return (
    <main className="mx-auto w-full max-w-6xl space-y-6 px-4 pb-16 pt-6 sm:px-6">
      <OrderHead order={order} backTo={{ href: "/sales", label: "Sales" }} />
      <div className="grid gap-8 lg:grid-cols-[minmax(0,1fr)_22rem]">
        <div className="min-w-0 space-y-6">
          <NextStep next={order.next} />
          {order.state === "funded" ? <ShipForm order={order} result={result} /> : null}
          {(order.state === "audition" || order.state === "arrived") && order.delivery.auditionEndsAt ? (
            <ActionCard title="The buyer's audition window" id="audition-heading">
              <p className="text-sm text-ink-soft">
                The buyer can listen, re-measure and accept or contest until{" "}
                <When iso={order.delivery.auditionEndsAt} className="font-medium text-ink" />. With no contest, the money is released to
                your payout account then.
              </p>
            </ActionCard>
          ) : null}
          {order.state === "contested" ? (
            <ActionCard title="Contested" id="contested-heading">
              <p className="text-sm text-ink-soft">
                The buyer has contested the unit. The money stays held while a moderator weighs the buyer's evidence against your listing
                and bench sheet; you hear the decision by e-mail. You can answer the buyer through your messages.
              </p>
            </ActionCard>
          ) : null}
          {order.delivery.releasedAt ? <ReviewLinkCard orderId={order.id} side="seller" /> : null}
          <Timeline events={order.events} />
        </div>
        <aside className="space-y-5" aria-label="Money and delivery">
          <MoneyPanel money={order.money} viewer="seller" state={order.state} />
          <DeliveryPanel order={order} />
        </aside>
      </div>
    </main>
  );
}
