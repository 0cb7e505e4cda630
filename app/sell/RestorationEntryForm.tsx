import { useEffect, useRef, useState } from "react";
import { Form, Link } from "react-router";
import { Button } from "~/components/Button";
import { Field, FormError, TextareaField } from "~/components/Field";
import type { FieldErrors } from "@shared/listing-draft";
import { blankPartRow, partRows, PartsListFields, postedRows, RowInput } from "./PartsListFields";
import { logValueText, type RestorationEntryView } from "@shared/restoration-form";

type Row = Record<string, string>;

/** Add or edit one dated step of the restoration log. Blank rows are ignored, so it works without JavaScript. */
export function RestorationEntryForm({
  entry,
  values,
  errors = {},
  formError,
  busy,
  cancelHref,
  focusFirst = false,
}: {
  entry?: RestorationEntryView;
  values?: Record<string, string>;
  errors?: FieldErrors;
  formError?: string;
  busy: boolean;
  cancelHref?: string;
  /** Focus the first field on mounting: after an entry was added, ready for the next. */
  focusFirst?: boolean;
}) {
  const formRef = useRef<HTMLFormElement>(null);
  useEffect(() => {
    if (focusFirst) formRef.current?.querySelector<HTMLElement>("input:not([type=hidden]), textarea, select")?.focus();
  }, [focusFirst]);
  const fromEntry = (): { before: Row[]; after: Row[] } => ({
    before: (entry?.readingsBefore ?? []).map((r) => ({ quantity: r.quantity, value: logValueText(r), conditions: r.conditions })),
    after: (entry?.readingsAfter ?? []).map((r) => ({ quantity: r.quantity, value: logValueText(r), conditions: r.conditions })),
  });
  const initial = values
    ? {
        before: postedRows(values, "before", ["quantity", "value", "conditions"]),
        after: postedRows(values, "after", ["quantity", "value", "conditions"]),
      }
    : fromEntry();
  // Two spare part rows and one spare reading row; "Add" buttons give more with JavaScript on.
  const [extra, setExtra] = useState({ parts: 2, before: 1, after: 1 });
  const v = (k: string) => values?.[k] ?? "";
  const blank = (fields: string[]) => Object.fromEntries(fields.map((f) => [f, ""]));
  const parts = [...partRows(values, entry?.parts), ...Array.from({ length: extra.parts }, blankPartRow)];
  const readingRows = (side: "before" | "after") => [
    ...initial[side],
    ...Array.from({ length: extra[side] }, () => blank(["quantity", "value", "conditions"])),
  ];

  return (
    <Form method="post" ref={formRef} className="space-y-5" noValidate aria-label={entry ? "Edit log entry" : "New log entry"}>
      <FormError>{formError}</FormError>
      <input type="hidden" name="intent" value={entry ? "update" : "add"} />
      {entry ? <input type="hidden" name="entryId" value={entry.id} /> : null}
      <div className="grid gap-4 sm:grid-cols-[12rem_1fr]">
        <Field
          label="Date"
          name="doneOn"
          type="date"
          required
          defaultValue={values ? v("doneOn") : (entry?.doneOn ?? "")}
          error={errors.doneOn}
        />
        <Field
          label="Done by"
          name="technician"
          maxLength={120}
          optional
          defaultValue={values ? v("technician") : (entry?.technician ?? "")}
          error={errors.technician}
          hint="The technician or workshop."
        />
      </div>
      <TextareaField
        label="Work done"
        name="work"
        rows={4}
        required
        defaultValue={values ? v("work") : (entry?.work ?? "")}
        error={errors.work}
        hint="What was found and what was done, e.g. “Replaced main filter capacitors, set bias to 25 mA per device.”"
      />

      <PartsListFields
        legend="Parts replaced"
        rows={parts}
        errors={errors}
        partPlaceholder="Filter capacitor 10 000 µF 63 V"
        referencePlaceholder="C401, C402"
        onAddRows={() => setExtra((x) => ({ ...x, parts: x.parts + 2 }))}
      />

      {(["before", "after"] as const).map((side) => (
        <fieldset key={side} className="space-y-2">
          <legend className="text-sm font-semibold">
            Readings {side} the work <span className="font-normal text-ink-faint">(optional)</span>
          </legend>
          {readingRows(side).map((r, i) => (
            <div key={i} className="grid gap-2 sm:grid-cols-[1fr_9rem_1.3fr]">
              <RowInput
                name={`${side}.${i}.quantity`}
                label="What"
                value={r.quantity}
                placeholder="Bias current, left"
                error={errors[`${side}.${i}.quantity`]}
              />
              <RowInput
                name={`${side}.${i}.value`}
                label="Value with unit"
                value={r.value}
                placeholder="25 mA"
                error={errors[`${side}.${i}.value`]}
              />
              <RowInput
                name={`${side}.${i}.conditions`}
                label="How measured"
                value={r.conditions}
                placeholder="After 30 min warm-up, 230 V mains"
                error={errors[`${side}.${i}.conditions`]}
              />
            </div>
          ))}
          <Button variant="quiet" size="sm" onClick={() => setExtra((x) => ({ ...x, [side]: x[side] + 1 }))}>
            Add a reading
          </Button>
        </fieldset>
      ))}
      <div className="flex flex-wrap gap-2 border-t border-rule pt-4">
        <Button type="submit" busy={busy}>
          {entry ? "Save the entry" : "Add to the log"}
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
