// How series tell apart: by colour and by dash, so a reader who cannot tell the colours apart (or a
// grey-scale print) still can. Up to four units are overlaid on compare; beyond that the styles repeat.

export interface SeriesStyle {
  stroke: string;
  /** SVG stroke-dasharray, in screen pixels (the strokes do not scale with the drawing). */
  dash?: string;
}

export const SERIES_STYLES: readonly SeriesStyle[] = [
  { stroke: "var(--color-trace)" },
  { stroke: "var(--color-walnut)", dash: "7 4" },
  { stroke: "#2f5d8a", dash: "2 3" },
  { stroke: "var(--color-brass-ink)", dash: "10 3 2 3" },
];

/** A reference curve (the RIAA target): brass, dashed, drawn under the measured traces. */
export const REFERENCE_STYLE: SeriesStyle = { stroke: "var(--color-brass)", dash: "5 4" };

export function seriesStyle(index: number): SeriesStyle {
  return SERIES_STYLES[index % SERIES_STYLES.length];
}

/** The sample beside a legend entry, drawn as the series is: a line, or a block for bars. */
export function LegendSwatch({ style, bar = false }: { style: SeriesStyle; bar?: boolean }) {
  return (
    <svg width="28" height="10" viewBox="0 0 28 10" aria-hidden="true" focusable="false" className="shrink-0">
      {bar ? (
        <rect x="9" y="0" width="10" height="10" rx="1" fill={style.stroke} />
      ) : (
        <path d="M1 5H27" stroke={style.stroke} strokeWidth={2} strokeDasharray={style.dash} fill="none" />
      )}
    </svg>
  );
}
