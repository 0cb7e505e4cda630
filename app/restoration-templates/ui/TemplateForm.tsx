import { useState } from "react";
import { Form, Link } from "react-router";
import { Button } from "~/components/Button";
import { Field, FormError, TextareaField } from "~/components/Field";
import { blankPartRow, partRows, PartsListFields } from "~/sell/PartsListFields";
import type { FieldErrors } from "@shared/listing-draft";
import type { RestorationTemplateView } from "@shared/restoration-template";

/** A new template or an edit of one: title, work done, parts. Blank part rows are ignored, so it works without JavaScript. */
export function TemplateForm({
  template,
  values,
  errors = {},
  formError,
  busy,
  cancelHref,
}: {
  template?: RestorationTemplateView;
  values?: Record<string, string>;
  errors?: FieldErrors;
  formError?: string;
  busy: boolean;
  cancelHref?: string;
}) {
  const [extra, setExtra] = useState(3);
  const rows = [...partRows(values, template?.parts), ...Array.from({ length: extra }, blankPartRow)];
  return (
    <Form method="post" className="space-y-5" noValidate aria-label={template ? `Edit template ${template.title}` : "New template"}>
      <FormError>{formError}</FormError>
      <input type="hidden" name="intent" value={template ? "update" : "add"} />
      {template ? <input type="hidden" name="templateId" value={template.id} /> : null}
      <Field
        label="Title"
        name="title"
        required
        maxLength={120}
        defaultValue={values ? (values.title ?? "") : (template?.title ?? "")}
        error={errors.title}
        hint="How it shows in the editor's “Use a template” list, e.g. “Full recap, integrated amplifier”."
      />
      <TextareaField
        label="Work done"
        name="work"
        rows={4}
        required
        defaultValue={values ? (values.work ?? "") : (template?.work ?? "")}
        error={errors.work}
        hint="The log entry's text; adjust it per unit when you apply the template."
      />
      <PartsListFields
        legend="Parts list"
        rows={rows}
        errors={errors}
        partPlaceholder="Electrolytic capacitor 470 µF 50 V"
        referencePlaceholder="C501, C502"
        onAddRows={() => setExtra((n) => n + 3)}
      />
      <div className="flex flex-wrap gap-2 border-t border-rule pt-4">
        <Button type="submit" busy={busy}>
          {template ? "Save the template" : "Save as a template"}
        </Button>
        {cancelHref ? (
          <Link to={cancelHref} className="inline-flex h-10 items-center px-3 text-sm">
            Cancel
          </Link>
        ) : null}
      </div>
    </Form>
  );
}
