import { cx } from "~/components/cx";
import type { RestorationPart } from "@shared/catalogue-schemas";

/** A log entry's or a template's parts as the workshop reads them back: "4 × Electrolytic capacitor (C501–C504)". */
export function PartsList({ parts, className }: { parts: readonly RestorationPart[]; className?: string }) {
  if (!parts.length) return null;
  return (
    <ul className={cx("space-y-0.5 text-sm", className)}>
      {parts.map((p, i) => (
        <li key={i}>
          <span className="figures">{p.quantity} ×</span> {p.part}
          {p.reference ? <span className="text-ink-faint"> ({p.reference})</span> : null}
        </li>
      ))}
    </ul>
  );
}
