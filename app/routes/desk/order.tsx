import { data, redirect } from "react-router";
import type { Route } from "./+types/order";
import { assertSameOrigin } from "~/auth/csrf.server";
import { requireRole } from "~/auth/guards.server";
import { readPageForm } from "~/http/body.server";
import { requestClock } from "~/buying/clock.server";
import { deskOrderPage, resolveFromDesk } from "~/buying/desk-order.server";
import { DeskOrderPage } from "~/buying/ui/DeskOrderPage";

// /desk/orders/:orderId: a contested order on the review desk: both sides' evidence, their conversation,
// the claim (opening it takes it), the decision and the order's trail.

export function meta({ data: page }: Route.MetaArgs) {
  return [{ title: page ? `Order ${page.view.ref} · Review desk · Loadline` : "Order · Review desk · Loadline" }];
}

export async function loader({ request, params }: Route.LoaderArgs) {
  const moderator = await requireRole(request, "moderator");
  return data(await deskOrderPage(moderator, params.orderId, await requestClock()), { headers: { "Cache-Control": "private, no-store" } });
}

export async function action({ request, params }: Route.ActionArgs) {
  assertSameOrigin(request);
  const moderator = await requireRole(request, "moderator");
  const fields = Object.fromEntries(await readPageForm(request));
  const done = await resolveFromDesk(moderator, params.orderId, fields, await requestClock());
  if (!done.ok) {
    const values = {
      resolution: String(fields.resolution ?? ""),
      amount: String(fields.amount ?? "").slice(0, 40),
      note: String(fields.note ?? "").slice(0, 4000),
    };
    return data({ errors: done.errors, values }, { status: done.status });
  }
  return redirect(`/desk/orders/${params.orderId}`);
}

export default function DeskOrder({ loaderData, actionData }: Route.ComponentProps) {
  return <DeskOrderPage page={loaderData} errors={actionData?.errors ?? {}} values={actionData?.values ?? {}} />;
}
