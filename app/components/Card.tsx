import type { HTMLAttributes, ReactNode } from "react";
import { cx } from "./cx";

/** A panel on the bench: card paper, a hairline rule and a faint shadow. */
export function Card({ className, padded = true, ...rest }: HTMLAttributes<HTMLDivElement> & { padded?: boolean }) {
  return <div className={cx("rounded-panel border border-rule bg-card shadow-panel", padded && "p-5 sm:p-6", className)} {...rest} />;
}

export function CardTitle({ children, className }: { children: ReactNode; className?: string }) {
  return <h2 className={cx("text-lg leading-snug", className)}>{children}</h2>;
}
