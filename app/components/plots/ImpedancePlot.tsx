import { useId } from "react";
import { PlotFrame } from "./PlotFrame";
import { hzDomain, hzWords, linePath, linearScale, linearTicks, logGrid, logScale, logTicks, niceDomain, plain } from "./scale";
import { LegendSwatch, REFERENCE_STYLE, seriesStyle } from "./series-style";

// A loudspeaker's impedance against log frequency: the modulus in ohms over a dashed line at 80 % of
// the rated impedance, and beneath it the phase in degrees when the sweep measured it. Server-drawn.

export interface ImpedancePoint {
  hz: number;
  ohms: number;
  phase?: number;
}

const n3 = (v: number) => plain(Number(v.toPrecision(3)));

/** The plot in words: span, the lowest and highest modulus and where, the phase's extremes. */
export function describeImpedance(points: readonly ImpedancePoint[], floorOhm: number | null): string {
  if (points.length === 0) return "No measured points.";
  const low = points.reduce((a, b) => (b.ohms < a.ohms ? b : a));
  const high = points.reduce((a, b) => (b.ohms > a.ohms ? b : a));
  const parts = [
    `Impedance from ${hzWords(points[0].hz)} to ${hzWords(points[points.length - 1].hz)}: lowest ${n3(low.ohms)} Ω at ${hzWords(low.hz)}, highest ${n3(high.ohms)} Ω at ${hzWords(high.hz)}.`,
  ];
  if (floorOhm !== null) parts.push(`80 % of the rated impedance: ${n3(floorOhm)} Ω.`);
  const phased = points.filter((p) => p.phase !== undefined);
  if (phased.length) {
    const lo = Math.min(...phased.map((p) => p.phase!));
    const hi = Math.max(...phased.map((p) => p.phase!));
    parts.push(`Phase between ${n3(lo)}° and ${n3(hi)}°.`);
  }
  return parts.join(" ");
}

export function ImpedancePlot({ title, points, floorOhm }: { title: string; points: ImpedancePoint[]; floorOhm: number | null }) {
  const descriptionId = useId();
  const hz = hzDomain(points.map((p) => p.hz));
  const sx = logScale(hz);
  // From 0 Ω: how far the curve dips towards a short is what matters to the amplifier.
  const top = niceDomain([0, ...points.map((p) => p.ohms), ...(floorOhm !== null ? [floorOhm] : [])], 4, 6);
  const zDomain: [number, number] = [0, top.domain[1]];
  const sz = linearScale(zDomain);
  const phased = points.filter((p) => p.phase !== undefined);
  const sp = linearScale([-90, 90]);
  const trace = seriesStyle(0);
  const x = { label: "Frequency (Hz)", scale: sx, ticks: logTicks(hz), grid: logGrid(hz) };
  return (
    <div className="space-y-2">
      <PlotFrame
        label={title}
        descriptionId={descriptionId}
        height={240}
        x={x}
        y={{ label: "Impedance (Ω)", scale: sz, ticks: linearTicks(zDomain, top.step) }}
      >
        {floorOhm !== null ? (
          <path
            data-series="floor"
            d={linePath(
              [
                { x: hz[0], y: floorOhm },
                { x: hz[1], y: floorOhm },
              ],
              sx,
              sz,
            )}
            fill="none"
            stroke={REFERENCE_STYLE.stroke}
            strokeWidth={1.5}
            strokeDasharray={REFERENCE_STYLE.dash}
            vectorEffect="non-scaling-stroke"
          />
        ) : null}
        <path
          data-series="modulus"
          d={linePath(
            points.map((p) => ({ x: p.hz, y: p.ohms })),
            sx,
            sz,
          )}
          fill="none"
          stroke={trace.stroke}
          strokeWidth={2}
          strokeLinejoin="round"
          vectorEffect="non-scaling-stroke"
        />
      </PlotFrame>
      {phased.length ? (
        <PlotFrame
          label={`${title}: phase`}
          descriptionId={descriptionId}
          height={150}
          zero={0}
          x={x}
          y={{ label: "Phase (°)", scale: sp, ticks: linearTicks([-90, 90], 45) }}
        >
          <path
            data-series="phase"
            d={linePath(
              phased.map((p) => ({ x: p.hz, y: p.phase! })),
              sx,
              sp,
            )}
            fill="none"
            stroke={seriesStyle(1).stroke}
            strokeWidth={2}
            strokeDasharray={seriesStyle(1).dash}
            strokeLinejoin="round"
            vectorEffect="non-scaling-stroke"
          />
        </PlotFrame>
      ) : null}
      <p id={descriptionId} className="sr-only">
        {describeImpedance(points, floorOhm)}
      </p>
      <ul className="flex flex-wrap gap-x-4 gap-y-1 text-[0.8125rem] text-ink-soft" aria-label="Legend">
        <li className="flex items-center gap-1.5">
          <LegendSwatch style={trace} />
          <span>Impedance</span>
        </li>
        {floorOhm !== null ? (
          <li className="flex items-center gap-1.5">
            <LegendSwatch style={REFERENCE_STYLE} />
            <span>80 % of the rated impedance</span>
          </li>
        ) : null}
        {phased.length ? (
          <li className="flex items-center gap-1.5">
            <LegendSwatch style={seriesStyle(1)} />
            <span>Phase (lower plot)</span>
          </li>
        ) : null}
      </ul>
    </div>
  );
}
