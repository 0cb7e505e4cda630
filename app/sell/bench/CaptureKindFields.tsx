import type { ReactNode } from "react";
import { controlClass } from "~/components/Field";
import { cx } from "~/components/cx";
import type { Category } from "@shared/bench/quantities";
import { CAPTURE_FORM_ID, type CaptureKind } from "./capture-kinds";
import { TwoToneFields } from "./TwoToneFields";

// The capture form's controls and the fields each capture kind asks for (the two-tone kinds' own are in
// TwoToneFields.tsx). Every input belongs to the capture form by its form attribute.

export const selectClass = cx(controlClass, "h-9 py-1 text-sm appearance-auto");
export const inputClass = cx(controlClass, "h-9 py-1.5 text-sm figures");

export function Field({ label, children, className }: { label: string; children: ReactNode; className?: string }) {
  return (
    <label className={cx("block space-y-1", className)}>
      <span className="text-xs font-medium text-ink-soft">{label}</span>
      {children}
    </label>
  );
}

/** The test tone and the speed it was played at; the sheet's speed rule needs the speed. */
export function WowFlutterFields({ category }: { category?: Category }) {
  return (
    <>
      <Field label="Test tone">
        <select form={CAPTURE_FORM_ID} name="testToneHz" className={selectClass} defaultValue="3150">
          <option value="3150">3150 Hz, weighted peak (IEC 60386)</option>
          <option value="3000">3000 Hz, weighted rms (WRMS)</option>
        </select>
      </Field>
      {category === "tape_deck" ? (
        <Field label="Tape speed">
          <select form={CAPTURE_FORM_ID} name="tapeSpeedCmS" className={selectClass} defaultValue="4.76">
            <option value="4.76">4.76 cm/s</option>
            <option value="9.5">9.5 cm/s</option>
            <option value="19">19 cm/s</option>
            <option value="38">38 cm/s</option>
          </select>
        </Field>
      ) : (
        <Field label="Speed">
          <select form={CAPTURE_FORM_ID} name="speedRpm" className={selectClass} defaultValue="33.333">
            <option value="33.333">33⅓ rpm</option>
            <option value="45">45 rpm</option>
            <option value="78">78 rpm</option>
          </select>
        </Field>
      )}
    </>
  );
}

/** The fields of the chosen kind beyond load and channel. */
export function KindFields({ kind }: { kind: CaptureKind }) {
  return (
    <>
      {kind === "sine" ? (
        <>
          <input form={CAPTURE_FORM_ID} type="hidden" name="scale" value="volts-per-full-scale" />
          <Field label="Full scale stands for">
            <div className="flex gap-2">
              <input
                form={CAPTURE_FORM_ID}
                name="volts"
                inputMode="decimal"
                placeholder="40"
                required
                className={inputClass}
                aria-label="Volts at full scale"
              />
              <select form={CAPTURE_FORM_ID} name="basis" className={cx(selectClass, "w-28")} defaultValue="peak" aria-label="Peak or rms">
                <option value="peak">V peak</option>
                <option value="rms">V rms</option>
              </select>
            </div>
          </Field>
          <Field label="Channels driven">
            <select form={CAPTURE_FORM_ID} name="channelsDriven" className={selectClass} defaultValue="both">
              <option value="both">Both channels</option>
              <option value="one">One channel</option>
              <option value="all">All channels</option>
            </select>
          </Field>
          <Field label="Measurement bandwidth (Hz)">
            <HzRange low="bandwidthLowHz" high="bandwidthHighHz" defaults={["20", "20000"]} />
          </Field>
        </>
      ) : null}
      {kind === "square" ? (
        <Field label="Square-wave frequency (Hz)">
          <input form={CAPTURE_FORM_ID} name="frequencyHz" inputMode="decimal" placeholder="10000" className={inputClass} />
        </Field>
      ) : null}
      {kind === "separation" || kind === "imd" || kind === "output_impedance" ? <TwoToneFields kind={kind} /> : null}
      {kind === "sweep" ? (
        <>
          <Field label="Compare with">
            <select form={CAPTURE_FORM_ID} name="reference" className={selectClass} defaultValue="flat">
              <option value="flat">Flat response</option>
              <option value="riaa">RIAA playback curve (phono)</option>
            </select>
          </Field>
          <Field label="Level column in">
            <select form={CAPTURE_FORM_ID} name="levelUnit" className={selectClass} defaultValue="dB">
              <option value="dB">dB</option>
              <option value="V">Volts</option>
            </select>
          </Field>
        </>
      ) : null}
      {kind === "impedance" ? (
        <>
          <Field label="Rated impedance (Ω)">
            <input form={CAPTURE_FORM_ID} name="ratedOhm" inputMode="decimal" placeholder="8" className={inputClass} />
          </Field>
          <Field label="Rated frequency range (Hz)">
            <HzRange low="bandLowHz" high="bandHighHz" placeholders={["20", "20000"]} />
          </Field>
        </>
      ) : null}
    </>
  );
}

/** A frequency band as two inputs, low and high, in Hz. */
function HzRange({
  low,
  high,
  defaults,
  placeholders,
}: {
  low: string;
  high: string;
  defaults?: [string, string];
  placeholders?: [string, string];
}) {
  const input = (name: string, end: 0 | 1) => (
    <input
      form={CAPTURE_FORM_ID}
      name={name}
      inputMode="decimal"
      defaultValue={defaults?.[end]}
      placeholder={placeholders?.[end]}
      className={inputClass}
      aria-label={end === 0 ? "Low end, Hz" : "High end, Hz"}
    />
  );
  return (
    <div className="flex items-center gap-2">
      {input(low, 0)}
      <span aria-hidden="true">–</span>
      {input(high, 1)}
    </div>
  );
}
