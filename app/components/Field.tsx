import { useId, type InputHTMLAttributes, type ReactNode, type SelectHTMLAttributes, type TextareaHTMLAttributes } from "react";
import { cx } from "./cx";

// Form fields with their label, an optional hint and the server's error text right beside the input.
// Errors are wired with aria-invalid/aria-describedby so screen readers read them with the field.

export const controlClass =
  "block w-full rounded-md border bg-card px-3 py-2 text-[0.9375rem] text-ink placeholder:text-ink-faint/70 " +
  "border-rule-strong shadow-[inset_0_1px_1px_rgb(31_26_21/0.04)] " +
  "focus-visible:border-walnut focus-visible:outline-2 focus-visible:outline-offset-0 focus-visible:outline-walnut " +
  "aria-invalid:border-fault aria-invalid:focus-visible:outline-fault disabled:bg-sunk disabled:text-ink-faint";

interface ShellProps {
  label: ReactNode;
  /** The server's message for this field; shown under the control in red-brown with an icon. */
  error?: string | string[] | null;
  hint?: ReactNode;
  /** Unit shown at the right edge of the control (e.g. "W", "Ω", "kg"). */
  unit?: string;
  optional?: boolean;
  className?: string;
}

function firstError(error: ShellProps["error"]): string | undefined {
  if (!error) return undefined;
  return Array.isArray(error) ? error[0] : error;
}

export function FieldShell({
  id,
  label,
  error,
  hint,
  optional,
  className,
  children,
}: ShellProps & { id: string; children: (a11y: ControlA11y) => ReactNode }) {
  const message = firstError(error);
  const hintId = hint ? `${id}-hint` : undefined;
  const errorId = message ? `${id}-error` : undefined;
  const describedBy = [hintId, errorId].filter(Boolean).join(" ") || undefined;
  return (
    <div className={cx("space-y-1.5", className)}>
      <label htmlFor={id} className="flex items-baseline justify-between gap-2 text-sm font-medium text-ink">
        <span>{label}</span>
        {optional ? <span className="text-xs font-normal text-ink-faint">optional</span> : null}
      </label>
      {children({ id, "aria-invalid": message ? true : undefined, "aria-describedby": describedBy })}
      {hint ? (
        <p id={hintId} className="text-[0.8125rem] text-ink-faint">
          {hint}
        </p>
      ) : null}
      {message ? (
        <p id={errorId} className="flex items-start gap-1.5 text-[0.8125rem] font-medium text-fault" role="alert">
          <svg aria-hidden="true" viewBox="0 0 16 16" className="mt-0.5 size-3.5 shrink-0">
            <circle cx="8" cy="8" r="7" fill="currentColor" />
            <path d="M8 4.2v4.6M8 11.2v.4" stroke="#fcfaf5" strokeWidth="1.8" strokeLinecap="round" />
          </svg>
          <span>{message}</span>
        </p>
      ) : null}
    </div>
  );
}

export interface ControlA11y {
  id: string;
  "aria-invalid"?: true;
  "aria-describedby"?: string;
}

export type FieldProps = ShellProps & Omit<InputHTMLAttributes<HTMLInputElement>, "className">;

/** A labelled input. `name` is required so the field posts without JavaScript. */
export function Field({ label, error, hint, unit, optional, className, id, ...input }: FieldProps) {
  const autoId = useId();
  return (
    <FieldShell id={id ?? autoId} label={label} error={error} hint={hint} optional={optional} className={className}>
      {(a11y) =>
        unit ? (
          <div className="relative">
            <input {...a11y} {...input} className={cx(controlClass, "pr-12 figures")} />
            <span className="pointer-events-none absolute inset-y-0 right-3 flex items-center text-sm text-ink-faint figures">{unit}</span>
          </div>
        ) : (
          <input {...a11y} {...input} className={controlClass} />
        )
      }
    </FieldShell>
  );
}

export type TextareaFieldProps = ShellProps & Omit<TextareaHTMLAttributes<HTMLTextAreaElement>, "className">;

export function TextareaField({ label, error, hint, optional, className, id, rows = 4, ...rest }: TextareaFieldProps) {
  const autoId = useId();
  return (
    <FieldShell id={id ?? autoId} label={label} error={error} hint={hint} optional={optional} className={className}>
      {(a11y) => <textarea {...a11y} rows={rows} {...rest} className={controlClass} />}
    </FieldShell>
  );
}

export type SelectFieldProps = ShellProps &
  Omit<SelectHTMLAttributes<HTMLSelectElement>, "className"> & {
    options: ReadonlyArray<{ value: string; label: string }>;
    /** Adds an empty first option with this text (e.g. "Choose…"). */
    placeholder?: string;
  };

export function SelectField({ label, error, hint, optional, className, id, options, placeholder, ...rest }: SelectFieldProps) {
  const autoId = useId();
  return (
    <FieldShell id={id ?? autoId} label={label} error={error} hint={hint} optional={optional} className={className}>
      {(a11y) => (
        <select {...a11y} {...rest} className={cx(controlClass, "appearance-auto pr-8")}>
          {placeholder !== undefined ? <option value="">{placeholder}</option> : null}
          {options.map((o) => (
            <option key={o.value} value={o.value}>
              {o.label}
            </option>
          ))}
        </select>
      )}
    </FieldShell>
  );
}

/** A labelled checkbox with the label to its right. */
export function CheckboxField({
  label,
  hint,
  error,
  className,
  id,
  ...rest
}: Omit<ShellProps, "unit" | "optional"> & Omit<InputHTMLAttributes<HTMLInputElement>, "className" | "type">) {
  const autoId = useId();
  const fid = id ?? autoId;
  const message = firstError(error);
  return (
    <div className={cx("flex items-start gap-2.5", className)}>
      <input
        id={fid}
        type="checkbox"
        aria-invalid={message ? true : undefined}
        aria-describedby={message ? `${fid}-error` : hint ? `${fid}-hint` : undefined}
        className="mt-0.5 size-4 shrink-0 accent-walnut"
        {...rest}
      />
      <div className="text-sm">
        <label htmlFor={fid} className="font-medium text-ink">
          {label}
        </label>
        {hint ? (
          <p id={`${fid}-hint`} className="text-[0.8125rem] text-ink-faint">
            {hint}
          </p>
        ) : null}
        {message ? (
          <p id={`${fid}-error`} className="text-[0.8125rem] font-medium text-fault" role="alert">
            {message}
          </p>
        ) : null}
      </div>
    </div>
  );
}

/** A message for the whole form (e.g. "E-mail or password is not right"). */
export function FormError({ children }: { children?: ReactNode }) {
  if (!children) return null;
  return (
    <div role="alert" className="rounded-md border border-fault/40 bg-fault-wash px-3 py-2 text-sm font-medium text-fault">
      {children}
    </div>
  );
}
