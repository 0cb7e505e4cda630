import type { ReactNode } from "react";
import { Link } from "react-router";
import type { OrderDetailView } from "../order-view";
import { DeliveryPanel } from "./DeliveryPanel";
import { ActionCard, IntentButton, type OrderActionData } from "./OrderActions";
import { MoneyPanel, NextStep, OrderHead, Timeline, When } from "./OrderParts";
import { HeavyUnit } from "~/components/cautions/HeavyUnit";
import { ReviewLinkCard } from "~/reputation/ui/ReviewLinkCard";
import type { ContestPhotoLink } from "~/orders/contest-photo-links.server";
import { ContestPhotos } from "./DeskEvidence";

// The buyer's order page: the next step first, the one form that step takes, then the timeline;
// money and delivery at the side (below on a phone).

export function PurchasePage({
  order,
  paid,
  result,
  audition,
  contestPhotos = [],
}: {
  order: OrderDetailView;
  paid: boolean;
  result: OrderActionData | null;
  /** The audition window's panel (cautions, readings, accept, contest), given by the route. */
  audition?: ReactNode;
  /** While contested: the buyer's own photos, through links made for them. */
  contestPhotos?: ContestPhotoLink[];
}) {
  return (
    <main className="mx-auto w-full max-w-6xl space-y-6 px-4 pb-16 pt-6 sm:px-6">
      <OrderHead order={order} backTo={{ href: "/purchases", label: "Purchases" }} />
      {order.state === "reserved" && paid ? <WaitingForProvider /> : null}
      <div className="grid gap-8 lg:grid-cols-[minmax(0,1fr)_22rem]">
        <div className="min-w-0 space-y-6">
          <NextStep next={order.next} />
          <BuyerStep order={order} paid={paid} result={result} audition={audition} />
          {order.state === "contested" ? (
            <ActionCard title="Contested" id="contested-heading">
              <p className="text-sm text-ink-soft">
                You have contested the unit. Your money stays held while a moderator weighs your evidence against the listing and its bench
                sheet; you hear the decision by e-mail. You can still write to the seller through your messages.
              </p>
              <ContestPhotos photos={contestPhotos} whose="Your" />
            </ActionCard>
          ) : null}
          {order.delivery.releasedAt ? <ReviewLinkCard orderId={order.id} side="buyer" /> : null}
          <Timeline events={order.events} />
        </div>
        <aside className="space-y-5" aria-label="Money and delivery">
          <MoneyPanel money={order.money} viewer="buyer" state={order.state} />
          <DeliveryPanel order={order} />
        </aside>
      </div>
    </main>
  );
}

function WaitingForProvider() {
  return (
    <div
      role="status"
      className="flex items-start gap-3 rounded-panel border border-brass/45 bg-brass-wash px-4 py-3 text-sm text-ink"
      data-testid="waiting-for-provider"
    >
      <svg aria-hidden="true" viewBox="0 0 16 16" className="mt-0.5 size-4 shrink-0 animate-spin text-brass-ink">
        <circle cx="8" cy="8" r="6" fill="none" stroke="currentColor" strokeOpacity="0.3" strokeWidth="2" />
        <path d="M14 8a6 6 0 0 0-6-6" fill="none" stroke="currentColor" strokeWidth="2" strokeLinecap="round" />
      </svg>
      <div className="space-y-1">
        <p className="font-semibold">Waiting for the payment provider</p>
        <p>
          The order counts as paid once the payment provider confirms it to Loadline, usually within seconds. This page looks again by
          itself; you can also{" "}
          <Link to="?paid=1" className="font-medium text-walnut underline underline-offset-2">
            check now
          </Link>
          .
        </p>
      </div>
    </div>
  );
}

function BuyerStep({
  order,
  paid,
  result,
  audition,
}: {
  order: OrderDetailView;
  paid: boolean;
  result: OrderActionData | null;
  audition?: ReactNode;
}) {
  switch (order.state) {
    case "reserved":
      return (
        <ActionCard title={paid ? "Payment sent" : "Pay for it"} id="pay-heading">
          <p className="text-sm text-ink-soft">
            {order.delivery.reservedUntil ? (
              <>
                The unit is held for you until <When iso={order.delivery.reservedUntil} className="font-medium text-ink" />. If it is not
                paid by then, it returns to the market.
              </>
            ) : (
              "The unit is held for you for a short while."
            )}
          </p>
          <IntentButton
            intent="pay"
            label={paid ? "Back to the payment page" : "Go to payment"}
            result={result}
            variant={paid ? "secondary" : "primary"}
          />
        </ActionCard>
      );
    case "funded":
      return (
        <ActionCard title="Paid, held in escrow" id="funded-heading">
          <p className="text-sm text-ink-soft">
            Your payment is held. The seller packs and ships the unit
            {order.delivery.shipBy ? (
              <>
                {" "}
                by <When iso={order.delivery.shipBy} className="font-medium text-ink" />
              </>
            ) : null}
            ; if they do not, the order is cancelled and you are refunded in full.
          </p>
        </ActionCard>
      );
    case "shipped":
      return (
        <ActionCard title="Has it arrived?" id="arrival-heading">
          <HeavyUnit weightG={order.listing.weightG} context="arrival" headingLevel={3} />
          <p className="text-sm text-ink-soft">
            Confirm arrival once the unit is with you. That opens your audition window, in which you can listen, measure and accept or
            contest. If you do not confirm, arrival is assumed some days after dispatch.
          </p>
          <IntentButton intent="arrived" label="It has arrived" result={result} />
        </ActionCard>
      );
    case "arrived":
    case "audition":
      return <>{audition}</>;
    default:
      return null;
  }
}
