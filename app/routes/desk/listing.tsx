import { data } from "react-router";
import type { Route } from "./+types/listing";
import { assertSameOrigin } from "~/auth/csrf.server";
import { requireRole } from "~/auth/guards.server";
import { redirectWithNotice } from "~/auth/session.server";
import { readPageForm } from "~/http/body.server";
import { requestClock } from "~/buying/clock.server";
import { deskListingPage } from "~/desk/listing-page.server";
import { actOnListing, NOTE_MAX } from "~/desk/listing-actions.server";
import { DeskListingPage } from "~/desk/ui/DeskListingPage";

// /desk/listings/:id: a listing on the review desk — the hold, its flags, the decision and the trail.

export function meta({ data: page }: Route.MetaArgs) {
  return [{ title: page ? `${page.listing.title} · Review desk · Loadline` : "Listing · Review desk · Loadline" }];
}

export async function loader({ request, params }: Route.LoaderArgs) {
  const moderator = await requireRole(request, "moderator");
  return data(await deskListingPage(moderator, params.id, await requestClock()), { headers: { "Cache-Control": "private, no-store" } });
}

const DONE: Record<string, string> = {
  clear_hold: "Cleared: the listing is in the market and the seller has been told.",
  ask_changes: "Changes asked: the listing is back among the seller's drafts with your note.",
  remove_listing: "Removed: the listing is off Loadline and the seller has been told.",
  dismiss_flag: "Flag dismissed.",
};

export async function action({ request, params }: Route.ActionArgs) {
  assertSameOrigin(request);
  const moderator = await requireRole(request, "moderator");
  const fields = Object.fromEntries(await readPageForm(request));
  const done = await actOnListing(moderator, params.id, fields, await requestClock());
  if (!done.ok) {
    const values = {
      intent: String(fields.intent ?? "").slice(0, 40),
      note: String(fields.note ?? "").slice(0, NOTE_MAX),
      flagId: String(fields.flagId ?? "").slice(0, 40),
    };
    return data({ errors: done.errors, values }, { status: done.status });
  }
  const back = done.intent === "dismiss_flag" ? `/desk/listings/${params.id}` : "/desk";
  return redirectWithNotice(request, back, DONE[done.intent]);
}

export default function DeskListing({ loaderData, actionData }: Route.ComponentProps) {
  return <DeskListingPage page={loaderData} errors={actionData?.errors ?? {}} values={actionData?.values ?? {}} />;
}
