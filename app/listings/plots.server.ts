import { describeConditions, formatValue, type BenchSheet } from "@shared/bench";
import { parseTwoColumnCsv, SQUARE_COLUMNS, type SineAnalysis, type SquareCaptureConditions } from "@shared/bench/analysis";
import type { Capture } from "~/models/capture.server";
import { ownListing } from "./access.server";
import { storedSheet } from "./bench.server";
import { capturesForSheet } from "./captures.server";
import { getObjectBuffer } from "~/services/storage.server";
import { dbDomain, decimateMinMax, responseSeries } from "./plot-math";
import { impedancePlots } from "./plots-impedance.server";
import { imdPlots, outputImpedancePlots, separationPlots } from "./plots-twotone.server";
import type { PlotSet, ResponsePlot, SpectrumPlot, SpeedDriftPlot, SquarePlot } from "./types";

// Plot data for the listing page and the seller's editor, from the bench sheet's sweeps and the seller's
// analysed captures. Only measured data is ever plotted; a sheet without sweeps or captures simply has
// no plots. Each capture kind has one function here that turns its captures into its plots.

const MAX_PLOTS_EACH = 3;
const CHANNEL_LABEL: Record<string, string> = { left: "Left", right: "Right", mono: "Mono", both: "Both channels" };
const CHANNEL_WORDS: Record<string, string> = { left: "left channel", right: "right channel", mono: "mono", both: "both channels" };
/** 0.99999 V reads as "1 V", not "1000 mV". */
const tidy = (x: number) => Number(x.toPrecision(3));

export async function plotsFor(sheet: BenchSheet | null, captures: Map<string, Capture>): Promise<PlotSet> {
  if (!sheet) return { spectra: [], responses: [], squares: [], impedances: [], speedDrifts: [] };
  const list = [...captures.values()];
  return {
    spectra: [...spectra(list.filter((c) => c.kind === "sine")), ...imdPlots(list), ...separationPlots(list)],
    responses: responses(sheet),
    squares: [...(await squares(list.filter((c) => c.kind === "square"))), ...outputImpedancePlots(list)],
    impedances: impedancePlots(
      list.filter((c) => c.kind === "impedance"),
      sheet.readings.find((r) => r.quantity === "nominal_impedance")?.value,
    ),
    speedDrifts: speedDrifts(list.filter((c) => c.kind === "wow_flutter")),
  };
}

/** The seller's own view while editing: the plots of the saved sheet's captures, before publishing. */
export async function plotsForDraft(listingId: string, userId: string): Promise<PlotSet> {
  const listing = await ownListing(listingId, userId);
  const { sheet } = await storedSheet(listing.id);
  const captures = sheet ? await capturesForSheet(sheet, listing.sellerId) : new Map<string, Capture>();
  return plotsFor(sheet, captures);
}

/** The channel a capture's conditions name, for the kinds that have one. */
function statedChannel(c: Capture): string | undefined {
  return c.conditions && "channel" in c.conditions ? c.conditions.channel : undefined;
}

// ---- harmonic spectrum ---------------------------------------------------------------------------

function sineAnalysis(c: Capture): SineAnalysis | null {
  return c.analysis?.kind === "sine" ? c.analysis : null;
}

/** One chart per test frequency and load; the channels of every capture taken there side by side. */
function spectra(sines: Capture[]): SpectrumPlot[] {
  const groups = new Map<string, { capture: Capture; analysis: SineAnalysis }[]>();
  for (const capture of sines) {
    const analysis = sineAnalysis(capture);
    if (!analysis?.channels.length) continue;
    const f0 = Math.round(analysis.channels[0].fundamental.frequency.value);
    const key = `${f0}|${analysis.conditions.loadOhms ?? ""}`;
    groups.set(key, [...(groups.get(key) ?? []), { capture, analysis }]);
  }
  const out: SpectrumPlot[] = [];
  const side = (c: Capture) => ["left", "right", "mono", "both"].indexOf(statedChannel(c) ?? "mono");
  for (const [key, unsorted] of groups) {
    const members = [...unsorted].sort((a, b) => side(a.capture) - side(b.capture));
    const bars = new Map<number, SpectrumPlot["bars"][number]>();
    const channels: SpectrumPlot["channels"] = [];
    const levels: number[] = [];
    for (const { capture, analysis } of members) {
      const stated = statedChannel(capture);
      for (const ch of analysis.channels) {
        const name = ch.channel === "mono" && stated ? stated : ch.channel;
        let chKey = name;
        for (let i = 2; channels.some((c) => c.key === chKey); i++) chKey = `${name}-${i}`;
        channels.push({
          key: chKey,
          label: CHANNEL_LABEL[name] ?? name,
          thd: `THD ${formatValue(ch.thd.ratio, "ratio")}, THD+N ${formatValue(ch.thdN.ratio, "ratio")}`,
        });
        for (const h of ch.harmonics) {
          if (!h.inBand) continue;
          const bar = bars.get(h.order) ?? { order: h.order, label: `H${h.order}`, frequencyHz: h.frequency.value, levels: {} };
          bar.levels[chKey] = Math.round(h.relativeDb.value * 10) / 10;
          levels.push(h.relativeDb.value);
          bars.set(h.order, bar);
        }
      }
    }
    if (bars.size === 0) continue;
    const first = members[0].analysis;
    // 999.9999 Hz reads as "1 kHz": four figures are more than any generator's dial.
    const f0 = Number(first.channels[0].fundamental.frequency.value.toPrecision(4));
    const power = first.channels[0].fundamental.power?.value;
    const rc = first.conditions;
    const parts = [
      power !== undefined ? `at ${formatValue(power, "power")}` : `at ${formatValue(first.channels[0].fundamental.rms.value, "voltage")}`,
      rc.loadOhms ? `into ${formatValue(rc.loadOhms, "resistance")}` : null,
      `harmonics 2–${rc.harmonicsUpTo} within ${formatValue(rc.bandwidth.lowHz, "frequency")}–${formatValue(rc.bandwidth.highHz, "frequency")}`,
      `${formatValue(rc.sampleRate, "frequency")} sampling`,
    ];
    out.push({
      id: `spectrum-${key.replace(/[^0-9a-z]+/gi, "-")}`,
      title: `Harmonic spectrum of a ${formatValue(f0, "frequency")} tone`,
      conditions: parts.filter(Boolean).join(", "),
      fundamentalHz: f0,
      bars: [...bars.values()].sort((a, b) => a.order - b.order),
      channels,
      floorDb: Math.max(-180, dbDomain(levels, 20, 40)[0]),
    });
    if (out.length >= MAX_PLOTS_EACH) break;
  }
  return out;
}

// ---- frequency response --------------------------------------------------------------------------

function responses(sheet: BenchSheet): ResponsePlot[] {
  return (sheet.sweeps ?? []).slice(0, MAX_PLOTS_EACH).map((sweep, i) => {
    const series = responseSeries(sweep);
    const riaa = sweep.kind === "riaa";
    const channel = sweep.channel ? CHANNEL_WORDS[sweep.channel] : null;
    const first = sweep.points[0].frequencyHz;
    const last = sweep.points[sweep.points.length - 1].frequencyHz;
    const conditions = [
      describeConditions({ ...sweep.conditions, frequencyRange: undefined }) || null,
      channel,
      `${sweep.points.length} points, ${formatValue(first, "frequency")}–${formatValue(last, "frequency")}`,
      `level re ${formatValue(series.referenceHz, "frequency")}`,
      sweep.origin === "capture" ? "from a capture" : "as typed",
    ];
    const levels = series.points.flatMap((p) => (p.target === undefined ? [p.level] : [p.level, p.target]));
    const deviations = series.points.map((p) => p.deviation ?? 0);
    return {
      id: `response-${i}`,
      title: riaa ? "Phono equalisation against the RIAA curve" : "Frequency response",
      conditions: conditions.filter(Boolean).join(", "),
      kind: sweep.kind,
      fromCapture: sweep.origin === "capture",
      points: series.points,
      riaa: series.riaa
        ? {
            variant: series.riaa.variant === "riaa_iec" ? "RIAA with the IEC 7950 µs pole" : "RIAA (IEC 60098)",
            worst: `${formatValue(series.riaa.worstDb, "decibel", { signed: true, sig: 2 }).replace(/^-/, "−")} at ${formatValue(series.riaa.atHz, "frequency")}`,
          }
        : null,
      domain: {
        level: riaa ? dbDomain(levels, 5, 20) : dbDomain(levels, 1, 6),
        deviation: riaa ? dbDomain(deviations, 0.5, 2) : null,
      },
    };
  });
}

// ---- square-wave trace ---------------------------------------------------------------------------

// Finished captures never change, so a thinned trace is kept per capture for later page views.
const traceCache = new Map<string, { t: number; v: number }[]>();
const TRACE_CACHE_MAX = 64;

async function traceOf(capture: Capture): Promise<{ t: number; v: number }[] | null> {
  const hit = traceCache.get(capture.id);
  if (hit) return hit;
  if (!capture.storageKey) return null;
  const bytes = await getObjectBuffer(capture.storageKey).catch(() => null);
  if (!bytes) return null;
  let cols;
  try {
    cols = parseTwoColumnCsv(bytes.toString("utf8"), SQUARE_COLUMNS);
  } catch {
    return null;
  }
  const t0 = cols.x[0];
  const points = decimateMinMax(cols.x, cols.y, 300).map((p) => ({
    t: Math.round((p.x - t0) * 1e6 * 1000) / 1000,
    v: Math.round(p.y * 10_000) / 10_000,
  }));
  if (traceCache.size >= TRACE_CACHE_MAX) traceCache.delete(traceCache.keys().next().value!);
  traceCache.set(capture.id, points);
  return points;
}

async function squares(captures: Capture[]): Promise<SquarePlot[]> {
  const out: SquarePlot[] = [];
  for (const capture of captures.slice(0, MAX_PLOTS_EACH)) {
    const a = capture.analysis;
    if (a?.kind !== "square") continue;
    const points = await traceOf(capture);
    if (!points || points.length < 2) continue;
    const c: Partial<SquareCaptureConditions> = capture.conditions?.kind === "square" ? capture.conditions : {};
    const conditions = [
      c.frequencyHz ? `${formatValue(c.frequencyHz, "frequency")} square wave` : "square wave",
      c.loadOhm ? `into ${formatValue(c.loadOhm, "resistance")}` : null,
      c.channel ? CHANNEL_WORDS[c.channel] : null,
      `${formatValue(tidy(a.amplitude.value), "voltage")} step`,
    ];
    out.push({
      id: `square-${out.length}`,
      title: "Square-wave response",
      conditions: conditions.filter(Boolean).join(", "),
      points,
      figures: [
        { label: "Rise time (10–90 %)", display: formatValue(a.riseTime.value, "time") },
        { label: "Overshoot", display: `${a.overshoot.value.toFixed(1)} %` },
        { label: "Implied bandwidth (0.35 / t_rise)", display: formatValue(a.impliedBandwidth.value, "frequency") },
      ],
    });
  }
  return out;
}

// ---- speed drift (wow & flutter) -----------------------------------------------------------------

const ratioPct = (r: number, signed = false) => {
  const s = `${(Math.abs(r) * 100).toFixed(Math.abs(r) < 0.001 ? 3 : 2)} %`;
  return signed ? `${r < 0 ? "−" : "+"}${s}` : s;
};

function speedDrifts(captures: Capture[]): SpeedDriftPlot[] {
  const out: SpeedDriftPlot[] = [];
  for (const capture of captures.slice(0, MAX_PLOTS_EACH)) {
    const a = capture.analysis;
    if (a?.kind !== "wow_flutter" || a.trace.length < 2) continue;
    const c = capture.conditions?.kind === "wow_flutter" ? capture.conditions : null;
    const conditions = [
      `${a.conditions.nominalHz} Hz test tone`,
      c?.speedRpm ? `${Math.abs(c.speedRpm - 100 / 3) < 0.01 ? "33⅓" : formatValue(c.speedRpm, "number")} rpm` : null,
      c?.tapeSpeedCmS ? `${formatValue(c.tapeSpeedCmS, "number")} cm/s` : null,
      `${a.conditions.analysedS.toFixed(1)} s read`,
      `${formatValue(a.conditions.sampleRate, "frequency")} sampling`,
    ];
    out.push({
      id: `speed-${out.length}`,
      title: "Speed drift",
      conditions: conditions.filter(Boolean).join(", "),
      points: a.trace,
      figures: [
        { label: "Wow & flutter, weighted peak (IEC 60386, two-sigma)", display: `±${ratioPct(a.weightedPeak.value)}` },
        { label: "Wow & flutter, weighted rms (WRMS)", display: ratioPct(a.weightedRms.value) },
        { label: "Unweighted peak", display: `±${ratioPct(a.unweightedPeak.value)}` },
        { label: "Speed error", display: ratioPct(a.speedError.value, true) },
        { label: "Drift (1 s averages, largest − smallest)", display: ratioPct(a.drift.value) },
      ],
    });
  }
  return out;
}
