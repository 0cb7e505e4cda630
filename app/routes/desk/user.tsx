import { data } from "react-router";
import type { Route } from "./+types/user";
import { assertSameOrigin } from "~/auth/csrf.server";
import { requireRole } from "~/auth/guards.server";
import { redirectWithNotice } from "~/auth/session.server";
import { readPageForm } from "~/http/body.server";
import { requestClock } from "~/buying/clock.server";
import { NOTE_MAX } from "~/desk/listing-actions.server";
import { actOnUser, deskUserPage } from "~/desk/user-desk.server";
import { DeskUserPage } from "~/desk/ui/DeskUserPage";

// /desk/users/:id: an account on the review desk — suspend or reinstate it, with its trail.

export function meta({ data: page }: Route.MetaArgs) {
  return [{ title: page ? `${page.account.name} · Review desk · Loadline` : "Account · Review desk · Loadline" }];
}

export async function loader({ request, params }: Route.LoaderArgs) {
  const moderator = await requireRole(request, "moderator");
  return data(await deskUserPage(moderator, params.id, await requestClock()), { headers: { "Cache-Control": "private, no-store" } });
}

export async function action({ request, params }: Route.ActionArgs) {
  assertSameOrigin(request);
  const moderator = await requireRole(request, "moderator");
  const fields = Object.fromEntries(await readPageForm(request));
  const done = await actOnUser(moderator, params.id, fields, await requestClock());
  if (!done.ok)
    return data({ errors: done.errors, values: { note: String(fields.note ?? "").slice(0, NOTE_MAX) } }, { status: done.status });
  const notice =
    done.intent === "suspend_account"
      ? `Suspended. ${done.withdrawn} listing${done.withdrawn === 1 ? "" : "s"} left the market; the owner has been told.`
      : "Reinstated; the owner has been told.";
  return redirectWithNotice(request, `/desk/users/${params.id}`, notice);
}

export default function DeskUser({ loaderData, actionData }: Route.ComponentProps) {
  return <DeskUserPage page={loaderData} errors={actionData?.errors ?? {}} values={actionData?.values ?? {}} />;
}
