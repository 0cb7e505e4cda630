import { timeOfDayText } from "@shared/dates";

/** What claimForViewer said, as plain loader data (until is an ISO time). */
export type ClaimState = { mine: true } | { mine: false; by: string; until: string };

/**
 * Above an item's actions: either "you have this" or who holds it and until when. The page disables
 * its actions when it is not ours (the server refuses them anyway).
 */
export function ClaimBanner({ claim, minutes }: { claim: ClaimState; minutes: number }) {
  if (claim.mine) {
    return (
      <p className="rounded-panel border border-rule bg-sunk px-4 py-2 text-sm text-ink-soft" data-testid="claim-banner">
        You have taken this item for {minutes} minutes; other moderators see it as yours until you act or it lapses.
      </p>
    );
  }
  return (
    <p
      role="status"
      className="rounded-panel border border-brass/50 bg-brass-wash px-4 py-2 text-sm text-brass-ink"
      data-testid="claim-banner"
    >
      Taken by <strong className="font-semibold">{claim.by}</strong> until <span className="figures">{timeOfDayText(claim.until)}</span>.
      Its actions are closed to you until then.
    </p>
  );
}
