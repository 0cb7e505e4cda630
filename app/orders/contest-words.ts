// The contest form's words, shared by the form, the server module and the pages that show a contest.

export const CONTEST_REASONS = ["measures_below_sheet", "fault", "damaged_in_transit", "not_as_described", "other"] as const;
export type ContestReason = (typeof CONTEST_REASONS)[number];

export const CONTEST_REASON_LABELS: Record<ContestReason, string> = {
  measures_below_sheet: "It measures worse than its bench sheet",
  fault: "A fault: it does not work as it should",
  damaged_in_transit: "It was damaged on the way",
  not_as_described: "It is not the unit described (condition, parts, service state)",
  other: "Something else",
};

export const CONTEST_NOTE_MAX = 4000;
export const CONTEST_PHOTOS_MAX = 8;
export const CONTEST_CAPTURES_MAX = 1;
/** The capture's stated conditions travel as `capture.volts`, `capture.loadOhm` … beside the contest's own fields. */
export const CAPTURE_FIELD_PREFIX = "capture.";
