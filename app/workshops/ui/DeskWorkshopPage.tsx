import { Form, useNavigation } from "react-router";
import { Badge } from "~/components/Badge";
import { Button } from "~/components/Button";
import { Card, CardTitle } from "~/components/Card";
import { FormError, TextareaField } from "~/components/Field";
import { PageHeader } from "~/components/PageHeader";
import { TextLink } from "~/auth/AuthPanel";
import { AuditTrail } from "~/desk/ui/AuditTrail";
import { ClaimBanner } from "~/desk/ui/ClaimBanner";
import type { deskWorkshopPage, DecisionErrors } from "../desk-page.server";
import type { ApplicationView } from "../desk.server";
import { APPLICATION_STATUS_LABELS, sizeText } from "../words";
import { dayText } from "@shared/dates";
import { DOCUMENT_LINK_MINUTES } from "../document-link";

type Page = Awaited<ReturnType<typeof deskWorkshopPage>>;

const STATUS = { applied: "Waiting for the desk", verified: "Verified", rejected: "Refused" } as const;

export function DeskWorkshopPage({ page, errors, values }: { page: Page; errors: DecisionErrors; values: Record<string, string> }) {
  const { workshop, applications, claim, claimMinutes, trail } = page;
  const waiting = applications.find((a) => a.status === "waiting") ?? null;
  const earlier = applications.filter((a) => a !== waiting);
  const mine = claim?.mine ?? false;
  return (
    <main className="mx-auto w-full max-w-4xl space-y-6 px-4 py-10">
      <PageHeader
        overline={<TextLink to="/desk?kind=workshop_application">Review desk · workshop applications</TextLink>}
        title={workshop.name}
        lede={
          <>
            {workshop.place} ·{" "}
            <Badge tone={workshop.status === "verified" ? "trace" : workshop.status === "rejected" ? "fault" : "brass"}>
              {STATUS[workshop.status]}
            </Badge>
          </>
        }
      />
      {claim && waiting ? <ClaimBanner claim={claim} minutes={claimMinutes} /> : null}
      {waiting ? (
        <ApplicationCard application={waiting} owner={workshop.owner} />
      ) : (
        <p className="text-sm text-ink-soft">No application is waiting.</p>
      )}
      {waiting ? <DecisionCard disabled={!mine} errors={errors} values={values} /> : null}
      {earlier.length ? (
        <section className="space-y-3" aria-labelledby="earlier-applications">
          <h2 id="earlier-applications" className="text-xl">
            {waiting ? "Earlier applications" : "Applications"}
          </h2>
          {earlier.map((a) => (
            <ApplicationCard key={a.id} application={a} owner={workshop.owner} />
          ))}
        </section>
      ) : null}
      <AuditTrail items={trail} />
    </main>
  );
}

function ApplicationCard({ application: a, owner }: { application: ApplicationView; owner: Page["workshop"]["owner"] }) {
  return (
    <Card className="space-y-4" data-testid={`application-${a.status}`}>
      <div className="flex flex-wrap items-baseline justify-between gap-2">
        <CardTitle>Application of {dayText(a.sentAt)}</CardTitle>
        <Badge tone={a.status === "verified" ? "trace" : a.status === "refused" ? "fault" : "brass"}>
          {APPLICATION_STATUS_LABELS[a.status]}
        </Badge>
      </div>
      <dl className="grid gap-x-6 gap-y-2 text-sm sm:grid-cols-[12rem_1fr]">
        <dt className="text-ink-faint">Business name</dt>
        <dd>{a.businessName}</dd>
        <dt className="text-ink-faint">Address</dt>
        <dd className="whitespace-pre-line">{a.address}</dd>
        <dt className="text-ink-faint">Registration number</dt>
        <dd className="figures">{a.registrationNumber}</dd>
        <dt className="text-ink-faint">Applicant</dt>
        <dd>{owner ? `${owner.name} · ${owner.email}` : "unknown"}</dd>
        <dt className="text-ink-faint">Document</dt>
        <dd className="space-y-1">
          <a
            href={a.document.href}
            target="_blank"
            rel="noreferrer noopener"
            className="font-medium text-walnut underline underline-offset-2"
          >
            Open the document
          </a>{" "}
          <span className="text-ink-faint">
            ({a.document.name}, <span className="figures">{sizeText(a.document.bytes)}</span>)
          </span>
          <p className="text-xs text-ink-faint">
            The link works for {DOCUMENT_LINK_MINUTES} minutes and only for you; reload the page for a fresh one.
          </p>
        </dd>
        {a.decidedAt ? (
          <>
            <dt className="text-ink-faint">Decided</dt>
            <dd>
              <span className="figures">{dayText(a.decidedAt)}</span> by {a.decidedBy}: {a.note}
            </dd>
          </>
        ) : null}
      </dl>
    </Card>
  );
}

function DecisionCard({ disabled, errors, values }: { disabled: boolean; errors: DecisionErrors; values: Record<string, string> }) {
  const busy = useNavigation().state === "submitting";
  return (
    <Card className="space-y-4">
      <CardTitle>Decision</CardTitle>
      <Form method="post" className="space-y-4">
        {errors._form ? <FormError>{errors._form}</FormError> : null}
        {errors.decision ? <FormError>{errors.decision}</FormError> : null}
        <TextareaField
          label="Note"
          name="note"
          rows={3}
          defaultValue={values.note}
          error={errors.note}
          hint="Required. It goes on the trail and to the applicant: what you checked, or what is missing."
          disabled={disabled}
        />
        <div className="flex flex-wrap gap-2">
          <Button type="submit" name="decision" value="verify" busy={busy} disabled={disabled}>
            Verify the workshop
          </Button>
          <Button type="submit" name="decision" value="refuse" variant="danger" busy={busy} disabled={disabled}>
            Refuse
          </Button>
        </div>
      </Form>
    </Card>
  );
}
