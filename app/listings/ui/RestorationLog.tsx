import type { RestorationEntryView } from "../types";

/** The restoration log: dated steps down a rule, parts with quantities, who did it, readings before and after. */
export function RestorationLog({ entries }: { entries: RestorationEntryView[] }) {
  if (entries.length === 0) return null;
  return (
    <section aria-labelledby="restoration-heading" className="space-y-4">
      <h2 id="restoration-heading" className="text-2xl">
        Restoration log
      </h2>
      <ol className="relative space-y-5 border-l-2 border-rule pl-5">
        {entries.map((e) => (
          <li key={e.id} className="relative">
            <span aria-hidden="true" className="absolute -left-[1.6875rem] top-1.5 size-3 rounded-full border-2 border-walnut bg-paper" />
            <article className="space-y-2.5 rounded-panel border border-rule bg-card p-4 shadow-panel">
              <header className="flex flex-wrap items-baseline justify-between gap-x-3 gap-y-0.5">
                <time dateTime={e.doneOn} className="figures text-sm font-medium text-walnut-deep">
                  {e.doneOnText}
                </time>
                {e.technician ? <p className="text-xs text-ink-faint">Work by {e.technician}</p> : null}
              </header>
              <p className="whitespace-pre-line text-[0.9375rem] leading-relaxed text-ink">{e.work}</p>
              {e.parts.length ? (
                <div>
                  <h3 className="mb-1 font-sans text-xs font-semibold uppercase tracking-[0.08em] text-ink-faint">Parts replaced</h3>
                  <ul className="space-y-0.5 text-sm text-ink-soft">
                    {e.parts.map((p, i) => (
                      <li key={i} className="flex gap-2">
                        <span className="figures w-10 shrink-0 text-right text-ink">{p.quantity} ×</span>
                        <span>
                          {p.part}
                          {p.reference ? <span className="figures ml-1.5 text-xs text-ink-faint">{p.reference}</span> : null}
                        </span>
                      </li>
                    ))}
                  </ul>
                </div>
              ) : null}
              {e.readings.length ? (
                <div className="overflow-x-auto">
                  <table className="w-full min-w-[26rem] text-sm">
                    <caption className="mb-1 text-left text-xs font-semibold uppercase tracking-[0.08em] text-ink-faint">
                      Readings before and after
                    </caption>
                    <thead>
                      <tr className="text-left text-xs text-ink-faint">
                        <th scope="col" className="py-1 pr-3 font-medium">
                          What
                        </th>
                        <th scope="col" className="py-1 pr-3 font-medium">
                          Before
                        </th>
                        <th scope="col" className="py-1 pr-3 font-medium">
                          After
                        </th>
                        <th scope="col" className="py-1 font-medium">
                          Conditions
                        </th>
                      </tr>
                    </thead>
                    <tbody>
                      {e.readings.map((r, i) => (
                        <tr key={i} className="border-t border-rule/60">
                          <th scope="row" className="py-1 pr-3 text-left font-normal text-ink">
                            {r.quantity}
                          </th>
                          <td className="figures py-1 pr-3 text-ink-soft">{r.before ?? "—"}</td>
                          <td className="figures py-1 pr-3 text-ink">{r.after ?? "—"}</td>
                          <td className="py-1 text-xs text-ink-faint">{r.conditions}</td>
                        </tr>
                      ))}
                    </tbody>
                  </table>
                </div>
              ) : null}
            </article>
          </li>
        ))}
      </ol>
    </section>
  );
}
