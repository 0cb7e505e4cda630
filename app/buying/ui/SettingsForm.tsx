import { Form, useNavigation } from "react-router";
import { Notice } from "~/auth/AuthPanel";
import { Button } from "~/components/Button";
import { Card } from "~/components/Card";
import { controlClass, Field, FormError } from "~/components/Field";
import { cx } from "~/components/cx";
import { CURRENCY_NAMES } from "@shared/currency";
import { CURRENCY_CODES } from "@shared/listing-input";
import { MAX_FEE_PERCENT, SETTING_BOUNDS, type TimingField } from "../settings-form";
import { momentText } from "@shared/dates";

// The admin's marketplace settings: the platform fee and the buying path's timings, one plain form.

export type SettingsActionData = { kind: "invalid"; errors: Record<string, string>; values: Record<string, string> } | { kind: "saved" };

const TIMING_TEXT: Record<TimingField, { label: string; hint: string }> = {
  auditionDays: {
    label: "Audition window",
    hint: "Days the buyer has after arrival to listen, re-measure and accept or contest; with no action the money is released.",
  },
  arrivalAssumedDays: {
    label: "Arrival assumed after",
    hint: "Days after dispatch when a unit counts as arrived if the buyer has not confirmed it.",
  },
  reservationMinutes: {
    label: "Reservation lasts",
    hint: "Minutes a unit stays held for one buyer's checkout before it returns to the market unpaid.",
  },
  offerHours: { label: "Offers expire after", hint: "Hours an offer stays open unless the buyer chooses another expiry." },
  offerCheckoutHours: { label: "Accepted offer holds for", hint: "Hours the buyer has to check out at an accepted offer's price." },
};

export function SettingsForm({
  stored,
  result,
  updated,
}: {
  stored: Record<string, string>;
  result: SettingsActionData | null;
  updated: { at: string; by: string | null } | null;
}) {
  const navigation = useNavigation();
  const busy = navigation.state === "submitting" && navigation.formAction?.startsWith("/admin/settings");
  const errors = result?.kind === "invalid" ? result.errors : {};
  const values = result?.kind === "invalid" ? result.values : stored;
  const count = Object.keys(errors).length;
  return (
    <Form method="post" className="space-y-6" key={JSON.stringify(result)} noValidate>
      {result?.kind === "saved" ? <Notice>Settings saved. New orders use them from now on; orders already open keep theirs.</Notice> : null}
      {count ? (
        <FormError>{count === 1 ? "One field needs another look." : `${count} fields need another look.`} Nothing was saved.</FormError>
      ) : null}

      <Card className="space-y-5">
        <div className="space-y-1">
          <h2 className="text-xl">Platform fee</h2>
          <p className="text-sm text-ink-soft">
            Taken from the price and delivery when the money is released to the seller: the percentage, or the minimum in the order's
            currency when that is more.
          </p>
        </div>
        <Field
          label="Fee"
          name="feePercent"
          unit="%"
          inputMode="decimal"
          autoComplete="off"
          defaultValue={values.feePercent}
          error={errors.feePercent}
          hint={`Up to ${MAX_FEE_PERCENT} %, at most two decimals.`}
          className="max-w-48"
        />
        <fieldset className="space-y-3">
          <legend className="text-sm font-medium text-ink">Minimum fee per currency</legend>
          <div className="grid grid-cols-2 gap-x-4 gap-y-3 sm:grid-cols-3 lg:grid-cols-4">
            {CURRENCY_CODES.map((c) => {
              const key = `minimum.${c}`;
              const id = `minimum-${c}`;
              const error = errors[key];
              return (
                <div key={c} className="space-y-1">
                  <label htmlFor={id} className="block text-xs text-ink-soft">
                    <span className="figures font-medium text-ink">{c}</span> <span className="max-sm:sr-only">{CURRENCY_NAMES[c]}</span>
                  </label>
                  <input
                    id={id}
                    name={key}
                    defaultValue={values[key]}
                    inputMode="decimal"
                    autoComplete="off"
                    aria-invalid={error ? true : undefined}
                    aria-describedby={error ? `${id}-error` : undefined}
                    className={cx(controlClass, "figures")}
                  />
                  {error ? (
                    <p id={`${id}-error`} role="alert" className="text-[0.8125rem] font-medium text-fault">
                      {error}
                    </p>
                  ) : null}
                </div>
              );
            })}
          </div>
        </fieldset>
      </Card>

      <Card className="space-y-5">
        <div className="space-y-1">
          <h2 className="text-xl">Timings</h2>
          <p className="text-sm text-ink-soft">Deadlines the buying path keeps by itself, each run as a scheduled job.</p>
        </div>
        <div className="grid gap-5 sm:grid-cols-2">
          {(Object.keys(TIMING_TEXT) as TimingField[]).map((f) => (
            <Field
              key={f}
              label={TIMING_TEXT[f].label}
              name={f}
              unit={SETTING_BOUNDS[f].short}
              inputMode="numeric"
              autoComplete="off"
              defaultValue={values[f]}
              error={errors[f]}
              hint={`${TIMING_TEXT[f].hint} ${SETTING_BOUNDS[f].min}–${SETTING_BOUNDS[f].max} ${SETTING_BOUNDS[f].unit}.`}
            />
          ))}
        </div>
      </Card>

      <div className="flex flex-wrap items-center gap-3">
        <Button type="submit" busy={busy}>
          Save settings
        </Button>
        {updated ? (
          <p className="text-sm text-ink-faint">
            Last changed <span className="figures">{momentText(updated.at)}</span>
            {updated.by ? ` by ${updated.by}` : ""}
          </p>
        ) : null}
      </div>
    </Form>
  );
}
