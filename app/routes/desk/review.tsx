import { data, Form, isRouteErrorResponse, Link, redirect } from "react-router";
import type { Route } from "./+types/review";
import { assertSameOrigin } from "~/auth/csrf.server";
import { requireRole } from "~/auth/guards.server";
import { readPageForm } from "~/http/body.server";
import { pageError } from "~/http/errors.server";
import { requestClock } from "~/buying/clock.server";
import { Button } from "~/components/Button";
import { ErrorPage } from "~/components/ErrorPage";
import { FormError, TextareaField } from "~/components/Field";
import { PageHeader } from "~/components/PageHeader";
import { AuditTrail } from "~/desk/ui/AuditTrail";
import { deskReviewPage } from "~/reputation/desk-review.server";
import { hideReview } from "~/reputation/reviews.server";
import { ReviewShown } from "~/reputation/ui/ReviewForms";

// /desk/reviews/:id: a moderator hides an abusive review with a note (audited as hide_review).

export const meta: Route.MetaFunction = () => [{ title: "Review · Review desk · Loadline" }, { name: "robots", content: "noindex" }];

export async function loader({ request, params }: Route.LoaderArgs) {
  await requireRole(request, "moderator");
  const page = await deskReviewPage(params.id).catch(pageError);
  return data({ page }, { headers: { "Cache-Control": "private, no-store" } });
}

export async function action({ request, params }: Route.ActionArgs) {
  assertSameOrigin(request);
  const moderator = await requireRole(request, "moderator");
  await deskReviewPage(params.id).catch(pageError);
  const fields = Object.fromEntries(await readPageForm(request));
  const done = await hideReview(moderator.id, params.id, fields, await requestClock()).catch(pageError);
  if (!done.ok) return data({ errors: done.errors, values: { note: String(fields.note ?? "").slice(0, 2000) } }, { status: done.status });
  return redirect(`/desk/reviews/${params.id}`);
}

export default function DeskReview({ loaderData, actionData }: Route.ComponentProps) {
  const { review, buyer, seller, order, trail } = loaderData.page;
  const errors = actionData?.errors ?? {};
  return (
    <main className="mx-auto w-full max-w-3xl space-y-6 px-4 pb-16 pt-6 sm:px-6">
      <PageHeader
        overline="Review desk · a review"
        title={`${buyer.name} on ${seller.name}`}
        lede={
          <>
            After buying {order.title}. <Link to={seller.href}>The seller's page</Link> ·{" "}
            <Link to={`/desk/orders/${order.id}`}>The order</Link>
          </>
        }
      />
      <ReviewShown review={review} sellerName={seller.name} />
      {review.hidden ? null : (
        <Form method="post" className="space-y-4">
          <FormError>{errors.form}</FormError>
          <TextareaField
            label="Why hide it"
            name="note"
            rows={3}
            defaultValue={actionData?.values.note ?? ""}
            error={errors.note}
            hint="Kept in the trail and shown to the buyer and the seller with the hidden review. Hide abuse, not criticism."
          />
          <Button type="submit" variant="danger">
            Hide the review
          </Button>
        </Form>
      )}
      <AuditTrail items={trail} />
    </main>
  );
}

export function ErrorBoundary({ error }: Route.ErrorBoundaryProps) {
  if (isRouteErrorResponse(error)) return <ErrorPage status={error.status} />;
  return <ErrorPage status={500} />;
}
