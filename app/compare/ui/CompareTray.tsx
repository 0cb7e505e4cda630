import { Form, Link, useLocation } from "react-router";
import { buttonClass } from "~/components/Button";
import { MAX_COMPARED, compareHref } from "../selection";
import { useCompareList } from "../use-compare-list";
import { CompareIcon } from "./CompareToggle";

// Pages where units are chosen: the tray follows the visitor there while the list holds anything.
const TRAY_PAGES = [/^\/$/, /^\/market$/, /^\/listings\/[^/]+$/, /^\/watching$/];

/** A bar along the bottom of the window: how many units are chosen, the way to compare them, and clear. */
export function CompareTray() {
  const list = useCompareList();
  const { pathname, search } = useLocation();
  if (!list.length || !TRAY_PAGES.some((p) => p.test(pathname))) return null;
  return (
    <aside aria-label="Compare list" className="sticky bottom-0 z-30 border-t border-rule-strong bg-card/95 shadow-panel backdrop-blur-sm">
      <div className="mx-auto flex max-w-6xl items-center gap-3 px-4 py-2.5 sm:px-6">
        <CompareIcon chosen />
        <p className="min-w-0 flex-1 text-sm text-ink">
          <span className="figures font-semibold">{list.length}</span> of {MAX_COMPARED} chosen to compare
          {list.length === 1 ? <span className="hidden text-ink-faint sm:inline"> · add another to set them side by side</span> : null}
        </p>
        <Form method="post" action="/compare">
          <input type="hidden" name="intent" value="clear" />
          <input type="hidden" name="returnTo" value={`${pathname}${search}`} />
          <button type="submit" className={buttonClass("quiet", "sm")}>
            Clear
          </button>
        </Form>
        <Link to={compareHref(list)} className={buttonClass("primary", "sm")}>
          Compare
        </Link>
      </div>
    </aside>
  );
}
