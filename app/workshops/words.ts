// Words and dates for the workshop pages (isomorphic).

/** "2 Dec 2026": a day as the rest of the site writes it (UTC). */
const DAY = new Intl.DateTimeFormat("en-GB", { day: "numeric", month: "short", year: "numeric", timeZone: "UTC" });
export function dayText(at: Date | string): string {
  return DAY.format(typeof at === "string" ? new Date(at) : at);
}

export function sizeText(bytes: number): string {
  return bytes >= 1024 * 1024 ? `${(bytes / (1024 * 1024)).toFixed(1)} MB` : `${Math.max(1, Math.round(bytes / 1024))} kB`;
}

export const APPLICATION_STATUS_LABELS = { waiting: "Waiting for the desk", verified: "Verified", refused: "Refused" } as const;
