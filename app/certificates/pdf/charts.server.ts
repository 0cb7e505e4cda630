import {
  hzDomain,
  linearScale,
  linearTicks,
  logGrid,
  logScale,
  logTicks,
  niceDomain,
  type Scale,
  type Tick,
} from "~/components/plots/scale";
import type { ImpedancePlot, PlotSet, ResponsePlot, SpectrumPlot, SpeedDriftPlot, SquarePlot } from "~/listings/types";
import { write } from "./fonts.server";
import { COLOURS } from "./style";

// The listing page's plots again, as vector paths on the certificate: the same plot data
// (app/listings/plots.server.ts), the same scales and ticks (app/components/plots/scale.ts), drawn with
// pdfkit's path operators so they print sharp at any size. Series differ by colour and by dash, as on
// the page, so a grey-scale print still tells them apart.

export interface Box {
  x: number;
  y: number;
  w: number;
  h: number;
}
interface Axis {
  label: string;
  scale: Scale;
  ticks: Tick[];
  grid?: number[];
  noGrid?: boolean;
}
interface Series {
  points: { x: number; y: number }[];
  colour: string;
  dash?: [number, number];
  width?: number;
}

const DASHED: [number, number] = [2.5, 2];
const SERIES: { colour: string; dash?: [number, number] }[] = [
  { colour: COLOURS.trace },
  { colour: COLOURS.walnut, dash: [3.5, 2] },
  { colour: "#2f5d8a", dash: [1, 1.5] },
  { colour: COLOURS.brassInk, dash: [5, 1.5] },
];

const PAD = { left: 30, bottom: 22, top: 4, right: 6 };

/** Frame, grid, tick labels and axis titles; returns where a value lands on the page. */
function frame(doc: PDFKit.PDFDocument, box: Box, x: Axis, y: Axis, zero?: number) {
  const area = { x: box.x + PAD.left, y: box.y + PAD.top, w: box.w - PAD.left - PAD.right, h: box.h - PAD.top - PAD.bottom };
  const px = (v: number) => area.x + x.scale(v) * area.w;
  const py = (v: number) => area.y + (1 - y.scale(v)) * area.h;
  const inside = (f: number) => f >= -1e-9 && f <= 1 + 1e-9;
  doc.save().lineWidth(0.3).strokeColor(COLOURS.rule);
  const xs = [...(x.noGrid ? [] : x.ticks.map((t) => t.value)), ...(x.grid ?? [])].filter((v) => inside(x.scale(v)));
  for (const v of xs) doc.moveTo(px(v), area.y).lineTo(px(v), area.y + area.h);
  for (const t of y.ticks.filter((t) => inside(y.scale(t.value)))) doc.moveTo(area.x, py(t.value)).lineTo(area.x + area.w, py(t.value));
  doc.stroke();
  doc.lineWidth(0.6).strokeColor(COLOURS.ruleStrong).rect(area.x, area.y, area.w, area.h).stroke();
  if (zero !== undefined && inside(y.scale(zero)))
    doc
      .lineWidth(0.6)
      .strokeColor(COLOURS.inkFaint)
      .moveTo(area.x, py(zero))
      .lineTo(area.x + area.w, py(zero))
      .stroke();
  doc.restore();
  doc.fontSize(6).fillColor(COLOURS.inkFaint);
  for (const t of y.ticks.filter((t) => inside(y.scale(t.value))))
    write(doc, t.label, "mono", area.x - 24, py(t.value) - 2.5, { width: 21, align: "right", lineBreak: false });
  for (const t of x.ticks.filter((t) => inside(x.scale(t.value))))
    write(doc, t.label, "mono", px(t.value) - 15, area.y + area.h + 3, { width: 30, align: "center", lineBreak: false });
  doc.fontSize(6.5).fillColor(COLOURS.inkSoft);
  write(doc, x.label, "sans", area.x, area.y + area.h + 12, { width: area.w, align: "center", lineBreak: false });
  doc.save().rotate(-90, { origin: [box.x + 2, area.y + area.h] });
  write(doc, y.label, "sans", box.x + 2, area.y + area.h, { width: area.h, align: "center", lineBreak: false });
  doc.restore();
  return { area, px, py };
}

function lines(doc: PDFKit.PDFDocument, f: ReturnType<typeof frame>, series: Series[]) {
  doc.save();
  doc.rect(f.area.x, f.area.y, f.area.w, f.area.h).clip();
  for (const s of series) {
    doc.lineWidth(s.width ?? 0.9).strokeColor(s.colour);
    if (s.dash) doc.dash(s.dash[0], { space: s.dash[1] });
    else doc.undash();
    let pen = false;
    for (const p of s.points) {
      const x = f.px(p.x);
      const y = f.py(p.y);
      if (!Number.isFinite(x) || !Number.isFinite(y)) {
        pen = false;
        continue;
      }
      if (pen) doc.lineTo(x, y);
      else doc.moveTo(x, y);
      pen = true;
    }
    doc.stroke();
  }
  doc.undash().restore();
}

function logAxis(label: string, frequencies: number[]): Axis {
  const domain = hzDomain(frequencies);
  return { label, scale: logScale(domain), ticks: logTicks(domain).filter((t) => !t.minor), grid: logGrid(domain) };
}

function linearAxis(label: string, values: number[], minSpan: number, maxTicks = 6): Axis {
  const { domain, step } = niceDomain(values, minSpan, maxTicks);
  return { label, scale: linearScale(domain), ticks: linearTicks(domain, step) };
}

function response(doc: PDFKit.PDFDocument, box: Box, plot: ResponsePlot) {
  const x = logAxis(
    "Frequency (Hz)",
    plot.points.map((p) => p.f),
  );
  const [lo, hi] = plot.domain.level;
  const y: Axis = { label: "Level (dB)", scale: linearScale([lo, hi]), ticks: linearTicks([lo, hi], niceStep(hi - lo)) };
  const f = frame(doc, box, x, y, 0);
  const target = plot.points.filter((p) => p.target !== undefined).map((p) => ({ x: p.f, y: p.target! }));
  lines(doc, f, [
    ...(target.length ? [{ points: target, colour: COLOURS.brass, dash: DASHED }] : []),
    { points: plot.points.map((p) => ({ x: p.f, y: p.level })), ...SERIES[0], width: 1.1 },
  ]);
}

function niceStep(span: number): number {
  return niceDomain([0, span], span, 6).step;
}

function spectrum(doc: PDFKit.PDFDocument, box: Box, plot: SpectrumPlot) {
  const n = plot.bars.length;
  const x: Axis = {
    label: plot.xLabel ?? "Harmonic",
    scale: linearScale([0, n]),
    ticks: plot.bars.map((b, i) => ({ value: i + 0.5, label: b.label })),
    noGrid: true,
  };
  const y: Axis = {
    label: plot.yLabel ?? "dB re fundamental",
    scale: linearScale([plot.floorDb, 0]),
    ticks: linearTicks([plot.floorDb, 0], niceStep(-plot.floorDb)),
  };
  const f = frame(doc, box, x, y);
  const slot = f.area.w / Math.max(1, n);
  const bw = (slot * 0.7) / Math.max(1, plot.channels.length);
  plot.bars.forEach((bar, i) => {
    plot.channels.forEach((c, j) => {
      const level = bar.levels[c.key];
      if (level === undefined) return;
      const top = f.py(Math.min(0, Math.max(plot.floorDb, level)));
      const left = f.area.x + i * slot + slot * 0.15 + j * bw;
      doc.rect(left, top, bw * 0.9, f.area.y + f.area.h - top).fill(SERIES[j % SERIES.length].colour);
    });
  });
}

function trace(
  doc: PDFKit.PDFDocument,
  box: Box,
  points: { x: number; y: number }[],
  xLabel: string,
  yLabel: string,
  extra: Series[] = [],
) {
  const xs = points.map((p) => p.x);
  const x: Axis = { label: xLabel, scale: linearScale([Math.min(...xs), Math.max(...xs)]), ticks: [] };
  x.ticks = linearTicks([Math.min(...xs), Math.max(...xs)], niceStep(Math.max(...xs) - Math.min(...xs)));
  const y = linearAxis(yLabel, [...points.map((p) => p.y), ...extra.flatMap((s) => s.points.map((p) => p.y))], 1e-6);
  lines(doc, frame(doc, box, x, y, 0), [...extra, { points, ...SERIES[0] }]);
}

function impedance(doc: PDFKit.PDFDocument, box: Box, plot: ImpedancePlot) {
  const x = logAxis(
    "Frequency (Hz)",
    plot.points.map((p) => p.f),
  );
  const y = linearAxis("Impedance (Ω)", [0, ...plot.points.map((p) => p.ohms)], 4);
  const f = frame(doc, box, x, y);
  const floor = plot.floorOhm;
  lines(doc, f, [
    ...(floor !== null ? [{ points: plot.points.map((p) => ({ x: p.f, y: floor })), colour: COLOURS.fault, dash: DASHED }] : []),
    { points: plot.points.map((p) => ({ x: p.f, y: p.ohms })), ...SERIES[0], width: 1.1 },
  ]);
}

/** Every plot of the set, in the listing page's order, each with its title and conditions. */
export function plotList(plots: PlotSet): { title: string; conditions: string; draw: (doc: PDFKit.PDFDocument, box: Box) => void }[] {
  const square = (p: SquarePlot) => (doc: PDFKit.PDFDocument, box: Box) =>
    trace(
      doc,
      box,
      p.points.map((q) => ({ x: q.t, y: q.v })),
      p.axes ? `${p.axes.x.label} (${p.axes.x.unit})` : "Time (µs)",
      p.axes ? `${p.axes.y.label} (${p.axes.y.unit})` : "Level (V)",
    );
  const drift = (p: SpeedDriftPlot) => (doc: PDFKit.PDFDocument, box: Box) =>
    trace(
      doc,
      box,
      p.points.map((q) => ({ x: q.t, y: q.percent })),
      "Time (s)",
      "Speed re nominal (%)",
    );
  return [
    ...plots.responses.map((p) => ({
      title: p.title,
      conditions: withRiaa(p),
      draw: (d: PDFKit.PDFDocument, b: Box) => response(d, b, p),
    })),
    ...plots.spectra.map((p) => ({
      title: p.title,
      conditions: withChannels(p),
      draw: (d: PDFKit.PDFDocument, b: Box) => spectrum(d, b, p),
    })),
    ...plots.squares.map((p) => ({ title: p.title, conditions: withFigures(p.conditions, p.figures), draw: square(p) })),
    ...plots.impedances.map((p) => ({
      title: p.title,
      conditions: withFigures(p.conditions, p.figures),
      draw: (d: PDFKit.PDFDocument, b: Box) => impedance(d, b, p),
    })),
    ...plots.speedDrifts.map((p) => ({ title: p.title, conditions: withFigures(p.conditions, p.figures), draw: drift(p) })),
  ];
}

const withRiaa = (p: ResponsePlot) => (p.riaa ? `${p.conditions}. ${p.riaa.variant}: worst deviation ${p.riaa.worst}` : p.conditions);
const withChannels = (p: SpectrumPlot) =>
  `${p.conditions}. ${p.channels.map((c, i) => `${c.label} (${["green", "brown", "blue", "ochre"][i % 4]}): ${c.thd}`).join("; ")}`;
const withFigures = (conditions: string, figures: { label: string; display: string }[]) =>
  `${conditions}. ${figures.map((f) => `${f.label}: ${f.display}`).join("; ")}`;
