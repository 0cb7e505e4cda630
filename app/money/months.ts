// Calendar months as "YYYY-MM" (UTC): they sort as text, and the ledger's SQL writes them the same way.

/** "2026-11". */
export type Month = string;

export function monthOf(date: Date): Month {
  return date.toISOString().slice(0, 7);
}

export function addMonths(month: Month, n: number): Month {
  const [y, m] = month.split("-").map(Number);
  const index = y * 12 + (m - 1) + n;
  return `${Math.floor(index / 12)}-${String((index % 12) + 1).padStart(2, "0")}`;
}

/** Every month from `from` to `to`, both included. */
export function monthsBetween(from: Month, to: Month): Month[] {
  const out: Month[] = [];
  for (let m = from; m <= to && out.length < 1200; m = addMonths(m, 1)) out.push(m);
  return out;
}

const NAME = new Intl.DateTimeFormat("en-GB", { month: "short", year: "numeric", timeZone: "UTC" });
const SHORT = new Intl.DateTimeFormat("en-GB", { month: "short", timeZone: "UTC" });

/** "Nov 2026"; `short`: "Nov". */
export function monthName(month: Month, short = false): string {
  return (short ? SHORT : NAME).format(new Date(`${month}-01T00:00:00Z`));
}
