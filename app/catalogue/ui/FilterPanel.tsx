import { COSMETIC_GRADES, COSMETIC_GRADE_TEXT, SERVICE_STATES, SERVICE_STATE_TEXT, CATEGORY_LABELS } from "@shared/catalogue";
import { CURRENCIES, isCurrency, type Currency } from "@shared/listing-input";
import { defaultSort, type FilterCounts } from "@shared/market-filters";
import { Field, SelectField } from "~/components/Field";
import { Button } from "~/components/Button";
import { usePricing } from "~/components/Price";
import { sortOptions } from "~/catalogue/market-view";
import { valuesOf, type MarketState } from "./use-market-state";
import { MeasuredFields } from "./MeasuredFields";
import { Choice, Legend } from "./Choice";

// The market's filter panel: a plain GET form (submitting it without JavaScript reloads the market with
// the parameters), and with JavaScript each change moves the URL and the results follow.

const MAINS_VOLTS = [100, 120, 230];

/** A country for "Delivers to", named and sorted on the server (the market's loader). */
export type CountryOption = { value: string; label: string };

export function FilterPanel({
  state,
  counts,
  errors,
  total,
  countries,
  onDone,
}: {
  state: MarketState;
  counts: FilterCounts | null;
  /** Messages by parameter: the panel's own reading of what was typed, and the server's. */
  errors: ReadonlyMap<string, string>;
  total: number;
  countries: CountryOption[];
  /** The phone's drawer: close it and show the results. */
  onDone?: () => void;
}) {
  const { draft, filters } = state;
  const category = filters.category;
  const currency = priceCurrency(state.draft, usePricing()?.display ?? null);
  const picked = (name: string) => valuesOf(draft, name);
  const toggle = (name: string, value: string, on: boolean) =>
    state.choose(name, on ? [...picked(name), value] : picked(name).filter((v) => v !== value));
  const mains = draft.get("mains") ?? "";
  const volts = mains && !MAINS_VOLTS.map(String).includes(mains) ? [...MAINS_VOLTS.map(String), mains] : MAINS_VOLTS.map(String);
  const q = draft.get("q")?.trim() || null;
  const sorts = sortOptions({ q, category });
  const sort = draft.get("sort") ?? defaultSort(q);

  return (
    <form
      id="market-filters"
      method="get"
      action="/market"
      aria-label="Filters"
      // A field reached with Tab scrolls clear of the phone's sticky submit bar.
      className="space-y-5 [&_input]:scroll-mb-24 [&_select]:scroll-mb-24"
      onSubmit={(e) => {
        e.preventDefault();
        state.apply();
        onDone?.();
      }}
    >
      {category ? <input type="hidden" name="category" value={CATEGORY_LABELS[category].slug} /> : null}
      {currency !== "EUR" ? <input type="hidden" name="currency" value={currency} /> : null}
      <Field
        label="Search"
        type="search"
        name="q"
        value={draft.get("q") ?? ""}
        onChange={(e) => state.type("q", e.target.value)}
        placeholder="Maker, model or words"
        autoComplete="off"
        error={errors.get("q")}
      />
      <SelectField
        label="Sort by"
        name="sort"
        value={sorts.some((o) => o.value === sort) ? sort : defaultSort(q)}
        onChange={(e) => state.choose("sort", e.target.value === defaultSort(q) ? null : e.target.value)}
        options={sorts}
        error={errors.get("sort")}
      />
      <fieldset>
        <Legend>Price in {currency}</Legend>
        <div className="grid grid-cols-2 gap-3">
          {(["priceMin", "priceMax"] as const).map((name) => (
            <Field
              key={name}
              label={name === "priceMin" ? "From" : "Up to"}
              name={name}
              value={draft.get(name) ?? ""}
              onChange={(e) => {
                // Bounds typed in the buyer's own currency name it, so the link means the same to anyone.
                if (!state.draft.get("currency") && currency !== "EUR") state.type("currency", currency);
                state.type(name, e.target.value);
              }}
              inputMode={CURRENCIES[currency] ? "decimal" : "numeric"}
              autoComplete="off"
              unit={currency}
              error={errors.get(name)}
            />
          ))}
        </div>
      </fieldset>
      <MeasuredFields state={state} category={category} counts={counts} errors={errors} />
      <CheckboxGroup
        legend="Condition"
        name="condition"
        values={COSMETIC_GRADES}
        labelOf={(g) => COSMETIC_GRADE_TEXT[g].label}
        counts={counts?.condition}
        picked={picked("condition")}
        onToggle={(g, on) => toggle("condition", g, on)}
        error={errors.get("condition")}
      />
      <CheckboxGroup
        legend="Service state"
        name="service"
        values={SERVICE_STATES}
        labelOf={(v) => SERVICE_STATE_TEXT[v].label}
        counts={counts?.service}
        picked={picked("service")}
        onToggle={(v, on) => toggle("service", v, on)}
        error={errors.get("service")}
      />
      <fieldset>
        <Legend>Seller</Legend>
        {(
          [
            ["", "Anyone"],
            ["workshop", "Workshops"],
            ["private", "Private sellers"],
          ] as const
        ).map(([value, label]) => (
          <Choice
            key={value || "any"}
            type="radio"
            name="seller"
            value={value}
            label={label}
            count={value && counts ? counts.seller[value] : undefined}
            checked={(draft.get("seller") ?? "") === value}
            onChange={() => state.choose("seller", value || null)}
          />
        ))}
        <FieldMessage text={errors.get("seller")} />
        <Choice
          type="checkbox"
          name="verified"
          value="1"
          className="mt-2 border-t border-rule pt-3"
          label="Bench-verified units only"
          count={counts?.verified}
          checked={filters.verified || draft.get("verified") === "1"}
          onChange={(e) => state.choose("verified", e.target.checked ? "1" : null)}
        />
        <FieldMessage text={errors.get("verified")} />
      </fieldset>
      <fieldset className="space-y-3">
        <Legend>Power and delivery</Legend>
        <SelectField
          label="Set for mains"
          name="mains"
          value={mains}
          onChange={(e) => state.choose("mains", e.target.value || null)}
          options={volts.map((v) => ({ value: v, label: `${v} V` }))}
          placeholder="Any voltage"
          hint="Units with a voltage selector match any."
          error={errors.get("mains")}
        />
        <SelectField
          label="Delivers to"
          name="deliverTo"
          value={draft.get("deliverTo")?.toUpperCase() ?? ""}
          onChange={(e) => state.choose("deliverTo", e.target.value || null)}
          options={countries}
          placeholder="Any country"
          hint="By parcel or freight; collection in person is always possible."
          error={errors.get("deliverTo")}
        />
      </fieldset>
      <div className="sticky bottom-0 -mx-4 border-t border-rule bg-card/95 px-4 py-3 backdrop-blur-sm lg:static lg:mx-0 lg:border-0 lg:bg-transparent lg:p-0">
        <Button type="submit" className="w-full">
          Show {total} {total === 1 ? "unit" : "units"}
        </Button>
      </div>
    </form>
  );
}

function FieldMessage({ text }: { text: string | undefined }) {
  return text ? (
    <p role="alert" className="mt-1 text-[0.8125rem] font-medium text-fault">
      {text}
    </p>
  ) : null;
}

/**
 * The currency the price bounds are typed in: the one the link names; else euros when the link has
 * bounds (as the server reads it); else the buyer's display currency.
 */
export function priceCurrency(draft: URLSearchParams, display: string | null): Currency {
  const named = draft.get("currency")?.trim().toUpperCase();
  if (named && isCurrency(named)) return named;
  if (draft.get("priceMin")?.trim() || draft.get("priceMax")?.trim()) return "EUR";
  return display && isCurrency(display) ? display : "EUR";
}

/** A repeatable parameter as checkboxes, each with the units it would leave. */
function CheckboxGroup<T extends string>({
  legend,
  name,
  values,
  labelOf,
  counts,
  picked,
  onToggle,
  error,
}: {
  legend: string;
  name: string;
  values: readonly T[];
  labelOf: (value: T) => string;
  counts: Record<T, number> | undefined;
  picked: readonly string[];
  onToggle: (value: T, on: boolean) => void;
  error: string | undefined;
}) {
  return (
    <fieldset>
      <Legend>{legend}</Legend>
      {values.map((v) => (
        <Choice
          key={v}
          type="checkbox"
          name={name}
          value={v}
          label={labelOf(v)}
          count={counts?.[v]}
          checked={picked.includes(v)}
          onChange={(e) => onToggle(v, e.target.checked)}
        />
      ))}
      <FieldMessage text={error} />
    </fieldset>
  );
}
