import { data, Form, redirect, useNavigation } from "react-router";
import type { Route } from "./+types/workshop";
import { Badge } from "~/components/Badge";
import { Button } from "~/components/Button";
import { Card, CardTitle } from "~/components/Card";
import { Field, FormError, SelectField, TextareaField } from "~/components/Field";
import { PageHeader } from "~/components/PageHeader";
import { Notice, TextLink } from "~/auth/AuthPanel";
import { assertSameOrigin } from "~/auth/csrf.server";
import { requireUser } from "~/auth/guards.server";
import { applicationState, submitApplication } from "~/workshops/apply.server";
import { APPLICATION_STATUS_LABELS } from "~/workshops/words";
import { dayText } from "@shared/dates";
import { countryOptions } from "@shared/countries";
import type { ApplicationStatus } from "~/models/workshop-application.server";

export const meta: Route.MetaFunction = () => [{ title: "Apply as a workshop · Loadline" }];

export async function loader({ request }: Route.LoaderArgs) {
  const user = await requireUser(request);
  const { workshop, latest, stage, mayApply } = await applicationState(user.id);
  const sent = new URL(request.url).searchParams.get("sent") === "1";
  return {
    stage,
    mayApply,
    sent,
    workshop: workshop ? { name: workshop.name, slug: workshop.slug } : null,
    latest: latest
      ? {
          status: plainStatus(latest.status),
          sentAt: latest.createdAt.toISOString(),
          decidedAt: latest.decidedAt?.toISOString() ?? null,
          note: latest.status === "refused" ? latest.decisionNote : null,
        }
      : null,
    countries: countryOptions(),
  };
}

function plainStatus(status: ApplicationStatus): ApplicationStatus {
  return status;
}

export async function action({ request }: Route.ActionArgs) {
  assertSameOrigin(request);
  const user = await requireUser(request);
  const result = await submitApplication(request, user.id);
  if (result.ok) return redirect("/account/workshop?sent=1");
  return data(result, { status: 400 });
}

export default function WorkshopApplicationPage({ loaderData, actionData }: Route.ComponentProps) {
  const { stage, mayApply, sent, workshop, latest, countries } = loaderData;
  const busy = useNavigation().state === "submitting";
  const errors = actionData && !actionData.ok ? actionData.errors : {};
  const values = actionData && !actionData.ok ? actionData.values : {};
  return (
    <main className="mx-auto w-full max-w-3xl space-y-8 px-4 py-10">
      <PageHeader
        overline="Your account"
        title="Apply as a workshop"
        lede="A workshop restores and measures gear for a living. Once the review desk has checked your business, your listings carry its name as a verified workshop."
      />
      {sent ? <Notice>Your application is with the review desk. We will e-mail you when a moderator has looked at it.</Notice> : null}
      {latest ? (
        <Card className="space-y-3" data-testid="application-status">
          <CardTitle>Your application</CardTitle>
          <p className="flex flex-wrap items-center gap-2">
            <span className="font-medium">{workshop?.name}</span>
            <Badge tone={latest.status === "verified" ? "trace" : latest.status === "refused" ? "fault" : "brass"}>
              {APPLICATION_STATUS_LABELS[latest.status]}
            </Badge>
          </p>
          <p className="text-sm text-ink-soft">
            Sent <span className="figures">{dayText(latest.sentAt)}</span>
            {latest.decidedAt ? (
              <>
                {" "}
                · decided <span className="figures">{dayText(latest.decidedAt)}</span>
              </>
            ) : null}
          </p>
          {latest.note ? <p className="text-sm">The desk’s note: {latest.note}</p> : null}
          {stage === "refused" ? <p className="text-sm text-ink-soft">You may apply again with the missing details below.</p> : null}
        </Card>
      ) : stage === "waiting" ? (
        <Card>
          <p className="text-sm">{workshop?.name} is waiting for the review desk.</p>
        </Card>
      ) : null}
      {stage === "verified" ? (
        <p className="text-sm">
          Your workshop is verified. <TextLink to="/sell">Go to your listings</TextLink>.
        </p>
      ) : null}
      {mayApply ? (
        <Card className="space-y-5">
          <CardTitle>The business</CardTitle>
          <Form method="post" encType="multipart/form-data" className="space-y-5" noValidate>
            {errors._form ? <FormError>{errors._form}</FormError> : null}
            <Field
              label="Business name"
              name="businessName"
              defaultValue={values.businessName}
              error={errors.businessName}
              autoComplete="organization"
              required
            />
            <TextareaField
              label="Street address"
              name="address"
              rows={3}
              defaultValue={values.address}
              error={errors.address}
              hint="Where the workshop is; the desk may check it against your document. Only the town, region and country are shown on your listings."
              required
            />
            <div className="grid gap-5 sm:grid-cols-2">
              <Field label="Town" name="town" defaultValue={values.town} error={errors.town} required />
              <Field label="Region" name="region" defaultValue={values.region} error={errors.region} optional />
            </div>
            <SelectField
              label="Country"
              name="country"
              options={countries}
              placeholder="Choose…"
              defaultValue={values.country ?? ""}
              error={errors.country}
              required
            />
            <Field
              label="Registration number"
              name="registrationNumber"
              defaultValue={values.registrationNumber}
              error={errors.registrationNumber}
              hint="As it appears in your country's business register."
              required
            />
            <DocumentField error={errors.document} />
            <p className="text-[0.8125rem] text-ink-soft">
              Restoring and measuring mains-powered gear is work for qualified technicians; verification checks your business, not your
              bench practice, and does not replace your local electrical-safety rules.
            </p>
            <Button type="submit" busy={busy}>
              Send the application
            </Button>
          </Form>
        </Card>
      ) : null}
    </main>
  );
}

function DocumentField({ error }: { error?: string }) {
  return (
    <div className="space-y-1.5">
      <label htmlFor="workshop-document" className="block text-sm font-medium text-ink">
        Registration document
      </label>
      <input
        id="workshop-document"
        type="file"
        name="document"
        accept="application/pdf,image/jpeg,image/png"
        aria-describedby={error ? "workshop-document-hint workshop-document-error" : "workshop-document-hint"}
        aria-invalid={error ? true : undefined}
        className="block w-full text-sm text-ink-soft file:mr-3 file:rounded-md file:border file:border-rule-strong file:bg-card file:px-3 file:py-1.5 file:text-sm file:text-ink"
      />
      <p id="workshop-document-hint" className="text-[0.8125rem] text-ink-faint">
        A PDF, JPEG or PNG of at most 8 MB. It is kept privately: only the review desk can open it.
      </p>
      {error ? (
        <p id="workshop-document-error" role="alert" className="text-[0.8125rem] font-medium text-fault">
          {error}
        </p>
      ) : null}
    </div>
  );
}
