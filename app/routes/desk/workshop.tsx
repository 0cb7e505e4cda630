import { data, redirect } from "react-router";
import type { Route } from "./+types/workshop";
import { assertSameOrigin } from "~/auth/csrf.server";
import { requireRole } from "~/auth/guards.server";
import { readPageForm } from "~/http/body.server";
import { decideFromDesk, deskWorkshopPage } from "~/workshops/desk-page.server";
import { DeskWorkshopPage } from "~/workshops/ui/DeskWorkshopPage";

// /desk/workshops/:id: a workshop's application on the review desk (its document through a signed
// link), the decision with its note, and the trail.

export function meta({ data: page }: Route.MetaArgs) {
  return [{ title: page ? `${page.workshop.name} · Review desk · Loadline` : "Workshop · Review desk · Loadline" }];
}

export async function loader({ request, params }: Route.LoaderArgs) {
  const moderator = await requireRole(request, "moderator");
  return data(await deskWorkshopPage(moderator, params.id), { headers: { "Cache-Control": "private, no-store" } });
}

export async function action({ request, params }: Route.ActionArgs) {
  assertSameOrigin(request);
  const moderator = await requireRole(request, "moderator");
  const fields = Object.fromEntries(await readPageForm(request));
  const done = await decideFromDesk(moderator, params.id, fields);
  if (!done.ok) return data({ errors: done.errors, values: { note: String(fields.note ?? "").slice(0, 4000) } }, { status: done.status });
  return redirect(`/desk/workshops/${params.id}`);
}

export default function DeskWorkshop({ loaderData, actionData }: Route.ComponentProps) {
  return <DeskWorkshopPage page={loaderData} errors={actionData?.errors ?? {}} values={actionData?.values ?? {}} />;
}
