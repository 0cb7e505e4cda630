import { Field, SelectField } from "~/components/Field";
import { CAPTURE_FIELD_PREFIX } from "../contest-words";
import type { FieldErrors } from "../readings-form";

// The contest form's capture: one WAV of a sine test tone, with what a full-scale sample stands for and
// the load, so the bench's own analysis can turn it into figures set beside the sheet's.

const name = (field: string) => `${CAPTURE_FIELD_PREFIX}${field}`;

export function ContestCaptureFields({ errors, values }: { errors: FieldErrors; values: Record<string, string> }) {
  return (
    <fieldset className="space-y-3 rounded-panel border border-rule p-4">
      <legend className="px-1 text-sm font-medium text-ink">A capture (optional)</legend>
      <p className="text-[0.8125rem] text-ink-faint">
        A WAV of a sine test tone recorded at the unit's output across your dummy load. Loadline analyses it as it does a seller's captures
        and sets its figures beside the bench sheet's.
      </p>
      <div className="space-y-1.5">
        <label htmlFor="contest-capture" className="text-sm font-medium text-ink">
          Capture file (WAV)
        </label>
        <input
          id="contest-capture"
          type="file"
          name="capture"
          accept=".wav,audio/wav,audio/x-wav"
          aria-invalid={errors.capture ? true : undefined}
          aria-describedby={errors.capture ? "contest-capture-error" : undefined}
          className="block w-full text-sm text-ink-soft file:mr-3 file:rounded-md file:border file:border-rule-strong file:bg-card file:px-3 file:py-1.5 file:text-sm file:text-ink"
        />
        {errors.capture ? (
          <p id="contest-capture-error" role="alert" className="text-[0.8125rem] font-medium text-fault">
            {errors.capture}
          </p>
        ) : null}
      </div>
      <div className="grid gap-3 sm:grid-cols-2">
        <Field
          label="Full scale stands for"
          name={name("volts")}
          inputMode="decimal"
          unit="V"
          defaultValue={values[name("volts")]}
          error={errors[name("volts")]}
          hint="The voltage at the unit's output that a full-scale sample means."
        />
        <SelectField
          label="Measured as"
          name={name("basis")}
          defaultValue={values[name("basis")] ?? "peak"}
          error={errors[name("basis")]}
          options={[
            { value: "peak", label: "Peak" },
            { value: "rms", label: "RMS" },
          ]}
        />
        <Field
          label="Load"
          name={name("loadOhm")}
          inputMode="decimal"
          unit="Ω"
          defaultValue={values[name("loadOhm")]}
          error={errors[name("loadOhm")]}
        />
        <SelectField
          label="Channel"
          name={name("channel")}
          defaultValue={values[name("channel")] ?? ""}
          error={errors[name("channel")]}
          placeholder="Not stated"
          options={[
            { value: "left", label: "Left" },
            { value: "right", label: "Right" },
          ]}
        />
      </div>
    </fieldset>
  );
}
