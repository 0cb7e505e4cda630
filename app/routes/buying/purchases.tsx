import { data } from "react-router";
import type { Route } from "./+types/purchases";
import { requireUser } from "~/auth/guards.server";
import { purchasesPage } from "~/buying/orders-page.server";
import { PageHeader } from "~/components/PageHeader";
import { ButtonLink } from "~/components/Button";
import { OrderRow } from "~/buying/ui/OrderParts";

// The buyer's orders, newest first, each with its state and whose move it is.

export const meta: Route.MetaFunction = () => [{ title: "Purchases · Loadline" }, { name: "robots", content: "noindex" }];

export async function loader({ request }: Route.LoaderArgs) {
  const user = await requireUser(request);
  return data(await purchasesPage(user), { headers: { "Cache-Control": "private, no-store" } });
}

export default function Purchases({ loaderData }: Route.ComponentProps) {
  const { orders } = loaderData;
  return (
    <main className="mx-auto w-full max-w-4xl space-y-6 px-4 py-8 sm:px-6 sm:py-10">
      <PageHeader
        overline="Buying"
        title="Purchases"
        lede="Units you are buying or have bought. Your money is held until you accept the unit or its audition window closes."
      />
      {orders.length ? (
        <ul className="space-y-3">
          {orders.map((o) => (
            <OrderRow key={o.id} order={o} base="/purchases" />
          ))}
        </ul>
      ) : (
        <div className="space-y-3 rounded-panel border border-rule bg-card p-6">
          <p className="text-ink-soft">You have not bought anything yet.</p>
          <ButtonLink to="/market" variant="secondary">
            Browse the market
          </ButtonLink>
        </div>
      )}
    </main>
  );
}
