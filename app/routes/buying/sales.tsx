import { data } from "react-router";
import type { Route } from "./+types/sales";
import { requireRole } from "~/auth/guards.server";
import { salesPage } from "~/buying/orders-page.server";
import { PageHeader } from "~/components/PageHeader";
import { ButtonLink } from "~/components/Button";
import { OrderRow } from "~/buying/ui/OrderParts";
import { PayoutsPanel } from "~/buying/ui/PayoutsPanel";

// The seller's orders, newest first, and the payouts released to their account.

export const meta: Route.MetaFunction = () => [{ title: "Sales · Loadline" }, { name: "robots", content: "noindex" }];

export async function loader({ request }: Route.LoaderArgs) {
  const user = await requireRole(request, "seller");
  return data(await salesPage(user), { headers: { "Cache-Control": "private, no-store" } });
}

export default function Sales({ loaderData }: Route.ComponentProps) {
  const { orders, payouts } = loaderData;
  return (
    <main className="mx-auto w-full max-w-5xl space-y-6 px-4 py-8 sm:px-6 sm:py-10">
      <PageHeader
        overline="Selling"
        title="Sales"
        lede="Units buyers have reserved or paid for. The money reaches you when the buyer accepts the unit or the audition window closes."
        actions={
          <ButtonLink to="/sales/money" variant="secondary">
            Money per month
          </ButtonLink>
        }
      />
      <div className="grid gap-8 lg:grid-cols-[minmax(0,1fr)_20rem]">
        <section aria-labelledby="orders-heading" className="space-y-3">
          <h2 id="orders-heading" className="sr-only">
            Orders
          </h2>
          {orders.length ? (
            <ul className="space-y-3">
              {orders.map((o) => (
                <OrderRow key={o.id} order={o} base="/sales" />
              ))}
            </ul>
          ) : (
            <p className="rounded-panel border border-rule bg-card p-6 text-ink-soft">No unit of yours has been bought yet.</p>
          )}
        </section>
        <PayoutsPanel payouts={payouts} />
      </div>
    </main>
  );
}
