import { data, redirect } from "react-router";
import type { Route } from "./+types/purchase";
import { assertSameOrigin } from "~/auth/csrf.server";
import { requireUser } from "~/auth/guards.server";
import { readPageForm } from "~/http/body.server";
import { requestClock } from "~/buying/clock.server";
import { buyerStep, orderPage } from "~/buying/orders-page.server";
import { PurchasePage } from "~/buying/ui/PurchasePage";

// /purchases/:orderId: the buyer's order. Paying happens on the provider's page; coming back with
// ?paid=1 shows "waiting for the payment provider" until the webhook has funded the order.

export function meta({ data: page, location }: Route.MetaArgs) {
  const tags: Route.MetaDescriptors = [{ title: page ? `${page.view.listing.title} · Purchases · Loadline` : "Purchase · Loadline" }];
  // Back from paying and not funded yet: look again in a few seconds, without any script.
  if (page?.view.state === "reserved" && new URLSearchParams(location.search).has("paid"))
    tags.push({ httpEquiv: "refresh", content: "4" });
  return tags;
}

export async function loader({ request, params }: Route.LoaderArgs) {
  const user = await requireUser(request);
  const { view } = await orderPage(user, params.orderId, "buyer");
  const paid = new URL(request.url).searchParams.has("paid");
  return data({ view, paid }, { headers: { "Cache-Control": "private, no-store" } });
}

export async function action({ request, params }: Route.ActionArgs) {
  assertSameOrigin(request);
  const user = await requireUser(request);
  const form = await readPageForm(request);
  const intent = String(form.get("intent") ?? "");
  const done = await buyerStep(user, params.orderId, intent, new URL(request.url).origin, await requestClock());
  if (!done.ok) return data({ intent, errors: done.errors, values: done.values }, { status: done.status });
  return redirect(done.redirectTo ?? `/purchases/${params.orderId}`);
}

export default function Purchase({ loaderData, actionData }: Route.ComponentProps) {
  return <PurchasePage order={loaderData.view} paid={loaderData.paid} result={actionData ?? null} />;
}
