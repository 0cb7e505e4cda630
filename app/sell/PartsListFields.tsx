import { Button } from "~/components/Button";
import { controlClass } from "~/components/Field";
import { cx } from "~/components/cx";
import type { FieldErrors } from "@shared/listing-draft";
import type { RestorationPart } from "@shared/catalogue-schemas";

// The restoration log's parts rows, as a log entry and a restoration template both take them: named
// parts.<i>.quantity|part|reference, blank rows ignored by the server, so they work without JavaScript.

export type PartRow = { quantity: string; part: string; reference: string };

export const blankPartRow = (): PartRow => ({ quantity: "", part: "", reference: "" });

/**
 * The rows to show: as posted back after a refusal, else as stored. Posted rows keep their places (a
 * blank row between filled ones stays) because the server's errors name rows by their posted number.
 */
export function partRows(values: Record<string, string> | undefined, stored: readonly RestorationPart[] | undefined): PartRow[] {
  if (!values) return (stored ?? []).map((p) => ({ quantity: String(p.quantity), part: p.part, reference: p.reference ?? "" }));
  return postedRows(values, "parts", ["quantity", "part", "reference"]);
}

/** Rows `prefix.<i>.<field>` as posted, up to the last with anything typed in it. */
export function postedRows<F extends string>(values: Record<string, string>, prefix: string, fields: readonly F[]): Record<F, string>[] {
  const rows = Array.from(
    { length: 80 },
    (_, i) => Object.fromEntries(fields.map((f) => [f, values[`${prefix}.${i}.${f}`] ?? ""])) as Record<F, string>,
  );
  const last = rows.findLastIndex((row) => fields.some((f) => row[f]));
  return rows.slice(0, last + 1);
}

/** One labelled text input of a repeated row, its error beneath it. */
export function RowInput({
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

export function PartsListFields({
  legend,
  rows,
  errors,
  partPlaceholder,
  referencePlaceholder,
  onAddRows,
}: {
  legend: string;
  rows: PartRow[];
  errors: FieldErrors;
  partPlaceholder: string;
  referencePlaceholder: string;
  /** More blank rows (with JavaScript on; without it the spare rows already shown serve). */
  onAddRows: () => void;
}) {
  return (
    <fieldset className="space-y-2">
      <legend className="text-sm font-semibold">{legend}</legend>
      {rows.map((p, i) => (
        <div key={i} className="grid grid-cols-[4.5rem_1fr] gap-2 sm:grid-cols-[5rem_1fr_12rem]">
          <RowInput name={`parts.${i}.quantity`} label="Qty" value={p.quantity} inputMode="numeric" error={errors[`parts.${i}.quantity`]} />
          <RowInput name={`parts.${i}.part`} label="Part" value={p.part} placeholder={partPlaceholder} error={errors[`parts.${i}.part`]} />
          <RowInput
            name={`parts.${i}.reference`}
            label="Board reference"
            value={p.reference}
            placeholder={referencePlaceholder}
            className="col-span-2 sm:col-span-1"
            error={errors[`parts.${i}.reference`]}
          />
        </div>
      ))}
      <Button variant="quiet" size="sm" onClick={onAddRows}>
        Add part rows
      </Button>
    </fieldset>
  );
}
