import { data, Form, Link, useNavigation } from "react-router";
import type { Route } from "./+types/review";
import { requireUser } from "~/auth/guards.server";
import { assertSameOrigin } from "~/auth/csrf.server";
import { readPageForm } from "~/http/body.server";
import { redirectWithNotice } from "~/auth/session.server";
import { publishListing } from "~/listings/publish.server";
import { stepFailure } from "~/listings/http.server";
import { ListingInputError } from "~/listings/errors.server";
import { Button, ButtonLink } from "~/components/Button";
import { BenchVerifiedMark } from "~/components/BenchVerifiedMark";
import { FormError } from "~/components/Field";
import { Section } from "~/sell/Section";
import { OutcomeCounts } from "~/sell/bench/VerdictPanel";
import { checklistHeading } from "~/sell/review-words";
import { useEditor } from "./editor";
import {
  COSMETIC_GRADE_TEXT,
  formatEra,
  formatPrice,
  formatWeight,
  SERVICE_STATE_TEXT,
  SHIPPING_METHOD_LABELS,
  listingTitle,
} from "@shared/catalogue";
import { countryName } from "@shared/countries";

type Failure = { formError?: string; issues: string[] };

export async function action({ request, params }: Route.ActionArgs) {
  assertSameOrigin(request);
  const user = await requireUser(request);
  const form = await readPageForm(request);
  if (form.get("intent") !== "publish") return data<Failure>({ formError: "Unknown request.", issues: [] }, { status: 400 });
  try {
    const { listing, verdict } = await publishListing(params.id, user);
    const title = listingTitle(listing.maker, listing.model);
    const notice =
      listing.status === "held"
        ? listing.reviewNote
          ? `${title} is back at the review desk with your changes. It reaches the market once a moderator clears it.`
          : `${title} is published and waiting at the review desk. ${sentence(listing.heldReason)}It reaches the market once a moderator clears it.`
        : listing.benchVerified
          ? `${title} is live and bench-verified.`
          : `${title} is live.${verdict ? " It does not carry the bench-verified mark; the verdict says why." : ""}`;
    return redirectWithNotice(request, `/sell/${params.id}/review`, notice);
  } catch (e) {
    if (e instanceof ListingInputError)
      return data<Failure>({ formError: e.message, issues: e.issues.map((i) => i.message) }, { status: 400 });
    const failure = stepFailure(e);
    return data<Failure>({ formError: failure.ok ? undefined : failure.formError, issues: [] }, { status: 409 });
  }
}

/** The hold's reason as a sentence of its own, or nothing. */
function sentence(reason: string | null): string {
  const r = reason?.trim();
  return r ? `${/[.!?]$/.test(r) ? r : `${r}.`} ` : "";
}

export default function ReviewStep({ actionData }: Route.ComponentProps) {
  const { listing, checklist, verdict, photos, restoration } = useEditor();
  const busy = useNavigation().state === "submitting";
  const open = checklist.filter((c) => !c.ok);
  const canPublish = (listing.status === "draft" || listing.status === "withdrawn") && open.length === 0;
  const ready = photos.filter((p) => p.status === "ready").length;
  const era = formatEra(listing.yearFrom, listing.yearTo);
  const heading = checklistHeading(listing.status);
  return (
    <div className="grid items-start gap-5 lg:grid-cols-[minmax(0,1fr)_22rem]">
      <div className="space-y-5">
        <Section title={heading.title} lede={heading.lede}>
          <ul className="space-y-2" aria-label="Publishing checklist">
            {checklist.map((c) => (
              <li key={c.id} className="flex items-start gap-3" data-check={c.id} data-ok={c.ok}>
                <span
                  aria-hidden="true"
                  className={
                    c.ok
                      ? "mt-0.5 inline-flex size-5 shrink-0 items-center justify-center rounded-full bg-trace text-xs text-card"
                      : "mt-0.5 inline-flex size-5 shrink-0 rounded-full border-2 border-dashed border-rule-strong"
                  }
                >
                  {c.ok ? "✓" : ""}
                </span>
                <div className="text-sm">
                  <p className="font-medium text-ink">
                    {c.label}
                    <span className="sr-only">{c.ok ? ": done" : ": still needed"}</span>
                  </p>
                  {c.ok ? null : (
                    <p className="text-ink-soft">
                      {c.hint}{" "}
                      {c.step === "account" ? (
                        <Link to="/account">Your account</Link>
                      ) : (
                        <Link to={`/sell/${listing.id}/${c.step}`}>Go to this step</Link>
                      )}
                    </p>
                  )}
                </div>
              </li>
            ))}
          </ul>
        </Section>
        <Section title={listing.status === "draft" || listing.status === "withdrawn" ? "What buyers will see" : "What buyers see"}>
          <dl className="grid gap-x-6 gap-y-3 text-sm sm:grid-cols-2">
            <div>
              <dt className="text-ink-faint">Unit</dt>
              <dd className="font-medium">
                {listing.title}
                {era ? `, ${era}` : ""}
              </dd>
            </div>
            <div>
              <dt className="text-ink-faint">Price</dt>
              <dd>
                <span className="figures">{listing.priceMinor !== null ? formatPrice(listing.priceMinor, listing.currency) : "—"}</span>
                {listing.offersWelcome ? " · offers welcome" : ""}
              </dd>
            </div>
            <div>
              <dt className="text-ink-faint">Condition</dt>
              <dd>
                {listing.cosmeticGrade ? COSMETIC_GRADE_TEXT[listing.cosmeticGrade].label : "—"} ·{" "}
                {listing.serviceState ? SERVICE_STATE_TEXT[listing.serviceState].label : "—"}
              </dd>
            </div>
            <div>
              <dt className="text-ink-faint">Where</dt>
              <dd>
                {[listing.town, listing.region, listing.country ? countryName(listing.country) : null].filter(Boolean).join(", ") || "—"}
              </dd>
            </div>
            <div>
              <dt className="text-ink-faint">Weight</dt>
              <dd className="figures">{listing.weightG ? formatWeight(listing.weightG) : "—"}</dd>
            </div>
            <div>
              <dt className="text-ink-faint">Shipping</dt>
              <dd>{listing.shippingOptions.map((o) => SHIPPING_METHOD_LABELS[o.method]).join(" · ") || "—"}</dd>
            </div>
            <div>
              <dt className="text-ink-faint">Photos</dt>
              <dd className="figures">{ready}</dd>
            </div>
            <div>
              <dt className="text-ink-faint">Restoration log</dt>
              <dd>
                {restoration.length} {restoration.length === 1 ? "entry" : "entries"}
              </dd>
            </div>
          </dl>
          <p className="text-xs text-ink-faint">The serial number and postcode are never shown.</p>
        </Section>
      </div>
      <aside className="space-y-4 lg:sticky lg:top-4">
        <Section title="Bench sheet">
          {verdict ? (
            <div className="space-y-2 text-sm">
              {verdict.benchVerified ? <BenchVerifiedMark /> : null}
              <p>{verdict.summary}</p>
              <OutcomeCounts verdict={verdict} />
              {verdict.counts.implausible > 0 ? (
                <p className="font-medium text-fault">Publishing sends this listing to the review desk first (held for review).</p>
              ) : null}
              <Link to={`/sell/${listing.id}/bench`}>Open the bench sheet</Link>
            </div>
          ) : (
            <p className="text-sm text-ink-soft">No bench sheet yet. Without one the listing cannot earn the bench-verified mark.</p>
          )}
        </Section>
        <Form method="post" className="space-y-3">
          <FormError>{actionData?.formError}</FormError>
          {actionData?.issues?.length ? (
            <ul className="list-disc pl-5 text-sm text-fault">
              {actionData.issues.map((i, n) => (
                <li key={n}>{i}</li>
              ))}
            </ul>
          ) : null}
          {listing.status === "draft" || listing.status === "withdrawn" ? (
            <>
              <Button type="submit" name="intent" value="publish" size="lg" className="w-full" busy={busy} disabled={!canPublish}>
                {listing.status === "withdrawn" ? "Publish again" : "Publish"}
              </Button>
              <p className="text-xs text-ink-faint">
                {canPublish
                  ? "The bench checks the saved sheet once more as you publish."
                  : `${open.length} thing${open.length > 1 ? "s" : ""} still missing.`}
              </p>
            </>
          ) : listing.status === "live" ? (
            <ButtonLink to={`/listings/${listing.id}`} variant="secondary" className="w-full">
              View the public page
            </ButtonLink>
          ) : null}
        </Form>
      </aside>
    </div>
  );
}
