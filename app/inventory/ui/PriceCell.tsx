import { useEffect, useRef, useState } from "react";
import { formatPrice } from "@shared/catalogue";
import { isCurrency, parsePrice, priceInputValue } from "@shared/listing-input";
import { EDITABLE_STATES, type InventoryAction, type InventoryRowView } from "@shared/inventory";
import { useHydrated } from "~/catalogue/ui/use-hydrated";
import { Button } from "~/components/Button";

// A unit's price in the table, edited in place: the typed price is read like the editor's price field
// (in the listing's own currency), the table shows it at once and the server's answer settles it; a
// refusal puts the old price back and says why beside it. Without JavaScript it is the price as text
// (the editor's item step changes it).

export function PriceCell({
  row,
  onSave,
  error,
  saving,
}: {
  row: InventoryRowView;
  onSave: (action: InventoryAction) => void;
  /** The server's refusal of this unit's last price change. */
  error: string | null;
  saving: boolean;
}) {
  const hydrated = useHydrated();
  const [editing, setEditing] = useState(false);
  const [text, setText] = useState("");
  const [problem, setProblem] = useState<string | null>(null);
  const input = useRef<HTMLInputElement>(null);
  const currency = isCurrency(row.currency) ? row.currency : "EUR";
  const editable = EDITABLE_STATES.includes(row.status);
  useEffect(() => {
    if (editing) input.current?.select();
  }, [editing]);

  const shown = row.priceMinor === null ? <span className="text-ink-faint">No price</span> : formatPrice(row.priceMinor, row.currency);
  if (!editing)
    return (
      <div className="space-y-1">
        <div className="flex items-center gap-2 sm:justify-end">
          <span className="figures" data-price={row.priceMinor ?? ""}>
            {shown}
          </span>
          {hydrated && editable ? (
            <button
              type="button"
              className="rounded px-1.5 py-0.5 text-xs font-medium text-walnut underline decoration-rule-strong underline-offset-2 hover:bg-walnut-wash"
              aria-label={`Change the price of ${row.title}`}
              onClick={() => {
                setText(priceInputValue(row.priceMinor, currency));
                setProblem(null);
                setEditing(true);
              }}
            >
              Edit
            </button>
          ) : null}
        </div>
        {saving ? <p className="text-xs text-ink-faint sm:text-right">Saving…</p> : null}
        {error ? (
          <p role="alert" className="text-xs text-fault sm:text-right">
            {error}
          </p>
        ) : null}
      </div>
    );

  const save = () => {
    const parsed = parsePrice(text, currency);
    if (!parsed.ok) return setProblem(parsed.message);
    setEditing(false);
    if (parsed.value !== row.priceMinor) onSave({ action: "price", ids: [row.id], priceMinor: parsed.value });
  };
  const id = `price-${row.id}`;
  return (
    // Not a form: the cell sits inside the bulk form, and forms do not nest.
    <div className="space-y-1">
      <label htmlFor={id} className="sr-only">
        New price of {row.title}, in {currency}
      </label>
      <div className="flex items-center gap-1 sm:justify-end">
        <input
          ref={input}
          id={id}
          inputMode="decimal"
          value={text}
          aria-invalid={problem ? true : undefined}
          aria-describedby={problem ? `${id}-problem` : undefined}
          onChange={(e) => setText(e.target.value)}
          onKeyDown={(e) => {
            if (e.key === "Enter") {
              e.preventDefault();
              save();
            } else if (e.key === "Escape") setEditing(false);
          }}
          className="figures h-8 w-24 rounded-md border border-rule-strong bg-card px-2 text-right text-sm focus-visible:outline-2 focus-visible:outline-walnut aria-invalid:border-fault"
        />
        <span className="text-xs text-ink-faint">{currency}</span>
      </div>
      <div className="flex gap-1 sm:justify-end">
        <Button type="button" size="sm" onClick={save}>
          Save
        </Button>
        <Button type="button" size="sm" variant="quiet" onClick={() => setEditing(false)}>
          Cancel
        </Button>
      </div>
      {problem ? (
        <p id={`${id}-problem`} className="text-xs text-fault sm:text-right">
          {problem}
        </p>
      ) : null}
    </div>
  );
}
