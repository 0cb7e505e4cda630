import type { CurrencyBook, MonthRow } from "./monthly.server";
import { monthName } from "./months";

// The money view for bookkeeping: one line per month and currency. Amounts are written as decimal
// numbers in the currency's own unit (two places for EUR and GBP, none for JPY), point as separator,
// no grouping, so a spreadsheet reads them as numbers, with the currency's code on every line
// (docs/decisions/0033). The arithmetic stays in integer minor units until the last step.

const COLUMNS: { title: string; key: keyof Omit<MonthRow, "month"> }[] = [
  { title: "Sales (buyers' payments)", key: "salesMinor" },
  { title: "Refunds to buyers", key: "refundsMinor" },
  { title: "Loadline fees", key: "feesMinor" },
  { title: "Released to you", key: "releasedMinor" },
  { title: "Paid out", key: "payoutsMinor" },
  { title: "Pending release at month end", key: "pendingReleaseMinor" },
  { title: "Awaiting payout at month end", key: "awaitingPayoutMinor" },
];

/** The currency's decimal places, as Intl knows them (ISO 4217). */
export function minorDigits(currency: string): number {
  return new Intl.NumberFormat("en", { style: "currency", currency }).resolvedOptions().maximumFractionDigits ?? 2;
}

/** 123456 EUR → "1234.56"; −5 → "-0.05"; JPY 1200 → "1200". No floating point on the way. */
export function decimalAmount(minor: number, currency: string): string {
  const digits = minorDigits(currency);
  const sign = minor < 0 ? "-" : "";
  const whole = String(Math.abs(minor)).padStart(digits + 1, "0");
  return digits === 0 ? `${sign}${whole}` : `${sign}${whole.slice(0, -digits)}.${whole.slice(-digits)}`;
}

function cell(value: string): string {
  return /[",\n\r]/.test(value) ? `"${value.replace(/"/g, '""')}"` : value;
}

export function moneyCsv(books: CurrencyBook[]): string {
  const header = ["Month", "Month name", "Currency", ...COLUMNS.map((c) => c.title)];
  const lines = [header.map(cell).join(",")];
  for (const b of books) {
    for (const m of b.months) {
      lines.push([m.month, monthName(m.month), b.currency, ...COLUMNS.map((c) => decimalAmount(m[c.key], b.currency))].map(cell).join(","));
    }
  }
  // CRLF, as RFC 4180 writes it.
  return `${lines.join("\r\n")}\r\n`;
}
