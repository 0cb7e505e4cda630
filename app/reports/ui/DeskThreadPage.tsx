import { Form, Link, useNavigation } from "react-router";
import { Badge } from "~/components/Badge";
import { Button } from "~/components/Button";
import { Card, CardTitle } from "~/components/Card";
import { FormError, TextareaField } from "~/components/Field";
import { PageHeader } from "~/components/PageHeader";
import { cx } from "~/components/cx";
import { TextLink } from "~/auth/AuthPanel";
import { AuditTrail } from "~/desk/ui/AuditTrail";
import { ClaimBanner } from "~/desk/ui/ClaimBanner";
import { momentText } from "@shared/dates";
import type { deskThreadPage, DeskReport, DismissErrors } from "../desk-thread.server";

type Page = Awaited<ReturnType<typeof deskThreadPage>>;

/** A reported conversation on the desk: read-only, its reports (open ones dismissed with a note) and its trail. */
export function DeskThreadPage({ page, errors, values }: { page: Page; errors: DismissErrors; values: Record<string, string> }) {
  const { thread, lines, reports, claim, claimMinutes, trail } = page;
  const mine = claim?.mine ?? false;
  const open = reports.filter((r) => r.resolution === null);
  return (
    <main className="mx-auto w-full max-w-4xl space-y-6 px-4 py-10">
      <PageHeader
        overline={<TextLink to="/desk?kind=report">Review desk · reports</TextLink>}
        title={thread.listing ? `Conversation about ${thread.listing.title}` : "Conversation"}
        lede={
          <>
            Between {thread.buyer ? <Link to={`/desk/users/${thread.buyer.id}`}>{thread.buyer.name}</Link> : "a former account"} (buyer) and{" "}
            {thread.seller ? <Link to={`/desk/users/${thread.seller.id}`}>{thread.seller.name}</Link> : "a former account"} (seller)
            {thread.listing ? (
              <>
                {" "}
                · <Link to={`/desk/listings/${thread.listing.id}`}>the listing on the desk</Link>
              </>
            ) : null}
          </>
        }
      />
      {claim && open.length ? <ClaimBanner claim={claim} minutes={claimMinutes} /> : null}
      <Card className="space-y-4">
        <CardTitle>Reports</CardTitle>
        {errors._form ? <FormError>{errors._form}</FormError> : null}
        <ul className="divide-y divide-rule" data-testid="thread-reports">
          {reports.map((r) => (
            <ReportLine key={r.id} report={r} canAct={mine} errors={errors} values={values} />
          ))}
        </ul>
      </Card>
      <Card className="space-y-4">
        <CardTitle>The conversation</CardTitle>
        <p className="text-xs text-ink-faint">As stored: contact details stay masked where they were masked for the other side.</p>
        {lines.length === 0 ? <p className="text-sm text-ink-soft">No messages.</p> : null}
        <ol className="space-y-3" data-testid="desk-conversation">
          {lines.map((l) => (
            <li
              key={l.id}
              className={cx(
                "rounded-panel border px-3 py-2",
                l.side === "buyer" ? "border-rule bg-card" : "border-walnut/25 bg-walnut-wash",
              )}
            >
              <p className="text-xs text-ink-faint">
                {l.who} ({l.side}) · <span className="figures">{momentText(l.at)}</span>
                {l.masked ? " · contact details masked" : ""}
              </p>
              <p className={cx("whitespace-pre-line text-sm", l.kind === "offer" && "font-medium")}>{l.text}</p>
            </li>
          ))}
        </ol>
      </Card>
      <AuditTrail items={trail} />
    </main>
  );
}

function ReportLine({
  report: r,
  canAct,
  errors,
  values,
}: {
  report: DeskReport;
  canAct: boolean;
  errors: DismissErrors;
  values: Record<string, string>;
}) {
  const busy = useNavigation().state === "submitting";
  const mine = values.flagId === r.id;
  return (
    <li className="space-y-2 py-3">
      <p className="flex flex-wrap items-center gap-2 text-sm">
        <strong className="font-semibold">{r.reason}</strong>
        {r.resolution ? <Badge>{r.resolution}</Badge> : <Badge tone="brass">Open</Badge>}
      </p>
      {r.note ? <p className="whitespace-pre-line text-sm text-ink-soft">{r.note}</p> : null}
      <p className="text-xs text-ink-faint">
        {r.reporter} · <span className="figures">{momentText(r.at)}</span>
      </p>
      {r.resolution === null ? (
        <Form method="post" className="space-y-2">
          <input type="hidden" name="flagId" value={r.id} />
          <TextareaField
            label="Note"
            name="note"
            rows={2}
            defaultValue={mine ? values.note : undefined}
            error={mine ? errors.note : undefined}
            disabled={!canAct}
            hint="Required: why the report needs nothing more."
          />
          <Button type="submit" variant="secondary" size="sm" busy={busy} disabled={!canAct}>
            Dismiss the report
          </Button>
        </Form>
      ) : null}
    </li>
  );
}
