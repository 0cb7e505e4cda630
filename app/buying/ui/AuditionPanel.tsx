import type { ListedFigure } from "@shared/bench/remeasure";
import { HeavyUnit } from "~/components/cautions/HeavyUnit";
import { AcceptWithReadingsForm } from "~/orders/ui/AcceptWithReadingsForm";
import { ContestForm } from "~/orders/ui/ContestForm";
import type { OrderDetailView } from "../order-view";
import { ActionCard } from "./OrderActions";
import { When } from "./OrderParts";

// The buyer's audition window: how long it runs, then accept (with their own figures if they measured)
// or, folded away until wanted, contest. Both forms carry the receiving-safely cautions before the
// readings boxes.

export interface AuditionResult {
  form: "accept" | "contest";
  errors: Record<string, string>;
  values: Record<string, string>;
}

export function AuditionPanel({
  order,
  figures,
  weightG,
  result,
}: {
  order: OrderDetailView;
  figures: readonly ListedFigure[];
  weightG: number | null;
  result: AuditionResult | null;
}) {
  const contestOpen = result?.form === "contest";
  return (
    <div className="space-y-6">
      <ActionCard title="Your audition window" id="audition-heading">
        <p className="text-sm text-ink-soft">
          Listen to it, and measure it if you can
          {order.delivery.auditionEndsAt ? (
            <>
              , until <When iso={order.delivery.auditionEndsAt} className="font-medium text-ink" />
            </>
          ) : null}
          . Accept it when you are happy; if something is wrong, contest it before the window closes. With no action the money is released
          to the seller when it closes.
        </p>
        <HeavyUnit weightG={weightG} context="arrival" headingLevel={3} />
      </ActionCard>
      <div className="rounded-panel border border-rule bg-card p-5 shadow-panel sm:p-6">
        <AcceptWithReadingsForm
          figures={figures}
          errors={result?.form === "accept" ? result.errors : {}}
          values={result?.form === "accept" ? result.values : {}}
        />
      </div>
      <details open={contestOpen} className="group rounded-panel border border-rule bg-card shadow-panel">
        <summary className="cursor-pointer list-none px-5 py-4 font-medium text-ink marker:hidden sm:px-6">
          <span className="flex items-center justify-between gap-3">
            <span>Something wrong? Contest the order</span>
            <span aria-hidden="true" className="text-ink-faint transition-transform group-open:rotate-180">
              ▾
            </span>
          </span>
        </summary>
        <div className="border-t border-rule px-5 pb-6 pt-4 sm:px-6">
          <ContestForm figures={figures} errors={contestOpen ? result.errors : {}} values={contestOpen ? result.values : {}} />
        </div>
      </details>
    </div>
  );
}
