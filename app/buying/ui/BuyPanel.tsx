import type { ReactNode } from "react";
import { Button, ButtonLink } from "~/components/Button";
import type { BuyState } from "../buy-state.server";

// "Buy" on the listing page, beside the seller's conversation buttons (passed in as children). A
// plain link: the checkout page itself asks an anonymous visitor to sign in and comes back.

export function BuyPanel({ state, children }: { state: BuyState | null; children?: ReactNode }) {
  if (!state && !children) return null;
  return (
    <div className="space-y-2" data-testid="buy-panel">
      <div className="flex flex-wrap items-center gap-2">
        {state?.kind === "buy" ? (
          <ButtonLink to={state.href} size="lg" className="max-sm:w-full">
            Buy
          </ButtonLink>
        ) : state?.kind === "continue" ? (
          <ButtonLink to={state.href} size="lg" className="max-sm:w-full">
            Continue to payment
          </ButtonLink>
        ) : state?.kind === "blocked" ? (
          <Button disabled size="lg" aria-describedby="buy-reason" className="max-sm:w-full">
            Buy
          </Button>
        ) : null}
        {children}
      </div>
      {state?.kind === "blocked" ? (
        <p id="buy-reason" className="text-sm text-ink-soft">
          {state.reason}
        </p>
      ) : state?.kind === "continue" ? (
        <p className="text-sm text-ink-soft">You are checking out this unit; it is held for you until your reservation lapses.</p>
      ) : null}
    </div>
  );
}
