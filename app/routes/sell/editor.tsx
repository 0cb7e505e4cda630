import { Link, Outlet, useRouteLoaderData } from "react-router";
import type { Route } from "./+types/editor";
import { requireUser } from "~/auth/guards.server";
import { editorData, type EditorData } from "~/listings/view.server";
import { ListingNotFound } from "~/listings/errors.server";
import { notFoundPage } from "~/listings/http.server";
import { BenchVerifiedMark } from "~/components/BenchVerifiedMark";
import { ButtonLink } from "~/components/Button";
import { StatusBadge } from "~/sell/StatusBadge";
import { StepNav } from "~/sell/StepNav";
import { CATEGORY_LABELS } from "@shared/catalogue";
import type { EditorStep } from "@shared/listing-draft";

// The listing editor's frame: title, state and the steps. Each step is a child route with its own form.

export async function loader({ request, params }: Route.LoaderArgs) {
  const user = await requireUser(request);
  try {
    return await editorData(params.id, user);
  } catch (e) {
    if (e instanceof ListingNotFound) notFoundPage();
    throw e;
  }
}

export const meta: Route.MetaFunction = ({ data }) => [{ title: `${data?.listing.title ?? "Listing"} · Sell · Loadline` }];

/** The editor's data in a step route. */
export function useEditor(): EditorData {
  const data = useRouteLoaderData<typeof loader>("routes/sell/editor");
  if (!data) throw new Error("useEditor belongs in the editor's step routes.");
  return data;
}

export default function Editor({ loaderData }: Route.ComponentProps) {
  const { listing, checklist, verdict } = loaderData;
  const checked = (step: EditorStep) => !checklist.some((c) => c.step === step && !c.ok);
  const done: Record<EditorStep, boolean> = {
    item: checked("item"),
    condition: checked("condition"),
    restoration: loaderData.restoration.length > 0,
    photos: loaderData.photos.some((p) => p.status === "ready"),
    bench: !!verdict?.benchVerified,
    review: listing.status !== "draft" && listing.status !== "withdrawn",
  };
  const untitled = listing.title === "Untitled unit";
  return (
    <main className="mx-auto w-full max-w-6xl space-y-6 px-4 py-6 sm:px-6 sm:py-8">
      <header className="flex flex-col gap-3 sm:flex-row sm:items-end sm:justify-between">
        <div className="min-w-0 space-y-1.5">
          <p className="text-xs font-semibold uppercase tracking-[0.14em] text-brass-ink">Sell · {CATEGORY_LABELS[listing.category].one}</p>
          <h1 className="truncate text-2xl leading-tight sm:text-[2rem]">
            {untitled ? `New ${CATEGORY_LABELS[listing.category].one.toLowerCase()}` : listing.title}
          </h1>
          <div className="flex flex-wrap items-center gap-2">
            <StatusBadge status={listing.status} />
            {listing.benchVerified ? <BenchVerifiedMark compact /> : null}
          </div>
        </div>
        <div className="flex shrink-0 gap-2">
          <ButtonLink to="/sell" variant="quiet" size="sm">
            All your listings
          </ButtonLink>
          {listing.status === "draft" && !listing.publishedAt ? (
            <Link
              to={`/sell/${listing.id}/delete`}
              className="inline-flex h-8 items-center rounded-md px-3 text-sm font-medium text-fault no-underline hover:bg-fault-wash"
            >
              Delete draft…
            </Link>
          ) : null}
          {listing.status === "live" ? (
            <ButtonLink to={`/listings/${listing.id}`} variant="secondary" size="sm">
              View public page
            </ButtonLink>
          ) : null}
        </div>
      </header>
      {listing.status === "held" ? (
        <div role="status" className="rounded-md border border-brass/50 bg-brass-wash px-4 py-3 text-sm text-brass-ink">
          <strong className="font-semibold">Held for review.</strong> The market does not show this listing until a moderator has looked at
          it. {listing.heldReason}
        </div>
      ) : null}
      {listing.status === "draft" && listing.reviewNote ? (
        <div
          role="status"
          className="rounded-md border border-brass/50 bg-brass-wash px-4 py-3 text-sm text-brass-ink"
          data-testid="review-note"
        >
          <strong className="font-semibold">The review desk asked for changes.</strong>{" "}
          <span className="whitespace-pre-line">{listing.reviewNote}</span>
          <span className="mt-1 block">Make them, then publish again from the review step: the listing goes back to the desk.</span>
        </div>
      ) : null}
      {listing.status === "sold" || listing.status === "removed" ? (
        <div role="status" className="rounded-md border border-rule bg-sunk px-4 py-3 text-sm text-ink-soft">
          This listing is {listing.status}; it is kept as a record and can no longer be changed.
        </div>
      ) : null}
      <StepNav listingId={listing.id} done={done} />
      <Outlet />
    </main>
  );
}
