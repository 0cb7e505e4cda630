import { data, isRouteErrorResponse, redirect } from "react-router";
import type { Route } from "./+types/purchase-review";
import { assertSameOrigin } from "~/auth/csrf.server";
import { requireUser } from "~/auth/guards.server";
import { readPageForm } from "~/http/body.server";
import { pageError } from "~/http/errors.server";
import { requestClock } from "~/buying/clock.server";
import { ErrorPage } from "~/components/ErrorPage";
import { reviewPage, writeReview } from "~/reputation/reviews.server";
import { BuyerReviewPage } from "~/reputation/ui/ReviewForms";

// /purchases/:orderId/review: the buyer rates the seller once the order's money was released.

export const meta: Route.MetaFunction = () => [{ title: "Rate the seller · Loadline" }, { name: "robots", content: "noindex" }];

export async function loader({ request, params }: Route.LoaderArgs) {
  const user = await requireUser(request);
  const page = await reviewPage(user.id, params.orderId, "buyer").catch(pageError);
  return data({ page }, { headers: { "Cache-Control": "private, no-store" } });
}

export async function action({ request, params }: Route.ActionArgs) {
  assertSameOrigin(request);
  const user = await requireUser(request);
  // Someone else's order is a 404 before anything in the body is read into an answer.
  await reviewPage(user.id, params.orderId, "buyer").catch(pageError);
  const fields = Object.fromEntries(await readPageForm(request));
  const done = await writeReview(user.id, params.orderId, fields, await requestClock()).catch(pageError);
  if (!done.ok) {
    const values = { rating: String(fields.rating ?? "").slice(0, 4), body: String(fields.body ?? "").slice(0, 1000) };
    return data({ errors: done.errors, values }, { status: done.status });
  }
  return redirect(`/purchases/${params.orderId}/review`);
}

export default function PurchaseReview({ loaderData, actionData }: Route.ComponentProps) {
  return <BuyerReviewPage page={loaderData.page} form={{ errors: actionData?.errors ?? {}, values: actionData?.values ?? {} }} />;
}

export function ErrorBoundary({ error }: Route.ErrorBoundaryProps) {
  if (isRouteErrorResponse(error)) return <ErrorPage status={error.status} />;
  return <ErrorPage status={500} />;
}
