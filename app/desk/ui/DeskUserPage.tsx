import { Form, Link } from "react-router";
import { Badge } from "~/components/Badge";
import { Button } from "~/components/Button";
import { Card, CardTitle } from "~/components/Card";
import { FormError, TextareaField } from "~/components/Field";
import { PageHeader } from "~/components/PageHeader";
import type { DeskUserPage as Page, UserActionErrors } from "../user-desk.server";
import { momentText } from "@shared/dates";
import { AuditTrail } from "./AuditTrail";
import { ClaimBanner } from "./ClaimBanner";

const linkClass = "font-medium text-walnut underline decoration-walnut/40 underline-offset-2 hover:text-walnut-deep";

export function DeskUserPage({ page, errors, values }: { page: Page; errors: UserActionErrors; values: { note?: string } }) {
  const { account, listings, orders, action, claim, trail } = page;
  return (
    <main className="mx-auto w-full max-w-6xl space-y-6 px-4 pb-16 pt-6 sm:px-6">
      <p className="text-sm">
        <Link to="/desk" className={linkClass}>
          ← Review desk
        </Link>
      </p>
      <PageHeader overline="Review desk · Account" title={account.name} />
      <div className="flex flex-wrap items-center gap-2 text-sm">
        {account.status === "suspended" ? <Badge tone="fault">Suspended</Badge> : <Badge tone="trace">Active</Badge>}
        <span className="text-ink-soft">{account.email}</span>
        <span className="text-ink-soft">{account.roles.join(", ")}</span>
        <span className="text-xs text-ink-faint">joined {momentText(account.joined)}</span>
      </div>
      <ClaimBanner claim={claim} minutes={page.claimMinutes} />
      <div className="grid gap-6 lg:grid-cols-[minmax(0,1fr)_22rem]">
        <div className="min-w-0 space-y-6">
          <Card className="space-y-3" aria-labelledby="user-orders">
            <CardTitle>
              <span id="user-orders">Orders under way</span>
            </CardTitle>
            {orders.length ? (
              <ul className="divide-y divide-rule text-sm">
                {orders.map((o) => (
                  <li key={o.id} className="flex flex-wrap items-center gap-2 py-2">
                    <Link to={`/desk/orders/${o.id}`} className={linkClass}>
                      {o.title}
                    </Link>
                    <Badge>{o.state}</Badge>
                    <span className="text-ink-faint">{o.side}</span>
                  </li>
                ))}
              </ul>
            ) : (
              <p className="text-sm text-ink-soft">None.</p>
            )}
            {account.status === "suspended" && orders.length ? (
              <p className="text-xs text-ink-faint">These continue while the account is suspended, watched by the desk.</p>
            ) : null}
          </Card>
          <Card className="space-y-3" aria-labelledby="user-listings">
            <CardTitle>
              <span id="user-listings">Listings</span>
            </CardTitle>
            {listings.length ? (
              <ul className="divide-y divide-rule text-sm">
                {listings.map((l) => (
                  <li key={l.id} className="flex flex-wrap items-center gap-2 py-2">
                    <Link to={`/desk/listings/${l.id}`} className={linkClass}>
                      {l.title}
                    </Link>
                    <Badge>{l.status}</Badge>
                  </li>
                ))}
              </ul>
            ) : (
              <p className="text-sm text-ink-soft">None.</p>
            )}
          </Card>
        </div>
        <div className="space-y-6">
          {action ? (
            <Card className="space-y-4" aria-labelledby="user-decision">
              <CardTitle>
                <span id="user-decision">{action === "suspend_account" ? "Suspend the account" : "Reinstate the account"}</span>
              </CardTitle>
              <p className="text-sm text-ink-soft">
                {action === "suspend_account"
                  ? "They can no longer sign in; their live and held listings leave the market (withdrawn). Orders under way continue, watched by the desk."
                  : "They can sign in again. Listings withdrawn by the suspension stay withdrawn until they publish them again."}
              </p>
              <Form method="post" className="space-y-4">
                {errors.form ? <FormError>{errors.form}</FormError> : null}
                <fieldset disabled={!claim.mine} className="space-y-4">
                  <TextareaField
                    label="Note"
                    name="note"
                    required
                    maxLength={2000}
                    rows={4}
                    hint="Required. It goes on the account's trail and in the mail to its owner."
                    defaultValue={values.note}
                    error={errors.note}
                  />
                  <Button type="submit" name="intent" value={action} variant={action === "suspend_account" ? "danger" : "primary"}>
                    {action === "suspend_account" ? "Suspend" : "Reinstate"}
                  </Button>
                </fieldset>
              </Form>
            </Card>
          ) : null}
          <AuditTrail items={trail} />
        </div>
      </div>
    </main>
  );
}
