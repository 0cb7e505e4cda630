import { Card } from "~/components/Card";
import { formatPrice } from "@shared/money";
import type { IndexGroup } from "@shared/price-index";
import type { SoldPriceIndex } from "../price-index.server";

// The sold-price index on a listing page: what this maker and model sold for on Loadline, in the
// listing's currency, all sales and then split by the bench-verified mark.

const panelTitle = "font-sans text-xs font-semibold uppercase tracking-[0.14em] text-brass-ink";

function Row({ label, group, currency }: { label: string; group: IndexGroup; currency: string }) {
  return (
    <tr className="border-t border-rule">
      <th scope="row" className="py-1.5 pr-3 text-left font-normal text-ink-soft">
        {label}
      </th>
      <td className="figures py-1.5 pr-3 text-right">{formatPrice(group.medianMinor, currency)}</td>
      <td className="figures py-1.5 pr-3 text-right text-ink-soft">
        {group.lowMinor === group.highMinor
          ? formatPrice(group.lowMinor, currency)
          : `${formatPrice(group.lowMinor, currency)} – ${formatPrice(group.highMinor, currency)}`}
      </td>
      <td className="figures py-1.5 text-right">{group.count}</td>
    </tr>
  );
}

export function SoldPriceIndexPanel({ index, title }: { index: SoldPriceIndex; title: string }) {
  return (
    <Card className="space-y-3" aria-labelledby="index-heading" data-testid="sold-price-index">
      <h2 id="index-heading" className={panelTitle}>
        Sold-price index
      </h2>
      <p className="text-sm text-ink-soft">What {title} units sold for on Loadline, orders completed without a refund.</p>
      <div className="overflow-x-auto">
        <table className="w-full text-sm">
          <thead>
            <tr className="text-xs text-ink-faint">
              <th scope="col" className="pb-1 text-left font-normal">
                <span className="sr-only">Sales</span>
              </th>
              <th scope="col" className="pb-1 pr-3 text-right font-normal">
                Median
              </th>
              <th scope="col" className="pb-1 pr-3 text-right font-normal">
                Range
              </th>
              <th scope="col" className="pb-1 text-right font-normal">
                Sales
              </th>
            </tr>
          </thead>
          <tbody>
            <Row label="All" group={index.all} currency={index.currency} />
            {index.verified ? <Row label="Bench-verified" group={index.verified} currency={index.currency} /> : null}
            {index.unverified ? <Row label="Not verified" group={index.unverified} currency={index.currency} /> : null}
          </tbody>
        </table>
      </div>
      <p className="text-xs text-ink-faint">Sales in other currencies are converted at today's rates.</p>
    </Card>
  );
}
