import { data, redirect } from "react-router";
import type { Route } from "./+types/sale";
import { assertSameOrigin } from "~/auth/csrf.server";
import { requireUser } from "~/auth/guards.server";
import { readPageForm } from "~/http/body.server";
import { requestClock } from "~/buying/clock.server";
import { orderPage, sellerStep } from "~/buying/orders-page.server";
import { SalePage } from "~/buying/ui/SalePage";

// /sales/:orderId: the seller's order: ship it, follow the audition window, see the payout.

export function meta({ data: page }: Route.MetaArgs) {
  return [{ title: page ? `${page.view.listing.title} · Sales · Loadline` : "Sale · Loadline" }];
}

export async function loader({ request, params }: Route.LoaderArgs) {
  const user = await requireUser(request);
  const { view } = await orderPage(user, params.orderId, "seller");
  return data({ view }, { headers: { "Cache-Control": "private, no-store" } });
}

export async function action({ request, params }: Route.ActionArgs) {
  assertSameOrigin(request);
  const user = await requireUser(request);
  const fields = Object.fromEntries(await readPageForm(request));
  const done = await sellerStep(user, params.orderId, fields, await requestClock());
  if (!done.ok) return data({ intent: String(fields.intent ?? ""), errors: done.errors, values: done.values }, { status: done.status });
  return redirect(`/sales/${params.orderId}`);
}

export default function Sale({ loaderData, actionData }: Route.ComponentProps) {
  return <SalePage order={loaderData.view} result={actionData ?? null} />;
}
