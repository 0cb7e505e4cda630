import { Form, useNavigation } from "react-router";
import { Button } from "~/components/Button";
import { controlClass, FormError } from "~/components/Field";
import { Notice } from "~/auth/AuthPanel";
import { cx } from "~/components/cx";
import { CURRENCY_NAMES } from "@shared/currency";
import { isCurrency } from "@shared/listing-input";
import { BASE_CURRENCY, CONFIRM_ABOVE, changeShare, type RateChange } from "./rate-form";
import type { RateChangeLine, RateRow } from "./rates.server";
import { dayText, momentText, timeOfDayText } from "@shared/dates";

// The admin's rate table: one field per currency, saved together; a large change asks again.

export type RatesActionData =
  | { kind: "invalid"; errors: Record<string, string>; values: Record<string, string> }
  | { kind: "confirm"; confirm: (RateChange & { from: string })[]; values: Record<string, string> }
  | { kind: "saved"; saved: RateChange[]; repriced: number };

const name = (code: string) => (isCurrency(code) ? CURRENCY_NAMES[code] : code);

export function RatesForm({ rates, result }: { rates: RateRow[]; result: RatesActionData | null }) {
  const navigation = useNavigation();
  const busy = navigation.state === "submitting" && navigation.formAction?.startsWith("/admin/rates");
  const errors = result?.kind === "invalid" ? result.errors : {};
  const submitted = result && result.kind !== "saved" ? result.values : null;
  const valueOf = (r: RateRow) => {
    const v = submitted?.[`rate.${r.currency}`];
    return typeof v === "string" ? v : r.perEur;
  };
  return (
    <Form method="post" className="space-y-4" key={JSON.stringify(result)} noValidate>
      {result?.kind === "saved" ? (
        <Notice>
          {result.saved.length
            ? `Saved ${result.saved.map((c) => `1 EUR = ${c.perEur} ${c.currency}`).join(", ")}; ${result.repriced} listing${result.repriced === 1 ? "" : "s"} re-priced.`
            : "No rate changed."}
        </Notice>
      ) : null}
      {errors.form ? <FormError>{errors.form}</FormError> : null}
      {result?.kind === "confirm" ? (
        <div role="alert" className="space-y-2 rounded-md border border-brass/45 bg-brass-wash px-4 py-3 text-sm text-ink">
          <p className="font-semibold text-brass-ink">
            {result.confirm.length === 1 ? "This rate moves" : "These rates move"} by more than {Math.round(CONFIRM_ABOVE * 100)} % at once.
            Nothing is saved yet.
          </p>
          <ul className="list-disc pl-5">
            {result.confirm.map((c) => (
              <li key={c.currency} className="figures">
                {c.currency}: {c.from} → {c.perEur} ({changeShare(c.from, c.perEur)})
              </li>
            ))}
          </ul>
          <label className="flex items-center gap-2 font-medium">
            <input type="checkbox" name="confirm" value="yes" className="size-4 accent-walnut" />
            Yes, these rates are right: re-price the listings.
          </label>
        </div>
      ) : null}
      <div className="overflow-x-auto rounded-panel border border-rule bg-card shadow-panel">
        <table className="w-full text-sm">
          <caption className="sr-only">Units of each currency per euro</caption>
          <thead className="border-b border-rule text-left text-xs uppercase tracking-[0.08em] text-ink-faint">
            <tr>
              <th scope="col" className="px-2 py-2.5 font-semibold sm:px-4">
                Currency
              </th>
              <th scope="col" className="px-2 py-2.5 font-semibold sm:px-4">
                1 EUR =
              </th>
              <th scope="col" className="px-2 py-2.5 font-semibold sm:px-4">
                Last changed
              </th>
            </tr>
          </thead>
          <tbody className="divide-y divide-rule/70">
            {rates.map((r) => {
              const error = errors[r.currency];
              const id = `rate-${r.currency}`;
              return (
                <tr key={r.currency} className="align-top">
                  <th scope="row" className="px-2 py-3 text-left font-medium sm:px-4">
                    {r.currency} <span className="block text-xs font-normal text-ink-faint">{name(r.currency)}</span>
                  </th>
                  <td className="px-2 py-3 sm:px-4">
                    {r.currency === BASE_CURRENCY ? (
                      <span className="figures">1 EUR (the base)</span>
                    ) : (
                      <div className="flex min-w-24 max-w-56 items-center gap-2">
                        <input
                          id={id}
                          name={`rate.${r.currency}`}
                          defaultValue={valueOf(r)}
                          inputMode="decimal"
                          autoComplete="off"
                          aria-label={`${r.currency} per euro`}
                          aria-invalid={error ? true : undefined}
                          aria-describedby={error ? `${id}-error` : undefined}
                          className={cx(controlClass, "figures")}
                        />
                        <span className="text-ink-soft">{r.currency}</span>
                      </div>
                    )}
                    {error ? (
                      <p id={`${id}-error`} className="mt-1 text-[0.8125rem] font-medium text-fault">
                        {error}
                      </p>
                    ) : null}
                  </td>
                  <td className="px-2 py-3 text-xs text-ink-soft sm:px-4 sm:text-sm">
                    <span className="figures block whitespace-nowrap sm:inline">{dayText(r.updatedAt)}</span>{" "}
                    <span className="figures whitespace-nowrap">{timeOfDayText(r.updatedAt)}</span>
                    {r.updatedBy ? <span className="block text-xs text-ink-faint">by {r.updatedBy}</span> : null}
                  </td>
                </tr>
              );
            })}
          </tbody>
        </table>
      </div>
      <div className="flex flex-wrap items-center gap-3">
        <Button type="submit" busy={busy}>
          Save rates
        </Button>
        <p className="text-[0.8125rem] text-ink-faint">
          Only changed rates are saved, all at once; every listing in those currencies is re-priced for the market's filters.
        </p>
      </div>
    </Form>
  );
}

export function RateChanges({ changes }: { changes: RateChangeLine[] }) {
  return (
    <section aria-labelledby="rate-changes" className="space-y-3">
      <h2 id="rate-changes" className="font-serif text-xl font-semibold">
        Changes
      </h2>
      {changes.length ? (
        <ul className="divide-y divide-rule/70 rounded-panel border border-rule bg-card text-sm">
          {changes.map((c) => (
            <li key={c.id} className="flex flex-wrap justify-between gap-x-4 gap-y-1 px-4 py-2.5">
              <span className="figures">
                {c.currency}: {c.oldPerEur} → {c.newPerEur}
              </span>
              <span className="text-ink-soft">
                {c.changedBy} · <span className="figures">{momentText(c.changedAt)}</span>
              </span>
            </li>
          ))}
        </ul>
      ) : (
        <p className="text-ink-soft">No rate has been changed yet.</p>
      )}
    </section>
  );
}
