import { useId } from "react";
import { PlotFrame } from "./PlotFrame";
import { hzWords, linearScale, linearTicks, SIZE } from "./scale";
import { Legend } from "./FrequencyResponsePlot";
import { seriesStyle } from "./series-style";

// A tone's harmonics as bars, dB re the fundamental, the channels side by side in each group. Bars rise
// from the plot's floor, so a quieter harmonic is a shorter bar.

export interface Harmonic {
  /** "H2", "H3" … */
  label: string;
  hz: number;
  /** dB re the fundamental, per channel key; a channel without this harmonic is left out. */
  levels: Record<string, number>;
}

/** The bars in words: each channel's harmonics and their levels. */
export function describeHarmonics(harmonics: readonly Harmonic[], channels: readonly { key: string; label: string }[]): string {
  return channels
    .map((c) => {
      const bars = harmonics.filter((h) => h.levels[c.key] !== undefined).map((h) => `${h.label} ${minus(h.levels[c.key].toFixed(1))} dB`);
      return `${c.label}: ${bars.length ? bars.join(", ") : "no harmonics above the floor"}.`;
    })
    .join(" ");
}

const minus = (s: string) => s.replace(/^-/, "−");

export function HarmonicSpectrumPlot({
  title,
  fundamentalHz,
  harmonics,
  channels,
  floorDb,
  height = 260,
  xLabel,
  yLabel,
}: {
  title: string;
  fundamentalHz: number;
  harmonics: Harmonic[];
  channels: { key: string; label: string }[];
  /** The bottom of the plot, dB re the fundamental (a multiple of 20). */
  floorDb: number;
  height?: number;
  /** Axis titles when the bars are not harmonics (intermodulation products, separation per tone). */
  xLabel?: string;
  yLabel?: string;
}) {
  const descriptionId = useId();
  const n = Math.max(1, harmonics.length);
  const sy = linearScale([floorDb, 0]);
  const group = SIZE / n;
  const barWidth = (group * 0.7) / Math.max(1, channels.length);
  return (
    <div className="space-y-2">
      <PlotFrame
        label={title}
        descriptionId={descriptionId}
        height={height}
        x={{
          label: xLabel ?? `Harmonic of ${hzWords(fundamentalHz)}`,
          scale: (i) => (i + 0.5) / n,
          ticks: harmonics.map((h, i) => ({ value: i, label: h.label })),
          noGrid: true,
        }}
        y={{ label: yLabel ?? "Level re fundamental (dB)", scale: sy, ticks: linearTicks([floorDb, 0], 20) }}
      >
        {channels.map((c, ci) =>
          harmonics.map((h, i) => {
            const level = h.levels[c.key];
            if (level === undefined) return null;
            const top = (1 - Math.min(1, Math.max(0, sy(level)))) * SIZE;
            return (
              <rect
                key={`${c.key}-${h.label}`}
                data-series={c.key}
                x={round(i * group + group * 0.15 + ci * barWidth)}
                y={round(top)}
                width={round(barWidth * 0.92)}
                height={round(SIZE - top)}
                fill={seriesStyle(ci).stroke}
              />
            );
          }),
        )}
      </PlotFrame>
      <p id={descriptionId} className="sr-only">
        {describeHarmonics(harmonics, channels)}
      </p>
      {channels.length > 1 ? (
        <Legend bars entries={channels.map((c, i) => ({ id: c.key, label: c.label, style: seriesStyle(i) }))} />
      ) : null}
    </div>
  );
}

const round = (x: number) => Math.round(x * 10) / 10;
