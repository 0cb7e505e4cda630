import { OutcomeBadge } from "~/components/Badge";
import { BenchVerifiedMark } from "~/components/BenchVerifiedMark";
import { cx } from "~/components/cx";
import type { BenchView, KeyFigureView } from "../types";
import { CaptureTag } from "./CaptureTag";

// The key figures up top, and the bench sheet in full: every reading with its conditions, and every
// check the bench ran with its outcome, what it compared and why it matters.

export function KeyFigures({ figures, verified }: { figures: KeyFigureView[]; verified: boolean }) {
  if (figures.length === 0) {
    return (
      <p className="rounded-md border border-dashed border-rule-strong px-4 py-3 text-sm text-ink-soft">
        No measured figures on this sheet yet. Any figures the seller typed from the maker's ratings are in the bench sheet below.
      </p>
    );
  }
  return (
    <section aria-labelledby="key-figures-heading" className="space-y-3">
      <div className="flex items-baseline justify-between gap-3">
        <h2 id="key-figures-heading" className="font-sans text-xs font-semibold uppercase tracking-[0.14em] text-brass-ink">
          Measured on the bench
        </h2>
        {verified ? <span className="text-xs text-ink-faint">every figure checked</span> : null}
      </div>
      <dl className="grid gap-x-5 gap-y-4 sm:grid-cols-2">
        {figures.map((f) => (
          <div key={f.key} className="min-w-0 border-l-2 border-trace/40 pl-3" data-figure={f.key}>
            <dt className="flex items-center gap-1.5 text-[0.6875rem] font-semibold uppercase tracking-[0.1em] text-ink-faint">
              {f.label}
              {f.fromCapture ? <CaptureTag className="normal-case tracking-normal" /> : null}
            </dt>
            <dd className="mt-0.5">
              <span className="figures text-xl font-medium text-ink">
                {f.value}
                {f.unit ? <span className="ml-1 text-ink-soft">{f.unit}</span> : null}
              </span>
              <span className="block text-[0.8125rem] leading-snug text-ink-faint">{f.conditions}</span>
            </dd>
          </div>
        ))}
      </dl>
    </section>
  );
}

const th = "px-3 py-2 text-left text-xs font-semibold uppercase tracking-[0.08em] text-ink-faint";
const cell = "px-3 py-2.5 align-top max-md:block max-md:px-0 max-md:py-1";

export function BenchSheetSection({ bench, listingVerified }: { bench: BenchView; listingVerified: boolean }) {
  const measured = [bench.measuredBy ? `Measured by ${bench.measuredBy}` : null, bench.measuredOn ? `on ${bench.measuredOn}` : null]
    .filter(Boolean)
    .join(" ");
  return (
    <section aria-labelledby="bench-heading" className="below-fold space-y-5">
      <div className="space-y-2">
        <div className="flex flex-wrap items-center gap-3">
          <h2 id="bench-heading" className="text-2xl">
            Bench sheet
          </h2>
          {listingVerified ? <BenchVerifiedMark compact /> : null}
        </div>
        {measured ? <p className="text-sm text-ink-soft">{measured}.</p> : null}
        <p
          className={cx(
            "rounded-md border px-4 py-3 text-sm leading-relaxed",
            bench.verified ? "border-trace/30 bg-trace-wash text-ink" : "border-rule-strong bg-card text-ink",
          )}
        >
          {bench.summary}
        </p>
        <OutcomeTally counts={bench.counts} />
      </div>

      <div className="rounded-panel border border-rule bg-card shadow-panel">
        <table className="w-full border-collapse text-sm">
          <caption className="border-b border-rule px-3 py-2.5 text-left font-serif text-base font-semibold text-ink">
            Readings
            <span className="ml-2 font-sans text-xs font-normal text-ink-faint">
              {bench.readings.length} on the sheet{bench.captureCount ? ` · ${bench.captureCount} from captures` : ""}
            </span>
          </caption>
          <thead className="bg-sunk/50 max-md:hidden">
            <tr>
              <th scope="col" className={th}>
                What
              </th>
              <th scope="col" className={th}>
                Value
              </th>
              <th scope="col" className={th}>
                Conditions
              </th>
              <th scope="col" className={th}>
                Source
              </th>
            </tr>
          </thead>
          <tbody>
            {bench.readings.map((r) => (
              // On a phone each reading is a small card: what and value on one line, then conditions and source.
              <tr
                key={r.ref}
                className="border-t border-rule/70 max-md:grid max-md:grid-cols-[1fr_auto] max-md:gap-x-3 max-md:px-3 max-md:py-2.5"
                data-ref={r.ref}
              >
                <th scope="row" className="px-3 py-2 text-left align-top font-medium text-ink max-md:p-0">
                  {r.quantity}
                  {r.channel ? <span className="block text-xs font-normal text-ink-faint">{r.channel}</span> : null}
                </th>
                <td className="figures whitespace-nowrap px-3 py-2 align-top text-ink max-md:p-0 max-md:text-right">{r.value}</td>
                <td className="px-3 py-2 align-top text-ink-soft max-md:col-span-2 max-md:p-0 max-md:pt-1 max-md:text-[0.8125rem]">
                  {r.conditions || <span className="text-ink-faint">conditions not given</span>}
                  {r.note ? <span className="block text-xs text-ink-faint">{r.note}</span> : null}
                </td>
                <td className="px-3 py-2 align-top max-md:col-span-2 max-md:p-0 max-md:pt-1">
                  {r.fromCapture ? (
                    <span className="space-y-0.5 max-md:flex max-md:flex-wrap max-md:items-center max-md:gap-2 max-md:space-y-0">
                      <CaptureTag />
                      <span className="block text-xs text-ink-faint">{r.captureNote}</span>
                    </span>
                  ) : (
                    <span className="text-xs text-ink-soft">{r.basis === "rated" ? "Maker's rating" : "Measured, typed"}</span>
                  )}
                </td>
              </tr>
            ))}
          </tbody>
        </table>
      </div>

      <div className="rounded-panel border border-rule bg-card shadow-panel">
        <table className="w-full border-collapse text-sm">
          <caption className="border-b border-rule px-3 py-2.5 text-left font-serif text-base font-semibold text-ink">
            Checks
            <span className="ml-2 font-sans text-xs font-normal text-ink-faint">
              {bench.checks.length} rules, each against physics, a published standard or the trade's practice
            </span>
          </caption>
          <thead className="bg-sunk/50 max-md:hidden">
            <tr>
              <th scope="col" className={th}>
                Check
              </th>
              <th scope="col" className={th}>
                Outcome
              </th>
              <th scope="col" className={th}>
                What the figures showed
              </th>
            </tr>
          </thead>
          <tbody>
            {bench.checks.map((c) => (
              <tr key={c.ruleId} className="border-t border-rule/70 max-md:block max-md:px-3 max-md:py-3" data-rule={c.ruleId}>
                <th scope="row" className={cx(cell, "text-left font-medium text-ink md:w-[32%]")}>
                  {c.title}
                  {c.usesCapture ? <CaptureTag className="ml-1.5 align-middle" /> : null}
                </th>
                <td className={cx(cell, "md:w-[9rem]")}>
                  <OutcomeBadge outcome={c.outcome} />
                </td>
                <td className={cx(cell, "text-ink-soft")}>
                  <ul className="space-y-1.5">
                    {c.findings.map((f, j) => (
                      <li key={j}>
                        <p className="text-ink">
                          {c.findings.length > 1 && f.outcome !== "consistent" ? (
                            <OutcomeBadge outcome={f.outcome} className="mr-1.5 align-middle" />
                          ) : null}
                          {f.detail}
                        </p>
                        {f.compared.length ? (
                          <dl className="mt-0.5 flex flex-wrap gap-x-4 gap-y-0.5">
                            {f.compared.map((x, k) => (
                              <div key={k} className="flex items-baseline gap-1.5">
                                <dt className="text-xs text-ink-faint">{x.label}</dt>
                                <dd className="figures text-[0.8125rem] text-ink">{x.display}</dd>
                              </div>
                            ))}
                          </dl>
                        ) : null}
                      </li>
                    ))}
                  </ul>
                  <details className="mt-1.5">
                    <summary className="cursor-pointer select-none text-xs font-medium text-walnut hover:text-walnut-deep">
                      Why this check
                    </summary>
                    <p className="mt-1 text-[0.8125rem] leading-relaxed">{c.explanation}</p>
                    <p className="mt-1 text-xs text-ink-faint">Source: {c.source}</p>
                  </details>
                </td>
              </tr>
            ))}
          </tbody>
        </table>
      </div>

      {bench.shortfalls.length || bench.derived.length || bench.skipped.length || bench.notes ? (
        <div className="grid gap-4 md:grid-cols-2">
          {bench.shortfalls.length ? (
            <Aside title="Below the maker's rating">
              <ul className="list-disc space-y-1 pl-4">
                {bench.shortfalls.map((s, i) => (
                  <li key={i}>{s}</li>
                ))}
              </ul>
              <p className="mt-2 text-xs text-ink-faint">Reported for the buyer; not held against the sheet.</p>
            </Aside>
          ) : null}
          {bench.derived.length ? (
            <Aside title="Worked out by the bench">
              <dl className="space-y-1">
                {bench.derived.map((d, i) => (
                  <div key={i} className="flex items-baseline justify-between gap-3">
                    <dt>{d.label}</dt>
                    <dd className="figures whitespace-nowrap text-ink">{d.display.replace(/^-/, "−")}</dd>
                  </div>
                ))}
              </dl>
            </Aside>
          ) : null}
          {bench.skipped.length ? (
            <Aside title="Not checked on this sheet">
              <ul className="space-y-1">
                {bench.skipped.map((s, i) => (
                  <li key={i}>
                    <span className="text-ink">{s.title}:</span> {s.reason}
                  </li>
                ))}
              </ul>
            </Aside>
          ) : null}
          {bench.notes ? (
            <Aside title="Seller's notes on the measurements">
              <p className="whitespace-pre-line">{bench.notes}</p>
            </Aside>
          ) : null}
        </div>
      ) : null}
    </section>
  );
}

function OutcomeTally({ counts }: { counts: BenchView["counts"] }) {
  const order = ["consistent", "questionable", "implausible", "missing"] as const;
  const shown = order.filter((o) => counts[o] > 0);
  if (!shown.length) return null;
  return (
    <ul className="flex flex-wrap gap-2" aria-label="Outcomes of the checks">
      {shown.map((o) => (
        <li key={o}>
          <OutcomeBadge outcome={o}>
            <span className="figures">{counts[o]}</span>&nbsp;{o}
          </OutcomeBadge>
        </li>
      ))}
    </ul>
  );
}

function Aside({ title, children }: { title: string; children: React.ReactNode }) {
  return (
    <div className="rounded-panel border border-rule bg-card/60 p-4 text-sm text-ink-soft">
      <h3 className="mb-2 font-sans text-sm font-semibold text-ink">{title}</h3>
      {children}
    </div>
  );
}
