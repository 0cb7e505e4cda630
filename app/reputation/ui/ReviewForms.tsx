import { Form, Link } from "react-router";
import { Button } from "~/components/Button";
import { Card } from "~/components/Card";
import { FormError, TextareaField } from "~/components/Field";
import { PageHeader } from "~/components/PageHeader";
import type { FieldErrors } from "../review-form";
import type { ReviewPage, ReviewView } from "../reviews.server";
import { RatingPips } from "./RatingPips";
import { dayText } from "@shared/dates";

// The buyer's review of an order and the seller's answer to it: forms that work without JavaScript,
// errors beside their fields, and the review as written once it exists.

export interface FormState {
  errors: FieldErrors;
  values: Record<string, string>;
}

const RATING_WORDS = ["", "Poor", "Below what was promised", "As described", "Good", "Excellent"];

export function ReviewShown({ review, sellerName }: { review: ReviewView; sellerName: string }) {
  return (
    <Card className="space-y-3" data-testid="review">
      <div className="flex flex-wrap items-center justify-between gap-2">
        <RatingPips value={review.rating} />
        <time dateTime={review.createdAt} className="text-xs text-ink-faint">
          {dayText(review.createdAt)}
        </time>
      </div>
      <p className="whitespace-pre-line leading-relaxed">{review.body}</p>
      {review.answer ? (
        <div className="ml-3 border-l-2 border-brass/60 pl-3">
          <p className="text-xs font-semibold text-brass-ink">{sellerName} answered</p>
          <p className="whitespace-pre-line text-sm leading-relaxed text-ink-soft">{review.answer}</p>
        </div>
      ) : null}
      {review.hidden ? (
        <p className="rounded-md border border-rule-strong bg-sunk px-3 py-2 text-sm text-ink-soft">
          The review desk hid this review on {dayText(review.hidden.at)}: {review.hidden.note}
        </p>
      ) : null}
    </Card>
  );
}

export function BuyerReviewPage({ page, form }: { page: ReviewPage; form: FormState }) {
  const { order, review } = page;
  return (
    <main className="mx-auto w-full max-w-2xl space-y-6 px-4 pb-16 pt-6 sm:px-6">
      <PageHeader overline="Your purchase" title={`Rate ${order.sellerName}`} lede={order.title} />
      {review ? (
        <ReviewShown review={review} sellerName={order.sellerName} />
      ) : !order.released ? (
        <p className="text-ink-soft">You can rate the seller once the money has been released to them, after the audition window.</p>
      ) : (
        <Form method="post" className="space-y-5">
          <FormError>{form.errors.form}</FormError>
          <fieldset className="space-y-2" aria-describedby={form.errors.rating ? "rating-error" : undefined}>
            <legend className="text-sm font-medium text-ink">How did the sale go?</legend>
            <div className="grid gap-2 sm:grid-cols-5">
              {[5, 4, 3, 2, 1].map((n) => (
                <label key={n} className="flex items-start gap-2 rounded-md border border-rule bg-card px-3 py-2 text-sm">
                  <input
                    type="radio"
                    name="rating"
                    value={n}
                    defaultChecked={form.values.rating === String(n)}
                    className="mt-1 size-4 accent-walnut"
                  />
                  <span>
                    <span className="figures">{n}</span> · {RATING_WORDS[n]}
                  </span>
                </label>
              ))}
            </div>
            {form.errors.rating ? (
              <p id="rating-error" role="alert" className="text-[0.8125rem] font-medium text-fault">
                {form.errors.rating}
              </p>
            ) : null}
          </fieldset>
          <TextareaField
            label="Your review"
            name="body"
            rows={5}
            maxLength={1000}
            defaultValue={form.values.body ?? ""}
            error={form.errors.body}
            hint="The unit against its listing, the packing, how the seller answered. Shown on the seller's page with your first name."
          />
          <Button type="submit">Post the review</Button>
        </Form>
      )}
      <p className="text-sm">
        <Link to={`/purchases/${order.id}`}>Back to the order</Link>
      </p>
    </main>
  );
}

export function SellerAnswerPage({ page, form }: { page: ReviewPage; form: FormState }) {
  const { order, review } = page;
  return (
    <main className="mx-auto w-full max-w-2xl space-y-6 px-4 pb-16 pt-6 sm:px-6">
      <PageHeader overline="Your sale" title="The buyer's review" lede={order.title} />
      {!review ? (
        <p className="text-ink-soft">{order.buyerName} has not rated this sale yet.</p>
      ) : (
        <>
          <ReviewShown review={review} sellerName="You" />
          {review.answer === null && !review.hidden ? (
            <Form method="post" className="space-y-4">
              <FormError>{form.errors.form}</FormError>
              <TextareaField
                label="Your answer"
                name="answer"
                rows={4}
                maxLength={1000}
                defaultValue={form.values.answer ?? ""}
                error={form.errors.answer}
                hint="Shown under the review on your page. You can answer once."
              />
              <Button type="submit">Post the answer</Button>
            </Form>
          ) : null}
        </>
      )}
      <p className="text-sm">
        <Link to={`/sales/${order.id}`}>Back to the sale</Link>
      </p>
    </main>
  );
}
