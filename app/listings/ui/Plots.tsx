import type { ReactNode } from "react";
import type { PlotSet, ResponsePlot, SpectrumPlot, SpeedDriftPlot } from "../types";
import { CaptureTag } from "./CaptureTag";
import { ImpedanceChart, ResponseChart, SpectrumChart, SpeedDriftChart, SquareChart } from "./charts";

// The plots are SVG drawn on the server: they show before any script runs, and the numbers behind
// each are in a table beside it for readers who would rather read.

function PlotFigure({
  id,
  title,
  conditions,
  fromCapture,
  children,
  numbers,
  wide = false,
}: {
  wide?: boolean;
  id: string;
  title: string;
  conditions: string;
  fromCapture: boolean;
  children: ReactNode;
  numbers: ReactNode;
}) {
  return (
    <figure
      aria-labelledby={`${id}-title`}
      className={`space-y-3 rounded-panel border border-rule bg-card p-4 shadow-panel sm:p-5 ${wide ? "xl:col-span-2" : ""}`}
    >
      <figcaption className="space-y-1">
        <div className="flex flex-wrap items-center gap-2">
          <h3 id={`${id}-title`} className="text-[1.0625rem] leading-snug">
            {title}
          </h3>
          {fromCapture ? <CaptureTag /> : null}
        </div>
        <p className="text-[0.8125rem] text-ink-faint">{conditions}</p>
      </figcaption>
      {children}
      <details className="group text-sm">
        <summary className="cursor-pointer select-none text-[0.8125rem] font-medium text-walnut hover:text-walnut-deep">
          The numbers behind this plot
        </summary>
        <div className="mt-2 overflow-x-auto">{numbers}</div>
      </details>
    </figure>
  );
}

const th = "border-b border-rule px-2 py-1 text-left text-xs font-semibold text-ink-soft";
const td = "border-b border-rule/60 px-2 py-1 figures text-[0.8125rem]";

function SpectrumNumbers({ plot }: { plot: SpectrumPlot }) {
  return (
    <table className="min-w-full">
      <thead>
        <tr>
          <th className={th}>{plot.xLabel ? "Component" : "Harmonic"}</th>
          <th className={th}>Frequency</th>
          {plot.channels.map((c) => (
            <th key={c.key} className={th}>
              {c.label}, {plot.yLabel ? "dB" : "dB re fundamental"}
            </th>
          ))}
        </tr>
      </thead>
      <tbody>
        {plot.bars.map((b) => (
          <tr key={b.order}>
            <td className={td}>{b.label}</td>
            <td className={td}>
              {b.frequencyHz >= 1000 ? `${Number((b.frequencyHz / 1000).toPrecision(4))} kHz` : `${Math.round(b.frequencyHz)} Hz`}
            </td>
            {plot.channels.map((c) => (
              <td key={c.key} className={td}>
                {b.levels[c.key] !== undefined ? b.levels[c.key].toFixed(1).replace(/^-/, "−") : "—"}
              </td>
            ))}
          </tr>
        ))}
      </tbody>
    </table>
  );
}

function ResponseNumbers({ plot }: { plot: ResponsePlot }) {
  const step = Math.max(1, Math.ceil(plot.points.length / 24));
  const rows = plot.points.filter((_, i) => i % step === 0 || i === plot.points.length - 1);
  const riaa = plot.kind === "riaa";
  const db = (x: number | undefined) => (x === undefined ? "—" : `${x >= 0 ? "+" : "−"}${Math.abs(x).toFixed(2)}`);
  return (
    <table className="min-w-full">
      <thead>
        <tr>
          <th className={th}>Frequency</th>
          <th className={th}>Level re 1 kHz, dB</th>
          {riaa ? <th className={th}>RIAA curve, dB</th> : null}
          {riaa ? <th className={th}>Deviation, dB</th> : null}
        </tr>
      </thead>
      <tbody>
        {rows.map((p) => (
          <tr key={p.f}>
            <td className={td}>{p.f >= 1000 ? `${Number((p.f / 1000).toPrecision(3))} kHz` : `${Number(p.f.toPrecision(3))} Hz`}</td>
            <td className={td}>{db(p.level)}</td>
            {riaa ? <td className={td}>{db(p.target)}</td> : null}
            {riaa ? <td className={td}>{db(p.deviation)}</td> : null}
          </tr>
        ))}
      </tbody>
    </table>
  );
}

function SpeedNumbers({ plot }: { plot: SpeedDriftPlot }) {
  const step = Math.max(1, Math.ceil(plot.points.length / 40));
  const rows = plot.points.filter((_, i) => i % step === 0);
  return (
    <table className="min-w-full">
      <thead>
        <tr>
          <th className={th}>Time, s</th>
          <th className={th}>Speed re nominal, %</th>
        </tr>
      </thead>
      <tbody>
        {rows.map((p) => (
          <tr key={p.t}>
            <td className={td}>{p.t.toFixed(2)}</td>
            <td className={td}>{`${p.percent >= 0 ? "+" : "−"}${Math.abs(p.percent).toFixed(3)}`}</td>
          </tr>
        ))}
      </tbody>
    </table>
  );
}

function FigureList({ figures }: { figures: { label: string; display: string }[] }) {
  return (
    <dl className="divide-y divide-rule/60 text-sm">
      {figures.map((f) => (
        <div key={f.label} className="flex items-baseline justify-between gap-3 py-1">
          <dt className="text-ink-soft">{f.label}</dt>
          <dd className="figures whitespace-nowrap text-ink">{f.display}</dd>
        </div>
      ))}
    </dl>
  );
}

export function Plots({
  plots,
  heading = "What the bench saw",
  lede = "Plotted from the seller's sweeps and captures, exactly as measured.",
}: {
  plots: PlotSet;
  heading?: string;
  lede?: string;
}) {
  const count = plots.spectra.length + plots.responses.length + plots.squares.length + plots.speedDrifts.length + plots.impedances.length;
  if (count === 0) return null;
  return (
    <section aria-labelledby="plots-heading" className="below-fold space-y-4">
      <div className="space-y-1">
        <h2 id="plots-heading" className="text-2xl">
          {heading}
        </h2>
        <p className="text-sm text-ink-soft">{lede}</p>
      </div>
      <div className="grid gap-4 xl:grid-cols-2">
        {plots.spectra.map((p) => (
          <PlotFigure key={p.id} id={p.id} title={p.title} conditions={p.conditions} fromCapture numbers={<SpectrumNumbers plot={p} />}>
            <SpectrumChart plot={p} />
            <ul className="flex flex-wrap gap-x-5 gap-y-1 text-[0.8125rem] text-ink-soft">
              {p.channels.map((c) => (
                <li key={c.key}>
                  <span className="font-medium text-ink">{c.label}:</span> <span className="figures">{c.thd}</span>
                </li>
              ))}
            </ul>
          </PlotFigure>
        ))}
        {plots.squares.map((p) => (
          <PlotFigure
            key={p.id}
            id={p.id}
            title={p.title}
            conditions={p.conditions}
            fromCapture
            numbers={<FigureList figures={p.figures} />}
          >
            <SquareChart plot={p} />
            <FigureList figures={p.figures} />
          </PlotFigure>
        ))}
        {plots.impedances.map((p) => (
          <PlotFigure
            key={p.id}
            wide
            id={p.id}
            title={p.title}
            conditions={p.conditions}
            fromCapture
            numbers={<FigureList figures={p.figures} />}
          >
            <ImpedanceChart plot={p} />
            <FigureList figures={p.figures} />
          </PlotFigure>
        ))}
        {plots.speedDrifts.map((p) => (
          <PlotFigure key={p.id} wide id={p.id} title={p.title} conditions={p.conditions} fromCapture numbers={<SpeedNumbers plot={p} />}>
            <SpeedDriftChart plot={p} />
            <FigureList figures={p.figures} />
          </PlotFigure>
        ))}
        {plots.responses.map((p) => (
          <PlotFigure
            key={p.id}
            wide
            id={p.id}
            title={p.title}
            conditions={p.conditions}
            fromCapture={p.fromCapture}
            numbers={<ResponseNumbers plot={p} />}
          >
            <ResponseChart plot={p} />
            {p.riaa ? (
              <p className="text-[0.8125rem] text-ink-soft">
                Against {p.riaa.variant} (brass, dashed); worst deviation <span className="figures text-ink">{p.riaa.worst}</span>.
              </p>
            ) : null}
          </PlotFigure>
        ))}
      </div>
    </section>
  );
}
