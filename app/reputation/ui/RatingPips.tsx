import { cx } from "~/components/cx";

// A rating as five pips, filled to the nearest half, with the figure beside it in the figures face.
// The words ("4.5 out of 5") are what a screen reader hears; the pips are decoration.

export function RatingPips({ value, className, size = "md" }: { value: number; className?: string; size?: "sm" | "md" }) {
  const halves = Math.round(value * 2);
  const pip = size === "sm" ? "h-2 w-3" : "h-2.5 w-4";
  return (
    <span className={cx("inline-flex items-center gap-2", className)}>
      <span className="sr-only">{`${formatRating(value)} out of 5`}</span>
      <span aria-hidden="true" className="inline-flex gap-0.5">
        {[0, 1, 2, 3, 4].map((i) => {
          const fill = Math.max(0, Math.min(2, halves - i * 2));
          return (
            <span key={i} className={cx("relative overflow-hidden rounded-[2px] border border-walnut/60 bg-card", pip)}>
              {fill > 0 ? <span className={cx("absolute inset-y-0 left-0 bg-walnut", fill === 2 ? "w-full" : "w-1/2")} /> : null}
            </span>
          );
        })}
      </span>
      <span aria-hidden="true" className="figures text-sm text-ink">
        {formatRating(value)}
      </span>
    </span>
  );
}

export function formatRating(value: number): string {
  return Number.isInteger(value) ? `${value}` : value.toFixed(1);
}
