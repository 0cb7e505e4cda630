import { OutcomeBadge } from "~/components/Badge";
import { controlClass } from "~/components/Field";
import { cx } from "~/components/cx";
import { CHANNELS, QUANTITY_INFO, WEIGHTING_LABELS, type Outcome, type Quantity } from "@shared/bench";
import { isOneOf } from "@shared/one-of";
import { CONDITION_FIELDS, FIELD_LABELS, SELECT_FIELDS, type ConditionField, type RowResult, type SheetRow } from "@shared/bench-form/rows";
import { rowField } from "@shared/bench-form/state";

const inputClass = cx(controlClass, "h-9 py-1.5 text-sm figures");
const selectClass = cx(controlClass, "h-9 py-1 text-sm appearance-auto");

const EXAMPLE: Record<string, string> = {
  power: "112 W",
  voltage: "28.3 Vrms",
  ratio: "0.03 %",
  decibel: "98 dB(A)",
  frequency: "95 kHz",
  time: "3.5 µs",
  resistance: "0.05 Ω",
  slewRate: "22 V/µs",
  number: "150",
};

const SELECT_LABELS: Record<string, Record<string, string>> = {
  weighting: WEIGHTING_LABELS,
  driven: { one: "One channel", both: "Both channels", all: "All channels" },
  supply: { split: "Split (± rails)", single: "Single rail" },
};

function Parsed({ id, text, error }: { id: string; text?: string; error?: string }) {
  if (error)
    return (
      <p id={id} role="alert" className="text-xs font-medium text-fault">
        {error}
      </p>
    );
  if (text)
    return (
      <p id={id} className="text-xs text-trace">
        reads as <span className="figures">{text}</span>
      </p>
    );
  return null;
}

export function ReadingRow({
  row,
  index,
  label,
  quantities,
  result,
  outcome,
  onChange,
  onRemove,
}: {
  row: SheetRow;
  index: number;
  label: string;
  quantities: readonly Quantity[];
  result?: RowResult;
  outcome?: Outcome;
  onChange: (patch: Partial<SheetRow>) => void;
  onRemove: () => void;
}) {
  const name = (f: string) => rowField(index, f);
  const id = (f: string) => `row-${row.key}-${f}`;
  const errors = result?.errors ?? {};
  const shown = result?.shown ?? {};
  const hidden = (
    <>
      <input type="hidden" name={name("key")} value={row.key} />
      <input type="hidden" name={name("basis")} value={row.basis} />
      {row.keep ? <input type="hidden" name={name("keep")} value={JSON.stringify(row.keep)} /> : null}
    </>
  );
  const remove = (
    <button
      type="submit"
      name="remove"
      value={index}
      onClick={(e) => {
        e.preventDefault();
        onRemove();
      }}
      className="inline-flex h-8 shrink-0 items-center rounded-md px-2 text-xs font-medium text-ink-faint hover:bg-sunk hover:text-fault"
      aria-label={`Remove reading ${label}`}
    >
      Remove
    </button>
  );

  const info = row.quantity ? QUANTITY_INFO[row.quantity] : null;
  const fields: ConditionField[] = row.quantity ? CONDITION_FIELDS[row.quantity] : [];
  return (
    <li
      id={`reading-${row.key}`}
      className={cx(
        "space-y-3 rounded-md border bg-card p-3",
        outcome === "implausible" ? "border-fault/50" : outcome === "questionable" ? "border-brass/60" : "border-rule",
      )}
      data-row={label}
    >
      {hidden}
      <div className="flex flex-wrap items-center gap-2">
        <span className="figures w-7 shrink-0 text-xs text-ink-faint">{label}</span>
        <label className="min-w-0 flex-1 basis-48">
          <span className="sr-only">Reading {label}: what was measured</span>
          <select
            name={name("quantity")}
            value={row.quantity}
            onChange={(e) => onChange({ quantity: isOneOf(quantities, e.target.value) ? e.target.value : "" })}
            className={selectClass}
            aria-invalid={errors.quantity ? true : undefined}
          >
            <option value="">Choose the reading…</option>
            {quantities.map((q) => (
              <option key={q} value={q}>
                {QUANTITY_INFO[q].label}
              </option>
            ))}
          </select>
        </label>
        <label className="w-32 shrink-0 max-sm:ml-9 max-sm:flex-1">
          <span className="sr-only">Channel</span>
          <select
            name={name("channel")}
            value={row.channel}
            onChange={(e) => onChange({ channel: isOneOf(CHANNELS, e.target.value) ? e.target.value : "" })}
            className={selectClass}
          >
            <option value="">Channel…</option>
            <option value="left">Left</option>
            <option value="right">Right</option>
            <option value="both">Both</option>
            <option value="mono">Mono</option>
          </select>
        </label>
        {outcome && outcome !== "consistent" ? <OutcomeBadge outcome={outcome} /> : null}
        {remove}
      </div>
      {errors.quantity ? <p className="text-xs font-medium text-fault sm:pl-9">{errors.quantity}</p> : null}
      <div className="grid grid-cols-2 gap-x-3 gap-y-2.5 sm:pl-9 lg:grid-cols-3">
        <label className="block space-y-1 max-sm:col-span-2">
          <span className="text-xs font-semibold text-ink">{row.basis === "rated" ? "Rated value" : "Measured value"}</span>
          <input
            name={name("value")}
            value={row.value}
            onChange={(e) => onChange({ value: e.target.value })}
            placeholder={info ? EXAMPLE[info.kind] : "value with unit"}
            autoComplete="off"
            spellCheck={false}
            className={inputClass}
            aria-invalid={errors.value ? true : undefined}
            aria-describedby={id("value")}
            aria-label={`Reading ${label}: ${row.basis} value${info ? `, ${info.label}` : ""}`}
          />
          <Parsed id={id("value")} text={row.value.trim() ? shown.value : undefined} error={row.value.trim() ? errors.value : undefined} />
        </label>
        {fields.map((f) => {
          const options = SELECT_FIELDS[f];
          return (
            <label key={f} className="block space-y-1">
              <span className="text-xs font-medium text-ink-soft">{FIELD_LABELS[f].label}</span>
              {options ? (
                <select
                  name={name(f)}
                  value={row[f]}
                  onChange={(e) => onChange({ [f]: e.target.value })}
                  className={selectClass}
                  aria-invalid={errors[f] ? true : undefined}
                >
                  <option value="">Not stated</option>
                  {options.map((o) => (
                    <option key={o} value={o}>
                      {SELECT_LABELS[f]?.[o] ?? o}
                    </option>
                  ))}
                </select>
              ) : (
                <input
                  name={name(f)}
                  value={row[f]}
                  onChange={(e) => onChange({ [f]: e.target.value })}
                  placeholder={FIELD_LABELS[f].placeholder}
                  autoComplete="off"
                  spellCheck={false}
                  className={inputClass}
                  aria-invalid={errors[f] ? true : undefined}
                  aria-describedby={id(f)}
                />
              )}
              <Parsed id={id(f)} text={!options && row[f].trim() ? shown[f] : undefined} error={errors[f]} />
            </label>
          );
        })}
        <details className="group col-span-2 lg:col-span-3" open={row.note ? true : undefined}>
          <summary className="cursor-pointer select-none text-xs font-medium text-ink-soft">{row.note ? "Note" : "Add a note"}</summary>
          <input
            name={name("note")}
            value={row.note}
            onChange={(e) => onChange({ note: e.target.value })}
            maxLength={500}
            placeholder="How or where it was taken"
            aria-label={`Reading ${label}: note`}
            className={cx(controlClass, "mt-1 h-9 py-1.5 text-sm")}
          />
        </details>
      </div>
    </li>
  );
}
