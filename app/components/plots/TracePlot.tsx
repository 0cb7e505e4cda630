import { useId } from "react";
import { PlotFrame } from "./PlotFrame";
import { linePath, linearScale, linearTicks, niceDomain, niceStep, plain } from "./scale";
import { seriesStyle } from "./series-style";

// One trace on linear axes: a square-wave capture, level against time.

export function describeTrace(points: readonly { x: number; y: number }[], xUnit: string, yUnit: string): string {
  if (points.length === 0) return "No samples.";
  const low = points.reduce((a, b) => (b.y < a.y ? b : a));
  const high = points.reduce((a, b) => (b.y > a.y ? b : a));
  const n = (v: number) => plain(Number(v.toPrecision(3)));
  return `${points.length} samples from ${n(points[0].x)} to ${n(points[points.length - 1].x)} ${xUnit}; lowest ${n(low.y)} ${yUnit} at ${n(low.x)} ${xUnit}, highest ${n(high.y)} ${yUnit} at ${n(high.x)} ${xUnit}.`;
}

export function TracePlot({
  title,
  points,
  x,
  y,
  height = 240,
  zero,
}: {
  title: string;
  points: { x: number; y: number }[];
  /** Axis titles with their units, and the unit alone for the description: { label: "Time (µs)", unit: "µs" }. */
  x: { label: string; unit: string; domain?: [number, number] };
  /** includeZero: the axis reaches 0 (a speed plot shows where nominal is). */
  y: { label: string; unit: string; includeZero?: boolean; minSpan?: number };
  height?: number;
  /** A firmer line at this y value. */
  zero?: number;
}) {
  const descriptionId = useId();
  const xs = points.map((p) => p.x);
  const xDomain: [number, number] = x.domain ?? [Math.min(...xs), Math.max(...xs)];
  const yFit = niceDomain(y.includeZero ? [0, ...points.map((p) => p.y)] : points.map((p) => p.y), y.minSpan ?? 0, 6);
  const sx = linearScale(xDomain);
  const sy = linearScale(yFit.domain);
  return (
    <div className="space-y-2">
      <PlotFrame
        label={title}
        descriptionId={descriptionId}
        height={height}
        x={{ label: x.label, scale: sx, ticks: linearTicks(xDomain, niceStep(xDomain[1] - xDomain[0], 5)) }}
        y={{ label: y.label, scale: sy, ticks: linearTicks(yFit.domain, yFit.step) }}
        zero={zero}
      >
        <path
          data-series="trace"
          d={linePath(points, sx, sy)}
          fill="none"
          stroke={seriesStyle(0).stroke}
          strokeWidth={1.75}
          strokeLinejoin="round"
          vectorEffect="non-scaling-stroke"
        />
      </PlotFrame>
      <p id={descriptionId} className="sr-only">
        {describeTrace(points, x.unit, y.unit)}
      </p>
    </div>
  );
}
