import { Link } from "react-router";
import { dayText } from "@shared/dates";
import { CATEGORY_LABELS } from "@shared/catalogue";
import {
  defaultDir,
  inventoryParams,
  SORT_LABELS,
  type InventoryAction,
  type InventoryQuery,
  type InventoryRowView,
  type InventorySort,
} from "@shared/inventory";
import { BenchVerifiedMark } from "~/components/BenchVerifiedMark";
import { OutcomeBadge } from "~/components/Badge";
import { StatusBadge } from "~/sell/StatusBadge";
import { cx } from "~/components/cx";
import { PriceCell } from "./PriceCell";

// The inventory's table. On a desktop, one line per unit with sortable headers (plain links, so sorting
// works without JavaScript); on a phone each unit is a small card: the checkbox, the unit and its
// state, then price and handling. The checkboxes belong to the bulk form around the table.

const day = dayText;

function SortHeader({ sort, query, className }: { sort: InventorySort; query: InventoryQuery; className?: string }) {
  const active = query.sort === sort;
  const dir = query.dir ?? defaultDir(query.sort);
  const next = active ? (dir === "asc" ? "desc" : "asc") : defaultDir(sort);
  const href = `?${inventoryParams({ ...query, sort, dir: next, page: 1 })}`;
  return (
    <th
      scope="col"
      aria-sort={active ? (dir === "asc" ? "ascending" : "descending") : undefined}
      className={cx("px-3 py-2 font-medium", className)}
    >
      <Link to={href} preventScrollReset className="inline-flex items-center gap-1 text-ink-soft no-underline hover:text-walnut-deep">
        {SORT_LABELS[sort]}
        <span aria-hidden="true" className={active ? "text-walnut" : "text-rule-strong"}>
          {active ? (dir === "asc" ? "▲" : "▼") : "↕"}
        </span>
      </Link>
    </th>
  );
}

export function InventoryTable({
  rows,
  query,
  selected,
  onToggle,
  onToggleAll,
  onSave,
  priceErrors,
  savingIds,
}: {
  rows: InventoryRowView[];
  query: InventoryQuery;
  selected: ReadonlySet<string>;
  onToggle: (id: string, on: boolean) => void;
  onToggleAll: (on: boolean) => void;
  onSave: (action: InventoryAction) => void;
  priceErrors: ReadonlyMap<string, string>;
  savingIds: ReadonlySet<string>;
}) {
  const all = rows.length > 0 && rows.every((r) => selected.has(r.id));
  return (
    <div className="overflow-hidden rounded-panel border border-rule bg-card shadow-panel">
      <table className="w-full border-collapse text-sm">
        <caption className="sr-only">Your units; select some to act on them together</caption>
        <thead className="border-b border-rule bg-sunk/60 text-left max-sm:sr-only">
          <tr>
            <th scope="col" className="w-10 px-3 py-2">
              <input
                type="checkbox"
                aria-label="Select every unit on this page"
                checked={all}
                onChange={(e) => onToggleAll(e.target.checked)}
                className="size-4 accent-walnut"
              />
            </th>
            <SortHeader sort="title" query={query} />
            <SortHeader sort="state" query={query} />
            <SortHeader sort="price" query={query} className="text-right [&_a]:justify-end" />
            <SortHeader sort="handling" query={query} className="max-md:hidden" />
            <SortHeader sort="updated" query={query} className="max-lg:hidden" />
          </tr>
        </thead>
        <tbody className="divide-y divide-rule">
          {rows.map((r) => (
            <tr
              key={r.id}
              data-listing={r.id}
              data-status={r.status}
              className={cx(
                "align-top max-sm:grid max-sm:grid-cols-[1.75rem_1fr_auto] max-sm:gap-x-2 max-sm:gap-y-2 max-sm:px-3 max-sm:py-3",
                selected.has(r.id) && "bg-walnut-wash/60",
              )}
            >
              <td className="px-3 py-3 max-sm:row-span-3 max-sm:p-0 max-sm:pt-1">
                <input
                  type="checkbox"
                  name="ids"
                  value={r.id}
                  checked={selected.has(r.id)}
                  onChange={(e) => onToggle(r.id, e.target.checked)}
                  aria-label={`Select ${r.title}`}
                  className="size-4 accent-walnut"
                />
              </td>
              <td className="px-3 py-3 max-sm:col-span-2 max-sm:p-0">
                <div className="flex min-w-0 items-start gap-3">
                  <div className="size-11 shrink-0 overflow-hidden rounded-md border border-rule bg-sunk">
                    {r.coverUrl ? <img src={r.coverUrl} alt="" className="size-full object-cover" loading="lazy" /> : null}
                  </div>
                  <div className="min-w-0">
                    <Link
                      to={`/sell/${r.id}`}
                      className="block font-serif text-base font-semibold leading-snug no-underline hover:underline"
                    >
                      {r.title === "Untitled unit" ? `New ${CATEGORY_LABELS[r.category].one.toLowerCase()}` : r.title}
                    </Link>
                    <p className="text-xs text-ink-faint">
                      {r.reference ? <span className="figures mr-2 text-ink-soft">{r.reference}</span> : null}
                      {CATEGORY_LABELS[r.category].one}
                    </p>
                  </div>
                </div>
              </td>
              <td className="px-3 py-3 max-sm:col-start-2 max-sm:p-0">
                <div className="flex flex-wrap items-center gap-1.5">
                  <StatusBadge status={r.status} />
                  {r.benchVerified ? <BenchVerifiedMark compact /> : null}
                  {r.counts && !r.benchVerified
                    ? (["implausible", "questionable", "missing"] as const)
                        .filter((o) => r.counts![o] > 0)
                        .map((o) => (
                          <OutcomeBadge key={o} outcome={o}>
                            {r.counts![o]} {o}
                          </OutcomeBadge>
                        ))
                    : null}
                </div>
                {r.status === "held" && r.heldReason ? <p className="mt-1 max-w-xs text-xs text-brass-ink">{r.heldReason}</p> : null}
              </td>
              <td className="px-3 py-3 text-right max-sm:col-start-3 max-sm:row-start-2 max-sm:p-0">
                <PriceCell row={r} onSave={onSave} error={priceErrors.get(r.id) ?? null} saving={savingIds.has(r.id)} />
              </td>
              <td className="px-3 py-3 text-ink-soft max-md:hidden max-sm:col-start-2 max-sm:block max-sm:p-0 max-sm:text-xs">
                <span className="figures" data-handling={r.handlingDays ?? ""}>
                  {r.handlingDays === null ? "—" : `${r.handlingDays} ${r.handlingDays === 1 ? "day" : "days"}`}
                </span>
                <span className="sm:hidden">
                  {r.handlingDays === null ? " no handling time set" : " to dispatch"} · saved {day(r.updatedAt)}
                </span>
              </td>
              <td className="px-3 py-3 text-ink-faint max-lg:hidden">
                <time dateTime={r.updatedAt}>{day(r.updatedAt)}</time>
              </td>
            </tr>
          ))}
        </tbody>
      </table>
    </div>
  );
}
