import { ORDER_TIME_FORMAT } from "@shared/orders";

// The site's one way of writing a moment ("2 Dec 2026, 14:05 UTC", shared/orders.ts), and its time
// of day alone ("14:05 UTC") for a claim that lapses within the hour.

export function deskMoment(at: Date | string): string {
  return `${ORDER_TIME_FORMAT.format(new Date(at))} UTC`;
}

export function untilTime(at: Date | string): string {
  const parts = ORDER_TIME_FORMAT.formatToParts(new Date(at));
  const part = (type: Intl.DateTimeFormatPartTypes) => parts.find((p) => p.type === type)?.value ?? "";
  return `${part("hour")}:${part("minute")} UTC`;
}
