import { useState } from "react";
import { ACTION_LABELS } from "@shared/inventory";
import { Button } from "~/components/Button";
import { controlClass } from "~/components/Field";
import { cx } from "~/components/cx";
import { useHydrated } from "~/catalogue/ui/use-hydrated";

// The bulk form's controls: what to do with the selected units and its one figure (a percentage or a
// number of days). Plain named fields, so the form posts without JavaScript; with it, the view reads
// the same form and calls the API. Withdrawing asks once more before it goes.

export function BulkBar({
  count,
  busy,
  confirming,
  onCancelConfirm,
  initialIntent,
}: {
  count: number;
  busy: boolean;
  /** A withdrawal waiting for "Yes, withdraw". */
  confirming: boolean;
  onCancelConfirm: () => void;
  initialIntent?: string;
}) {
  const [intent, setIntent] = useState(initialIntent ?? "publish");
  // Without JavaScript the page cannot count the ticks: the bar speaks of "the selected units".
  const hydrated = useHydrated();
  const units = !hydrated ? "the selected units" : count === 1 ? "1 unit" : `${count} units`;
  if (confirming)
    return (
      <div
        className="flex flex-wrap items-center gap-3 rounded-md border border-fault/40 bg-fault-wash px-4 py-3"
        role="group"
        aria-label="Confirm"
      >
        <p className="text-sm text-ink">
          Withdraw {units}? {count === 1 ? "It leaves" : "They leave"} the market at once; buyers watching see {count === 1 ? "it" : "them"}{" "}
          as withdrawn. You can publish again later.
        </p>
        <input type="hidden" name="intent" value="withdraw" />
        <div className="flex gap-2">
          <Button type="submit" name="confirm" value="yes" variant="danger" size="sm" busy={busy}>
            Yes, withdraw {units}
          </Button>
          <Button type="button" variant="quiet" size="sm" onClick={onCancelConfirm}>
            Cancel
          </Button>
        </div>
      </div>
    );
  return (
    <div className="flex flex-wrap items-end gap-3 rounded-md border border-rule bg-card px-4 py-3 shadow-panel">
      {hydrated ? (
        <p className="w-full text-sm text-ink-soft sm:w-auto sm:self-center" aria-live="polite">
          <span className="figures font-semibold text-ink">{count}</span> selected
        </p>
      ) : (
        <p className="w-full text-sm text-ink-soft">Tick the units below, choose what to do, then apply.</p>
      )}
      <label className="grid gap-1 text-xs font-medium text-ink-soft">
        Action
        <select name="intent" value={intent} onChange={(e) => setIntent(e.target.value)} className={cx(controlClass, "h-9 w-auto py-1")}>
          {Object.entries(ACTION_LABELS).map(([value, label]) => (
            <option key={value} value={value}>
              {label}
            </option>
          ))}
        </select>
      </label>
      {/* Both figures are always in the form (a no-JS visitor may change the action after the page loaded); only the one that applies shows. */}
      <label
        className={cx("grid gap-1 text-xs font-medium text-ink-soft", hydrated && intent !== "reprice" && "hidden")}
        data-for="reprice"
      >
        Change, %
        <input name="percent" inputMode="decimal" placeholder="-10" className={cx(controlClass, "figures h-9 w-24 py-1")} />
      </label>
      <label
        className={cx("grid gap-1 text-xs font-medium text-ink-soft", hydrated && intent !== "handling" && "hidden")}
        data-for="handling"
      >
        Handling, days
        <input name="handlingDays" inputMode="numeric" placeholder="3" className={cx(controlClass, "figures h-9 w-20 py-1")} />
      </label>
      <Button type="submit" size="sm" className="h-9" busy={busy} disabled={hydrated && count === 0}>
        Apply to {units}
      </Button>
    </div>
  );
}
