import { Form, useNavigation } from "react-router";
import { Button } from "~/components/Button";
import { Card } from "~/components/Card";
import { Field, FormError, TextareaField } from "~/components/Field";
import type { FieldErrors } from "../order-forms";
import { Money } from "./Money";

// The moderator's decision on a contested order: release, refund in whole or in part, always with a
// note both sides read.

export function ResolveForm({
  currency,
  refundableMinor,
  errors,
  values,
  disabled = false,
}: {
  currency: string;
  refundableMinor: number;
  errors: FieldErrors;
  values: Record<string, string>;
  /** Another moderator holds the order: the form shows, closed (the server refuses it anyway). */
  disabled?: boolean;
}) {
  const busy = useNavigation().state === "submitting";
  const chosen = values.resolution ?? "";
  const option = (value: string, title: string, text: React.ReactNode) => (
    <label className="flex cursor-pointer items-start gap-3 rounded-md border border-rule bg-card p-3 has-checked:border-walnut has-checked:bg-walnut-wash/40">
      <input
        type="radio"
        name="resolution"
        value={value}
        defaultChecked={chosen === value}
        className="mt-1 size-4 shrink-0 accent-walnut"
      />
      <span className="space-y-0.5">
        <span className="block font-medium text-ink">{title}</span>
        <span className="block text-sm text-ink-soft">{text}</span>
      </span>
    </label>
  );
  return (
    <Card className="space-y-4" aria-labelledby="decision-heading">
      <h2 id="decision-heading" className="text-xl">
        Decision
      </h2>
      <Form method="post" className="space-y-4" noValidate>
        <input type="hidden" name="intent" value="resolve" />
        <fieldset disabled={disabled} className="space-y-4">
          <FormError>{errors.form}</FormError>
          <fieldset className="space-y-2" aria-describedby={errors.resolution ? "resolution-error" : undefined}>
            <legend className="mb-1 text-sm font-medium text-ink">What happens to the held money</legend>
            {option("release", "Release to the seller", "The unit is as described; the seller is paid less the platform fee.")}
            {option(
              "refund_whole",
              "Refund the buyer in whole",
              <>
                <Money minor={refundableMinor} currency={currency} /> back to the buyer; arrange the unit's return with both sides.
              </>,
            )}
            {option(
              "refund_part",
              "Refund the buyer in part",
              "The amount below goes back to the buyer; the rest is released to the seller.",
            )}
            {errors.resolution ? (
              <p id="resolution-error" role="alert" className="text-[0.8125rem] font-medium text-fault">
                {errors.resolution}
              </p>
            ) : null}
          </fieldset>
          <Field
            label={`Part refund (${currency})`}
            name="amount"
            inputMode="decimal"
            autoComplete="off"
            defaultValue={values.amount}
            error={errors.amount}
            hint="Only for a part refund: less than what the buyer paid."
            className="max-w-56"
            unit={currency}
          />
          <TextareaField
            label="Note"
            name="note"
            rows={4}
            defaultValue={values.note}
            error={errors.note}
            hint="Why you decided so. Both sides read it, and it stays on the order's timeline."
          />
          <Button type="submit" busy={busy}>
            Record the decision
          </Button>
        </fieldset>
      </Form>
    </Card>
  );
}
