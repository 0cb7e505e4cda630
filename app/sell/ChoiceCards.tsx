import { cx } from "~/components/cx";

/** A radio group as cards, each with Loadline's word and its one-line meaning. Plain inputs: posts without JS. */
export function ChoiceCards({
  legend,
  name,
  options,
  value,
  error,
  hint,
}: {
  legend: string;
  name: string;
  options: { value: string; label: string; description: string }[];
  value: string | null;
  error?: string;
  hint?: string;
}) {
  const errorId = `${name}-error`;
  return (
    <fieldset className="space-y-2" aria-describedby={error ? errorId : undefined} aria-invalid={error ? true : undefined}>
      <legend className="text-sm font-medium text-ink">{legend}</legend>
      {hint ? <p className="text-[0.8125rem] text-ink-faint">{hint}</p> : null}
      <div className="grid gap-2 sm:grid-cols-2">
        {options.map((o) => (
          <label
            key={o.value}
            className={cx(
              "flex cursor-pointer gap-3 rounded-md border bg-card p-3 transition-colors hover:border-walnut",
              "has-[:checked]:border-walnut has-[:checked]:bg-walnut-wash has-[:focus-visible]:outline-2 has-[:focus-visible]:outline-walnut",
              error ? "border-fault/60" : "border-rule",
            )}
          >
            <input
              type="radio"
              name={name}
              value={o.value}
              defaultChecked={value === o.value}
              className="mt-1 size-4 shrink-0 accent-walnut"
            />
            <span className="space-y-0.5">
              <span className="block font-semibold text-ink">{o.label}</span>
              <span className="block text-sm text-ink-soft">{o.description}</span>
            </span>
          </label>
        ))}
      </div>
      {error ? (
        <p id={errorId} role="alert" className="text-[0.8125rem] font-medium text-fault">
          {error}
        </p>
      ) : null}
    </fieldset>
  );
}
