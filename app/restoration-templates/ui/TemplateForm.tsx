import { useState } from "react";
import { Form, Link } from "react-router";
import { Button } from "~/components/Button";
import { controlClass, Field, FormError, TextareaField } from "~/components/Field";
import type { FieldErrors } from "@shared/listing-draft";
import type { RestorationTemplateView } from "@shared/restoration-template";

type PartRow = { quantity: string; part: string; reference: string };

function PartInput({
  name,
  label,
  value,
  error,
  placeholder,
}: {
  name: string;
  label: string;
  value: string;
  error?: string;
  placeholder?: string;
}) {
  return (
    <label className="block space-y-1">
      <span className="text-xs font-medium text-ink-soft">{label}</span>
      <input name={name} defaultValue={value} placeholder={placeholder} aria-invalid={error ? true : undefined} className={controlClass} />
      {error ? (
        <span role="alert" className="block text-xs font-medium text-fault">
          {error}
        </span>
      ) : null}
    </label>
  );
}

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
  const stored: PartRow[] = values
    ? Array.from({ length: 70 }, (_, i) => ({
        quantity: values[`parts.${i}.quantity`] ?? "",
        part: values[`parts.${i}.part`] ?? "",
        reference: values[`parts.${i}.reference`] ?? "",
      })).filter((r) => r.quantity || r.part || r.reference)
    : (template?.parts ?? []).map((p) => ({ quantity: String(p.quantity), part: p.part, reference: p.reference ?? "" }));
  const rows = [...stored, ...Array.from({ length: extra }, () => ({ quantity: "", part: "", reference: "" }))];
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
      <fieldset className="space-y-2">
        <legend className="text-sm font-semibold">Parts list</legend>
        {rows.map((p, i) => (
          <div key={i} className="grid grid-cols-[4.5rem_1fr] gap-2 sm:grid-cols-[5rem_1fr_12rem]">
            <PartInput name={`parts.${i}.quantity`} label="Qty" value={p.quantity} error={errors[`parts.${i}.quantity`]} />
            <PartInput
              name={`parts.${i}.part`}
              label="Part"
              value={p.part}
              placeholder="Electrolytic capacitor 470 µF 50 V"
              error={errors[`parts.${i}.part`]}
            />
            <div className="col-span-2 sm:col-span-1">
              <PartInput
                name={`parts.${i}.reference`}
                label="Board reference"
                value={p.reference}
                placeholder="C501, C502"
                error={errors[`parts.${i}.reference`]}
              />
            </div>
          </div>
        ))}
        <Button variant="quiet" size="sm" onClick={() => setExtra((n) => n + 3)}>
          Add part rows
        </Button>
      </fieldset>
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
