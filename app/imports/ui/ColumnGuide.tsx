import { COSMETIC_GRADES, SERVICE_STATES } from "@shared/catalogue";
import { FIGURE_COLUMNS } from "@shared/inventory-csv";

// What each column of the inventory CSV holds, for the import page (the template's comment line points here).

const UNIT_HELP: [string, string][] = [
  ["reference", "Your own stock number (optional, up to 40 characters)."],
  ["category", "The kind of unit, e.g. integrated_amplifier, turntable, loudspeaker. Needed."],
  ["maker, model", "As on the unit's front panel or label. Needed."],
  ["era", "A year or span: 1978, 1975–79, 1970s, c. 1980."],
  ["cosmetic_grade", `One of ${COSMETIC_GRADES.join(", ")}.`],
  ["service_state", `One of ${SERVICE_STATES.join(", ")}.`],
  ["description", "The condition note buyers read."],
  ["price, currency", "1250 or 1,250.00 and a code such as EUR or GBP."],
  ["handling_days", "Days to dispatch after payment, 0 to 30."],
  ["mains_voltage, weight_kg", "230 (volts); 11.4 (kilograms)."],
  ["country", "Two letters, e.g. DE; blank: your workshop's."],
  ["measured_on, measured_by", "When and by whom the figures were measured (YYYY-MM-DD)."],
];

export function ColumnGuide() {
  return (
    <div className="space-y-4 text-sm">
      <dl className="grid gap-x-4 gap-y-2 sm:grid-cols-[11rem_1fr]">
        {UNIT_HELP.map(([k, v]) => (
          <div key={k} className="contents">
            <dt className="font-mono text-[0.8125rem] text-ink">{k}</dt>
            <dd className="text-ink-soft">{v}</dd>
          </div>
        ))}
      </dl>
      <p className="text-ink-soft">
        Measured figures go in their own column with the conditions beside it, typed as on the bench sheet step; the bench checks them the
        same way. Only the figures a kind of unit has are taken:
      </p>
      <dl className="grid gap-x-4 gap-y-2 sm:grid-cols-[11rem_1fr]">
        {FIGURE_COLUMNS.map((f) => (
          <div key={f.column} className="contents">
            <dt className="font-mono text-[0.8125rem] text-ink">{f.column}</dt>
            <dd className="text-ink-soft">
              e.g. <span className="figures">{f.example}</span>
              {f.conditions.length ? (
                <>
                  {" "}
                  with <span className="font-mono text-[0.8125rem]">{f.conditions.map((c) => `${f.column}_${c}`).join(", ")}</span>
                </>
              ) : null}
            </dd>
          </div>
        ))}
      </dl>
    </div>
  );
}
