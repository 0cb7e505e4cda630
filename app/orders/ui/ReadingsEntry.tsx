import { QUANTITIES, QUANTITY_INFO } from "@shared/bench/quantities";
import { CHANNELS } from "@shared/bench/schema";
import { describeConditions, channelLabel } from "@shared/bench/describe";
import type { ListedFigure } from "@shared/bench/remeasure";
import { Field, SelectField } from "~/components/Field";
import { EXTRA_ROWS, extraField, figureField, type FieldErrors } from "../readings-form";

// The buyer's own figures, one box beside each measured figure of the listing's bench sheet (its
// conditions copied, so the pair is like for like), and a few free rows for figures the sheet lacks.
// Plain inputs: it posts without JavaScript; errors come back from the server beside each box.

const UNIT_HINT: Record<string, string> = {
  power: "e.g. 64 W or 18 dBW",
  voltage: "e.g. 22 V or 62 Vpp",
  ratio: "e.g. 0.02 % or −74 dB",
  decibel: "e.g. 96 dB",
  frequency: "e.g. 45 kHz",
  time: "e.g. 4 µs",
  resistance: "e.g. 6.2 Ω",
  slewRate: "e.g. 20 V/µs",
  number: "e.g. 120",
};

const quantityOptions = QUANTITIES.map((q) => ({ value: q, label: QUANTITY_INFO[q].label }));
const channelOptions = CHANNELS.map((c) => ({ value: c, label: channelLabel(c) }));

export interface ReadingsEntryProps {
  /** The sheet's measured figures (remeasurableFigures on the server). */
  figures: readonly ListedFigure[];
  errors?: FieldErrors;
  /** What the buyer typed last time, by field name. */
  values?: Record<string, string>;
  /** Free rows for figures the sheet lacks; the accept form may leave them out. */
  extras?: boolean;
  legend?: string;
}

export function ReadingsEntry({ figures, errors = {}, values = {}, extras = true, legend = "Your own figures" }: ReadingsEntryProps) {
  return (
    <fieldset className="space-y-4">
      <legend className="font-serif text-lg leading-snug text-ink">{legend}</legend>
      <p className="text-sm text-ink-soft">
        Type what you read, with its unit, beside the figures you measured; leave the rest blank. Each box keeps the bench sheet&apos;s
        conditions, so measure under them: the same load, frequency and level.
      </p>
      {errors._readings ? (
        <p role="alert" className="text-[0.8125rem] font-medium text-fault">
          {errors._readings}
        </p>
      ) : null}
      {figures.length ? (
        <div className="grid gap-4 sm:grid-cols-2">
          {figures.map((f) => {
            const name = figureField(f.ref);
            const label = QUANTITY_INFO[f.quantity].label + (f.channel && f.channel !== "both" ? `, ${channelLabel(f.channel)}` : "");
            const cond = describeConditions(f.conditions);
            return (
              <Field
                key={f.ref}
                name={name}
                label={label}
                hint={`Listed ${f.display}${cond ? `, ${cond}` : ""}`}
                placeholder={UNIT_HINT[QUANTITY_INFO[f.quantity].kind]}
                defaultValue={values[name] ?? ""}
                error={errors[name]}
                autoComplete="off"
                optional
              />
            );
          })}
        </div>
      ) : (
        <p className="text-sm text-ink-soft">The bench sheet has no measured figures to set yours beside; add your own below.</p>
      )}
      {extras
        ? Array.from({ length: EXTRA_ROWS }, (_, i) => (
            <fieldset key={i} className="grid gap-3 rounded-md border border-rule px-3 py-3 sm:grid-cols-5">
              <legend className="px-1 text-sm font-medium text-ink">Another figure {i + 1}</legend>
              <SelectField
                name={extraField(i, "quantity")}
                label="What"
                options={quantityOptions}
                placeholder="Choose…"
                defaultValue={values[extraField(i, "quantity")] ?? ""}
                error={errors[extraField(i, "quantity")]}
                className="sm:col-span-2"
                optional
              />
              <Field
                name={extraField(i, "value")}
                label="Figure"
                placeholder="e.g. 48 W"
                defaultValue={values[extraField(i, "value")] ?? ""}
                error={errors[extraField(i, "value")]}
                autoComplete="off"
              />
              <Field
                name={extraField(i, "load")}
                label="Load"
                placeholder="8 Ω"
                defaultValue={values[extraField(i, "load")] ?? ""}
                error={errors[extraField(i, "load")]}
                autoComplete="off"
              />
              <Field
                name={extraField(i, "frequency")}
                label="Frequency"
                placeholder="1 kHz"
                defaultValue={values[extraField(i, "frequency")] ?? ""}
                error={errors[extraField(i, "frequency")]}
                autoComplete="off"
              />
              <SelectField
                name={extraField(i, "channel")}
                label="Channel"
                options={channelOptions}
                placeholder="—"
                defaultValue={values[extraField(i, "channel")] ?? ""}
                className="sm:col-span-2"
                optional
              />
            </fieldset>
          ))
        : null}
      <div className="grid gap-4 sm:grid-cols-2">
        <Field
          name="equipment"
          label="What you measured with"
          placeholder="e.g. sound-card analyser, 8 Ω 300 W dummy load"
          defaultValue={values.equipment ?? ""}
          error={errors.equipment}
          optional
        />
        <Field
          name="measuredOn"
          type="date"
          label="Measured on"
          defaultValue={values.measuredOn ?? ""}
          error={errors.measuredOn}
          optional
        />
      </div>
    </fieldset>
  );
}
