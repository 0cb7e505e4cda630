// Phono equalisation: a response sweep against the RIAA playback curve, and flat sweeps read for deviation and −3 dB points.
import { riaaPlaybackDb } from "../curves";
import { RIAA_CATEGORIES } from "../quantities";
import type { Sweep } from "../schema";
import { formatReadingValue } from "../describe";
import { formatValue } from "../format";
import { channelsCompatible } from "./match";
import { fig, type Emit, type SheetIndex, type Rule, type SweepItem } from "./types";

/** DIN 45500 allows ±2 dB re 1 kHz on equalised (phono) inputs. */
export const RIAA_LIMIT_DB = 2;
/** A claim may be rounded; the sweep may exceed it by this much before the bench asks. */
export const RIAA_CLAIM_SLACK_DB = 0.1;

type Pts = Sweep["points"];

/** Level at f by linear interpolation in log-frequency; undefined outside the sweep. */
export function levelAt(points: Pts, f: number): number | undefined {
  if (f < points[0].frequencyHz || f > points[points.length - 1].frequencyHz) return undefined;
  let lo = 0;
  let hi = points.length - 1;
  while (hi - lo > 1) {
    const mid = (lo + hi) >> 1;
    if (points[mid].frequencyHz <= f) lo = mid;
    else hi = mid;
  }
  const a = points[lo];
  const b = points[hi];
  if (a.frequencyHz === f || a === b) return a.levelDb;
  const t = Math.log(f / a.frequencyHz) / Math.log(b.frequencyHz / a.frequencyHz);
  return a.levelDb + t * (b.levelDb - a.levelDb);
}

export type RiaaFit = { variant: "riaa" | "riaa_iec"; worstDb: number; atHz: number; lowHz: number; highHz: number };

/** Worst deviation from the RIAA playback curve, both normalised to 1 kHz. */
export function riaaDeviation(points: Pts, variant: "riaa" | "riaa_iec"): RiaaFit | undefined {
  const ref = levelAt(points, 1000);
  if (ref === undefined) return undefined;
  const iecPole = variant === "riaa_iec";
  let worst = 0;
  let atHz = 1000;
  for (const p of points) {
    const dev = p.levelDb - ref - riaaPlaybackDb(p.frequencyHz, { iecPole });
    if (Math.abs(dev) > Math.abs(worst)) [worst, atHz] = [dev, p.frequencyHz];
  }
  return { variant, worstDb: worst, atHz, lowHz: points[0].frequencyHz, highHz: points[points.length - 1].frequencyHz };
}

/** The stated variant, or whichever of plain RIAA and RIAA with the IEC pole fits the sweep better. */
export function bestRiaaFit(s: Sweep): RiaaFit | undefined {
  if (s.variant) return riaaDeviation(s.points, s.variant);
  const plain = riaaDeviation(s.points, "riaa");
  const iec = riaaDeviation(s.points, "riaa_iec");
  if (!plain || !iec) return plain ?? iec;
  return Math.abs(iec.worstDb) < Math.abs(plain.worstDb) ? iec : plain;
}

const range = (lo: number, hi: number) => `${formatValue(lo, "frequency")}–${formatValue(hi, "frequency")}`;

export const riaaAccuracy: Rule = {
  id: "riaa-deviation",
  title: "Phono equalisation follows the RIAA curve",
  explanation:
    "A phono stage must undo the record's pre-emphasis by following the RIAA playback curve (time constants 3180, 318 and 75 µs; +19.3 dB at 20 Hz, −19.6 dB at 20 kHz re 1 kHz). The bench normalises the sweep at 1 kHz, finds the worst deviation and where it is, and holds it against what the sheet claims.",
  source: "IEC 60098 (RIAA playback curve, optional 7950 µs IEC pole); DIN 45500 ±2 dB for equalised inputs",
  categories: RIAA_CATEGORIES,
  evaluate(ix, out) {
    const sweeps = ix.sweeps.filter((s) => s.kind === "riaa");
    const typed = ix.measured("riaa_deviation");
    if (!sweeps.length) {
      if (!typed.length) return "No RIAA sweep or RIAA deviation figure.";
      for (const t of typed) {
        const ok = Math.abs(t.value) <= RIAA_LIMIT_DB;
        out.result({
          outcome: ok ? "consistent" : "questionable",
          detail: `Typed RIAA deviation ${formatReadingValue(t)} ${ok ? "is within" : "exceeds"} ±${RIAA_LIMIT_DB} dB; a sweep would show where the worst deviation is.`,
          refs: [t.ref],
          compared: [fig("RIAA deviation", t.value, "decibel"), fig("limit", RIAA_LIMIT_DB, "decibel")],
        });
      }
      return;
    }
    for (const s of sweeps) evaluateSweep(ix, s, typed, out);
  },
};

function evaluateSweep(ix: SheetIndex, s: SweepItem, typed: ReturnType<SheetIndex["measured"]>, out: Emit) {
  const fit = bestRiaaFit(s);
  const lo = s.points[0].frequencyHz;
  const hi = s.points[s.points.length - 1].frequencyHz;
  if (!fit) {
    out.result({
      outcome: "missing",
      detail: `The sweep covers ${range(lo, hi)}; it must span 1 kHz to be compared with the RIAA curve.`,
      refs: [s.ref],
    });
    return;
  }
  const worst = Math.abs(fit.worstDb);
  const ch = s.channel && s.channel !== "both" ? `${s.channel} channel ` : "";
  const variant = fit.variant === "riaa_iec" ? "RIAA with the IEC subsonic pole" : "RIAA";
  out.derive({
    id: `riaa-worst-deviation:${s.ref}`,
    label: `Worst ${ch}deviation from ${variant}, at ${formatValue(fit.atHz, "frequency")}`,
    value: fit.worstDb,
    kind: "decibel",
    refs: [s.ref],
    format: { signed: true },
  });
  const claim = typed.find((t) => channelsCompatible(t.channel, s.channel));
  const compared = [
    fig("worst deviation", fit.worstDb, "decibel", { signed: true }),
    fig("at", fit.atHz, "frequency"),
    fig("sweep low end", lo, "frequency"),
    fig("sweep high end", hi, "frequency"),
  ];
  const where = `${formatValue(fit.worstDb, "decibel", { signed: true, sig: 2 })} at ${formatValue(fit.atHz, "frequency")} (${variant}, ${range(lo, hi)})`;
  if (claim && worst > Math.abs(claim.value) + RIAA_CLAIM_SLACK_DB) {
    out.result({
      outcome: "questionable",
      detail: `The ${ch}sweep deviates by ${where}, more than the ${formatReadingValue(claim)} the sheet states.`,
      refs: [s.ref, claim.ref],
      compared: [...compared, fig("stated deviation", claim.value, "decibel")],
    });
    return;
  }
  const ok = worst <= RIAA_LIMIT_DB;
  out.result({
    outcome: ok ? "consistent" : "questionable",
    detail: ok
      ? `The ${ch}sweep's worst deviation is ${where}, within ±${RIAA_LIMIT_DB} dB.`
      : `The ${ch}sweep deviates by ${where}, beyond ±${RIAA_LIMIT_DB} dB: the equalisation network needs attention.`,
    refs: claim ? [s.ref, claim.ref] : [s.ref],
    compared: [...compared, fig("limit", RIAA_LIMIT_DB, "decibel")],
  });
}

/** Flat sweeps: worst deviation from the 1 kHz level and the −3 dB points, as derived values. */
export function deriveFlatSweeps(ix: SheetIndex, out: Emit): void {
  for (const s of ix.sweeps) {
    if (s.kind !== "flat") continue;
    const ref = levelAt(s.points, 1000);
    if (ref === undefined) continue;
    let worst = 0;
    for (const p of s.points) if (Math.abs(p.levelDb - ref) > Math.abs(worst)) worst = p.levelDb - ref;
    const ch = s.channel && s.channel !== "both" ? `${s.channel} channel ` : "";
    out.derive({
      id: `response-deviation:${s.ref}`,
      label: `Worst ${ch}deviation from the 1 kHz level`,
      value: worst,
      kind: "decibel",
      refs: [s.ref],
      format: { signed: true },
    });
    const low = crossing(s.points, ref - 3, "down");
    const high = crossing(s.points, ref - 3, "up");
    if (low !== undefined)
      out.derive({ id: `f3db-low:${s.ref}`, label: `Low ${ch}−3 dB point from the sweep`, value: low, kind: "frequency", refs: [s.ref] });
    if (high !== undefined)
      out.derive({
        id: `f3db-high:${s.ref}`,
        label: `High ${ch}−3 dB point from the sweep`,
        value: high,
        kind: "frequency",
        refs: [s.ref],
      });
  }
}

/** First frequency, walking from 1 kHz downwards ("down") or upwards ("up"), where the level falls to `level`. */
export function crossing(points: Pts, level: number, dir: "up" | "down"): number | undefined {
  let i = points.findIndex((p) => p.frequencyHz >= 1000);
  if (i < 0) return undefined;
  const step = dir === "up" ? 1 : -1;
  if (dir === "down" && points[i].frequencyHz > 1000) i--;
  for (let j = i; j + step >= 0 && j + step < points.length; j += step) {
    const a = points[j];
    const b = points[j + step];
    if (a.levelDb >= level && b.levelDb < level) {
      const t = (a.levelDb - level) / (a.levelDb - b.levelDb);
      return a.frequencyHz * (b.frequencyHz / a.frequencyHz) ** t;
    }
  }
  return undefined;
}
