import { useEffect, useState } from "react";
import { Button } from "~/components/Button";
import { cx } from "~/components/cx";
import { describeSave, type SaveState } from "./useAutosave";

/** The foot of a step form: what the autosave did, Save, and Save and go on. Works without JavaScript. */
export function SaveBar({
  state,
  busy,
  next,
  disabled,
  notice,
}: {
  state?: SaveState;
  busy?: boolean;
  next?: { label: string; short?: string };
  disabled?: boolean;
  /** The last explicit save's answer. */ notice?: string;
}) {
  const bad = state?.status === "invalid" || state?.status === "failed";
  // Autosave needs JavaScript; until it runs, the page says how saving works without it.
  const [live, setLive] = useState(false);
  useEffect(() => setLive(true), []);
  return (
    <div className="sticky bottom-0 z-10 -mx-4 border-t border-rule bg-paper/95 px-4 py-3 backdrop-blur-sm sm:mx-0 sm:rounded-b-panel sm:px-0">
      <div className="flex items-center justify-between gap-3">
        <p
          aria-live="polite"
          className={cx("min-w-0 text-xs sm:text-sm", bad ? "font-medium text-fault" : "text-ink-faint")}
          data-save-status={state?.status ?? "idle"}
        >
          {notice && (!state || state.status === "idle")
            ? notice
            : state && live
              ? describeSave(state)
              : "Save when you are done with this step."}
        </p>
        <div className="flex shrink-0 gap-2">
          <Button type="submit" name="intent" value="save" variant="secondary" busy={busy} disabled={disabled}>
            Save
          </Button>
          {next ? (
            <Button type="submit" name="intent" value="next" disabled={disabled || busy}>
              <span className="sm:hidden">{next.short ?? "Next"}</span>
              <span className="hidden sm:inline">{next.label}</span>
            </Button>
          ) : null}
        </div>
      </div>
    </div>
  );
}
