import { useRef } from "react";
import { Form } from "react-router";
import { FormError, TextareaField } from "~/components/Field";
import { COSMETIC_GRADES, COSMETIC_GRADE_TEXT, SERVICE_STATES, SERVICE_STATE_TEXT } from "@shared/catalogue";
import { readConditionForm, type ConditionValues, type FieldErrors } from "@shared/listing-draft";
import { ChoiceCards } from "./ChoiceCards";
import { SaveBar } from "./SaveBar";
import { Section } from "./Section";
import { useAutosave } from "./useAutosave";
import { issuesByField } from "./issues";

export function ConditionForm({
  listingId,
  values,
  errors: serverErrors = {},
  formError,
  busy,
  notice,
}: {
  listingId: string;
  values: ConditionValues;
  errors?: FieldErrors;
  formError?: string;
  busy: boolean;
  notice?: string;
}) {
  const formRef = useRef<HTMLFormElement>(null);
  const autosave = useAutosave(listingId);
  const errors = { ...serverErrors, ...issuesByField(autosave.serverIssues, "condition"), ...autosave.clientErrors };
  const onChange = () => {
    const form = formRef.current;
    if (!form) return;
    autosave.schedule(() => {
      const r = readConditionForm(new FormData(form));
      return r.ok ? { ok: true, body: { condition: r.value } } : r;
    });
  };
  return (
    <Form method="post" ref={formRef} onChange={onChange} className="space-y-5" noValidate aria-label="Condition">
      <FormError>{formError}</FormError>
      <Section title="How it looks" lede="Judge at arm's length in daylight, then say what you see close up in the note.">
        <ChoiceCards
          legend="Cosmetic grade"
          name="cosmeticGrade"
          value={values.cosmeticGrade}
          error={errors.cosmeticGrade}
          options={COSMETIC_GRADES.map((g) => ({ value: g, ...COSMETIC_GRADE_TEXT[g] }))}
        />
      </Section>
      <Section title="What has been done to it" lede="The service state tells a buyer what to expect when it is first switched on.">
        <ChoiceCards
          legend="Service state"
          name="serviceState"
          value={values.serviceState}
          error={errors.serviceState}
          options={SERVICE_STATES.map((s) => ({ value: s, ...SERVICE_STATE_TEXT[s] }))}
          hint="“Serviced & measured” needs a restoration log entry and a bench sheet before it can be published."
        />
      </Section>
      <Section title="Condition note">
        <TextareaField
          label="In your own words"
          name="conditionNote"
          rows={6}
          maxLength={4000}
          defaultValue={values.conditionNote ?? ""}
          error={errors.conditionNote}
          hint="Marks, missing parts, noisy controls, known faults. A unit that needs work or is for parts must say what is wrong."
        />
      </Section>
      <SaveBar state={autosave.state} busy={busy} notice={notice} next={{ label: "Save and go to the restoration log" }} />
    </Form>
  );
}
