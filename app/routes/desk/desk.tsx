import { Link } from "react-router";
import type { Route } from "./+types/desk";
import { Badge } from "~/components/Badge";
import { Card, CardTitle } from "~/components/Card";
import { PageHeader } from "~/components/PageHeader";
import { requireRole } from "~/auth/guards.server";
import { reviewQueue, type ContestedOrderItem, type HeldListingItem, type WorkshopApplicationItem } from "~/desk/queue.server";

export const meta: Route.MetaFunction = () => [{ title: "Review desk · Loadline" }];

export async function loader({ request }: Route.LoaderArgs) {
  await requireRole(request, "moderator");
  return reviewQueue();
}

function day(iso: string) {
  return new Date(iso).toISOString().slice(0, 10);
}

export default function Desk({ loaderData }: Route.ComponentProps) {
  const { heldListings, heldCount, workshopApplications, applicationCount, contestedOrders, contestedCount } = loaderData;
  const clear = heldCount === 0 && applicationCount === 0 && contestedCount === 0;
  return (
    <main className="mx-auto w-full max-w-5xl space-y-8 px-4 py-10">
      <PageHeader
        overline="Moderation"
        title="Review desk"
        lede={
          clear
            ? "The queue is clear: no listing is held for review, no workshop is waiting to be verified and no order is contested."
            : `${contestedCount} contested order${contestedCount === 1 ? "" : "s"} · ${heldCount} listing${heldCount === 1 ? "" : "s"} held for review · ${applicationCount} workshop application${applicationCount === 1 ? "" : "s"}, oldest first.`
        }
      />
      <Queue title="Contested orders" count={contestedCount} empty="No order is contested.">
        {contestedOrders.map((o) => (
          <ContestedOrder key={o.id} item={o} />
        ))}
      </Queue>
      <Queue title="Listings held for review" count={heldCount} empty="No listing is held for review.">
        {heldListings.map((l) => (
          <HeldListing key={l.id} item={l} />
        ))}
      </Queue>
      <Queue title="Workshop applications" count={applicationCount} empty="No workshop is waiting to be verified.">
        {workshopApplications.map((w) => (
          <Application key={w.id} item={w} />
        ))}
      </Queue>
    </main>
  );
}

function Queue({ title, count, empty, children }: { title: string; count: number; empty: string; children: React.ReactNode }) {
  return (
    <Card className="space-y-4">
      <div className="flex items-baseline justify-between gap-3">
        <CardTitle>{title}</CardTitle>
        <span className="figures text-sm text-ink-soft">{count}</span>
      </div>
      {count === 0 ? <p className="text-sm text-ink-soft">{empty}</p> : <ul className="divide-y divide-rule">{children}</ul>}
    </Card>
  );
}

function HeldListing({ item }: { item: HeldListingItem }) {
  return (
    <li className="space-y-1 py-3">
      <p className="flex flex-wrap items-center gap-2">
        <Link
          to={`/listings/${item.id}`}
          className="font-serif text-lg text-ink underline decoration-walnut/40 underline-offset-2 hover:text-walnut-deep"
        >
          {item.title}
        </Link>
        <Badge tone="brass">Held for review</Badge>
        <span className="text-sm text-ink-faint">{item.category}</span>
      </p>
      <p className="text-sm">{item.reason}</p>
      <p className="text-xs text-ink-faint">
        {item.workshop ? `${item.workshop} (${item.seller})` : item.seller} · held since <span className="figures">{day(item.since)}</span>
      </p>
    </li>
  );
}

function ContestedOrder({ item }: { item: ContestedOrderItem }) {
  return (
    <li className="space-y-1 py-3">
      <p className="flex flex-wrap items-center gap-2">
        <Link
          to={`/desk/orders/${item.id}`}
          className="font-serif text-lg text-ink underline decoration-walnut/40 underline-offset-2 hover:text-walnut-deep"
        >
          {item.title}
        </Link>
        <Badge tone="fault">Contested</Badge>
        <span className="figures text-sm text-ink-faint">Order {item.ref}</span>
      </p>
      <p className="text-sm">{item.reason}</p>
      <p className="text-xs text-ink-faint">
        {item.buyer} bought from {item.seller} · contested <span className="figures">{day(item.since)}</span>
      </p>
    </li>
  );
}

function Application({ item }: { item: WorkshopApplicationItem }) {
  return (
    <li className="space-y-1 py-3">
      <p className="flex flex-wrap items-center gap-2">
        <Link
          to={`/desk/workshops/${item.id}`}
          className="font-serif text-lg text-ink underline decoration-walnut/40 underline-offset-2 hover:text-walnut-deep"
        >
          {item.name}
        </Link>
        <Badge tone="walnut">Applied</Badge>
      </p>
      <p className="text-sm text-ink-soft">{item.place}</p>
      <p className="text-xs text-ink-faint">
        {item.owner} · {item.ownerEmail} · applied <span className="figures">{day(item.since)}</span>
      </p>
    </li>
  );
}
