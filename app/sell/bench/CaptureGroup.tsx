import { Badge, OutcomeBadge } from "~/components/Badge";
import { channelLabel, describeConditions, formatReadingValue, QUANTITY_INFO, type Outcome } from "@shared/bench";
import type { SheetRow } from "@shared/bench-form/rows";
import { rowField } from "@shared/bench-form/state";

export type CaptureItem = { row: SheetRow; index: number; label: string; outcome?: Outcome };

/** The readings one capture gave the sheet: shown as the bench derived them, removed together. */
export function CaptureGroup({ items, onRemove }: { items: CaptureItem[]; onRemove: () => void }) {
  const captureId = items[0].row.capture!.captureId!;
  return (
    <li className="space-y-2 rounded-md border border-trace/30 bg-trace-wash/40 p-3" data-capture={captureId}>
      <div className="flex flex-wrap items-center justify-between gap-2">
        <div className="flex items-center gap-2">
          <Badge tone="trace" className="whitespace-nowrap">
            From a capture
          </Badge>
          <span className="text-xs text-ink-faint">
            {items.length} reading{items.length > 1 ? "s" : ""} measured by the bench from the uploaded file
          </span>
        </div>
        <button
          type="submit"
          name="removeCapture"
          value={captureId}
          onClick={(e) => {
            e.preventDefault();
            onRemove();
          }}
          className="inline-flex h-8 items-center rounded-md px-2 text-xs font-medium text-ink-faint hover:bg-sunk hover:text-fault"
        >
          Remove this capture
        </button>
      </div>
      <ul className="divide-y divide-trace/15">
        {items.map(({ row, index, label, outcome }) => {
          const r = row.capture!;
          const cond = describeConditions(r.conditions);
          return (
            <li
              key={row.key}
              id={`reading-${row.key}`}
              className="grid grid-cols-[2.25rem_1fr] gap-x-2 py-1.5 text-sm"
              data-row={label}
              data-origin="capture"
            >
              <input type="hidden" name={rowField(index, "key")} value={row.key} />
              <input type="hidden" name={rowField(index, "basis")} value="measured" />
              <input type="hidden" name={rowField(index, "quantity")} value={r.quantity} />
              <input type="hidden" name={rowField(index, "capture")} value={JSON.stringify(r)} />
              <span className="figures pt-0.5 text-xs text-ink-faint">{label}</span>
              <div className="min-w-0">
                <p className="flex flex-wrap items-baseline gap-x-2">
                  <span className="font-medium text-ink">
                    {QUANTITY_INFO[r.quantity].label}
                    {r.channel ? `, ${channelLabel(r.channel)}` : ""}:
                  </span>
                  <span className="figures text-ink">{formatReadingValue(r)}</span>
                  {outcome && outcome !== "consistent" ? <OutcomeBadge outcome={outcome} /> : null}
                </p>
                {cond ? <p className="text-xs text-ink-soft">{cond}</p> : null}
                {r.note ? <p className="text-xs text-ink-faint">{r.note}</p> : null}
              </div>
            </li>
          );
        })}
      </ul>
    </li>
  );
}
