import type { PublicReview } from "../profile.server";
import { RatingPips } from "./RatingPips";
import { dayText } from "@shared/dates";

/** The latest reviews, each with the seller's answer under it. */
export function ReviewList({ reviews, sellerName }: { reviews: PublicReview[]; sellerName: string }) {
  if (reviews.length === 0) return <p className="text-sm text-ink-soft">No reviews yet.</p>;
  return (
    <ol className="divide-y divide-rule" aria-label="Latest reviews">
      {reviews.map((r) => (
        <li key={r.id} className="space-y-2 py-4 first:pt-0" data-review={r.id}>
          <div className="flex flex-wrap items-center justify-between gap-2">
            <RatingPips value={r.rating} size="sm" />
            <p className="text-xs text-ink-faint">
              {r.by} · bought {r.unit} · <time dateTime={r.createdAt}>{dayText(r.createdAt)}</time>
            </p>
          </div>
          <p className="whitespace-pre-line text-[0.9375rem] leading-relaxed text-ink">{r.body}</p>
          {r.answer ? (
            <div className="ml-3 border-l-2 border-brass/60 pl-3">
              <p className="text-xs font-semibold text-brass-ink">{sellerName} answered</p>
              <p className="whitespace-pre-line text-sm leading-relaxed text-ink-soft">{r.answer}</p>
            </div>
          ) : null}
        </li>
      ))}
    </ol>
  );
}
