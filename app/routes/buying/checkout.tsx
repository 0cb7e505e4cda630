import { data, redirect } from "react-router";
import type { Route } from "./+types/checkout";
import { assertSameOrigin } from "~/auth/csrf.server";
import { requireUser } from "~/auth/guards.server";
import { readPageForm } from "~/http/body.server";
import { loadCheckout, startCheckout } from "~/buying/checkout.server";
import { requestClock } from "~/buying/clock.server";
import { CheckoutPage } from "~/buying/ui/CheckoutPage";

// /checkout/:listingId: choose the delivery, then reserve the unit and go to the provider's hosted
// payment page. Works as a plain form.

export const meta: Route.MetaFunction = () => [{ title: "Checkout · Loadline" }, { name: "robots", content: "noindex" }];

const notHere = () => data({ message: "There is no listing to buy here." }, { status: 404, statusText: "Not Found" });

export async function loader({ request, params }: Route.LoaderArgs) {
  const user = await requireUser(request);
  const url = new URL(request.url);
  const view = await loadCheckout(
    params.listingId,
    user,
    { zone: url.searchParams.get("zone"), acceptLanguage: request.headers.get("Accept-Language") },
    await requestClock(),
  );
  if (!view) throw notHere();
  // The buyer already holds this unit: their purchase page carries on with the payment.
  if (view.buy?.kind === "continue") throw redirect(view.buy.href);
  return data(view, { headers: { "Cache-Control": "private, no-store" } });
}

export async function action({ request, params }: Route.ActionArgs) {
  assertSameOrigin(request);
  const user = await requireUser(request, { redirectTo: `/checkout/${params.listingId}` });
  const fields = Object.fromEntries(await readPageForm(request));
  const started = await startCheckout(params.listingId, user, fields, new URL(request.url).origin, await requestClock());
  if (!started.ok) {
    if (started.status === 404) throw notHere();
    return data({ errors: started.errors }, { status: started.status });
  }
  return redirect(started.paymentUrl);
}

export default function Checkout({ loaderData, actionData }: Route.ComponentProps) {
  return <CheckoutPage view={loaderData} errors={actionData?.errors ?? {}} />;
}
