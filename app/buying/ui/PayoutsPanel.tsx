import { Link } from "react-router";
import { Card } from "~/components/Card";
import { Money } from "./Money";
import { When } from "./OrderParts";

// The seller's payouts: each released order's transfer to their connected account, and whether
// they can be paid at all.

export interface PayoutView {
  orderId: string;
  ref: string;
  title: string;
  at: string;
  amountMinor: number;
  currency: string;
}

export function PayoutsPanel({ payouts }: { payouts: { enabled: boolean; items: PayoutView[] } }) {
  return (
    <Card className="h-fit space-y-3" aria-labelledby="payouts-heading">
      <h2 id="payouts-heading" className="text-lg">
        Payouts
      </h2>
      {!payouts.enabled ? (
        <p className="rounded-md border border-brass/45 bg-brass-wash px-3 py-2 text-sm text-ink">
          Buyers cannot buy your units until you connect a payout account.{" "}
          <Link to="/account#payouts" className="font-medium text-walnut underline underline-offset-2">
            Connect one on your account page
          </Link>
          .
        </p>
      ) : null}
      {payouts.items.length ? (
        <ul className="divide-y divide-rule/70 text-sm" data-testid="payouts">
          {payouts.items.map((p) => (
            <li key={p.orderId} className="flex items-baseline justify-between gap-3 py-2">
              <span className="min-w-0">
                <Link to={`/sales/${p.orderId}`} className="block truncate font-medium text-ink no-underline hover:text-walnut-deep">
                  {p.title}
                </Link>
                <span className="text-xs text-ink-faint">
                  <When iso={p.at} />
                </span>
              </span>
              <Money minor={p.amountMinor} currency={p.currency} className="shrink-0 font-semibold" />
            </li>
          ))}
        </ul>
      ) : (
        <p className="text-sm text-ink-soft">Nothing paid out yet. Each payout shows here once a buyer's audition window closes.</p>
      )}
    </Card>
  );
}
