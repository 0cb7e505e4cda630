import { data, redirect } from "react-router";
import type { Route } from "./+types/thread";
import { assertSameOrigin } from "~/auth/csrf.server";
import { requireRole } from "~/auth/guards.server";
import { readPageForm } from "~/http/body.server";
import { pageError } from "~/http/errors.server";
import { deskThreadPage, dismissThreadReport } from "~/reports/desk-thread.server";
import { DeskThreadPage } from "~/reports/ui/DeskThreadPage";

// /desk/threads/:id: a reported conversation for moderators, read-only, with its reports and trail.

export const meta: Route.MetaFunction = () => [{ title: "Reported conversation · Review desk · Loadline" }];

export async function loader({ request, params }: Route.LoaderArgs) {
  const moderator = await requireRole(request, "moderator");
  try {
    return data(await deskThreadPage(moderator, params.id), { headers: { "Cache-Control": "private, no-store" } });
  } catch (e) {
    pageError(e);
  }
}

export async function action({ request, params }: Route.ActionArgs) {
  assertSameOrigin(request);
  const moderator = await requireRole(request, "moderator");
  const fields = Object.fromEntries(await readPageForm(request));
  try {
    const done = await dismissThreadReport(moderator, params.id, fields);
    if (done.ok) return redirect(`/desk/threads/${params.id}`);
    const values = { flagId: String(fields.flagId ?? "").slice(0, 40), note: String(fields.note ?? "").slice(0, 4000) };
    return data({ errors: done.errors, values }, { status: done.status });
  } catch (e) {
    pageError(e);
  }
}

export default function DeskThread({ loaderData, actionData }: Route.ComponentProps) {
  return <DeskThreadPage page={loaderData} errors={actionData?.errors ?? {}} values={actionData?.values ?? {}} />;
}
