import { cx } from "~/components/cx";
import { controlClass } from "~/components/Field";
import { CAPTURE_FORM_ID } from "./capture-kinds";

// The capture form's own fields for the separation, intermodulation and output-impedance kinds.

const selectClass = cx(controlClass, "h-9 py-1 text-sm appearance-auto");
const inputClass = cx(controlClass, "h-9 py-1.5 text-sm figures");

function Field({ label, hint, children }: { label: string; hint?: string; children: React.ReactNode }) {
  return (
    <label className="block space-y-1">
      <span className="text-xs font-medium text-ink-soft">{label}</span>
      {children}
      {hint ? <span className="block text-xs text-ink-faint">{hint}</span> : null}
    </label>
  );
}

export function TwoToneFields({ kind }: { kind: "separation" | "imd" | "output_impedance" }) {
  if (kind === "separation")
    return (
      <>
        <Field label="Driven channel" hint="A stereo WAV: one side driven, the other loaded as in use and silent.">
          <select form={CAPTURE_FORM_ID} name="driven" className={selectClass} defaultValue="">
            <option value="">The louder side</option>
            <option value="left">Left</option>
            <option value="right">Right</option>
          </select>
        </Field>
        <Field label="Test tones (Hz)" hint="Leave blank to read every test tone in the file, e.g. 100, 1000, 10000.">
          <input form={CAPTURE_FORM_ID} name="frequenciesHz" placeholder="1000" className={inputClass} />
        </Field>
      </>
    );
  if (kind === "imd")
    return (
      <Field label="Method" hint="SMPTE: 60 Hz + 7 kHz at 4:1. Difference frequency: 19 + 20 kHz, equal levels.">
        <select form={CAPTURE_FORM_ID} name="method" className={selectClass} defaultValue="smpte">
          <option value="smpte">SMPTE (modulation)</option>
          <option value="dfd">Difference frequency</option>
        </select>
      </Field>
    );
  return (
    <>
      <Field label="Damping factor quoted into (Ω)" hint="Type 8 for a loudspeaker output; leave blank for a line or phono output.">
        <input form={CAPTURE_FORM_ID} name="nominalLoadOhm" inputMode="decimal" placeholder="8" className={inputClass} />
      </Field>
      <p className="text-xs text-ink-faint sm:col-span-2">
        Play one steady tone with the output open, then switch the load in (the Load field above) and keep playing, at least half a second
        each. Switch the load only with the amplifier muted or turned down, and never short the output.
      </p>
    </>
  );
}
