import { data, redirect } from "react-router";
import type { Route } from "./+types/purchase";
import { assertSameOrigin } from "~/auth/csrf.server";
import { requireUser } from "~/auth/guards.server";
import { readPageForm } from "~/http/body.server";
import { requestClock } from "~/buying/clock.server";
import { buyerStep, orderPage } from "~/buying/orders-page.server";
import { acceptFromForm, auditionFigures, contestFromForm } from "~/buying/audition.server";
import { PurchasePage } from "~/buying/ui/PurchasePage";
import { AuditionPanel, type AuditionResult } from "~/buying/ui/AuditionPanel";
import { contestPhotoLinks } from "~/orders/contest-photo-links.server";

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
  const auditioning = view.state === "audition" || view.state === "arrived";
  const figures = auditioning ? await auditionFigures(view.listing.id) : [];
  // The buyer's own contest photos, each link made for them alone (none before a contest).
  const contestPhotos = view.state === "contested" ? await contestPhotoLinks(view.id, user, await requestClock()) : [];
  return data({ view, paid, figures, contestPhotos }, { headers: { "Cache-Control": "private, no-store" } });
}

export async function action({ request, params }: Route.ActionArgs) {
  assertSameOrigin(request);
  const user = await requireUser(request);
  const back = `/purchases/${params.orderId}`;
  // The audition forms name their intent in the URL and read their own (larger, multipart) body.
  const urlIntent = new URL(request.url).searchParams.get("intent");
  if (urlIntent === "accept" || urlIntent === "contest") {
    const run = urlIntent === "accept" ? acceptFromForm : contestFromForm;
    const done = await run(user, params.orderId, request, await requestClock());
    if (!done.ok)
      return data(
        { audition: { form: urlIntent, errors: done.errors, values: done.values } satisfies AuditionResult },
        { status: done.status },
      );
    return redirect(back);
  }
  const form = await readPageForm(request);
  const intent = String(form.get("intent") ?? "");
  const done = await buyerStep(user, params.orderId, intent, new URL(request.url).origin, await requestClock());
  if (!done.ok) return data({ intent, errors: done.errors, values: done.values }, { status: done.status });
  return redirect(done.redirectTo ?? back);
}

export default function Purchase({ loaderData, actionData }: Route.ComponentProps) {
  const { view, paid, figures, contestPhotos } = loaderData;
  const result = actionData && "intent" in actionData ? actionData : null;
  const audition = actionData && "audition" in actionData ? actionData.audition : null;
  return (
    <PurchasePage
      order={view}
      paid={paid}
      result={result}
      contestPhotos={contestPhotos}
      audition={<AuditionPanel order={view} figures={figures} weightG={view.listing.weightG} result={audition} />}
    />
  );
}
