import type { FormEvent } from "react";
import { Link, useFetcher, useLocation } from "react-router";
import { Button } from "~/components/Button";
import { cx } from "~/components/cx";
import type { CompareActionResult } from "../types";
import { MAX_COMPARED, compareHref } from "../selection";
import { useCompareList } from "../use-compare-list";

/**
 * Add a unit to the compare list or take it off. Without JavaScript a plain form posts to /compare and
 * comes back here; with it, the state shows at once and the list in the header follows.
 */
export function CompareToggle({
  listingId,
  layout = "card",
  className,
}: {
  listingId: string;
  layout?: "card" | "page";
  className?: string;
}) {
  const list = useCompareList();
  const fetcher = useFetcher<CompareActionResult>();
  const location = useLocation();
  const asked = fetcher.formData?.get("intent");
  const chosen = asked === "add" || asked === "remove" ? asked === "add" : list.includes(listingId);
  const problem = fetcher.state === "idle" && fetcher.data && !fetcher.data.ok ? fetcher.data.reason : null;
  const card = layout === "card";

  function onSubmit(e: FormEvent<HTMLFormElement>) {
    e.preventDefault();
    if (fetcher.state !== "idle") return;
    void fetcher.submit({ intent: chosen ? "remove" : "add", listingId }, { method: "post", action: "/compare" });
  }

  return (
    <form
      method="post"
      action="/compare"
      onSubmit={onSubmit}
      className={cx(card ? "relative z-10 flex flex-col items-end" : "flex flex-wrap items-center gap-x-3 gap-y-1", className)}
    >
      <input type="hidden" name="intent" value={chosen ? "remove" : "add"} />
      <input type="hidden" name="listingId" value={listingId} />
      <input type="hidden" name="returnTo" value={`${location.pathname}${location.search}`} />
      <Button
        type="submit"
        size="sm"
        variant="secondary"
        aria-pressed={chosen}
        data-compare-toggle={listingId}
        className={cx(card && "bg-card/95 shadow-panel backdrop-blur-sm", chosen && "border-trace/50 text-trace")}
      >
        <CompareIcon chosen={chosen} />
        {/* The name holds the visible words; pressing a chosen unit's button takes it off the list. */}
        {chosen ? (
          "Comparing"
        ) : card ? (
          <>
            <span className="sr-only">Add to </span>Compare
          </>
        ) : (
          "Add to compare"
        )}
      </Button>
      {!card && list.length ? (
        <Link to={compareHref(list)} className="text-sm font-medium text-walnut underline decoration-walnut/30 underline-offset-2">
          Open compare ({list.length} of {MAX_COMPARED})
        </Link>
      ) : null}
      <p
        role="status"
        className={cx(
          problem ? "text-fault" : "sr-only",
          card ? "mt-1.5 max-w-56 rounded-md bg-card/95 px-2 py-1 text-right text-xs shadow-panel" : "basis-full text-xs",
          !problem && "sr-only",
        )}
      >
        {problem ?? ""}
      </p>
    </form>
  );
}

/** Two columns side by side; a tick in the second once chosen. */
export function CompareIcon({ chosen = false }: { chosen?: boolean }) {
  // One path while not chosen: the icon is drawn on every card of a list, and each element counts.
  const columns =
    "M3.2 3.5h4.1a1.2 1.2 0 0 1 1.2 1.2v10.6a1.2 1.2 0 0 1-1.2 1.2H3.2A1.2 1.2 0 0 1 2 15.3V4.7a1.2 1.2 0 0 1 1.2-1.2z" +
    "M12.7 3.5h4.1a1.2 1.2 0 0 1 1.2 1.2v10.6a1.2 1.2 0 0 1-1.2 1.2h-4.1a1.2 1.2 0 0 1-1.2-1.2V4.7a1.2 1.2 0 0 1 1.2-1.2z";
  return (
    <svg aria-hidden="true" viewBox="0 0 20 20" className="size-4">
      {chosen ? (
        <>
          <path d={columns} fill="none" stroke="currentColor" strokeWidth="1.5" />
          <rect x="11.5" y="3.5" width="6.5" height="13" rx="1.2" fill="currentColor" />
          <path d="M12.9 10.2l1.5 1.5 2.3-2.9" fill="none" stroke="var(--color-card)" strokeWidth="1.5" strokeLinecap="round" />
        </>
      ) : (
        <path d={`${columns}M14.75 7.5v5M12.25 10h5`} fill="none" stroke="currentColor" strokeWidth="1.5" strokeLinecap="round" />
      )}
    </svg>
  );
}
