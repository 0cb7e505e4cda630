import { useState, type FormEvent } from "react";
import { useMutation } from "@tanstack/react-query";
import { sendWatch, WatchError } from "~/listings/watch-client";
import { Button } from "./Button";
import { cx } from "./cx";

/**
 * Watch or stop watching a unit. With JavaScript the new state shows at once and the API confirms it;
 * if the server refuses, the button returns to what was saved and says why. Without JavaScript it is
 * a plain form posted to `action` (the listing page, or the watch list).
 */
export function WatchButton({
  listingId,
  watching: saved,
  action,
  layout = "page",
  className,
}: {
  listingId: string;
  watching: boolean;
  /** Where the form posts without JavaScript; the current page when left out. */
  action?: string;
  layout?: "page" | "card";
  className?: string;
}) {
  // What the server last confirmed; follows the loader when it sends a newer state.
  const [confirmed, setConfirmed] = useState(saved);
  const [seen, setSeen] = useState(saved);
  if (seen !== saved) {
    setSeen(saved);
    setConfirmed(saved);
  }
  const [problem, setProblem] = useState<string | null>(null);
  const mutation = useMutation({
    mutationKey: ["watch", listingId],
    mutationFn: (watch: boolean) => sendWatch(listingId, watch),
    onMutate: () => setProblem(null),
    onSuccess: (r) => setConfirmed(r.watching),
    onError: (e) => setProblem(`Not saved: ${e instanceof WatchError ? e.message : "something went wrong; try again."}`),
  });
  // Optimistic: while the request is out, show the state asked for; on error it falls back to `confirmed`.
  const watching = mutation.isPending ? mutation.variables : confirmed;

  function onSubmit(e: FormEvent<HTMLFormElement>) {
    e.preventDefault();
    if (!mutation.isPending) mutation.mutate(!watching);
  }

  const card = layout === "card";
  const label = card ? (watching ? "Watching" : "Watch") : watching ? "Watching" : "Watch this unit";
  return (
    <form
      method="post"
      action={action}
      onSubmit={onSubmit}
      className={cx(card ? "relative z-10 flex flex-col items-end" : "space-y-1", className)}
    >
      <input type="hidden" name="intent" value={watching ? "unwatch" : "watch"} />
      <input type="hidden" name="listingId" value={listingId} />
      <Button
        type="submit"
        size={card ? "sm" : "md"}
        variant={watching ? "secondary" : card ? "secondary" : "primary"}
        aria-pressed={watching}
        aria-label={card ? `${watching ? "Stop watching" : "Watch"} this unit` : undefined}
        className={cx(card ? "bg-card/95 shadow-panel backdrop-blur-sm" : "w-full sm:w-auto", watching && card && "text-walnut-deep")}
      >
        <EyeIcon filled={watching} />
        {label}
      </Button>
      <p
        role="status"
        className={cx(
          problem ? "text-fault" : "text-ink-faint",
          card ? (problem ? "mt-1.5 max-w-56 rounded-md bg-card/95 px-2 py-1 text-right text-xs shadow-panel" : "sr-only") : "text-xs",
        )}
      >
        {problem ?? (card ? "" : watching ? "Press again to stop watching." : "Keep it on your watch list.")}
      </p>
    </form>
  );
}

export function EyeIcon({ filled = false }: { filled?: boolean }) {
  return (
    <svg aria-hidden="true" viewBox="0 0 20 20" className="size-4">
      <path d="M1.8 10s3-5.5 8.2-5.5S18.2 10 18.2 10s-3 5.5-8.2 5.5S1.8 10 1.8 10z" fill="none" stroke="currentColor" strokeWidth="1.6" />
      <circle cx="10" cy="10" r="2.6" fill={filled ? "currentColor" : "none"} stroke="currentColor" strokeWidth="1.6" />
    </svg>
  );
}
