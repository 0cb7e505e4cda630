import { useEffect, useState } from "react";
import type { Category } from "@shared/catalogue";
import { MEASURED_FILTERS, measuredFiltersFor, type FilterCounts, type MeasuredFilter } from "@shared/market-filters";
import { Field } from "~/components/Field";
import type { MarketState } from "./use-market-state";
import { Choice, Legend } from "./Choice";

// The measured-figure filters: typed the way the trade writes them, each with what its bound means,
// how many units it leaves, and the switch for which sheets' figures count.

export function MeasuredFields({
  state,
  category,
  counts,
  errors,
}: {
  state: MarketState;
  category: Category | null;
  counts: FilterCounts | null;
  errors: ReadonlyMap<string, string>;
}) {
  const { draft } = state;
  const set = (m: MeasuredFilter) => (draft.get(m.param) ?? "") !== "";
  const offered = measuredFiltersFor(category);
  const anySet = MEASURED_FILTERS.some(set);
  // Every category's fields are a hundred-odd elements most visitors never open: the server sends only
  // those in use (a category's own figures come with the category); the rest are drawn once unfolded.
  const [unfolded, setUnfolded] = useState(false);
  useEffect(() => {
    if (anySet) setUnfolded(true);
  }, [anySet]);
  const fields = (list: readonly MeasuredFilter[]) => (
    <div className="space-y-3">
      {list.map((m) => (
        <MeasuredField key={m.key} filter={m} state={state} count={counts?.measured[m.key] ?? null} error={errors.get(m.param)} />
      ))}
    </div>
  );
  return (
    <fieldset className="space-y-3">
      <Legend>Measured on the bench</Legend>
      {category ? (
        fields(offered)
      ) : (
        // Every category's figures are many: folded away until asked for, open when one is in use.
        <details open={anySet} onToggle={(e) => e.currentTarget.open && setUnfolded(true)} className="group text-sm">
          <summary className="cursor-pointer font-medium text-walnut hover:text-walnut-deep">Figures of every category</summary>
          <p className="my-2 text-[0.8125rem] text-ink-soft">
            {unfolded ? "Choose a category above to see only its figures." : "Choose a category above to filter by its figures."}
          </p>
          {fields(unfolded ? MEASURED_FILTERS : MEASURED_FILTERS.filter(set))}
        </details>
      )}
      <fieldset className="rounded-md border border-rule bg-paper/60 px-3 pb-2.5 pt-1">
        <Legend>Which figures count</Legend>
        <Choice
          type="radio"
          name="figures"
          value="verified"
          label="From bench-verified sheets only"
          checked={draft.get("figures") !== "measured"}
          onChange={() => state.choose("figures", null)}
        />
        <Choice
          type="radio"
          name="figures"
          value="measured"
          label="Also measured figures on sheets not verified"
          checked={draft.get("figures") === "measured"}
          onChange={() => state.choose("figures", "measured")}
        />
        <p className="mt-1 text-[0.8125rem] text-ink-soft">The maker's rated figures never count, only what was measured.</p>
        {errors.get("figures") ? (
          <p role="alert" className="text-[0.8125rem] font-medium text-fault">
            {errors.get("figures")}
          </p>
        ) : null}
      </fieldset>
    </fieldset>
  );
}

function MeasuredField({
  filter: m,
  state,
  count,
  error,
}: {
  filter: MeasuredFilter;
  state: MarketState;
  count: number | null;
  error: string | undefined;
}) {
  const value = state.draft.get(m.param) ?? "";
  const units = (n: number) => `${n} ${n === 1 ? "unit" : "units"}`;
  const tally = count === null ? null : state.filters.measured[m.key] !== undefined ? `${units(count)} left` : `${units(count)} measured`;
  return (
    <Field
      label={m.label}
      name={m.param}
      value={value}
      onChange={(e) => state.type(m.param, e.target.value)}
      placeholder={m.placeholder}
      unit={m.unit || undefined}
      autoComplete="off"
      spellCheck={false}
      error={error}
      hint={
        <>
          e.g. {m.placeholder}
          {tally ? <> · {tally}</> : null}
        </>
      }
    />
  );
}
