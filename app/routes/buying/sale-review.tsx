import { data, isRouteErrorResponse, redirect } from "react-router";
import type { Route } from "./+types/sale-review";
import { assertSameOrigin } from "~/auth/csrf.server";
import { requireUser } from "~/auth/guards.server";
import { readPageForm } from "~/http/body.server";
import { pageError } from "~/http/errors.server";
import { requestClock } from "~/buying/clock.server";
import { ErrorPage } from "~/components/ErrorPage";
import { answerReview, reviewPage } from "~/reputation/reviews.server";
import { SellerAnswerPage } from "~/reputation/ui/ReviewForms";

// /sales/:orderId/review: the seller reads the buyer's review of the sale and answers it once.

export const meta: Route.MetaFunction = () => [{ title: "The buyer's review · Loadline" }, { name: "robots", content: "noindex" }];

export async function loader({ request, params }: Route.LoaderArgs) {
  const user = await requireUser(request);
  const page = await reviewPage(user.id, params.orderId, "seller").catch(pageError);
  return data({ page }, { headers: { "Cache-Control": "private, no-store" } });
}

export async function action({ request, params }: Route.ActionArgs) {
  assertSameOrigin(request);
  const user = await requireUser(request);
  await reviewPage(user.id, params.orderId, "seller").catch(pageError);
  const fields = Object.fromEntries(await readPageForm(request));
  const done = await answerReview(user.id, params.orderId, fields, await requestClock()).catch(pageError);
  if (!done.ok)
    return data({ errors: done.errors, values: { answer: String(fields.answer ?? "").slice(0, 1000) } }, { status: done.status });
  return redirect(`/sales/${params.orderId}/review`);
}

export default function SaleReview({ loaderData, actionData }: Route.ComponentProps) {
  return <SellerAnswerPage page={loaderData.page} form={{ errors: actionData?.errors ?? {}, values: actionData?.values ?? {} }} />;
}

export function ErrorBoundary({ error }: Route.ErrorBoundaryProps) {
  if (isRouteErrorResponse(error)) return <ErrorPage status={error.status} />;
  return <ErrorPage status={500} />;
}
