import { Form, useLocation } from "react-router";
import { CURRENCY_NAMES } from "@shared/currency";
import { CURRENCY_CODES } from "@shared/listing-input";
import { buttonClass } from "./Button";

/** The buyer's display currency: a plain form (works without JavaScript), kept in a cookie by /currency. */
export function CurrencyPicker({ display }: { display: string }) {
  const location = useLocation();
  return (
    <Form method="post" action="/currency" className="flex flex-wrap items-center gap-2 sm:justify-end" key={display}>
      <input type="hidden" name="returnTo" value={`${location.pathname}${location.search}`} />
      <label htmlFor="display-currency" className="text-ink-soft">
        Show approximate prices in
      </label>
      <select
        id="display-currency"
        name="currency"
        defaultValue={display}
        className="h-9 rounded-md border border-rule-strong bg-card px-2 text-sm text-ink"
      >
        {CURRENCY_CODES.map((c) => (
          <option key={c} value={c}>
            {c} · {CURRENCY_NAMES[c]}
          </option>
        ))}
      </select>
      <button type="submit" className={buttonClass("secondary", "sm")}>
        Apply
      </button>
    </Form>
  );
}
