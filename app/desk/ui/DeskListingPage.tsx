import { Link } from "react-router";
import { Badge } from "~/components/Badge";
import { Card, CardTitle } from "~/components/Card";
import { PageHeader } from "~/components/PageHeader";
import { StatusBadge } from "~/sell/StatusBadge";
import type { DeskListingPage as Page } from "../listing-page.server";
import type { ActionErrors } from "../listing-actions.server";
import { momentText } from "@shared/dates";
import { AuditTrail } from "./AuditTrail";
import { ClaimBanner } from "./ClaimBanner";
import { DeskFlags } from "./DeskFlags";
import { ListingActions } from "./ListingActions";

const linkClass = "font-medium text-walnut underline decoration-walnut/40 underline-offset-2 hover:text-walnut-deep";
const OUTCOME_TONE = { implausible: "fault", questionable: "brass", missing: "neutral" } as const;

export function DeskListingPage({
  page,
  errors,
  values,
}: {
  page: Page;
  errors: ActionErrors;
  values: { intent?: string; note?: string; flagId?: string };
}) {
  const { listing, verdict, photos, flags, actions, claim, trail } = page;
  const closed = !claim.mine;
  return (
    <main className="mx-auto w-full max-w-6xl space-y-6 px-4 pb-16 pt-6 sm:px-6">
      <p className="text-sm">
        <Link to="/desk" className={linkClass}>
          ← Review desk
        </Link>
      </p>
      <PageHeader overline={`Review desk · ${listing.category}`} title={listing.title} />
      <div className="flex flex-wrap items-center gap-2 text-sm">
        <StatusBadge status={listing.status} />
        {listing.price ? <span className="figures">{listing.price}</span> : null}
        {listing.place ? <span className="text-ink-soft">{listing.place}</span> : null}
        {listing.seller ? (
          <span className="text-ink-soft">
            by{" "}
            <Link to={`/desk/users/${listing.seller.id}`} className={linkClass}>
              {listing.seller.name}
            </Link>
            {listing.seller.status === "suspended" ? (
              <Badge tone="fault" className="ml-1">
                Suspended
              </Badge>
            ) : null}
          </span>
        ) : null}
        <Link to={`/listings/${listing.id}`} className={linkClass}>
          Open the listing page
        </Link>
      </div>
      <ClaimBanner claim={claim} minutes={page.claimMinutes} />
      <div className="grid gap-6 lg:grid-cols-[minmax(0,1fr)_22rem]">
        <div className="min-w-0 space-y-6">
          {listing.status === "held" || listing.heldReason ? (
            <Card className="space-y-2" aria-labelledby="desk-hold">
              <CardTitle>
                <span id="desk-hold">Why it is held</span>
              </CardTitle>
              <p className="text-sm" data-testid="held-reason">
                {listing.heldReason ?? "No reason was recorded."}
              </p>
              {listing.reviewNote ? (
                <p className="text-sm text-ink-soft">
                  Changes asked earlier: <span className="whitespace-pre-line">{listing.reviewNote}</span>
                </p>
              ) : null}
            </Card>
          ) : null}
          {verdict ? (
            <Card className="space-y-3" aria-labelledby="desk-verdict-figures">
              <CardTitle>
                <span id="desk-verdict-figures">The bench's verdict</span>
              </CardTitle>
              <p className="text-sm">{verdict.summary}</p>
              {verdict.checkedAt ? <p className="text-xs text-ink-faint">Checked {momentText(verdict.checkedAt)}</p> : null}
              {verdict.lines.length ? (
                <ul className="divide-y divide-rule">
                  {verdict.lines.map((l, i) => (
                    <li key={i} className="space-y-1 py-2 text-sm">
                      <p className="flex flex-wrap items-center gap-2">
                        <Badge tone={OUTCOME_TONE[l.outcome as keyof typeof OUTCOME_TONE] ?? "neutral"}>{l.outcome}</Badge>
                        <span className="font-semibold">{l.title}</span>
                      </p>
                      <p className="text-ink-soft">{l.detail}</p>
                      {l.figures.length ? <p className="figures text-xs text-ink-faint">{l.figures.join(" · ")}</p> : null}
                    </li>
                  ))}
                </ul>
              ) : (
                <p className="text-sm text-ink-soft">Every rule came out consistent.</p>
              )}
            </Card>
          ) : null}
          <DeskFlags flags={flags} disabled={closed} errors={errors} values={values} />
          {photos.length ? (
            <Card className="space-y-3" aria-labelledby="desk-photos">
              <CardTitle>
                <span id="desk-photos">Photos</span>
              </CardTitle>
              <div className="grid grid-cols-2 gap-2 sm:grid-cols-3">
                {photos.map((p) => (
                  <img key={p.id} src={p.url} alt="" className="aspect-[4/3] w-full rounded-md border border-rule object-cover" />
                ))}
              </div>
            </Card>
          ) : null}
        </div>
        <div className="space-y-6">
          <ListingActions actions={actions} disabled={closed} errors={errors} values={values} />
          {!actions.some((a) => a !== "dismiss_flag") ? (
            <p className="text-sm text-ink-soft">Nothing to decide on a {listing.status} listing beyond its flags.</p>
          ) : null}
          <AuditTrail items={trail} />
        </div>
      </div>
    </main>
  );
}
