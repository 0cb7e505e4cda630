// The words search engines show under our pages' titles. A route's `meta` replaces its parents', so
// each public page names its own description.
export const SITE_DESCRIPTION =
  "A market for used and vintage amplifiers, turntables, tape decks and loudspeakers whose bench measurements are checked against physics and the trade's standards.";

/** The market's description, for all categories or one (its plural label, e.g. "Phono stages"). */
export function marketDescription(many: string | null): string {
  const what = many ? many.toLowerCase() : "used and vintage hi-fi";
  return `Browse ${what} for sale on Loadline, each with the figures it measured on the bench and the conditions behind them; bench-verified units passed every check.`;
}
