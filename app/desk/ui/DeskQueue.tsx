import { Link } from "react-router";
import { Badge, type Tone } from "~/components/Badge";
import { Card } from "~/components/Card";
import { PageHeader } from "~/components/PageHeader";
import { cx } from "~/components/cx";
import type { DeskKind, DeskQueue as Queue } from "../queue.server";
import { momentText } from "@shared/dates";

// The queue: a chip per kind with its count (a link, so the filter works without script), then every
// item oldest first with what it is, how long it has waited and who has taken it.

const KINDS: { kind: DeskKind; label: string; one: string; tone: Tone }[] = [
  { kind: "held_listing", label: "Held listings", one: "Held listing", tone: "brass" },
  { kind: "copied_photo", label: "Copied photos", one: "Copied photo", tone: "fault" },
  { kind: "low_price", label: "Low prices", one: "Low price", tone: "brass" },
  { kind: "report", label: "Reports", one: "Report", tone: "fault" },
  { kind: "workshop_application", label: "Workshop applications", one: "Workshop application", tone: "walnut" },
  { kind: "contested_order", label: "Contested orders", one: "Contested order", tone: "fault" },
];
const ONE = Object.fromEntries(KINDS.map((k) => [k.kind, k])) as Record<DeskKind, (typeof KINDS)[number]>;

const chip = "inline-flex items-center gap-1.5 rounded-full border px-3 py-1 text-sm";

export function DeskQueue({ queue }: { queue: Queue }) {
  const { items, counts, total, kind } = queue;
  return (
    <main className="mx-auto w-full max-w-5xl space-y-6 px-4 py-10">
      <PageHeader
        overline="Moderation"
        title="Review desk"
        lede={
          total === 0 ? "The queue is clear: nothing needs a moderator." : `${total} item${total === 1 ? "" : "s"} waiting, oldest first.`
        }
      />
      <nav aria-label="Filter by kind" className="flex flex-wrap gap-2">
        <Link
          to="/desk"
          aria-current={kind === null ? "page" : undefined}
          className={cx(chip, kind === null ? "border-walnut bg-walnut-wash text-walnut-deep" : "border-rule")}
        >
          Everything <span className="figures">{total}</span>
        </Link>
        {KINDS.map((k) => (
          <Link
            key={k.kind}
            to={`/desk?kind=${k.kind}`}
            aria-current={kind === k.kind ? "page" : undefined}
            className={cx(chip, kind === k.kind ? "border-walnut bg-walnut-wash text-walnut-deep" : "border-rule")}
          >
            {k.label} <span className="figures">{counts[k.kind]}</span>
          </Link>
        ))}
      </nav>
      <Card padded={false}>
        {items.length === 0 ? (
          <p className="p-5 text-sm text-ink-soft">{kind ? `No ${ONE[kind].label.toLowerCase()} waiting.` : "Nothing waiting."}</p>
        ) : (
          <ol className="divide-y divide-rule" aria-label="Queue">
            {items.map((i) => (
              <li key={`${i.kind}:${i.subject.id}`} className="space-y-1 px-5 py-3" data-kind={i.kind}>
                <p className="flex flex-wrap items-center gap-2">
                  <Link
                    to={i.href}
                    className="font-serif text-lg text-ink underline decoration-walnut/40 underline-offset-2 hover:text-walnut-deep"
                  >
                    {i.title}
                  </Link>
                  <Badge tone={ONE[i.kind].tone}>{ONE[i.kind].one}</Badge>
                  {i.takenBy ? <Badge tone="neutral">Taken by {i.takenBy}</Badge> : null}
                </p>
                <p className="text-sm text-ink-soft">{i.summary}</p>
                <p className="text-xs text-ink-faint">
                  waiting since{" "}
                  <time className="figures" dateTime={i.since}>
                    {momentText(i.since)}
                  </time>
                </p>
              </li>
            ))}
          </ol>
        )}
      </Card>
    </main>
  );
}
