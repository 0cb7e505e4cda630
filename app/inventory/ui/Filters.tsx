import { Form, Link, useSubmit } from "react-router";
import { CATEGORIES, CATEGORY_LABELS, LISTING_STATUS_LABELS } from "@shared/catalogue";
import { INVENTORY_STATES, inventoryParams, type InventoryQuery, type InventoryState } from "@shared/inventory";
import { Button } from "~/components/Button";
import { controlClass } from "~/components/Field";
import { cx } from "~/components/cx";

// The table's filters, all in the URL: state as a row of links with their counts (they wrap on a phone
// rather than scroll), category and text in a GET form. A changed category applies at once with
// JavaScript; the button applies without.

export function Filters({ query, stateCounts }: { query: InventoryQuery; stateCounts: Record<InventoryState, number> }) {
  const submit = useSubmit();
  const all = INVENTORY_STATES.reduce((n, s) => n + stateCounts[s], 0);
  const chip = (state: InventoryState | undefined, label: string, n: number) => {
    const active = query.state === state;
    return (
      <li key={state ?? "all"}>
        <Link
          to={`?${inventoryParams({ ...query, state, page: 1 })}`}
          preventScrollReset
          aria-current={active ? "true" : undefined}
          className={cx(
            "inline-flex h-8 items-center gap-1.5 rounded-full border px-3 text-sm no-underline",
            active ? "border-walnut bg-walnut text-card" : "border-rule-strong bg-card text-ink hover:border-walnut",
          )}
        >
          {label}
          <span className={cx("figures text-xs", active ? "text-card/80" : "text-ink-faint")}>{n}</span>
        </Link>
      </li>
    );
  };
  return (
    <div className="space-y-3">
      <ul className="flex flex-wrap gap-2" aria-label="State">
        {chip(undefined, "All", all)}
        {INVENTORY_STATES.map((s) => chip(s, LISTING_STATUS_LABELS[s], stateCounts[s]))}
      </ul>
      <Form method="get" className="flex flex-wrap items-end gap-3" preventScrollReset>
        {query.state ? <input type="hidden" name="state" value={query.state} /> : null}
        {query.sort !== "updated" ? <input type="hidden" name="sort" value={query.sort} /> : null}
        {query.dir ? <input type="hidden" name="dir" value={query.dir} /> : null}
        <label className="grid gap-1 text-xs font-medium text-ink-soft">
          Kind of unit
          <select
            name="category"
            defaultValue={query.category ?? ""}
            onChange={(e) => void submit(e.currentTarget.form, { preventScrollReset: true })}
            className={cx(controlClass, "h-9 w-auto py-1")}
          >
            <option value="">Every kind</option>
            {CATEGORIES.map((c) => (
              <option key={c} value={c}>
                {CATEGORY_LABELS[c].many}
              </option>
            ))}
          </select>
        </label>
        <label className="grid min-w-48 flex-1 gap-1 text-xs font-medium text-ink-soft sm:max-w-xs">
          Reference, maker or model
          <input type="search" name="q" defaultValue={query.q ?? ""} className={cx(controlClass, "h-9 py-1")} />
        </label>
        <Button type="submit" variant="secondary" size="sm" className="h-9">
          Filter
        </Button>
        {query.q || query.category ? (
          <Link to={`?${inventoryParams({ ...query, q: undefined, category: undefined, page: 1 })}`} className="self-center text-sm">
            Clear
          </Link>
        ) : null}
      </Form>
    </div>
  );
}
