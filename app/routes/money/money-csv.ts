import type { Route } from "./+types/money-csv";
import { requireRole } from "~/auth/guards.server";
import { moneyPage } from "~/money/page.server";
import { moneyCsv } from "~/money/csv";

// The money view's months as CSV, for the seller's bookkeeping.
export async function loader({ request }: Route.LoaderArgs) {
  const user = await requireRole(request, "seller");
  const { range, problem, books } = await moneyPage(user, new URL(request.url));
  if (problem)
    return new Response(problem, { status: 400, headers: { "Content-Type": "text/plain; charset=utf-8", "Cache-Control": "no-store" } });
  return new Response(moneyCsv(books), {
    headers: {
      "Content-Type": "text/csv; charset=utf-8",
      "Content-Disposition": `attachment; filename="loadline-money-${range.from}-to-${range.to}.csv"`,
      "Cache-Control": "private, no-store",
    },
  });
}
