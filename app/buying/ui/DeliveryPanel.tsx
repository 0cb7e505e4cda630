import { Link } from "react-router";
import { Card } from "~/components/Card";
import type { OrderDetailView } from "../order-view";
import { When } from "./OrderParts";

// How the unit travels, the deadlines that apply, and the way to the conversation with the other side.

export function DeliveryPanel({ order }: { order: OrderDetailView }) {
  const d = order.delivery;
  const row = "flex flex-wrap items-baseline justify-between gap-x-4 gap-y-0.5 py-1.5";
  return (
    <Card className="space-y-2" aria-labelledby="delivery-heading">
      <h2 id="delivery-heading" className="text-lg">
        Delivery
      </h2>
      <dl className="divide-y divide-rule/70 text-sm">
        <div className={row}>
          <dt className="text-ink-soft">How</dt>
          <dd className="text-right">
            {d.methodLabel} <span className="text-ink-faint">· {d.zoneLabel}</span>
          </dd>
        </div>
        {d.carrier ? (
          <div className={row}>
            <dt className="text-ink-soft">Carrier</dt>
            <dd>{d.carrier}</dd>
          </div>
        ) : null}
        {d.trackingNumber ? (
          <div className={row}>
            <dt className="text-ink-soft">Tracking number</dt>
            <dd className="figures break-all" data-testid="tracking-number">
              {d.trackingNumber}
            </dd>
          </div>
        ) : null}
        {order.state === "reserved" && d.reservedUntil ? <Dated label="Reserved until" iso={d.reservedUntil} /> : null}
        {order.state === "funded" && d.shipBy ? <Dated label="Ships by" iso={d.shipBy} /> : null}
        {d.shippedAt ? <Dated label="Shipped" iso={d.shippedAt} /> : null}
        {d.arrivedAt ? <Dated label="Arrived" iso={d.arrivedAt} /> : null}
        {d.auditionEndsAt && (order.state === "audition" || order.state === "arrived") ? (
          <Dated label="Audition window ends" iso={d.auditionEndsAt} />
        ) : null}
        {d.releasedAt ? <Dated label="Released" iso={d.releasedAt} /> : null}
      </dl>
      {order.threadHref ? (
        <p className="pt-1 text-sm">
          <Link
            to={order.threadHref}
            className="font-medium text-walnut underline decoration-walnut/40 underline-offset-2 hover:text-walnut-deep"
          >
            {order.viewer === "seller"
              ? "Messages with the buyer"
              : order.viewer === "buyer"
                ? "Messages with the seller"
                : "The buyer and seller's messages"}
          </Link>
        </p>
      ) : null}
    </Card>
  );
}

function Dated({ label, iso }: { label: string; iso: string }) {
  return (
    <div className="flex flex-wrap items-baseline justify-between gap-x-4 gap-y-0.5 py-1.5">
      <dt className="text-ink-soft">{label}</dt>
      <dd>
        <When iso={iso} />
      </dd>
    </div>
  );
}
