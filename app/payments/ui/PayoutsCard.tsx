import type { ReactNode } from "react";
import { Form } from "react-router";
import { Badge } from "~/components/Badge";
import { Button } from "~/components/Button";
import { Card, CardTitle } from "~/components/Card";

// /account's "Payouts" section for sellers and workshops: whether their payout account is connected,
// and a plain form that sends them to the payment provider's onboarding page (works without JavaScript).

export interface PayoutsView {
  connected: boolean;
  enabled: boolean;
}

export function PayoutsCard({ payouts, message, busy }: { payouts: PayoutsView; message: ReactNode; busy: boolean }) {
  return (
    <Card className="space-y-4" id="payouts">
      <CardTitle>Payouts</CardTitle>
      <p className="flex flex-wrap items-center gap-2">
        {payouts.enabled ? (
          <Badge tone="trace">Payout account connected</Badge>
        ) : payouts.connected ? (
          <Badge tone="brass">Setup not finished</Badge>
        ) : (
          <Badge tone="neutral">No payout account yet</Badge>
        )}
      </p>
      <p className="text-sm text-ink-soft">
        {payouts.enabled
          ? "Buyers can buy your units. Once a buyer accepts a unit, what it sold for, less Loadline's fee, is sent to this account."
          : "Before your first sale, connect the account you want to be paid into. Until then your listings are shown but cannot be bought."}{" "}
        The payment provider holds buyers' money until each sale completes and asks for your details on its own page.
      </p>
      {message}
      <Form method="post">
        <input type="hidden" name="intent" value="connect-payouts" />
        <Button type="submit" variant={payouts.enabled ? "secondary" : "primary"} busy={busy}>
          {payouts.enabled
            ? "Update payout details"
            : payouts.connected
              ? "Finish connecting your payout account"
              : "Connect a payout account"}
        </Button>
      </Form>
    </Card>
  );
}
