import { FrequencyResponsePlot, HarmonicSpectrumPlot, ImpedancePlot, TracePlot } from "~/components/plots";
import { round125 } from "~/components/plots/scale";
import type { ImpedancePlot as ImpedancePlotData, ResponsePlot, SpectrumPlot, SpeedDriftPlot, SquarePlot } from "../types";

// The listing's bench plots, drawn with the shared plot components on the server.

export function SpectrumChart({ plot }: { plot: SpectrumPlot }) {
  return (
    <HarmonicSpectrumPlot
      title={plot.title}
      fundamentalHz={plot.fundamentalHz}
      harmonics={plot.bars.map((b) => ({ label: b.label, hz: b.frequencyHz, levels: b.levels }))}
      channels={plot.channels}
      floorDb={plot.floorDb}
      xLabel={plot.xLabel}
      yLabel={plot.yLabel}
    />
  );
}

export function ResponseChart({ plot }: { plot: ResponsePlot }) {
  const riaa = plot.kind === "riaa";
  const span = plot.domain.level[1] - plot.domain.level[0];
  const measured = { id: `${plot.id}-level`, label: "Measured", points: plot.points.map((p) => ({ hz: p.f, db: p.level })) };
  const target = riaa
    ? [
        {
          id: `${plot.id}-target`,
          label: "RIAA curve",
          reference: true,
          points: plot.points.flatMap((p) => (p.target === undefined ? [] : [{ hz: p.f, db: p.target }])),
        },
      ]
    : [];
  return (
    <div className="space-y-3">
      <FrequencyResponsePlot
        title={plot.title}
        series={[measured, ...target]}
        yLabel="Level re 1 kHz (dB)"
        yDomain={plot.domain.level}
        yStep={riaa ? 5 : span > 12 ? 3 : 1}
        height={riaa ? 240 : 260}
        table={false}
      />
      {riaa && plot.domain.deviation ? (
        <FrequencyResponsePlot
          title={`${plot.title}: deviation from the curve`}
          series={[
            {
              id: `${plot.id}-deviation`,
              label: "Deviation from RIAA",
              points: plot.points.map((p) => ({ hz: p.f, db: p.deviation ?? 0 })),
            },
          ]}
          yLabel="Deviation (dB)"
          yDomain={plot.domain.deviation}
          yStep={0.5}
          height={160}
          table={false}
        />
      ) : null}
    </div>
  );
}

export function SquareChart({ plot }: { plot: SquarePlot }) {
  const last = plot.points[plot.points.length - 1]?.t || 1;
  return (
    <TracePlot
      title={plot.title}
      points={plot.points.map((p) => ({ x: p.t, y: p.v }))}
      x={plot.axes ? plot.axes.x : { label: "Time (µs)", unit: "µs", domain: [0, round125(last, true)] }}
      y={plot.axes ? plot.axes.y : { label: "Level (V)", unit: "V" }}
    />
  );
}

export function ImpedanceChart({ plot }: { plot: ImpedancePlotData }) {
  return (
    <ImpedancePlot
      title={plot.title}
      points={plot.points.map((p) => ({ hz: p.f, ohms: p.ohms, phase: p.phase }))}
      floorOhm={plot.floorOhm}
    />
  );
}

export function SpeedDriftChart({ plot }: { plot: SpeedDriftPlot }) {
  const last = plot.points[plot.points.length - 1]?.t || 1;
  return (
    <TracePlot
      title={`${plot.title}: speed against time`}
      points={plot.points.map((p) => ({ x: p.t, y: p.percent }))}
      x={{ label: "Time (s)", unit: "s", domain: [0, Math.ceil(last)] }}
      y={{ label: "Speed re nominal (%)", unit: "%", includeZero: true, minSpan: 0.1 }}
      zero={0}
    />
  );
}
