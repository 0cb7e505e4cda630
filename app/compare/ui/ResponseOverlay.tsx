import { FrequencyResponsePlot } from "~/components/plots";
import type { Comparison } from "../types";

/** The units' frequency responses on one plot, each relative to its own 1 kHz level. */
export function ResponseOverlay({ responses }: { responses: Comparison["responses"] }) {
  const { series, without, conditions } = responses;
  return (
    <section aria-labelledby="responses" className="space-y-3">
      <h2 id="responses" className="text-2xl">
        Frequency response
      </h2>
      {series.length ? (
        <div className="space-y-2 rounded-panel border border-rule bg-card p-4 shadow-panel">
          <FrequencyResponsePlot
            title={`Frequency response of ${series.length === 1 ? series[0].label : `${series.length} units overlaid`}`}
            series={series}
            legend
          />
          <p className="text-[0.8125rem] text-ink-faint">{conditions}</p>
        </div>
      ) : (
        <p className="text-sm text-ink-soft">None of these units has a frequency-response sweep on its bench sheet.</p>
      )}
      {without.length && series.length ? (
        <p className="text-[0.8125rem] text-ink-faint">No sweep on the bench sheet of {without.join(", ")}.</p>
      ) : null}
    </section>
  );
}
