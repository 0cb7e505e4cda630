import { Bar, BarChart, CartesianGrid, Legend, Line, LineChart, ReferenceLine, ResponsiveContainer, Tooltip, XAxis, YAxis } from "recharts";
import type { ResponsePlot, SpectrumPlot, SquarePlot } from "../types";

// The bench plots, drawn with recharts in the browser (it measures its container, so nothing is
// drawn on the server). Trace green on paper, hairline graticule, mono tick labels, units on every axis.

const INK = "#1f1a15";
const FAINT = "#6b5f52";
const RULE = "#dcd1bd";
const TRACE = "#2e6a4e";
const TRACE_2 = "#86b498";
const BRASS = "#b48f3e";

const tick = { fill: FAINT, fontSize: 11, fontFamily: "JetBrains Mono, ui-monospace, monospace" };
const axisLabel = (value: string, angle = 0) => ({
  value,
  angle,
  position: angle ? ("insideLeft" as const) : ("insideBottom" as const),
  offset: angle ? 4 : -2,
  style: { fill: INK, fontSize: 12, textAnchor: "middle" as const },
});
const tooltipStyle = {
  contentStyle: { background: "#fcfaf5", border: `1px solid ${RULE}`, borderRadius: 6, fontSize: 12 },
  labelStyle: { color: INK, fontWeight: 600 },
};

/** "1 kHz", "500 Hz": for labels in prose. */
function hzWords(f: number): string {
  return f >= 1000 ? `${Number((f / 1000).toPrecision(3))} kHz` : `${Number(f.toPrecision(3))} Hz`;
}

/** "1k", "500": for ticks. */
export function hz(f: number): string {
  if (f >= 1000) return `${Number((f / 1000).toPrecision(3))}k`;
  return `${Number(f.toPrecision(3))}`;
}

// Decades only: on a phone-width log axis anything finer collides.
const LOG_TICKS = [1, 10, 100, 1000, 10_000, 100_000, 1_000_000];

/** Every `step` from lo to hi (the domain is already on whole steps). */
function linearTicks([lo, hi]: [number, number], step: number): number[] {
  const out: number[] = [];
  for (let v = lo; v <= hi + 1e-9; v += step) out.push(Math.round(v * 1000) / 1000);
  return out;
}

/** 1, 2 or 5 × 10^n at or above x: a time axis that ends on a round number. */
function niceCeil(x: number): number {
  const p = 10 ** Math.floor(Math.log10(x));
  return [1, 2, 5, 10].map((m) => m * p).find((v) => v >= x - 1e-9) ?? 10 * p;
}

export function SpectrumChart({ plot }: { plot: SpectrumPlot }) {
  // Bars rise from the floor of the plot: heights are dB above the floor, labelled back in dB re fundamental.
  const floor = plot.floorDb;
  const data = plot.bars.map((b) => ({
    name: b.label,
    frequency: b.frequencyHz,
    ...Object.fromEntries(Object.entries(b.levels).map(([k, v]) => [k, Math.max(0, v - floor)])),
  }));
  const ticks = Array.from({ length: Math.floor(-floor / 20) + 1 }, (_, i) => i * 20);
  return (
    <ResponsiveContainer width="100%" height={260}>
      <BarChart data={data} margin={{ top: 8, right: 12, bottom: 22, left: 14 }} barGap={2}>
        <CartesianGrid stroke={RULE} strokeDasharray="2 3" vertical={false} />
        <XAxis
          dataKey="name"
          tick={tick}
          tickLine={false}
          axisLine={{ stroke: RULE }}
          label={axisLabel(`Harmonic of ${hzWords(plot.fundamentalHz)}`)}
        />
        <YAxis
          domain={[0, -floor]}
          ticks={ticks}
          tick={tick}
          tickFormatter={(v: number) => String(v + floor)}
          width={52}
          tickLine={false}
          axisLine={{ stroke: RULE }}
          label={axisLabel("dB re fundamental", -90)}
        />
        <Tooltip
          {...tooltipStyle}
          cursor={{ fill: "rgb(46 106 78 / 0.06)" }}
          formatter={(v, name) => [
            `${(Number(v) + floor).toFixed(1)} dB`,
            plot.channels.find((c) => c.key === name)?.label ?? String(name),
          ]}
          labelFormatter={(label) => {
            const bar = plot.bars.find((b) => b.label === label);
            return bar ? `${bar.label} · ${hzWords(bar.frequencyHz)}` : label;
          }}
        />
        {plot.channels.length > 1 ? (
          <Legend
            verticalAlign="top"
            align="right"
            height={24}
            iconType="square"
            formatter={(key) => <span style={{ color: INK, fontSize: 12 }}>{plot.channels.find((c) => c.key === key)?.label ?? key}</span>}
          />
        ) : null}
        {plot.channels.map((c, i) => (
          <Bar key={c.key} dataKey={c.key} fill={i === 0 ? TRACE : TRACE_2} radius={[2, 2, 0, 0]} isAnimationActive={false} />
        ))}
      </BarChart>
    </ResponsiveContainer>
  );
}

function logDomain(points: { f: number }[]): [number, number] {
  const lo = points[0]?.f ?? 20;
  const hi = points[points.length - 1]?.f ?? 20_000;
  return [lo, hi];
}

export function ResponseChart({ plot }: { plot: ResponsePlot }) {
  const domain = logDomain(plot.points);
  const ticks = LOG_TICKS.filter((t) => t >= domain[0] && t <= domain[1]);
  const riaa = plot.kind === "riaa";
  const span = plot.domain.level[1] - plot.domain.level[0];
  const levelTicks = linearTicks(plot.domain.level, riaa ? 5 : span > 12 ? 3 : 1);
  return (
    <div className="space-y-1">
      <ResponsiveContainer width="100%" height={riaa ? 240 : 260}>
        <LineChart data={plot.points} margin={{ top: 8, right: 12, bottom: 22, left: 14 }}>
          <CartesianGrid stroke={RULE} strokeDasharray="2 3" />
          <XAxis
            dataKey="f"
            type="number"
            scale="log"
            domain={domain}
            ticks={ticks}
            interval={0}
            tickFormatter={hz}
            tick={tick}
            tickLine={false}
            axisLine={{ stroke: RULE }}
            allowDataOverflow
            label={axisLabel("Frequency (Hz)")}
          />
          <YAxis
            domain={plot.domain.level}
            ticks={levelTicks}
            interval={0}
            tick={tick}
            width={52}
            tickLine={false}
            axisLine={{ stroke: RULE }}
            allowDataOverflow
            label={axisLabel("Level re 1 kHz (dB)", -90)}
          />
          <ReferenceLine y={0} stroke={FAINT} strokeOpacity={0.5} />
          <Tooltip
            {...tooltipStyle}
            labelFormatter={(f) => hzWords(Number(f))}
            formatter={(v, name) => [`${Number(v).toFixed(2)} dB`, name === "target" ? "RIAA curve" : "Measured"]}
          />
          {riaa ? (
            <Line dataKey="target" stroke={BRASS} strokeWidth={1.5} strokeDasharray="5 4" dot={false} isAnimationActive={false} />
          ) : null}
          <Line dataKey="level" stroke={TRACE} strokeWidth={2} dot={false} isAnimationActive={false} />
        </LineChart>
      </ResponsiveContainer>
      {riaa && plot.domain.deviation ? (
        <ResponsiveContainer width="100%" height={150}>
          <LineChart data={plot.points} margin={{ top: 4, right: 12, bottom: 22, left: 14 }}>
            <CartesianGrid stroke={RULE} strokeDasharray="2 3" />
            <XAxis
              dataKey="f"
              type="number"
              scale="log"
              domain={domain}
              ticks={ticks}
              tickFormatter={hz}
              tick={tick}
              tickLine={false}
              axisLine={{ stroke: RULE }}
              allowDataOverflow
              label={axisLabel("Frequency (Hz)")}
            />
            <YAxis
              domain={plot.domain.deviation}
              ticks={linearTicks(plot.domain.deviation, 0.5)}
              interval={0}
              tick={tick}
              width={52}
              tickLine={false}
              axisLine={{ stroke: RULE }}
              allowDataOverflow
              label={axisLabel("Deviation (dB)", -90)}
            />
            <ReferenceLine y={0} stroke={BRASS} strokeDasharray="5 4" />
            <Tooltip
              {...tooltipStyle}
              labelFormatter={(f) => hzWords(Number(f))}
              formatter={(v) => [`${Number(v).toFixed(2)} dB`, "Deviation from RIAA"]}
            />
            <Line dataKey="deviation" stroke={TRACE} strokeWidth={2} dot={false} isAnimationActive={false} />
          </LineChart>
        </ResponsiveContainer>
      ) : null}
    </div>
  );
}

export function SquareChart({ plot }: { plot: SquarePlot }) {
  const last = niceCeil(plot.points[plot.points.length - 1]?.t || 1);
  return (
    <ResponsiveContainer width="100%" height={240}>
      <LineChart data={plot.points} margin={{ top: 8, right: 12, bottom: 22, left: 14 }}>
        <CartesianGrid stroke={RULE} strokeDasharray="2 3" />
        <XAxis
          dataKey="t"
          type="number"
          domain={[0, last]}
          ticks={linearTicks([0, last], last / 4)}
          interval={0}
          tick={tick}
          tickFormatter={(t: number) => String(Number(t.toPrecision(3)))}
          tickLine={false}
          axisLine={{ stroke: RULE }}
          label={axisLabel("Time (µs)")}
        />
        <YAxis
          tick={tick}
          width={52}
          tickLine={false}
          axisLine={{ stroke: RULE }}
          domain={["auto", "auto"]}
          label={axisLabel("Level (V)", -90)}
        />
        <Tooltip
          {...tooltipStyle}
          labelFormatter={(t) => `${Number(t).toFixed(2)} µs`}
          formatter={(v) => [`${Number(v).toFixed(3)} V`, "Level"]}
        />
        <Line dataKey="v" type="linear" stroke={TRACE} strokeWidth={1.75} dot={false} isAnimationActive={false} />
      </LineChart>
    </ResponsiveContainer>
  );
}
