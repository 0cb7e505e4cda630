// The one way Loadline writes dates and moments, on every page (isomorphic, always UTC so the server's
// HTML and the hydrated page agree): a day "2 Dec 2026", a moment "2 Dec 2026, 14:05 UTC", a month
// "December 2026", a time of day "14:05 UTC".

const DAY = new Intl.DateTimeFormat("en-GB", { day: "numeric", month: "short", year: "numeric", timeZone: "UTC" });
const MOMENT = new Intl.DateTimeFormat("en-GB", {
  day: "numeric",
  month: "short",
  year: "numeric",
  hour: "2-digit",
  minute: "2-digit",
  hourCycle: "h23",
  timeZone: "UTC",
});
const MONTH = new Intl.DateTimeFormat("en-GB", { month: "long", year: "numeric", timeZone: "UTC" });

type When = Date | string;

/** A Date, an ISO timestamp or a calendar date ("2026-12-02", read as that day in UTC). */
function toDate(at: When): Date {
  return typeof at === "string" ? new Date(/^\d{4}-\d{2}-\d{2}$/.test(at) ? `${at}T00:00:00Z` : at) : at;
}

/** "2 Dec 2026". */
export function dayText(at: When): string {
  return DAY.format(toDate(at));
}

/** "2 Dec 2026, 14:05 UTC". */
export function momentText(at: When): string {
  return `${MOMENT.format(toDate(at))} UTC`;
}

/** "14:05 UTC", for something that lapses within the day. */
export function timeOfDayText(at: When): string {
  const parts = MOMENT.formatToParts(toDate(at));
  const part = (type: Intl.DateTimeFormatPartTypes) => parts.find((p) => p.type === type)?.value ?? "";
  return `${part("hour")}:${part("minute")} UTC`;
}

/** "December 2026", for "member since" and the like. */
export function monthText(at: When): string {
  return MONTH.format(toDate(at));
}
