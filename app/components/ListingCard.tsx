import type { ReactNode } from "react";
import { Link } from "react-router";
import { CATEGORY_LABELS, COSMETIC_GRADE_TEXT, SERVICE_STATE_TEXT } from "@shared/catalogue";
import type { ListingSummary } from "~/catalogue/types";
import { CompareToggle } from "~/compare/ui/CompareToggle";
import { BenchVerifiedMark } from "./BenchVerifiedMark";
import { Figure } from "./Figure";
import { Price } from "./Price";
import { cx } from "./cx";

/**
 * One unit in a list: the photo, the title in serif, the key measured figure with its conditions,
 * price, condition and the bench-verified mark. The whole card is one link (the title), so keyboard
 * users meet one tab stop per unit.
 */
export function ListingCard({
  listing,
  href,
  className,
  action,
  priority = false,
}: {
  listing: ListingSummary;
  href: string;
  className?: string;
  /** A control over the photo's corner (the watch button), above the card's link. */
  action?: ReactNode;
  /** The first card of a list: its photo is the page's largest paint, so it loads at once, first. */
  priority?: boolean;
}) {
  const l = listing;
  return (
    <article
      className={cx(
        "group relative flex min-w-0 flex-col overflow-hidden rounded-panel border border-rule bg-card shadow-panel transition-shadow",
        "hover:border-rule-strong hover:shadow-[0_2px_0_rgb(31_26_21/0.04),0_6px_18px_rgb(31_26_21/0.08)]",
        "focus-within:border-walnut",
        className,
      )}
    >
      <div className="relative aspect-[4/3] bg-sunk">
        {l.cover ? (
          <img
            src={l.cover.thumbUrl}
            alt=""
            width={l.cover.width}
            height={l.cover.height}
            loading={priority ? "eager" : "lazy"}
            fetchPriority={priority ? "high" : undefined}
            decoding="async"
            className="size-full object-cover"
          />
        ) : (
          <div className="flex size-full items-center justify-center text-sm text-ink-faint">No photo yet</div>
        )}
        {l.benchVerified ? <BenchVerifiedMark compact className="absolute left-2.5 top-2.5 bg-card/95 backdrop-blur-sm" /> : null}
        {action ? <div className="absolute right-2.5 top-2.5">{action}</div> : null}
        <div className="absolute bottom-2.5 right-2.5">
          <CompareToggle listingId={l.id} />
        </div>
      </div>
      <div className="flex flex-1 flex-col gap-3 p-4">
        <div className="space-y-0.5">
          <p className="text-xs font-medium text-ink-faint">
            {CATEGORY_LABELS[l.category].one}
            {l.era ? <> · {l.era}</> : null}
          </p>
          <h3 className="font-serif text-[1.1875rem] font-semibold leading-snug text-ink">
            <Link to={href} className="no-underline after:absolute after:inset-0 after:content-[''] focus-visible:outline-none">
              {l.title}
            </Link>
          </h3>
        </div>
        {l.keyFigure ? (
          <Figure
            size="sm"
            label={l.keyFigure.label}
            value={l.keyFigure.value}
            unit={l.keyFigure.unit}
            conditions={l.keyFigure.conditions}
          />
        ) : (
          <p className="text-[0.8125rem] text-ink-faint">No bench figures given</p>
        )}
        <div className="mt-auto flex items-end justify-between gap-3 border-t border-rule pt-3">
          <div className="min-w-0 text-[0.8125rem] leading-snug text-ink-soft">
            <p className="truncate">
              {COSMETIC_GRADE_TEXT[l.cosmeticGrade].label} · {SERVICE_STATE_TEXT[l.serviceState].label}
            </p>
            <p className="truncate text-ink-faint">
              {l.seller.kind === "workshop" ? l.seller.name : "Private seller"} · {l.place}
            </p>
          </div>
          <div className="shrink-0 text-right">
            <Price minor={l.priceMinor} currency={l.currency} layout="stacked" className="text-lg font-semibold text-ink" />
            {l.offersWelcome ? <p className="text-xs text-brass-ink">Offers welcome</p> : null}
          </div>
        </div>
      </div>
    </article>
  );
}
