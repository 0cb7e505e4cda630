import { useId } from "react";
import { Form, Link } from "react-router";
import { COSMETIC_GRADE_TEXT, SERVICE_STATE_TEXT, formatPrice } from "@shared/catalogue";
import { ApproxPrice } from "~/components/Price";
import { BenchVerifiedMark } from "~/components/BenchVerifiedMark";
import { cx } from "~/components/cx";
import { BETTER_WORDS } from "../rows";
import { compareHref } from "../selection";
import type { ComparedUnit, FigureCell, FigureGroup } from "../types";

// The units in columns, the figures in rows. The first column stays put while the table scrolls
// sideways (a phone shows one or two units at a time), and says what each row is and which way is better.

const sticky = "sticky left-0 z-10 bg-card shadow-[1px_0_0_var(--color-rule)]";
const headCell = "p-3 text-left align-top text-sm font-medium text-ink-soft";
const unitCell = "p-3 align-top text-sm";

export function CompareTable({ units, groups }: { units: ComparedUnit[]; groups: FigureGroup[] }) {
  const tableId = useId();
  return (
    <div className="space-y-2">
      {units.length > 1 ? (
        <p className="flex items-center gap-1.5 text-xs font-medium text-ink-faint sm:hidden" aria-hidden="true">
          Swipe the table sideways to see every unit
          <svg viewBox="0 0 20 20" className="size-4">
            <path d="M4 10h11m-4-4 4 4-4 4" fill="none" stroke="currentColor" strokeWidth="1.6" strokeLinecap="round" />
          </svg>
        </p>
      ) : null}
      {/* Focusable so keyboard users can scroll it too. */}
      <div
        role="region"
        aria-label="Units side by side"
        tabIndex={0}
        className="overflow-x-auto rounded-panel border border-rule bg-card shadow-panel"
      >
        {/* Fixed layout: the units share the width evenly, and below it the table scrolls rather than squeezes them. */}
        <table className="w-full table-fixed border-separate border-spacing-0" style={{ minWidth: `${9 + units.length * 10.5}rem` }}>
          <colgroup>
            <col className="w-36 sm:w-52" />
            {units.map((u) => (
              <col key={u.id} />
            ))}
          </colgroup>
          <caption className="sr-only">
            Measured figures of {units.length} {units.length === 1 ? "unit" : "units"}, with the stronger figure in each row marked where
            the conditions match
          </caption>
          <thead>
            <tr>
              <td className={cx(sticky, headCell, "bg-sunk")}>
                <span className="sr-only">Unit</span>
              </td>
              {units.map((u) => (
                <th key={u.id} scope="col" className={cx(unitCell, "bg-sunk text-left font-normal")}>
                  <UnitHead unit={u} others={units.filter((x) => x.id !== u.id).map((x) => x.id)} />
                </th>
              ))}
            </tr>
          </thead>
          <tbody>
            <DetailRow label="Price" units={units} render={(u) => <Price unit={u} />} />
            <DetailRow label="Seller" units={units} render={(u) => <Seller unit={u} />} />
            <DetailRow label="Era" units={units} render={(u) => u.era ?? <span className="text-ink-faint">Not given</span>} />
            <DetailRow
              label="Service"
              units={units}
              render={(u) => (
                <>
                  <span className="font-medium text-ink">{SERVICE_STATE_TEXT[u.serviceState].label}</span>
                  <span className="block text-[0.8125rem] text-ink-faint">{COSMETIC_GRADE_TEXT[u.cosmeticGrade].label} cosmetically</span>
                </>
              )}
            />
            <DetailRow
              label="Bench"
              units={units}
              render={(u) => (u.benchVerified ? <BenchVerifiedMark compact /> : <span className="text-ink-faint">Not bench-verified</span>)}
            />
          </tbody>
          {groups.map((g, gi) => (
            // The group's title names its rows (a row group), so it does not stand over the units' columns.
            <tbody key={g.title} aria-labelledby={`${tableId}-group-${gi}`}>
              <tr>
                <td colSpan={units.length + 1} className="border-t border-rule-strong bg-paper p-0 text-left">
                  <span
                    id={`${tableId}-group-${gi}`}
                    className="sticky left-0 inline-block px-3 pb-1.5 pt-4 font-serif text-base font-semibold text-ink"
                  >
                    {g.title}
                  </span>
                </td>
              </tr>
              {g.rows.map((row) => (
                <tr key={row.key} data-figure-row={row.key}>
                  <th scope="row" className={cx(sticky, headCell, "border-t border-rule")}>
                    <span className="block text-ink">{row.label}</span>
                    {row.better ? <span className="block text-xs font-normal text-ink-faint">{BETTER_WORDS[row.better]}</span> : null}
                    {row.note ? <span className="mt-1 block text-xs font-normal leading-snug text-brass-ink">{row.note}</span> : null}
                  </th>
                  {row.cells.map((c, i) => (
                    <td key={units[i].id} className={cx(unitCell, "border-t border-rule", c?.stronger && "bg-trace-wash")}>
                      {c ? <Cell cell={c} /> : <NotOnSheet />}
                    </td>
                  ))}
                </tr>
              ))}
            </tbody>
          ))}
        </table>
      </div>
    </div>
  );
}

function DetailRow({ label, units, render }: { label: string; units: ComparedUnit[]; render: (u: ComparedUnit) => React.ReactNode }) {
  return (
    <tr>
      <th scope="row" className={cx(sticky, headCell, "border-t border-rule")}>
        {label}
      </th>
      {units.map((u) => (
        <td key={u.id} className={cx(unitCell, "border-t border-rule text-ink-soft")}>
          {render(u)}
        </td>
      ))}
    </tr>
  );
}

function UnitHead({ unit: u, others }: { unit: ComparedUnit; others: string[] }) {
  return (
    <div className="space-y-2">
      <Link to={u.href} className="block overflow-hidden rounded-md bg-sunk" tabIndex={-1} aria-hidden="true">
        {u.cover ? (
          <img
            src={u.cover.thumbUrl}
            alt=""
            width={u.cover.width}
            height={u.cover.height}
            loading="lazy"
            className="aspect-[4/3] w-full object-cover"
          />
        ) : (
          <span className="flex aspect-[4/3] items-center justify-center text-xs text-ink-faint">No photo yet</span>
        )}
      </Link>
      <p className="text-xs font-medium text-ink-faint">{u.categoryLabel}</p>
      <Link to={u.href} className="block font-serif text-[1.0625rem] font-semibold leading-snug text-ink no-underline hover:text-walnut">
        {u.title}
      </Link>
      {u.status === "sold" ? (
        <span className="inline-block rounded border border-rule-strong px-1.5 text-xs font-medium text-ink-soft">Sold</span>
      ) : null}
      <Form method="post" action="/compare">
        <input type="hidden" name="intent" value="remove" />
        <input type="hidden" name="listingId" value={u.id} />
        <input type="hidden" name="returnTo" value={compareHref(others)} />
        <button
          type="submit"
          className="text-xs font-medium text-walnut underline decoration-walnut/30 underline-offset-2 hover:text-walnut-deep"
          aria-label={`Remove ${u.title} from the comparison`}
        >
          Remove
        </button>
      </Form>
    </div>
  );
}

function Price({ unit: u }: { unit: ComparedUnit }) {
  return (
    <>
      <span className="figures text-base font-semibold text-ink">{formatPrice(u.priceMinor, u.currency)}</span>
      <ApproxPrice minor={u.priceMinor} currency={u.currency} className="figures block text-xs" />
      {u.status === "sold" ? <span className="block text-xs text-ink-faint">Sold at this price</span> : null}
      {u.offersWelcome && u.status === "live" ? <span className="block text-xs text-brass-ink">Offers welcome</span> : null}
    </>
  );
}

function Seller({ unit: u }: { unit: ComparedUnit }) {
  return (
    <>
      <span className="block font-medium text-ink">{u.seller.kind === "workshop" ? u.seller.name : "Private seller"}</span>
      <span className="block text-[0.8125rem] text-ink-faint">
        {u.seller.kind === "workshop" ? (u.seller.verified ? "Verified workshop" : "Workshop") : u.seller.name}
        {u.place ? ` · ${u.place}` : null}
      </span>
    </>
  );
}

function Cell({ cell: c }: { cell: FigureCell }) {
  return (
    <div className="space-y-1" data-stronger={c.stronger || undefined}>
      <div className="flex flex-wrap items-baseline gap-x-2 gap-y-1">
        <span className="figures text-[0.9375rem] font-medium text-ink">
          {c.value}
          {c.unit ? <span className="ml-1 text-ink-soft">{c.unit}</span> : null}
        </span>
        {c.stronger ? (
          <span className="inline-flex items-center gap-1 rounded bg-trace px-1.5 py-px text-[0.6875rem] font-semibold uppercase tracking-wide text-card">
            <svg aria-hidden="true" viewBox="0 0 10 10" className="size-2.5">
              <path d="M5 1.5 9 8.5H1z" fill="currentColor" />
            </svg>
            Stronger
          </span>
        ) : null}
      </div>
      <p className="text-[0.8125rem] leading-snug text-ink-faint">{c.conditions}</p>
      {c.fromCapture ? <p className="text-xs text-trace">From a capture</p> : null}
    </div>
  );
}

function NotOnSheet() {
  return (
    <span className="text-ink-faint">
      <span aria-hidden="true">—</span>
      <span className="sr-only">Not on its sheet</span>
    </span>
  );
}
