import { useId } from "react";
import { PlotFrame } from "~/components/plots/PlotFrame";
import { Legend } from "~/components/plots/FrequencyResponsePlot";
import { linearScale, linearTicks, niceDomain, SIZE } from "~/components/plots/scale";
import type { SeriesStyle } from "~/components/plots/series-style";
import { formatPrice } from "@shared/money";
import type { CurrencyBook } from "../monthly.server";
import { monthName } from "../months";
import { minorDigits } from "../csv";

// A seller's months as bars, our own SVG in the plots' frame: sales, fees and payouts side by side per
// month, and what was still held in escrow at each month's end as a dashed line over them. The table
// beside it carries every number; the chart is for the shape of the year.

const BARS: { key: "salesMinor" | "feesMinor" | "payoutsMinor"; label: string; style: SeriesStyle }[] = [
  { key: "salesMinor", label: "Sales", style: { stroke: "var(--color-trace)" } },
  { key: "feesMinor", label: "Loadline fees", style: { stroke: "var(--color-brass)" } },
  { key: "payoutsMinor", label: "Paid out", style: { stroke: "var(--color-walnut)" } },
];
const PENDING: SeriesStyle = { stroke: "#2f5d8a", dash: "5 3" };

export function MoneyChart({ book }: { book: CurrencyBook }) {
  const descriptionId = useId();
  const digits = 10 ** minorDigits(book.currency);
  const values = book.months.flatMap((m) => [m.salesMinor, m.feesMinor, m.payoutsMinor, m.pendingReleaseMinor].map((v) => v / digits));
  const { domain, step } = niceDomain([0, ...values], 1, 6);
  // Amounts below zero are rare (none of these columns goes negative): the axis starts at 0 unless one does.
  const lo = values.some((v) => v < 0) ? Math.min(0, domain[0]) : 0;
  const sy = linearScale([lo, domain[1]]);
  const n = Math.max(1, book.months.length);
  const group = SIZE / n;
  const bar = (group * 0.72) / BARS.length;
  const y = (v: number) => Math.round((1 - sy(v / digits)) * SIZE * 10) / 10;
  const pending = book.months.map((m, i) => `${i ? "L" : "M"}${Math.round((i + 0.5) * group)} ${y(m.pendingReleaseMinor)}`).join("");
  const short = n > 6;
  return (
    <div className="space-y-2">
      <PlotFrame
        label={`${book.currency}: sales, fees and payouts per month, and what was held in escrow at each month's end`}
        descriptionId={descriptionId}
        height={260}
        x={{
          label: "Month (UTC)",
          scale: linearScale([0, n]),
          ticks: book.months.map((m, i) => ({ value: i + 0.5, label: monthName(m.month, short), minor: short && i % 2 === 1 })),
          noGrid: true,
        }}
        y={{ label: `Amount (${book.currency})`, scale: sy, ticks: linearTicks([lo, domain[1]], step, compact) }}
        zero={0}
      >
        {book.months.map((m, i) =>
          BARS.map((b, j) => {
            const top = y(Math.max(0, m[b.key]));
            const bottom = y(Math.min(0, m[b.key]));
            return bottom - top > 0 ? (
              <rect
                key={`${m.month}-${b.key}`}
                x={i * group + group * 0.14 + j * bar}
                y={top}
                width={bar * 0.88}
                height={bottom - top}
                fill={b.style.stroke}
              />
            ) : null;
          }),
        )}
        <path
          d={pending}
          fill="none"
          stroke={PENDING.stroke}
          strokeWidth={2}
          strokeDasharray={PENDING.dash}
          vectorEffect="non-scaling-stroke"
        />
      </PlotFrame>
      <Legend
        entries={[
          ...BARS.map((b) => ({ id: b.key, label: b.label, style: b.style })),
          { id: "pending", label: "Held in escrow at month end", style: PENDING },
        ]}
      />
      <p id={descriptionId} className="sr-only">
        {book.months
          .map(
            (m) =>
              `${monthName(m.month)}: sales ${formatPrice(m.salesMinor, book.currency)}, fees ${formatPrice(m.feesMinor, book.currency)}, paid out ${formatPrice(m.payoutsMinor, book.currency)}, held ${formatPrice(m.pendingReleaseMinor, book.currency)}.`,
          )
          .join(" ")}
      </p>
    </div>
  );
}

/** Axis labels in the currency's unit: "0", "500", "1.5k". */
function compact(v: number): string {
  const s = Math.abs(v) >= 1000 ? `${Number((v / 1000).toPrecision(3))}k` : String(Number(v.toPrecision(4)));
  return s.replace(/^-/, "−");
}
