import { useEffect, useRef } from "react";
import { NavLink, useLocation } from "react-router";
import { cx } from "~/components/cx";
import { EDITOR_STEPS, type EditorStep } from "@shared/listing-draft";

/** The editor's steps as numbered tabs; a tick where the step has what publishing needs. */
export function StepNav({ listingId, done }: { listingId: string; done: Partial<Record<EditorStep, boolean>> }) {
  const nav = useRef<HTMLElement>(null);
  const { pathname } = useLocation();
  // On a phone the tabs scroll sideways: keep the current step in view.
  useEffect(() => {
    nav.current?.querySelector('[aria-current="page"]')?.scrollIntoView({ block: "nearest", inline: "center" });
  }, [pathname]);
  return (
    <nav ref={nav} aria-label="Listing steps" className="scroll-hint -mx-4 overflow-x-auto px-4 sm:mx-0 sm:px-0">
      <ol className="flex min-w-max gap-1 border-b border-rule">
        {EDITOR_STEPS.map((s, i) => (
          <li key={s.id}>
            <NavLink
              to={`/sell/${listingId}/${s.id}`}
              className={({ isActive }) =>
                cx(
                  "relative flex h-11 items-center gap-2 rounded-t-md px-3 text-sm font-medium no-underline transition-colors",
                  isActive
                    ? "bg-card text-walnut-deep after:absolute after:inset-x-2 after:-bottom-px after:h-0.5 after:bg-walnut"
                    : "text-ink-soft hover:bg-sunk hover:text-ink",
                )
              }
            >
              <span
                aria-hidden="true"
                className={cx(
                  "figures inline-flex size-5 items-center justify-center rounded-full text-[0.6875rem]",
                  done[s.id] ? "bg-trace text-card" : "border border-rule-strong text-ink-faint",
                )}
              >
                {done[s.id] ? "✓" : i + 1}
              </span>
              {s.label}
              {done[s.id] ? <span className="sr-only"> (complete)</span> : null}
            </NavLink>
          </li>
        ))}
      </ol>
    </nav>
  );
}
