import { formatPrice } from "@shared/money";
import type { CurrencyBook, MonthRow } from "../monthly.server";
import { monthName } from "../months";

// Every number behind the chart, month by month, with the range's totals.

const COLUMNS: { key: keyof Omit<MonthRow, "month">; label: string }[] = [
  { key: "salesMinor", label: "Sales" },
  { key: "refundsMinor", label: "Refunds" },
  { key: "feesMinor", label: "Fees" },
  { key: "releasedMinor", label: "Released to you" },
  { key: "payoutsMinor", label: "Paid out" },
  { key: "pendingReleaseMinor", label: "Held at month end" },
  { key: "awaitingPayoutMinor", label: "Awaiting payout" },
];

const th = "border-b border-rule px-3 py-2 text-right text-xs font-semibold text-ink-soft first:text-left";
const td = "border-b border-rule/60 px-3 py-2 text-right figures text-[0.8125rem] whitespace-nowrap";

export function MoneyTable({ book }: { book: CurrencyBook }) {
  return (
    <div className="scroll-hint overflow-x-auto rounded-panel border border-rule bg-card">
      <table className="min-w-full">
        <caption className="sr-only">{book.currency} per month</caption>
        <thead>
          <tr>
            <th scope="col" className={th}>
              Month
            </th>
            {COLUMNS.map((c) => (
              <th key={c.key} scope="col" className={th}>
                {c.label}
              </th>
            ))}
          </tr>
        </thead>
        <tbody>
          {book.months.map((m) => (
            <tr key={m.month}>
              <th scope="row" className="border-b border-rule/60 px-3 py-2 text-left text-sm font-medium whitespace-nowrap">
                {monthName(m.month)}
              </th>
              {COLUMNS.map((c) => (
                <td key={c.key} className={`${td} ${m[c.key] === 0 ? "text-ink-faint" : ""}`}>
                  {formatPrice(m[c.key], book.currency)}
                </td>
              ))}
            </tr>
          ))}
        </tbody>
        <tfoot>
          <tr>
            <th scope="row" className="px-3 py-2 text-left text-sm font-semibold">
              Total
            </th>
            {COLUMNS.map((c) => (
              <td key={c.key} className="px-3 py-2 text-right figures text-[0.8125rem] font-semibold whitespace-nowrap">
                {c.key in book.totals ? formatPrice(book.totals[c.key as keyof CurrencyBook["totals"]], book.currency) : ""}
              </td>
            ))}
          </tr>
        </tfoot>
      </table>
    </div>
  );
}
