import type { Comparison } from "../types";

// The units' frequency responses on one plot. The SVG frequency-response plot comes from
// app/components/plots (several series and a legend); until it is in place this section says so
// plainly and lists what it would draw, rather than showing a stand-in picture.

export function ResponseOverlay({ responses }: { responses: Comparison["responses"] }) {
  const { series, without, conditions } = responses;
  return (
    <section aria-labelledby="responses" className="space-y-3">
      <h2 id="responses" className="text-2xl">
        Frequency response
      </h2>
      {series.length ? (
        <div className="rounded-panel border border-dashed border-brass/60 bg-brass-wash/50 px-4 py-5 text-sm text-ink-soft" data-plot-gap>
          <p className="font-semibold text-brass-ink">The overlaid plot is not drawn yet.</p>
          <p className="mt-1">
            Sweeps on file for {series.map((s) => s.label).join(", ")} ({series.map((s) => `${s.points.length} points`).join(", ")}). Each
            unit's own response plot is on its page.
          </p>
        </div>
      ) : (
        <p className="text-sm text-ink-soft">None of these units has a frequency-response sweep on its bench sheet.</p>
      )}
      {series.length ? <p className="text-[0.8125rem] text-ink-faint">{conditions}</p> : null}
      {without.length && series.length ? (
        <p className="text-[0.8125rem] text-ink-faint">No sweep on the bench sheet of {without.join(", ")}.</p>
      ) : null}
    </section>
  );
}
