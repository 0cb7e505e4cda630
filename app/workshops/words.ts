// Words for the workshop pages (isomorphic); dates are shared/dates.ts.

export function sizeText(bytes: number): string {
  return bytes >= 1024 * 1024 ? `${(bytes / (1024 * 1024)).toFixed(1)} MB` : `${Math.max(1, Math.round(bytes / 1024))} kB`;
}

export const APPLICATION_STATUS_LABELS = { waiting: "Waiting for the desk", verified: "Verified", refused: "Refused" } as const;
