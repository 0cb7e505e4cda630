import type { AlertFrequency } from "../frequency";

// "At once" or "daily digest" as two radio buttons; with `off`, the third choice an unsubscribe link sets.

export const FREQUENCY_LABELS: Record<AlertFrequency, string> = {
  instant: "At once",
  daily: "Daily digest",
  off: "No e-mail",
};

const HINTS: Record<AlertFrequency, string> = {
  instant: "One e-mail for each matching unit as soon as it is published.",
  daily: "One e-mail a day (07:00 UTC) with every match of the day.",
  off: "The alert is kept; nothing is sent.",
};

export function FrequencyChoice({
  name,
  value,
  withOff = false,
  error,
}: {
  name: string;
  value: AlertFrequency;
  withOff?: boolean;
  error?: string;
}) {
  const choices: AlertFrequency[] = withOff ? ["instant", "daily", "off"] : ["instant", "daily"];
  return (
    <fieldset className="space-y-2">
      <legend className="text-sm font-medium text-ink">How often to e-mail</legend>
      {choices.map((f) => (
        <label key={f} className="flex cursor-pointer items-start gap-2 text-sm">
          <input type="radio" name={name} value={f} defaultChecked={f === value} className="mt-1 size-4 accent-walnut" />
          <span>
            <span className="font-medium">{FREQUENCY_LABELS[f]}</span> <span className="text-ink-faint">— {HINTS[f]}</span>
          </span>
        </label>
      ))}
      {error ? (
        <p role="alert" className="text-[0.8125rem] font-medium text-fault">
          {error}
        </p>
      ) : null}
    </fieldset>
  );
}
