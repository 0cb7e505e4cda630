import type { ReactNode } from "react";
import { gridPath, SIZE, type Scale, type Tick } from "./scale";

// The frame every plot shares. The drawing is an SVG stretched over the plot area (so it fills any
// width without script), its strokes kept at hairline width; tick and axis labels are HTML placed by
// percentage, so text stays at reading size on a phone and on a desktop alike.

export interface Axis {
  /** With its unit: "Frequency (Hz)", "Level re 1 kHz (dB)". */
  label: string;
  scale: Scale;
  ticks: Tick[];
  /** Extra faint lines without labels (the 2…9 of a log axis). */
  grid?: number[];
  /** No lines at the ticks (a bar chart's categories). */
  noGrid?: boolean;
}

const pct = (f: number) => `${Math.round(f * 100_000) / 1000}%`;

export function PlotFrame({
  label,
  descriptionId,
  height,
  x,
  y,
  zero,
  children,
}: {
  /** The plot's accessible name. */
  label: string;
  descriptionId?: string;
  height: number;
  x: Axis;
  y: Axis;
  /** Draws a firmer line at this y value (0 dB). */
  zero?: number;
  /** SVG content in plot coordinates (0…1000 both ways, y downwards). */
  children: ReactNode;
}) {
  const inside = (f: number) => f >= -1e-9 && f <= 1 + 1e-9;
  const xTicks = x.ticks.map((t) => ({ ...t, at: x.scale(t.value) })).filter((t) => inside(t.at));
  const yTicks = y.ticks.map((t) => ({ ...t, at: y.scale(t.value) })).filter((t) => inside(t.at));
  const grid = gridPath(
    [...(x.noGrid ? [] : xTicks.map((t) => t.at)), ...(x.grid ?? []).map(x.scale)],
    yTicks.map((t) => t.at),
  );
  const zeroAt = zero === undefined ? undefined : y.scale(zero);
  return (
    <div role="img" aria-label={label} aria-describedby={descriptionId} className="plot relative select-none" style={{ height }}>
      <div className="absolute inset-y-2 left-0 flex w-4 items-center justify-center pb-8">
        <span className="whitespace-nowrap text-xs text-ink-soft [writing-mode:vertical-rl] rotate-180">{y.label}</span>
      </div>
      <div className="absolute bottom-10 left-14 right-3 top-2">
        <svg
          className="absolute inset-0 h-full w-full overflow-visible"
          viewBox={`0 0 ${SIZE} ${SIZE}`}
          preserveAspectRatio="none"
          aria-hidden="true"
          focusable="false"
        >
          <path d={grid} fill="none" stroke="var(--color-rule)" strokeWidth={1} vectorEffect="non-scaling-stroke" />
          <rect x={0} y={0} width={SIZE} height={SIZE} fill="none" stroke="var(--color-rule-strong)" vectorEffect="non-scaling-stroke" />
          {zeroAt !== undefined && inside(zeroAt) ? (
            <path
              d={`M0 ${Math.round((1 - zeroAt) * SIZE * 10) / 10}H${SIZE}`}
              stroke="var(--color-ink-faint)"
              vectorEffect="non-scaling-stroke"
            />
          ) : null}
          {children}
        </svg>
        {yTicks.map((t) => (
          <span
            key={`y${t.value}`}
            className="figures absolute right-full mr-1.5 -translate-y-1/2 text-[0.6875rem] leading-none text-ink-faint"
            style={{ top: pct(1 - t.at) }}
          >
            {t.label}
          </span>
        ))}
        {xTicks.map((t) => (
          <span
            key={`x${t.value}`}
            className={`figures absolute top-full mt-1.5 -translate-x-1/2 text-[0.6875rem] leading-none text-ink-faint ${t.minor ? "max-sm:hidden" : ""}`}
            style={{ left: pct(t.at) }}
          >
            {t.label}
          </span>
        ))}
      </div>
      <div className="absolute bottom-0 left-14 right-3 text-center text-xs text-ink-soft">{x.label}</div>
    </div>
  );
}
