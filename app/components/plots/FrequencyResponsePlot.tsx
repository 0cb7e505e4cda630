import { useId } from "react";
import { PlotFrame } from "./PlotFrame";
import {
  dbWords,
  hzDomain,
  hzWords,
  levelAtHz,
  linePath,
  linearScale,
  linearTicks,
  logGrid,
  logScale,
  logTicks,
  niceDomain,
  niceStep,
} from "./scale";
import { LegendSwatch, REFERENCE_STYLE, seriesStyle, type SeriesStyle } from "./series-style";

// Level against frequency on a log axis, one or several traces with a legend: a unit's sweep on the
// listing page, up to four units overlaid on compare. Drawn on the server; no script needed to see it.

export interface ResponseSeries {
  id: string;
  label: string;
  /** In frequency order. */
  points: { hz: number; db: number }[];
  /** A target curve rather than a measurement (the RIAA curve): drawn brass and dashed, underneath. */
  reference?: boolean;
}

/** Each series' style: measured traces take the palette in order, references the reference style. */
export function styleSeries(series: readonly ResponseSeries[]): { series: ResponseSeries; style: SeriesStyle }[] {
  let n = 0;
  return series.map((s) => ({ series: s, style: s.reference ? REFERENCE_STYLE : seriesStyle(n++) }));
}

/** The plot in words, for screen readers: each trace's span and its lowest and highest level. */
export function describeResponses(series: readonly ResponseSeries[]): string {
  const parts = series
    .filter((s) => s.points.length > 0)
    .map((s) => {
      const first = s.points[0];
      const last = s.points[s.points.length - 1];
      const low = s.points.reduce((a, b) => (b.db < a.db ? b : a));
      const high = s.points.reduce((a, b) => (b.db > a.db ? b : a));
      return `${s.label}: ${hzWords(first.hz)} to ${hzWords(last.hz)}, lowest ${dbWords(low.db)} at ${hzWords(low.hz)}, highest ${dbWords(high.db)} at ${hzWords(high.hz)}.`;
    });
  return parts.length ? parts.join(" ") : "No measured points.";
}

export function FrequencyResponsePlot({
  title,
  series,
  yLabel = "Level (dB)",
  yDomain,
  yStep,
  hzRange,
  height = 260,
  legend = series.length > 1,
  table = true,
}: {
  /** The plot's accessible name, e.g. "Frequency response of three amplifiers". */
  title: string;
  series: ResponseSeries[];
  yLabel?: string;
  /** Defaults to a range that holds every trace, on whole steps. */
  yDomain?: [number, number];
  yStep?: number;
  /** Defaults to the traces' span widened to 1-2-5 values. */
  hzRange?: [number, number];
  height?: number;
  legend?: boolean;
  /** A table of the levels at the tick frequencies, behind a disclosure. */
  table?: boolean;
}) {
  const descriptionId = useId();
  const all = series.flatMap((s) => s.points);
  const fit = niceDomain(
    all.map((p) => p.db),
    6,
  );
  const domain = yDomain ?? fit.domain;
  const step = yStep ?? (yDomain ? niceStep(yDomain[1] - yDomain[0]) : fit.step);
  const hz = hzRange ?? hzDomain(all.map((p) => p.hz));
  const sx = logScale(hz);
  const sy = linearScale(domain);
  const styled = styleSeries(series);
  // References first, so the measured traces lie on top of them.
  const drawOrder = [...styled.filter((s) => s.series.reference), ...styled.filter((s) => !s.series.reference)];
  return (
    <div className="space-y-2">
      <PlotFrame
        label={title}
        descriptionId={descriptionId}
        height={height}
        zero={domain[0] < 0 && domain[1] > 0 ? 0 : undefined}
        x={{ label: "Frequency (Hz)", scale: sx, ticks: logTicks(hz), grid: logGrid(hz) }}
        y={{ label: yLabel, scale: sy, ticks: linearTicks(domain, step) }}
      >
        {drawOrder.map(({ series: s, style }) => (
          <path
            key={s.id}
            data-series={s.id}
            d={linePath(
              s.points.map((p) => ({ x: p.hz, y: p.db })),
              sx,
              sy,
            )}
            fill="none"
            stroke={style.stroke}
            strokeWidth={s.reference ? 1.5 : 2}
            strokeDasharray={style.dash}
            strokeLinejoin="round"
            vectorEffect="non-scaling-stroke"
          />
        ))}
      </PlotFrame>
      <p id={descriptionId} className="sr-only">
        {describeResponses(series)}
      </p>
      {legend ? <Legend entries={styled.map(({ series: s, style }) => ({ id: s.id, label: s.label, style }))} /> : null}
      {table ? (
        <details className="text-sm">
          <summary className="cursor-pointer select-none text-[0.8125rem] font-medium text-walnut hover:text-walnut-deep">
            The numbers behind this plot
          </summary>
          <div className="mt-2 overflow-x-auto">
            <ResponseTable series={series} frequencies={logTicks(hz).map((t) => t.value)} />
          </div>
        </details>
      ) : null}
    </div>
  );
}

export function Legend({ entries, bars = false }: { entries: { id: string; label: string; style: SeriesStyle }[]; bars?: boolean }) {
  return (
    <ul className="flex flex-wrap gap-x-4 gap-y-1 text-[0.8125rem] text-ink-soft" aria-label="Legend">
      {entries.map((e) => (
        <li key={e.id} className="flex items-center gap-1.5">
          <LegendSwatch style={e.style} bar={bars} />
          <span>{e.label}</span>
        </li>
      ))}
    </ul>
  );
}

const th = "border-b border-rule px-2 py-1 text-left text-xs font-semibold text-ink-soft";
const td = "border-b border-rule/60 px-2 py-1 figures text-[0.8125rem]";

/** Each trace's level at the given frequencies (read between measured points); "—" outside a sweep. */
export function ResponseTable({ series, frequencies }: { series: ResponseSeries[]; frequencies: number[] }) {
  return (
    <table className="min-w-full">
      <thead>
        <tr>
          <th scope="col" className={th}>
            Frequency
          </th>
          {series.map((s) => (
            <th key={s.id} scope="col" className={th}>
              {s.label}, dB
            </th>
          ))}
        </tr>
      </thead>
      <tbody>
        {frequencies.map((f) => (
          <tr key={f}>
            <th scope="row" className={`${td} text-left font-normal`}>
              {hzWords(f)}
            </th>
            {series.map((s) => {
              const db = levelAtHz(s.points, f);
              return (
                <td key={s.id} className={td}>
                  {db === undefined ? "—" : dbWords(db).replace(" dB", "")}
                </td>
              );
            })}
          </tr>
        ))}
      </tbody>
    </table>
  );
}
