import { data, redirect, useNavigation } from "react-router";
import type { Route } from "./+types/item";
import { requireUser } from "~/auth/guards.server";
import { assertSameOrigin } from "~/auth/csrf.server";
import { BODY_LIMITS, readPageForm } from "~/http/body.server";
import { saveItem } from "~/listings/drafts.server";
import { stepFailure } from "~/listings/http.server";
import { ItemForm } from "~/sell/ItemForm";
import { useEditor } from "./editor";
import { ITEM_FORM_FIELD, itemFormValues, readItemForm } from "@shared/listing-draft";

export async function action({ request, params }: Route.ActionArgs) {
  assertSameOrigin(request);
  const user = await requireUser(request);
  const form = await readPageForm(request, { maxBytes: BODY_LIMITS.editorForm });
  const values = Object.fromEntries([...form.entries()].map(([k, v]) => [k, typeof v === "string" ? (v === "on" ? true : v) : ""]));
  const read = readItemForm(form);
  if (!read.ok) return data({ ok: false as const, errors: read.errors, formError: undefined, values }, { status: 400 });
  try {
    await saveItem(params.id, user.id, read.value);
  } catch (e) {
    return data({ ...stepFailure(e, ITEM_FORM_FIELD), values }, { status: 400 });
  }
  if (form.get("intent") === "next") return redirect(`/sell/${params.id}/condition`);
  return { ok: true as const, notice: "Saved." };
}

export default function ItemStep({ actionData }: Route.ComponentProps) {
  const { listing } = useEditor();
  const busy = useNavigation().state === "submitting";
  const failed = actionData && !actionData.ok ? actionData : null;
  return (
    <ItemForm
      listingId={listing.id}
      values={failed?.values ?? itemFormValues(listing)}
      errors={failed?.errors}
      formError={failed?.formError}
      published={listing.status !== "draft"}
      busy={busy}
      notice={actionData?.ok ? actionData.notice : undefined}
    />
  );
}
