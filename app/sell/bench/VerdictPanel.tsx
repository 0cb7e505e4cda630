import { OutcomeBadge } from "~/components/Badge";
import { BenchVerifiedMark } from "~/components/BenchVerifiedMark";
import { cx } from "~/components/cx";
import type { Outcome, RuleResult, Verdict } from "@shared/bench";

const ORDER: Outcome[] = ["implausible", "questionable", "missing", "consistent"];

/** Counts per outcome as badges, worst first. */
export function OutcomeCounts({ verdict, className }: { verdict: Verdict; className?: string }) {
  return (
    <div className={cx("flex flex-wrap gap-1.5", className)}>
      {ORDER.filter((o) => verdict.counts[o] > 0).map((o) => (
        <OutcomeBadge key={o} outcome={o}>
          <span className="figures">{verdict.counts[o]}</span> {o}
        </OutcomeBadge>
      ))}
    </div>
  );
}

function Result({ r, rowLabel }: { r: RuleResult; rowLabel: (ref: string) => string | null }) {
  const rows = r.refs
    .map(rowLabel)
    .filter((label) => label !== null)
    .sort((a, b) => a.localeCompare(b, "en", { numeric: true }));
  return (
    <li
      className={cx("space-y-1.5 py-3", r.outcome === "implausible" && "rounded-md bg-fault-wash/60 px-3")}
      data-outcome={r.outcome}
      data-rule={r.ruleId}
    >
      <div className="flex flex-wrap items-center gap-2">
        <OutcomeBadge outcome={r.outcome} />
        <h4 className="font-sans text-sm font-semibold text-ink">{r.title}</h4>
      </div>
      <p className="text-sm text-ink">{r.detail}</p>
      {r.compared.length ? (
        <ul className="flex flex-wrap gap-1.5" aria-label="Numbers compared">
          {r.compared.map((f, i) => (
            <li key={i} className="rounded border border-rule bg-sunk px-1.5 py-0.5 text-xs text-ink-soft">
              {f.label}: <span className="figures text-ink">{f.display}</span>
            </li>
          ))}
        </ul>
      ) : null}
      {rows.length ? <p className="text-xs text-ink-faint">Rows: {rows.join(", ")}</p> : null}
      <details className="text-xs text-ink-faint">
        <summary className="cursor-pointer select-none">Why this check</summary>
        <p className="mt-1">{r.explanation}</p>
        <p className="mt-1 italic">Source: {r.source}</p>
      </details>
    </li>
  );
}

/** The bench's verdict on the sheet: the mark or why not, then every rule's outcome with its numbers. */
export function VerdictPanel({
  verdict,
  stale,
  published,
  rowLabel,
}: {
  verdict: Verdict | null;
  /** The form has fields that do not read; the verdict shown is for the last sheet that did. */
  stale?: number;
  published: boolean;
  rowLabel: (ref: string) => string | null;
}) {
  if (!verdict)
    return (
      <div className="rounded-panel border border-dashed border-rule-strong bg-card/60 p-5 text-sm text-ink-soft" data-verdict="none">
        Type a reading with its unit and the bench checks it here as you go.
      </div>
    );
  const sorted = [...verdict.results].sort((a, b) => ORDER.indexOf(a.outcome) - ORDER.indexOf(b.outcome));
  const problems = sorted.filter((r) => r.outcome !== "consistent");
  const consistent = sorted.filter((r) => r.outcome === "consistent");
  const implausible = verdict.counts.implausible > 0;
  return (
    <section
      aria-labelledby="verdict-title"
      className={cx(
        "space-y-4 rounded-panel border bg-card p-5 shadow-panel",
        implausible ? "border-fault/40" : verdict.benchVerified ? "border-trace/40" : "border-rule",
      )}
      data-verdict={verdict.benchVerified ? "verified" : implausible ? "implausible" : "not-verified"}
    >
      <header className="space-y-2">
        <h3 id="verdict-title" className="text-lg">
          The bench's verdict
        </h3>
        {verdict.benchVerified ? (
          <div className="space-y-1">
            <BenchVerifiedMark />
            <p className="text-sm text-ink-soft">
              {published ? "This listing carries the mark." : "The listing carries this mark once published."}
            </p>
          </div>
        ) : null}
        <p className="text-sm text-ink" aria-live="polite">
          {verdict.summary}
        </p>
        {implausible ? (
          <p className="text-sm font-medium text-fault">
            A sheet with an implausible outcome can still be published, but it waits at the review desk until a moderator has looked at it.
          </p>
        ) : null}
        {stale ? (
          <p className="text-sm text-brass-ink">
            {stale} field{stale > 1 ? "s do" : " does"} not read yet; this verdict is for the sheet before that change.
          </p>
        ) : null}
        <OutcomeCounts verdict={verdict} />
      </header>
      {problems.length ? (
        <ul className="divide-y divide-rule">
          {problems.map((r, i) => (
            <Result key={`${r.ruleId}-${i}`} r={r} rowLabel={rowLabel} />
          ))}
        </ul>
      ) : null}
      {consistent.length ? (
        <details className="group rounded-md border border-rule">
          <summary className="flex cursor-pointer select-none items-center justify-between gap-2 px-3 py-2 text-sm font-medium">
            <span>
              <span className="figures">{consistent.length}</span> consistent check{consistent.length > 1 ? "s" : ""}
            </span>
            <span className="hidden text-xs text-ink-faint group-open:hidden sm:inline">Show each with its numbers</span>
            <span className="hidden text-xs text-ink-faint sm:group-open:inline">Hide</span>
          </summary>
          <ul className="divide-y divide-rule border-t border-rule px-3">
            {consistent.map((r, i) => (
              <Result key={`${r.ruleId}-${i}`} r={r} rowLabel={rowLabel} />
            ))}
          </ul>
        </details>
      ) : null}
      {verdict.shortfalls.length ? (
        <div className="space-y-1 text-sm">
          <h4 className="font-sans font-semibold">Below the maker's rating</h4>
          <p className="text-ink-soft">Reported to buyers, not held against the sheet.</p>
          <ul className="list-disc pl-5 text-ink-soft">
            {verdict.shortfalls.map((s, i) => (
              <li key={i}>{s.detail}</li>
            ))}
          </ul>
        </div>
      ) : null}
      {verdict.fromCaptures.length ? (
        <div className="space-y-1 text-sm">
          <h4 className="font-sans font-semibold">Figures from captures</h4>
          <ul className="text-ink-soft">
            {verdict.fromCaptures.map((f) => (
              <li key={f.ref}>
                {f.label}: <span className="figures text-ink">{f.display}</span>
              </li>
            ))}
          </ul>
        </div>
      ) : null}
      {verdict.skipped.length ? (
        <details className="text-sm text-ink-soft">
          <summary className="cursor-pointer">Not checked on this sheet ({verdict.skipped.length})</summary>
          <ul className="mt-2 space-y-1">
            {verdict.skipped.map((s) => (
              <li key={s.ruleId}>
                <span className="font-medium text-ink">{s.title}</span>: {s.reason}
              </li>
            ))}
          </ul>
        </details>
      ) : null}
    </section>
  );
}
