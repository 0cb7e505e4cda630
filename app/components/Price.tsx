import { createContext, useContext, type ReactNode } from "react";
import { showPrice, type Rates } from "@shared/currency";
import { cx } from "./cx";

// Every price a buyer sees: the seller's figure, and beside it, when the buyer's display currency
// differs, an approximate one marked "≈" (read as "about"). The root loader provides the display
// currency and the rates to the whole page.

export interface PricingData {
  display: string;
  rates: Rates;
}

const PricingContext = createContext<PricingData | null>(null);

export function PricingProvider({ pricing, children }: { pricing: PricingData | null; children: ReactNode }) {
  return <PricingContext.Provider value={pricing}>{children}</PricingContext.Provider>;
}

export function usePricing(): PricingData | null {
  return useContext(PricingContext);
}

/**
 * `inline`: "£1,200 · ≈ €1,395" on one line (the listing page); `stacked`: the approximation on a
 * line of its own under the price (cards).
 */
export function Price({
  minor,
  currency,
  layout = "inline",
  className,
  approxClassName,
  testId,
}: {
  minor: number;
  currency: string;
  layout?: "inline" | "stacked";
  className?: string;
  approxClassName?: string;
  testId?: string;
}) {
  const pricing = usePricing();
  const shown = showPrice(minor, currency, pricing?.display ?? null, pricing?.rates ?? null);
  const approx = shown.approx ? <Approx text={shown.approx} className={approxClassName} /> : null;
  if (layout === "stacked") {
    return (
      <>
        <p className={cx("figures", className)} data-testid={testId}>
          {shown.text}
        </p>
        {approx ? <p className="figures text-xs leading-snug">{approx}</p> : null}
      </>
    );
  }
  return (
    <p className={cx("figures", className)} data-testid={testId}>
      {shown.text}
      {approx ? (
        <>
          <span aria-hidden="true" className={cx("text-ink-faint", approxClassName)}>
            {" · "}
          </span>
          <span className="sr-only">, </span>
          {approx}
        </>
      ) : null}
    </p>
  );
}

function Approx({ text, className }: { text: string; className?: string }) {
  return (
    <span className={cx("text-ink-soft", className)} data-testid="approx-price" title="Approximate, at Loadline's exchange rate">
      <span aria-hidden="true">≈ </span>
      <span className="sr-only">about </span>
      {text}
    </span>
  );
}

/** Only the approximate figure (or nothing), for a price already shown beside it (shipping costs). */
export function ApproxPrice({ minor, currency, className }: { minor: number; currency: string; className?: string }) {
  const pricing = usePricing();
  const shown = showPrice(minor, currency, pricing?.display ?? null, pricing?.rates ?? null);
  // "Free" needs no conversion.
  return minor > 0 && shown.approx ? <Approx text={shown.approx} className={className} /> : null;
}
