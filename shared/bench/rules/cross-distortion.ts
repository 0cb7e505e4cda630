// A power quoted at a distortion limit against the distortion readings taken at or below that power.
import { AMPLIFIER_CATEGORIES } from "../quantities";
import { formatReadingValue } from "../describe";
import { formatValue } from "../format";
import { channelsCompatible, nameOf, near } from "./match";
import { fig, type Item, type Rule } from "./types";

/** The rule's lowest power: a rating's distortion holds "at any power from 250 milliwatts to the rated power" (16 CFR 432.2(a)). */
export const FTC_LOWEST_POWER_W = 0.25;
/** A distortion reading may sit this far above the limit before it counts against it (1 dB, meter tolerance; common practice). */
export const LIMIT_TOLERANCE = 10 ** (1 / 20);

function powerOf(r: Item, load: number): number | undefined {
  const c = r.conditions;
  if (c.powerW !== undefined) return c.powerW;
  if (c.voltageV !== undefined) return (c.voltageV * c.voltageV) / (c.loadOhm ?? load);
  return undefined;
}

/** The reading's test frequency lies in the power figure's band (or at its frequency); unstated on either side pairs. */
function inBand(d: Item, p: Item): boolean {
  const f = d.conditions.frequencyHz;
  if (f === undefined) return true;
  const range = p.conditions.frequencyRange;
  if (range) return f >= range.lowHz * 0.98 && f <= range.highHz * 1.02;
  return p.conditions.frequencyHz === undefined || near(f, p.conditions.frequencyHz);
}

export const powerAtDistortionLimit: Rule = {
  id: "power-at-distortion-limit",
  title: "Distortion below a power's limit at lower powers",
  explanation:
    "A power quoted at a distortion limit (60 W at 0.1 % THD) promises that distortion stays within that limit at any power from 250 mW up to it, across the stated band. A distortion reading on the same sheet, into the same load, at a lower power but above the limit contradicts it: for the maker's rating it is a shortfall of this unit, for a measured figure the sheet disagrees with itself.",
  source:
    "US FTC amplifier rule, 16 CFR 432.2(a) (maximum distortion at any power from 250 mW to the rated power); 1 dB meter tolerance (common practice)",
  categories: AMPLIFIER_CATEGORIES,
  evaluate(ix, out) {
    const powers = ix.all("output_power").filter((p) => p.conditions.atDistortion && p.conditions.loadOhm !== undefined);
    if (!powers.length) return "No power figure with its distortion limit and load.";
    let pairs = 0;
    for (const p of powers) {
      const lim = p.conditions.atDistortion!;
      const load = p.conditions.loadOhm!;
      // A THD+N limit is broken by a THD reading above it too (THD+N ≥ THD); a THD limit only by THD.
      const candidates = [...ix.measured("thd"), ...(lim.measure === "thd_n" ? ix.measured("thd_n") : [])];
      for (const d of candidates) {
        if (!channelsCompatible(d.channel, p.channel) || !inBand(d, p)) continue;
        if (d.conditions.loadOhm !== undefined && !near(d.conditions.loadOhm, load)) continue;
        const at = powerOf(d, load);
        if (at === undefined || at < FTC_LOWEST_POWER_W || at > p.value * 1.001) continue;
        pairs++;
        const within = d.value <= lim.ratio * LIMIT_TOLERANCE;
        const limitText = `${formatValue(lim.ratio, "ratio", { trimZeros: true })} ${lim.measure === "thd" ? "THD" : "THD+N"}`;
        const who = p.basis === "rated" ? `the maker's ${formatReadingValue(p)}` : `the measured ${formatReadingValue(p)}`;
        const compared = [
          fig("power", p.value, "power"),
          fig("its distortion limit", lim.ratio, "ratio", { trimZeros: true }),
          fig("distortion reading", d.value, "ratio"),
          fig("at power", at, "power"),
        ];
        const refs = [p.ref, d.ref];
        if (within) {
          out.result({
            outcome: "consistent",
            detail: `${nameOf(d)} at ${formatValue(at, "power")} is within the ${limitText} of ${who} into ${formatValue(load, "resistance")}.`,
            refs,
            compared,
          });
          continue;
        }
        const detail = `${nameOf(d)} at ${formatValue(at, "power")} is above the ${limitText} that ${who} into ${formatValue(load, "resistance")} is quoted at`;
        if (p.basis === "rated") {
          out.result({
            outcome: "consistent",
            detail: `${detail}: this unit does not meet its rating's distortion limit.`,
            refs,
            compared,
          });
          out.shortfall({ detail: `${detail}.`, percent: Number(((d.value / lim.ratio - 1) * 100).toFixed(1)), refs });
        } else
          out.result({
            outcome: "questionable",
            detail: `${detail}: at a lower power the limit is already passed, so the power figure or the reading is wrong.`,
            refs,
            compared,
          });
      }
    }
    if (!pairs) return "No distortion reading into the same load between 250 mW and a power quoted at a distortion limit.";
  },
};
