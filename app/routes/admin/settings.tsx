import { data } from "react-router";
import type { Route } from "./+types/settings";
import { AdminNav } from "~/components/AdminNav";
import { PageHeader } from "~/components/PageHeader";
import { assertSameOrigin } from "~/auth/csrf.server";
import { requireRole } from "~/auth/guards.server";
import { readPageForm } from "~/http/body.server";
import { readSettingsForm } from "~/buying/settings-form";
import { loadSettingsForAdmin, saveSettingsAsAdmin } from "~/buying/settings.server";
import { SettingsForm, type SettingsActionData } from "~/buying/ui/SettingsForm";

// The admin's marketplace settings: the platform fee and the buying path's timings.

export const meta: Route.MetaFunction = () => [{ title: "Marketplace settings · Admin · Loadline" }];

export async function loader({ request }: Route.LoaderArgs) {
  await requireRole(request, "admin");
  return data(await loadSettingsForAdmin(), { headers: { "Cache-Control": "private, no-store" } });
}

export async function action({ request }: Route.ActionArgs) {
  assertSameOrigin(request);
  const admin = await requireRole(request, "admin");
  const form = await readPageForm(request);
  const read = readSettingsForm(form);
  if (!read.ok) {
    // What was typed goes back into the fields.
    const values: Record<string, string> = {};
    for (const [k, v] of form.entries()) if (typeof v === "string") values[k] = v.slice(0, 40);
    return data<SettingsActionData>({ kind: "invalid", errors: read.errors, values }, { status: 400 });
  }
  await saveSettingsAsAdmin(admin.id, read.value);
  return data<SettingsActionData>({ kind: "saved" });
}

export default function AdminSettings({ loaderData, actionData }: Route.ComponentProps) {
  return (
    <main className="mx-auto w-full max-w-6xl space-y-6 px-4 py-10">
      <PageHeader
        overline="Admin"
        title="Marketplace settings"
        lede="The platform's fee on each sale and the deadlines of the buying path, from reservation to the end of the audition window."
        actions={<AdminNav />}
      />
      <SettingsForm stored={loaderData.values} updated={loaderData.updated} result={actionData ?? null} />
    </main>
  );
}
