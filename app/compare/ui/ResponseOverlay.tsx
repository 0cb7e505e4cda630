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
      {riaa ? <OverlayPlot overlay={riaa} what="Deviation from the RIAA curve" yLabel="Deviation (dB)" yDomain={around0(riaa)} /> : null}
      {!flat && !riaa ? (
        <p className="text-sm text-ink-soft">None of these units has a response sweep on its bench sheet.</p>
      ) : without.length ? (
        <p className="text-[0.8125rem] text-ink-faint">No response sweep on the bench sheet of {without.join(", ")}.</p>
      ) : null}
    </section>
  );
}

/** A range centred on 0 dB that holds every deviation in half-decibel steps: ±1 dB at least, so ±0.2 dB reads small. */
function around0(overlay: Overlay): [number, number] {
  const worst = Math.max(0, ...overlay.series.flatMap((s) => s.points.map((p) => Math.abs(p.db))));
  const edge = Math.max(1, Math.ceil((worst + 0.1) * 2) / 2);
  return [-edge, edge];
}

function OverlayPlot({ overlay, what, yLabel, yDomain }: { overlay: Overlay; what: string; yLabel?: string; yDomain?: [number, number] }) {
  const n = overlay.series.length;
  return (
    <figure className="space-y-2 rounded-panel border border-rule bg-card p-4 shadow-panel">
      <figcaption className="text-sm font-semibold text-ink">{what}</figcaption>
      <FrequencyResponsePlot
        title={`${what} of ${n === 1 ? overlay.series[0].label : `${n} units overlaid`}`}
        series={overlay.series}
        yLabel={yLabel}
        yDomain={yDomain}
        legend
      />
      <p className="text-[0.8125rem] text-ink-faint">{overlay.conditions}</p>
    </figure>
  );
}
