import { data, redirect, useNavigation } from "react-router";
import type { Route } from "./+types/condition";
import { requireUser } from "~/auth/guards.server";
import { assertSameOrigin } from "~/auth/csrf.server";
import { BODY_LIMITS, readPageForm } from "~/http/body.server";
import { saveCondition } from "~/listings/drafts.server";
import { stepFailure } from "~/listings/http.server";
import { ConditionForm } from "~/sell/ConditionForm";
import { useEditor } from "./editor";
import { readConditionForm, type ConditionValues } from "@shared/listing-draft";
import { COSMETIC_GRADES, SERVICE_STATES } from "@shared/catalogue";
import { isOneOf } from "@shared/one-of";

export async function action({ request, params }: Route.ActionArgs) {
  assertSameOrigin(request);
  const user = await requireUser(request);
  const form = await readPageForm(request, { maxBytes: BODY_LIMITS.editorForm });
  const grade = form.get("cosmeticGrade");
  const service = form.get("serviceState");
  // What was sent, to fill the form in again next to its messages.
  const values: ConditionValues = {
    cosmeticGrade: isOneOf(COSMETIC_GRADES, grade) ? grade : null,
    serviceState: isOneOf(SERVICE_STATES, service) ? service : null,
    conditionNote: String(form.get("conditionNote") ?? ""),
  };
  const read = readConditionForm(form);
  if (!read.ok) return data({ ok: false as const, errors: read.errors, formError: undefined, values }, { status: 400 });
  try {
    await saveCondition(params.id, user.id, read.value);
  } catch (e) {
    return data({ ...stepFailure(e, {}), values }, { status: 400 });
  }
  if (form.get("intent") === "next") return redirect(`/sell/${params.id}/restoration`);
  return { ok: true as const, notice: "Saved." };
}

export default function ConditionStep({ actionData }: Route.ComponentProps) {
  const { listing } = useEditor();
  const busy = useNavigation().state === "submitting";
  const failed = actionData && !actionData.ok ? actionData : null;
  return (
    <ConditionForm
      listingId={listing.id}
      values={
        failed?.values ?? { cosmeticGrade: listing.cosmeticGrade, serviceState: listing.serviceState, conditionNote: listing.conditionNote }
      }
      errors={failed?.errors}
      formError={failed?.formError}
      busy={busy}
      notice={actionData?.ok ? actionData.notice : undefined}
    />
  );
}
