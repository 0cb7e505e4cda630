// Left and right channels match in level and distortion.
import { STEREO_ELECTRONICS, type Quantity } from "../quantities";
import { formatReadingValue } from "../describe";
import { formatValue } from "../format";
import type { Kind } from "../units";
import { conditionsCompatible, ALL_KEYS } from "./match";
import { fig, type Item, type Rule } from "./types";

/** Level difference between channels a restored unit should hold (common practice). */
export const BALANCE_DB = 0.5;
/** Loudspeakers of a pair: sensitivity within 1 dB (common practice). */
export const SPEAKER_BALANCE_DB = 1;
/** Distortion between channels: within 3×, or both below 0.01 % (common practice). */
export const DISTORTION_SPREAD = 3;
export const DISTORTION_FLOOR = 1e-4;

const LEVELS: { q: Quantity; kind: Kind; db: (l: number, r: number) => number }[] = [
  { q: "output_power", kind: "power", db: (l, r) => 10 * Math.log10(l / r) },
  { q: "output_voltage", kind: "voltage", db: (l, r) => 20 * Math.log10(l / r) },
  { q: "gain", kind: "decibel", db: (l, r) => l - r },
  { q: "sensitivity", kind: "decibel", db: (l, r) => l - r },
];
const DISTORTIONS: Quantity[] = ["thd", "thd_n"];

function pairs(ls: Item[], rs: Item[]): [Item, Item][] {
  const out: [Item, Item][] = [];
  for (const l of ls) {
    const r = rs.find((r) => conditionsCompatible(l.conditions, r.conditions, ALL_KEYS));
    if (r) out.push([l, r]);
  }
  return out;
}

export const channelBalance: Rule = {
  id: "channel-balance",
  title: "The two channels match",
  explanation:
    "After a restoration both channels should deliver the same level within about 0.5 dB (1 dB for a pair of loudspeakers) and distortion of the same order. A larger difference points at a fault in one channel or at a measurement taken differently; either way a buyer should know.",
  source: "Common practice: level within 0.5 dB (loudspeaker pairs 1 dB); distortion within 3× or both below 0.01 %",
  categories: [...STEREO_ELECTRONICS, "loudspeaker"],
  evaluate(ix, out) {
    if ((ix.sheet.channelCount ?? 2) < 2) return "Single-channel unit.";
    let checked = 0;
    const tol = ix.category === "loudspeaker" ? SPEAKER_BALANCE_DB : BALANCE_DB;
    for (const { q, kind, db } of LEVELS) {
      const ms = ix.measured(q);
      for (const [l, r] of pairs(
        ms.filter((m) => m.channel === "left"),
        ms.filter((m) => m.channel === "right"),
      )) {
        checked++;
        const d = db(l.value, r.value);
        out.result({
          outcome: Math.abs(d) <= tol ? "consistent" : "questionable",
          detail: `Left ${formatReadingValue(l)} and right ${formatReadingValue(r)} differ by ${formatValue(Math.abs(d), "decibel", { sig: 2 })} (limit ${formatValue(tol, "decibel")}).`,
          refs: [l.ref, r.ref],
          compared: [
            fig("left", l.value, kind),
            fig("right", r.value, kind),
            fig("difference", Math.abs(d), "decibel"),
            fig("limit", tol, "decibel"),
          ],
        });
      }
    }
    for (const q of DISTORTIONS) {
      const ms = ix.measured(q);
      for (const [l, r] of pairs(
        ms.filter((m) => m.channel === "left"),
        ms.filter((m) => m.channel === "right"),
      )) {
        checked++;
        const spread = Math.max(l.value, r.value) / Math.min(l.value, r.value);
        const ok = spread <= DISTORTION_SPREAD || Math.max(l.value, r.value) <= DISTORTION_FLOOR;
        out.result({
          outcome: ok ? "consistent" : "questionable",
          detail: `Left ${formatReadingValue(l)} and right ${formatReadingValue(r)} ${q === "thd" ? "THD" : "THD+N"} (${spread.toFixed(1)}× apart).`,
          refs: [l.ref, r.ref],
          compared: [
            fig("left", l.value, "ratio"),
            fig("right", r.value, "ratio"),
            fig("spread", spread, "number", { display: `${spread.toFixed(1)}×` }),
          ],
        });
      }
    }
    for (const b of ix.measured("channel_balance")) {
      checked++;
      out.result({
        outcome: Math.abs(b.value) <= tol ? "consistent" : "questionable",
        detail: `Channel balance ${formatReadingValue(b)} (limit ${formatValue(tol, "decibel")}).`,
        refs: [b.ref],
        compared: [fig("balance", b.value, "decibel"), fig("limit", tol, "decibel")],
      });
    }
    if (checked) return;
    // Balance is not on any category's required list (docs/api.md): with nothing to compare the check is
    // skipped, not counted as missing, so a sheet with exactly the required readings can earn the mark.
    return "No left and right readings under the same conditions and no channel balance figure.";
  },
};
