import { Form, Link, useNavigation } from "react-router";
import type { Route } from "./+types/index";
import { requireUser } from "~/auth/guards.server";
import { assertSameOrigin } from "~/auth/csrf.server";
import { readPageForm } from "~/http/body.server";
import { redirectWithNotice } from "~/auth/session.server";
import { sellerListings } from "~/listings/view.server";
import { withdrawListing } from "~/listings/drafts.server";
import { stepFailure } from "~/listings/http.server";
import { ButtonLink, Button } from "~/components/Button";
import { BenchVerifiedMark } from "~/components/BenchVerifiedMark";
import { OutcomeBadge } from "~/components/Badge";
import { FormError } from "~/components/Field";
import { PageHeader } from "~/components/PageHeader";
import { StatusBadge } from "~/sell/StatusBadge";
import { isOneOf } from "@shared/one-of";
import { CATEGORY_LABELS, formatPrice, listingTitle } from "@shared/catalogue";

export const meta: Route.MetaFunction = () => [{ title: "Your listings · Sell · Loadline" }];

export async function loader({ request }: Route.LoaderArgs) {
  const user = await requireUser(request);
  return { listings: await sellerListings(user.id) };
}

export async function action({ request }: Route.ActionArgs) {
  assertSameOrigin(request);
  const user = await requireUser(request);
  const form = await readPageForm(request);
  const id = String(form.get("listingId") ?? "");
  if (form.get("intent") !== "withdraw") return { ok: false as const, id, formError: "Unknown request." };
  if (form.get("confirm") !== "yes") return { ok: false as const, id, formError: "Confirm that you want to withdraw the listing." };
  try {
    const listing = await withdrawListing(id, user.id);
    return redirectWithNotice(
      request,
      "/sell",
      `${listingTitle(listing.maker, listing.model)} is withdrawn and no longer on the market. You can publish it again from its review step.`,
    );
  } catch (e) {
    const failure = stepFailure(e);
    return { ok: false as const, id, formError: failure.ok ? undefined : failure.formError };
  }
}

const GROUPS = [
  { title: "Drafts", statuses: ["draft"] },
  { title: "On the market and at the review desk", statuses: ["live", "held"] },
  { title: "Sold and withdrawn", statuses: ["sold", "withdrawn"] },
] as const;

export default function SellIndex({ loaderData, actionData }: Route.ComponentProps) {
  const { listings } = loaderData;
  const busy = useNavigation().state === "submitting";
  return (
    <main className="mx-auto w-full max-w-5xl space-y-8 px-4 py-8 sm:px-6 sm:py-10">
      <PageHeader
        overline="Sell"
        title="Your listings"
        lede="Drafts save as you go. A listing whose bench sheet passes every check carries the bench-verified mark."
        actions={<ButtonLink to="/sell/new">List a unit</ButtonLink>}
      />
      {listings.length === 0 ? (
        <div className="rounded-panel border border-dashed border-rule-strong bg-card/60 px-6 py-12 text-center">
          <h2 className="text-xl">Nothing listed yet</h2>
          <p className="mx-auto mt-2 max-w-md text-ink-soft">
            Start with the kind of unit. You fill in the details, condition, restoration log, photos and bench sheet at your own pace;
            nothing is public until you publish.
          </p>
          <ButtonLink to="/sell/new" className="mt-5">
            List your first unit
          </ButtonLink>
        </div>
      ) : (
        GROUPS.map((g) => {
          const rows = listings.filter((l) => isOneOf(g.statuses, l.status));
          if (!rows.length) return null;
          return (
            <section key={g.title} className="space-y-3" aria-labelledby={`g-${g.statuses[0]}`}>
              <h2 id={`g-${g.statuses[0]}`} className="text-xl">
                {g.title} <span className="figures text-base font-normal text-ink-faint">{rows.length}</span>
              </h2>
              <ul className="divide-y divide-rule overflow-hidden rounded-panel border border-rule bg-card shadow-panel">
                {rows.map((l) => (
                  <li key={l.id} className="flex flex-col gap-3 p-4 sm:flex-row sm:items-center sm:gap-4" data-listing={l.id}>
                    <div className="flex min-w-0 flex-1 items-start gap-3">
                      <div className="size-16 shrink-0 overflow-hidden rounded-md border border-rule bg-sunk">
                        {l.coverUrl ? <img src={l.coverUrl} alt="" className="size-full object-cover" /> : null}
                      </div>
                      <div className="min-w-0 space-y-1">
                        <Link to={`/sell/${l.id}`} className="block truncate font-serif text-lg font-semibold no-underline hover:underline">
                          {l.title === "Untitled unit" ? `New ${CATEGORY_LABELS[l.category].one.toLowerCase()}` : l.title}
                        </Link>
                        <div className="flex flex-wrap items-center gap-2 text-sm text-ink-soft">
                          <StatusBadge status={l.status} />
                          {l.benchVerified ? <BenchVerifiedMark compact /> : null}
                          <span>{CATEGORY_LABELS[l.category].one}</span>
                          {l.priceMinor !== null ? <span className="figures">{formatPrice(l.priceMinor, l.currency)}</span> : null}
                          {l.counts && !l.benchVerified
                            ? (["implausible", "questionable", "missing"] as const)
                                .filter((o) => l.counts![o] > 0)
                                .map((o) => (
                                  <OutcomeBadge key={o} outcome={o}>
                                    {l.counts![o]} {o}
                                  </OutcomeBadge>
                                ))
                            : null}
                        </div>
                        {l.status === "held" && l.heldReason ? <p className="text-sm text-brass-ink">{l.heldReason}</p> : null}
                        <p className="text-xs text-ink-faint">
                          Last saved{" "}
                          <time dateTime={l.updatedAt}>
                            {new Date(l.updatedAt).toLocaleString("en-GB", { dateStyle: "medium", timeStyle: "short", timeZone: "UTC" })}{" "}
                            UTC
                          </time>
                        </p>
                      </div>
                    </div>
                    <div className="flex shrink-0 flex-wrap items-start gap-2 sm:justify-end">
                      {l.status === "live" ? (
                        <ButtonLink to={`/listings/${l.id}`} variant="quiet" size="sm">
                          View
                        </ButtonLink>
                      ) : null}
                      <ButtonLink to={`/sell/${l.id}`} variant="secondary" size="sm">
                        {l.status === "draft" ? "Continue draft" : l.status === "sold" ? "Open" : "Edit"}
                      </ButtonLink>
                      {l.status === "live" || l.status === "held" ? (
                        <details className="group relative">
                          <summary className="inline-flex h-8 cursor-pointer list-none items-center rounded-md px-3 text-sm font-medium text-fault hover:bg-fault-wash">
                            Withdraw…
                          </summary>
                          <Form
                            method="post"
                            className="mt-2 w-72 space-y-2 rounded-md border border-rule bg-card p-3 text-sm shadow-panel sm:absolute sm:right-0 sm:z-10"
                          >
                            <p>It leaves the market at once. Buyers watching it see it as withdrawn; you can publish it again later.</p>
                            {actionData && !actionData.ok && actionData.id === l.id ? <FormError>{actionData.formError}</FormError> : null}
                            <input type="hidden" name="intent" value="withdraw" />
                            <input type="hidden" name="listingId" value={l.id} />
                            <Button type="submit" name="confirm" value="yes" variant="danger" size="sm" busy={busy}>
                              Yes, withdraw it
                            </Button>
                          </Form>
                        </details>
                      ) : null}
                    </div>
                  </li>
                ))}
              </ul>
            </section>
          );
        })
      )}
    </main>
  );
}
