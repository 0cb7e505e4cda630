import { data, Form, Link } from "react-router";
import type { Route } from "./+types/money";
import { requireRole } from "~/auth/guards.server";
import { moneyPage } from "~/money/page.server";
import { MoneyChart } from "~/money/ui/MoneyChart";
import { MoneyTable } from "~/money/ui/MoneyTable";
import { monthName } from "~/money/months";
import { PageHeader } from "~/components/PageHeader";
import { Button, buttonClass } from "~/components/Button";
import { formatPrice } from "@shared/money";

// The seller's money per month from the escrow ledger: a chart, every number in a table, and the same
// months as CSV for the bookkeeping.

export const meta: Route.MetaFunction = () => [{ title: "Money · Loadline" }, { name: "robots", content: "noindex" }];

export async function loader({ request }: Route.LoaderArgs) {
  const user = await requireRole(request, "seller");
  return data(await moneyPage(user, new URL(request.url)), { headers: { "Cache-Control": "private, no-store" } });
}

export default function Money({ loaderData }: Route.ComponentProps) {
  const { range, problem, books } = loaderData;
  const query = new URLSearchParams({ from: range.from, to: range.to }).toString();
  return (
    <main className="mx-auto w-full max-w-5xl space-y-8 px-4 py-8 sm:px-6 sm:py-10">
      <PageHeader
        overline="Selling"
        title="Money"
        lede={`What buyers paid for your units, Loadline's fees, what reached your account and what is still held, ${monthName(range.from)} to ${monthName(range.to)} (months in UTC).`}
        actions={
          <a href={`/sales/money.csv?${query}`} className={buttonClass("secondary")} download>
            Download CSV
          </a>
        }
      />
      <Form method="get" className="flex flex-wrap items-end gap-3" aria-label="Months to show">
        <label className="space-y-1 text-sm">
          <span className="block font-medium text-ink-soft">From</span>
          <input type="month" name="from" defaultValue={range.from} className="rounded-md border border-rule-strong bg-card px-3 py-2" />
        </label>
        <label className="space-y-1 text-sm">
          <span className="block font-medium text-ink-soft">To</span>
          <input type="month" name="to" defaultValue={range.to} className="rounded-md border border-rule-strong bg-card px-3 py-2" />
        </label>
        <Button type="submit" variant="secondary">
          Show
        </Button>
        {problem ? (
          <p role="alert" className="w-full text-sm text-fault">
            {problem} Showing the last twelve months instead.
          </p>
        ) : null}
      </Form>
      {books.length === 0 ? (
        <p className="rounded-panel border border-rule bg-card p-6 text-ink-soft">
          No money has moved for your sales up to {monthName(range.to)}. <Link to="/sales">Your sales</Link>
        </p>
      ) : (
        books.map((book) => {
          const last = book.months[book.months.length - 1];
          const tiles = [
            { label: "Sales", value: book.totals.salesMinor },
            { label: "Loadline fees", value: book.totals.feesMinor },
            { label: "Paid out to you", value: book.totals.payoutsMinor },
            { label: `Held in escrow, end of ${monthName(last.month)}`, value: last.pendingReleaseMinor },
          ];
          return (
            <section key={book.currency} aria-labelledby={`money-${book.currency}`} className="space-y-5">
              <h2 id={`money-${book.currency}`} className="text-2xl">
                In {book.currency}
              </h2>
              <dl className="grid grid-cols-2 gap-3 sm:grid-cols-4">
                {tiles.map((t) => (
                  <div key={t.label} className="rounded-panel border border-rule bg-card p-4 shadow-panel">
                    <dt className="text-xs text-ink-soft">{t.label}</dt>
                    <dd className="figures mt-1 text-xl">{formatPrice(t.value, book.currency)}</dd>
                  </div>
                ))}
              </dl>
              <div className="rounded-panel border border-rule bg-card p-4 shadow-panel sm:p-5">
                <MoneyChart book={book} />
              </div>
              <MoneyTable book={book} />
            </section>
          );
        })
      )}
    </main>
  );
}
