import { Form, Link, useNavigation } from "react-router";
import { Button } from "~/components/Button";
import { Card, CardTitle } from "~/components/Card";
import { FormError, TextareaField } from "~/components/Field";
import { PageHeader } from "~/components/PageHeader";
import { Notice } from "~/auth/AuthPanel";
import { dayText } from "@shared/dates";
import type { ReportErrors, ReportPage } from "../reports.server";
import { REPORT_NOTE_MAX } from "../words";

// The report page for a listing or a conversation: a reason from the short list and a note, sent to the
// review desk. A plain form: it works without JavaScript.

export function ReportView({
  page,
  sent,
  errors = {},
  values = {},
}: {
  page: ReportPage;
  sent: boolean;
  errors?: ReportErrors;
  values?: Record<string, string>;
}) {
  const busy = useNavigation().state === "submitting";
  const what = page.target.kind === "listing" ? "listing" : "conversation";
  return (
    <main className="mx-auto w-full max-w-2xl space-y-6 px-4 py-10">
      <p className="text-sm">
        <Link to={page.backHref}>← Back to the {what}</Link>
      </p>
      <PageHeader overline={`Report this ${what}`} title={page.title} />
      {sent ? <Notice>Thank you. The review desk has your report; a moderator will look at it.</Notice> : null}
      {page.reportedAt ? (
        <p className="text-sm text-ink-soft" data-testid="already-reported">
          You reported this {what} on <span className="figures">{dayText(page.reportedAt)}</span>. The review desk has it; you can report it
          again once a moderator has dealt with it.
        </p>
      ) : (
        <Card className="space-y-4">
          <CardTitle>What is wrong?</CardTitle>
          <Form method="post" className="space-y-4" noValidate>
            {errors._form ? <FormError>{errors._form}</FormError> : null}
            <fieldset className="space-y-2" aria-describedby={errors.reason ? "report-reason-error" : undefined}>
              <legend className="text-sm font-medium">Reason</legend>
              {page.reasons.map((r) => (
                <label key={r.value} className="flex items-start gap-2 text-sm">
                  <input type="radio" name="reason" value={r.value} defaultChecked={values.reason === r.value} className="mt-1" />
                  <span>{r.label}</span>
                </label>
              ))}
              {errors.reason ? (
                <p id="report-reason-error" role="alert" className="text-[0.8125rem] font-medium text-fault">
                  {errors.reason}
                </p>
              ) : null}
            </fieldset>
            <TextareaField
              label="Note for the moderators"
              name="note"
              rows={4}
              maxLength={REPORT_NOTE_MAX}
              defaultValue={values.note}
              error={errors.note}
              hint="What you saw, and where. The other side does not see your report."
            />
            <Button type="submit" busy={busy}>
              Send the report
            </Button>
          </Form>
        </Card>
      )}
    </main>
  );
}
