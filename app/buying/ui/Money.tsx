import { formatPrice } from "@shared/catalogue";
import { cx } from "~/components/cx";

/** An amount in the order's currency, in the figures face; `free` replaces a zero. */
export function Money({ minor, currency, free, className }: { minor: number; currency: string; free?: string; className?: string }) {
  if (minor === 0 && free) return <span className={className}>{free}</span>;
  return <span className={cx("figures", className)}>{formatPrice(minor, currency)}</span>;
}

/** A negative amount, written with a true minus sign. */
export function Minus({ minor, currency, className }: { minor: number; currency: string; className?: string }) {
  return <span className={cx("figures", className)}>−{formatPrice(Math.abs(minor), currency)}</span>;
}
