import { data, redirect } from "react-router";
import type { Route } from "./+types/restoration";
import { requireUser } from "~/auth/guards.server";
import { assertSameOrigin } from "~/auth/csrf.server";
import { BODY_LIMITS, readPageForm } from "~/http/body.server";
import { addRestorationEntry, deleteRestorationEntry, updateRestorationEntry } from "~/listings/restoration.server";
import { stepFailure } from "~/listings/http.server";
import { RestorationLogStep } from "~/sell/RestorationLogStep";
import { useEditor } from "./editor";
import { readRestorationForm } from "@shared/restoration-form";
import { templatesForEditor } from "~/restoration-templates/templates.server";

// A workshop's restoration templates: "Use a template" (?template=<id>) fills the new entry's form.
export async function loader({ request }: Route.LoaderArgs) {
  const user = await requireUser(request);
  return { templates: await templatesForEditor(user, new URL(request.url).searchParams.get("template")) };
}

export async function action({ request, params }: Route.ActionArgs) {
  assertSameOrigin(request);
  const user = await requireUser(request);
  const form = await readPageForm(request, { maxBytes: BODY_LIMITS.editorForm });
  const intent = form.get("intent");
  const entryId = String(form.get("entryId") ?? "");
  const values = Object.fromEntries([...form.entries()].map(([k, v]) => [k, String(v)]));
  try {
    if (intent === "delete") {
      if (form.get("confirm") !== "yes")
        return data(
          { ok: false as const, intent: "delete", entryId, errors: {}, formError: "Confirm the deletion.", values },
          { status: 400 },
        );
      await deleteRestorationEntry(params.id, user.id, entryId);
      return redirect(`/sell/${params.id}/restoration`);
    }
    const read = readRestorationForm(form);
    if (!read.ok)
      return data(
        { ok: false as const, intent: String(intent), entryId, errors: read.errors, formError: undefined, values },
        { status: 400 },
      );
    if (intent === "update") await updateRestorationEntry(params.id, user.id, entryId, read.value);
    else {
      // A fresh "added" each time: the page starts an empty form, focused, for the next entry.
      const added = await addRestorationEntry(params.id, user.id, read.value);
      return redirect(`/sell/${params.id}/restoration?added=${added.id}`);
    }
    return redirect(`/sell/${params.id}/restoration`);
  } catch (e) {
    return data({ ...stepFailure(e, {}), intent: String(intent), entryId, values }, { status: 400 });
  }
}

export default function RestorationStep({ actionData, loaderData }: Route.ComponentProps) {
  const { listing, restoration } = useEditor();
  return (
    <RestorationLogStep
      listingId={listing.id}
      restoration={restoration}
      failure={actionData && !actionData.ok ? actionData : null}
      templates={loaderData.templates}
    />
  );
}
