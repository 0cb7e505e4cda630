import { FrequencyResponsePlot } from "~/components/plots";
import type { Comparison, Overlay } from "../types";

/** The units' frequency responses overlaid: flat sweeps on one plot, phono stages' RIAA deviation on another. */
export function ResponseOverlay({ responses }: { responses: Comparison["responses"] }) {
  const { flat, riaa, without } = responses;
  return (
    <section aria-labelledby="responses" className="space-y-3">
      <h2 id="responses" className="text-2xl">
        Frequency response
      </h2>
      {flat ? <OverlayPlot overlay={flat} what="Frequency response" /> : null}
      {riaa ? <OverlayPlot overlay={riaa} what="Deviation from the RIAA curve" yLabel="Deviation (dB)" /> : null}
      {!flat && !riaa ? (
        <p className="text-sm text-ink-soft">None of these units has a response sweep on its bench sheet.</p>
      ) : without.length ? (
        <p className="text-[0.8125rem] text-ink-faint">No response sweep on the bench sheet of {without.join(", ")}.</p>
      ) : null}
    </section>
  );
}

function OverlayPlot({ overlay, what, yLabel }: { overlay: Overlay; what: string; yLabel?: string }) {
  const n = overlay.series.length;
  return (
    <figure className="space-y-2 rounded-panel border border-rule bg-card p-4 shadow-panel">
      <figcaption className="text-sm font-semibold text-ink">{what}</figcaption>
      <FrequencyResponsePlot
        title={`${what} of ${n === 1 ? overlay.series[0].label : `${n} units overlaid`}`}
        series={overlay.series}
        yLabel={yLabel}
        legend
      />
      <p className="text-[0.8125rem] text-ink-faint">{overlay.conditions}</p>
    </figure>
  );
}
