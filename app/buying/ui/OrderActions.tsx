import type { ReactNode } from "react";
import { Form, useNavigation } from "react-router";
import { Button } from "~/components/Button";
import { Card } from "~/components/Card";
import { Field, FormError } from "~/components/Field";
import type { OrderDetailView } from "../order-view";
import type { FieldErrors } from "../order-forms";
import { HeavyUnit } from "~/components/cautions/HeavyUnit";
import { When } from "./OrderParts";

// The forms on an order page, one per step, each a plain POST with an `intent`. The transition behind
// each checks the order's state again, so a stale page only gets a message back.

export interface OrderActionData {
  intent: string;
  errors: FieldErrors;
  values?: Record<string, string>;
}

function useBusy(intent: string) {
  const nav = useNavigation();
  return nav.state === "submitting" && nav.formData?.get("intent") === intent;
}

export function ActionCard({ title, children, id }: { title: string; children: ReactNode; id?: string }) {
  return (
    <Card className="space-y-4" aria-labelledby={id}>
      <h2 id={id} className="text-xl">
        {title}
      </h2>
      {children}
    </Card>
  );
}

/** The seller's dispatch: carrier and tracking number, within the handling time. */
export function ShipForm({ order, result }: { order: OrderDetailView; result: OrderActionData | null }) {
  const busy = useBusy("ship");
  const errors = result?.intent === "ship" ? result.errors : {};
  const values = result?.intent === "ship" ? (result.values ?? {}) : {};
  return (
    <ActionCard title="Ship it" id="ship-heading">
      <p className="text-sm text-ink-soft">
        {order.delivery.shipBy ? (
          <>
            Hand it to the carrier and enter the tracking number by <When iso={order.delivery.shipBy} className="font-medium text-ink" />
            {order.delivery.handlingDays !== null ? ` (your handling time: ${order.delivery.handlingDays} working days)` : ""}. If it has
            not shipped by then, the order is cancelled and the buyer refunded automatically.
          </>
        ) : (
          "Hand it to the carrier and enter the tracking number."
        )}
      </p>
      <HeavyUnit weightG={order.listing.weightG} context="dispatch" headingLevel={3} />
      <Form method="post" className="space-y-4" noValidate>
        <input type="hidden" name="intent" value="ship" />
        <FormError>{errors.form}</FormError>
        <div className="grid gap-4 sm:grid-cols-2">
          <Field
            label="Carrier"
            name="carrier"
            autoComplete="off"
            maxLength={60}
            defaultValue={values.carrier}
            error={errors.carrier}
            hint={order.listing.heavy ? "The freight company." : "The parcel service or freight company."}
          />
          <Field
            label="Tracking number"
            name="trackingNumber"
            autoComplete="off"
            maxLength={60}
            defaultValue={values.trackingNumber}
            error={errors.trackingNumber}
            className="[&_input]:font-mono"
          />
        </div>
        <Button type="submit" busy={busy}>
          Mark as shipped
        </Button>
      </Form>
    </ActionCard>
  );
}

/** A one-button step (confirm arrival, accept, go to payment): its form, an optional explanation and the refusal if any. */
export function IntentButton({
  intent,
  label,
  result,
  variant = "primary",
  children,
}: {
  intent: string;
  label: string;
  result: OrderActionData | null;
  variant?: "primary" | "secondary";
  children?: ReactNode;
}) {
  const busy = useBusy(intent);
  const error = result?.intent === intent ? result.errors.form : undefined;
  return (
    <Form method="post" className="space-y-3">
      <input type="hidden" name="intent" value={intent} />
      {children}
      <FormError>{error}</FormError>
      <Button type="submit" busy={busy} variant={variant} className="max-sm:w-full">
        {label}
      </Button>
    </Form>
  );
}
