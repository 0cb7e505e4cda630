import { formatValue } from "@shared/bench";
import type { Capture } from "~/models/capture.server";
import { dbDomain } from "./plot-math";
import type { SpectrumPlot, SquarePlot } from "./types";

// Plots for the separation, intermodulation and output-impedance captures, one function per kind:
// the intermodulation products around the high tone, the leak at each test tone, and the tone's level
// while the load is switched in. Each reads only the stored analysis (no file is fetched).

const MAX_PLOTS_EACH = 3;
const CHANNEL_LABEL: Record<string, string> = { left: "Left", right: "Right", mono: "Mono", both: "Both channels" };
const hzLabel = (hz: number) => formatValue(Number(hz.toPrecision(4)), "frequency");
const pct = (ratio: number) => `${Number((100 * ratio).toPrecision(2))} %`;

type Stored = NonNullable<Capture["analysis"]>;

/** The finished captures of one kind with their analyses, at most MAX_PLOTS_EACH. */
function analyses<K extends Stored["kind"]>(captures: Capture[], kind: K): { capture: Capture; analysis: Extract<Stored, { kind: K }> }[] {
  const out: { capture: Capture; analysis: Extract<Stored, { kind: K }> }[] = [];
  for (const capture of captures) {
    const a = capture.analysis;
    if (a && isKind(a, kind)) out.push({ capture, analysis: a });
  }
  return out.slice(0, MAX_PLOTS_EACH);
}

function isKind<K extends Stored["kind"]>(a: Stored, kind: K): a is Extract<Stored, { kind: K }> {
  return a.kind === kind;
}

/** Intermodulation products as bars, dB re the high tone, the channels side by side. */
export function imdPlots(captures: Capture[]): SpectrumPlot[] {
  return analyses(captures, "imd").map(({ capture, analysis }, i) => {
    const rc = analysis.conditions;
    const smpte = rc.method === "smpte";
    const bars = new Map<string, SpectrumPlot["bars"][number]>();
    const levels: number[] = [];
    const stated = capture.conditions?.kind === "imd" ? capture.conditions.channel : undefined;
    const channels = analysis.channels.map((ch) => {
      const key = ch.channel === "mono" && stated ? stated : ch.channel;
      const f2 = ch.highTone.frequency.value;
      const f1 = ch.lowTone.frequency.value;
      ch.products.forEach((p, order) => {
        const hz = p.frequency.value;
        const label = smpte
          ? `${hz < f2 ? "−" : "+"}${Math.round(Math.abs(hz - f2) / f1)}·f1`
          : hz < f1
            ? "f2−f1"
            : hz < f2
              ? "2f1−f2"
              : "2f2−f1";
        const bar = bars.get(label) ?? { order: smpte ? Math.round((hz - f2) / f1) : order, label, frequencyHz: hz, levels: {} };
        const db = Math.max(-180, p.relativeDb.value);
        bar.levels[key] = Math.round(db * 10) / 10;
        levels.push(db);
        bars.set(label, bar);
      });
      return {
        key,
        label: CHANNEL_LABEL[key] ?? key,
        thd: smpte
          ? `IMD ${pct(ch.imd.ratio)} (d_m2 ${pct(ch.second)}, d_m3 ${pct(ch.third)})`
          : `d_2 ${pct(ch.second)}, d_3 ${pct(ch.third)}`,
      };
    });
    const first = analysis.channels[0];
    const level = first.power
      ? `at ${formatValue(first.power.value, "power")}`
      : first.equivalentSineRms
        ? `at ${formatValue(first.equivalentSineRms.value, "voltage")}`
        : null;
    return {
      id: `imd-${i}`,
      title: smpte ? "Intermodulation around the high tone (SMPTE)" : "Difference-frequency intermodulation",
      conditions: [
        `${hzLabel(first.lowTone.frequency.value)} + ${hzLabel(first.highTone.frequency.value)} at ${first.amplitudeRatio.toFixed(1)}:1`,
        level,
        rc.loadOhms ? `into ${formatValue(rc.loadOhms, "resistance")}` : null,
        smpte ? "IEC 60268-3 modulation method" : "IEC 60268-3 difference-frequency method",
      ]
        .filter(Boolean)
        .join(", "),
      fundamentalHz: first.highTone.frequency.value,
      bars: [...bars.values()].sort((a, b) => a.frequencyHz - b.frequencyHz),
      channels,
      floorDb: Math.max(-180, dbDomain(levels, 20, 40)[0]),
      xLabel: smpte ? `Sidebands of ${hzLabel(first.highTone.frequency.value)}` : "Products of the two tones",
      yLabel: "Level re the high tone (dB)",
    };
  });
}

/** The leak into the undriven side at each test tone, dB re the driven side. */
export function separationPlots(captures: Capture[]): SpectrumPlot[] {
  return analyses(captures, "separation").map(({ analysis }, i) => {
    const key = analysis.undriven;
    const levels = analysis.points.map((p) => -p.separation.value);
    const worst = analysis.points.reduce((a, b) => (b.separation.value < a.separation.value ? b : a));
    return {
      id: `separation-${i}`,
      title: `Channel separation, ${analysis.driven} driven`,
      conditions: [
        `leak into the ${analysis.undriven} channel at ${analysis.points.length} test tone${analysis.points.length === 1 ? "" : "s"}`,
        analysis.conditions.loadOhms ? `into ${formatValue(analysis.conditions.loadOhms, "resistance")}` : null,
        analysis.points.some((p) => p.belowNoise) ? "a bar at the noise means at least that much separation" : null,
      ]
        .filter(Boolean)
        .join(", "),
      fundamentalHz: analysis.points[0].frequency.value,
      bars: analysis.points.map((p, n) => ({
        order: n,
        label: hzLabel(p.frequency.value),
        frequencyHz: p.frequency.value,
        levels: { [key]: Math.round(-p.separation.value * 10) / 10 },
      })),
      channels: [
        {
          key,
          label: CHANNEL_LABEL[key] ?? key,
          thd: `least separation ${worst.separation.value.toFixed(1)} dB at ${hzLabel(worst.frequency.value)}`,
        },
      ],
      floorDb: Math.max(-180, dbDomain(levels, 20, 40)[0]),
      xLabel: "Test tone",
      yLabel: "Leak re the driven side (dB)",
    };
  });
}

/** The tone's level block by block: open, the switch, loaded. */
export function outputImpedancePlots(captures: Capture[]): SquarePlot[] {
  return analyses(captures, "output_impedance").map(({ analysis }, i) => {
    const ch = analysis.channels[0];
    const rc = analysis.conditions;
    // Levels in dB re the open level, so the small step a low output impedance makes is visible.
    const points = ch.levels.map((l) => ({
      t: Math.round(l.t * 1000) / 1000,
      v: Math.round(20 * Math.log10(l.rmsFs / ch.openRmsFs) * 1e4) / 1e4,
    }));
    const figures = analysis.channels.flatMap((c) => {
      const name = analysis.channels.length > 1 ? `${CHANNEL_LABEL[c.channel] ?? c.channel}: ` : "";
      return [
        { label: `${name}Output impedance`, display: formatValue(c.outputImpedance.value, "resistance") },
        ...(c.dampingFactor !== null && rc.nominalLoadOhms
          ? [
              {
                label: `${name}Damping factor into ${formatValue(rc.nominalLoadOhms, "resistance")}`,
                display: Number(c.dampingFactor.toPrecision(3)).toString(),
              },
            ]
          : []),
      ];
    });
    return {
      id: `output-impedance-${i}`,
      title: "Output level, open and loaded",
      conditions: `${hzLabel(ch.frequency.value)} tone, open then into ${formatValue(rc.loadOhms, "resistance")} (${CHANNEL_LABEL[ch.channel] ?? ch.channel})`,
      points,
      figures,
      axes: { x: { label: "Time (s)", unit: "s" }, y: { label: "Level re open (dB)", unit: "dB" } },
    };
  });
}
