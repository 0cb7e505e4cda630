import type { ReactNode } from "react";
import { Link, type LinkProps } from "react-router";
import { Card } from "~/components/Card";
import { cx } from "~/components/cx";

/** The narrow, centred panel the sign-in family of pages share. */
export function AuthPanel({ title, lede, children, footer }: { title: string; lede?: ReactNode; children: ReactNode; footer?: ReactNode }) {
  return (
    <main className="mx-auto w-full max-w-md px-4 py-10 sm:py-16">
      <Card className="space-y-6">
        <header className="space-y-2">
          <h1 className="font-serif text-2xl leading-tight sm:text-3xl">{title}</h1>
          {lede ? <p className="text-ink-soft">{lede}</p> : null}
        </header>
        {children}
      </Card>
      {footer ? <div className="mt-6 space-y-2 text-center text-sm text-ink-soft">{footer}</div> : null}
    </main>
  );
}

/** A quiet confirmation (e.g. "Your e-mail address is confirmed"). */
export function Notice({ children }: { children?: ReactNode }) {
  if (!children) return null;
  return (
    <div role="status" className="rounded-md border border-trace/30 bg-trace-wash px-3 py-2 text-sm font-medium text-trace">
      {children}
    </div>
  );
}

export const textLinkClass =
  "font-medium text-walnut underline decoration-walnut/40 underline-offset-2 hover:text-walnut-deep hover:decoration-walnut";

/** A link inside running text, visibly a link. */
export function TextLink({ className, ...rest }: LinkProps) {
  return <Link className={cx(textLinkClass, className)} {...rest} />;
}
