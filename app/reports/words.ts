// What a report may say (isomorphic): a reason from a short list per kind of item, and a note.

export const LISTING_REPORT_REASONS = {
  not_as_described: "Not as described: the figures, condition or photos do not match the unit",
  suspected_fraud: "Looks like a scam: a price too good to be true, a seller who is not who they say",
  copied_photos: "The photos are someone else's",
  unsafe: "Unsafe: altered mains wiring, a missing earth, damage that makes it dangerous",
  abusive: "Offensive or abusive words",
  other: "Something else",
} as const;

export const THREAD_REPORT_REASONS = {
  pay_outside: "Asks to pay or talk outside Loadline",
  suspected_fraud: "Looks like a scam",
  abusive: "Abusive or threatening",
  spam: "Unwanted advertising",
  other: "Something else",
} as const;

export type ListingReportReason = keyof typeof LISTING_REPORT_REASONS;
export type ThreadReportReason = keyof typeof THREAD_REPORT_REASONS;

/** Every reason's words, for the desk (a report flag's reason is one of these codes). */
export const REPORT_REASON_LABELS: Record<string, string> = { ...LISTING_REPORT_REASONS, ...THREAD_REPORT_REASONS };

export const REPORT_NOTE_MIN = 10;
export const REPORT_NOTE_MAX = 1000;
