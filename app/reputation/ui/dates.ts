// Dates as the rest of the site writes a day ("2 December 2026", UTC), as the restoration log does.
const dayFormat = new Intl.DateTimeFormat("en-GB", { day: "numeric", month: "long", year: "numeric", timeZone: "UTC" });

export function reviewDate(iso: string): string {
  return dayFormat.format(new Date(iso));
}
