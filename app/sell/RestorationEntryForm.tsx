import { useEffect, useRef, useState } from "react";
import { Form, Link } from "react-router";
import { Button } from "~/components/Button";
import { controlClass, Field, FormError, TextareaField } from "~/components/Field";
import { cx } from "~/components/cx";
import type { FieldErrors } from "@shared/listing-draft";
import { logValueText, type RestorationEntryView } from "@shared/restoration-form";

type Row = Record<string, string>;

function RowInput({
  name,
  label,
  value,
  error,
  placeholder,
  className,
  inputMode,
}: {
  name: string;
  label: string;
  value: string;
  error?: string;
  placeholder?: string;
  className?: string;
  inputMode?: "numeric";
}) {
  return (
    <label className={cx("block space-y-1", className)}>
      <span className="text-xs font-medium text-ink-soft">{label}</span>
      <input
        name={name}
        defaultValue={value}
        placeholder={placeholder}
        inputMode={inputMode}
        aria-invalid={error ? true : undefined}
        className={controlClass}
      />
      {error ? (
        <span role="alert" className="block text-xs font-medium text-fault">
          {error}
        </span>
      ) : null}
    </label>
  );
}

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
  const fromEntry = (): { parts: Row[]; before: Row[]; after: Row[] } => ({
    parts: (entry?.parts ?? []).map((p) => ({ part: p.part, quantity: String(p.quantity), reference: p.reference ?? "" })),
    before: (entry?.readingsBefore ?? []).map((r) => ({ quantity: r.quantity, value: logValueText(r), conditions: r.conditions })),
    after: (entry?.readingsAfter ?? []).map((r) => ({ quantity: r.quantity, value: logValueText(r), conditions: r.conditions })),
  });
  const rowsFrom = (prefix: string, fields: string[]): Row[] => {
    if (!values) return [];
    const rows: Row[] = [];
    for (let i = 0; i < 80; i++) {
      const row = Object.fromEntries(fields.map((f) => [f, values[`${prefix}.${i}.${f}`] ?? ""]));
      if (fields.some((f) => row[f])) rows.push(row);
    }
    return rows;
  };
  const initial = values
    ? {
        parts: rowsFrom("parts", ["part", "quantity", "reference"]),
        before: rowsFrom("before", ["quantity", "value", "conditions"]),
        after: rowsFrom("after", ["quantity", "value", "conditions"]),
      }
    : fromEntry();
  // Two spare part rows and one spare reading row; "Add" buttons give more with JavaScript on.
  const [extra, setExtra] = useState({ parts: 2, before: 1, after: 1 });
  const v = (k: string) => values?.[k] ?? "";
  const blank = (fields: string[]) => Object.fromEntries(fields.map((f) => [f, ""]));
  const parts = [...initial.parts, ...Array.from({ length: extra.parts }, () => blank(["part", "quantity", "reference"]))];
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

      <fieldset className="space-y-2">
        <legend className="text-sm font-semibold">Parts replaced</legend>
        {parts.map((p, i) => (
          <div key={i} className="grid grid-cols-[4.5rem_1fr] gap-2 sm:grid-cols-[5rem_1fr_12rem]">
            <RowInput
              name={`parts.${i}.quantity`}
              label="Qty"
              value={p.quantity}
              inputMode="numeric"
              error={errors[`parts.${i}.quantity`]}
            />
            <RowInput
              name={`parts.${i}.part`}
              label="Part"
              value={p.part}
              placeholder="Filter capacitor 10 000 µF 63 V"
              error={errors[`parts.${i}.part`]}
            />
            <RowInput
              name={`parts.${i}.reference`}
              label="Board reference"
              value={p.reference}
              placeholder="C401, C402"
              className="col-span-2 sm:col-span-1"
              error={errors[`parts.${i}.reference`]}
            />
          </div>
        ))}
        <Button variant="quiet" size="sm" onClick={() => setExtra((x) => ({ ...x, parts: x.parts + 2 }))}>
          Add part rows
        </Button>
      </fieldset>

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
