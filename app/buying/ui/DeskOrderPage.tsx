import { Link } from "react-router";
import { Card } from "~/components/Card";
import { RemeasureTable } from "~/components/RemeasureTable";
import type { ContestView } from "../desk-order.server";
import type { FieldErrors } from "../order-forms";
import type { OrderDetailView } from "../order-view";
import { DeliveryPanel } from "./DeliveryPanel";
import { MoneyPanel, NextStep, OrderHead, Timeline, When } from "./OrderParts";
import { ResolveForm } from "./ResolveForm";
import { ContestCaptures, ContestPhotos, DeskThreadCard } from "./DeskEvidence";
import type { DeskThread } from "../desk-thread.server";
import { AuditTrail, type AuditTrailLine } from "~/desk/ui/AuditTrail";
import { ClaimBanner, type ClaimState } from "~/desk/ui/ClaimBanner";

// The desk's contested-order screen: the buyer's evidence beside the seller's listing, the decision
// form while it is contested, and the whole timeline.

const linkClass = "font-medium text-walnut underline decoration-walnut/40 underline-offset-2 hover:text-walnut-deep";

export interface DeskOrderData {
  view: OrderDetailView;
  contest: ContestView | null;
  refundableMinor: number;
  claim: ClaimState | null;
  claimMinutes: number;
  trail: AuditTrailLine[];
  thread: DeskThread | null;
  sellerSuspended: boolean;
}

export function DeskOrderPage({ page, errors, values }: { page: DeskOrderData; errors: FieldErrors; values: Record<string, string> }) {
  const { view, contest, claim } = page;
  return (
    <main className="mx-auto w-full max-w-6xl space-y-6 px-4 pb-16 pt-6 sm:px-6">
      <OrderHead order={view} backTo={{ href: "/desk", label: "Review desk" }} />
      <div className="grid gap-8 lg:grid-cols-[minmax(0,1fr)_22rem]">
        <div className="min-w-0 space-y-6">
          {claim ? <ClaimBanner claim={claim} minutes={page.claimMinutes} /> : null}
          {page.sellerSuspended ? (
            <p
              role="status"
              className="rounded-md border border-fault bg-fault-wash px-4 py-3 text-sm text-ink"
              data-testid="seller-suspended"
            >
              <strong className="font-semibold">Seller suspended, under watch.</strong> This order runs on to its end; check each step here
              until it is released or refunded.
            </p>
          ) : null}
          <NextStep next={view.next} />
          {contest ? (
            <div className="grid gap-5 xl:grid-cols-2">
              <Card className="space-y-3" aria-labelledby="buyer-evidence">
                <h2 id="buyer-evidence" className="text-xl">
                  The buyer's side
                </h2>
                <p className="text-sm">
                  <span className="font-semibold text-ink">{contest.reason}</span>
                  <span className="text-ink-faint">
                    {" "}
                    · contested <When iso={contest.at} />
                  </span>
                </p>
                {contest.note ? (
                  <p className="whitespace-pre-line border-l-2 border-walnut/30 pl-3 text-sm text-ink-soft">{contest.note}</p>
                ) : null}
                <p className="text-xs text-ink-faint">
                  {contest.photoCount} photo{contest.photoCount === 1 ? "" : "s"} · {contest.captureCount} capture
                  {contest.captureCount === 1 ? "" : "s"}
                  {contest.equipment ? ` · measured with ${contest.equipment}` : ""}
                </p>
                <ContestPhotos photos={contest.photos} />
                <ContestCaptures captures={contest.captures} />
              </Card>
              <Card className="space-y-3" aria-labelledby="seller-evidence">
                <h2 id="seller-evidence" className="text-xl">
                  The seller's side
                </h2>
                <p className="text-sm text-ink-soft">
                  The listing as the buyer bought it, with its bench sheet, captures and restoration log, is the seller's evidence.
                </p>
                <ul className="space-y-1 text-sm">
                  <li>
                    <Link to={`/listings/${view.listing.id}`} className={linkClass}>
                      The listing and its bench sheet
                    </Link>
                  </li>
                  {page.thread ? (
                    <li>
                      <a href="#desk-thread" className={linkClass}>
                        Their conversation, below
                      </a>
                    </li>
                  ) : null}
                </ul>
              </Card>
            </div>
          ) : (
            <p className="rounded-panel border border-rule bg-card p-4 text-sm text-ink-soft">This order has not been contested.</p>
          )}
          {contest?.comparison ? (
            <Card>
              <RemeasureTable comparison={contest.comparison} title="The buyer's re-measurement against the bench sheet" />
            </Card>
          ) : contest ? (
            <p className="text-sm text-ink-soft">The buyer gave no readings of their own.</p>
          ) : null}
          {view.state === "contested" ? (
            <ResolveForm
              currency={view.money.currency}
              refundableMinor={page.refundableMinor}
              errors={errors}
              values={values}
              disabled={claim ? !claim.mine : false}
            />
          ) : contest?.resolutionNote ? (
            <Card className="space-y-1">
              <h2 className="text-xl">Decision</h2>
              <p className="text-sm text-ink-faint">{contest.resolvedBy ? `By ${contest.resolvedBy}` : null}</p>
              <p className="whitespace-pre-line text-sm text-ink">{contest.resolutionNote}</p>
            </Card>
          ) : null}
          <DeskThreadCard thread={page.thread} buyer={view.buyerName} seller={view.sellerName} />
          <AuditTrail items={page.trail} title="The order's trail" />
          <Timeline events={view.events} />
        </div>
        <aside className="space-y-5" aria-label="Money and delivery">
          <MoneyPanel money={view.money} viewer="moderator" state={view.state} />
          <DeliveryPanel order={view} />
        </aside>
      </div>
    </main>
  );
}
