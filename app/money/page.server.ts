import type { SessionUser } from "~/auth/guards.server";
import { MonthRangeSchema, moneyByMonth, monthRange } from "./monthly.server";

// The money view's input: ?from=YYYY-MM&to=YYYY-MM, both optional (the last twelve months). A range
// that does not parse is answered with the default one and the reason, so the page still shows.

export async function moneyPage(user: SessionUser, url: URL, now = new Date()) {
  const parsed = MonthRangeSchema.safeParse({
    from: url.searchParams.get("from") || undefined,
    to: url.searchParams.get("to") || undefined,
  });
  const range = monthRange(parsed.success ? parsed.data : {}, now);
  return {
    range,
    problem: parsed.success ? null : parsed.error.issues[0].message,
    books: await moneyByMonth(user.id, range),
  };
}
export type MoneyPageData = Awaited<ReturnType<typeof moneyPage>>;
