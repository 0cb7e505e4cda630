// The maker's power rating against the measured power at the same load and distortion limit.
import { AMPLIFIER_CATEGORIES } from "../quantities";
import { formatReadingValue } from "../describe";
import { formatValue } from "../format";
import { conditionsCompatible, nameOf, near, pct, weakestChannelBest } from "./match";
import { fig, type Emit, type Item, type Rule } from "./types";

/** Measured far above the rating (+1.8 dB): common practice. */
export const FAR_ABOVE_RATED = 1.5;

export const ratedVsMeasuredPower: Rule = {
  id: "measured-vs-rated-power",
  title: "Measured power against the maker's rating",
  explanation:
    "The weakest channel's measured power is compared with the maker's rating at the same load. Falling short is reported with the percentage (ageing parts and mains voltage matter); far above the rating suggests a different load, a looser distortion limit or a peak figure.",
  source: "Maker's rating as the yardstick; more than 1.5× the rating is questionable (common practice)",
  categories: AMPLIFIER_CATEGORIES,
  evaluate(ix, out) {
    const rated = ix.rated("output_power").filter((r) => r.conditions.loadOhm);
    if (!rated.length) return "No maker's power rating with its load.";
    let compared = 0;
    for (const r of rated) {
      const limit = r.conditions.atDistortion?.ratio;
      const ms = ix
        .measured("output_power")
        .filter(
          (m) =>
            m.conditions.loadOhm !== undefined &&
            near(m.conditions.loadOhm, r.conditions.loadOhm!) &&
            conditionsCompatible(m.conditions, r.conditions, ["channelsDriven"]) &&
            (limit === undefined || m.conditions.atDistortion === undefined || m.conditions.atDistortion.ratio <= limit * 1.05),
        );
      const m = weakestChannelBest(ms);
      if (!m) {
        // Measured at the rated load but only at a looser distortion limit: not like for like, yet worth saying.
        const looser = weakestChannelBest(
          ix
            .measured("output_power")
            .filter(
              (x) =>
                x.conditions.loadOhm !== undefined &&
                near(x.conditions.loadOhm, r.conditions.loadOhm!) &&
                conditionsCompatible(x.conditions, r.conditions, ["channelsDriven"]),
            ),
        );
        if (looser) {
          compared++;
          differentLimits(r, looser, out);
        }
        continue;
      }
      compared++;
      const ratio = m.value / r.value;
      const load = formatValue(r.conditions.loadOhm!, "resistance");
      const refs = [r.ref, m.ref];
      const compared_ = [
        fig("rated power", r.value, "power"),
        fig("measured power (weakest channel)", m.value, "power"),
        fig("measured ÷ rated", ratio, "number", { display: `${ratio.toFixed(2)}×` }),
      ];
      if (ratio > FAR_ABOVE_RATED) {
        out.result({
          outcome: "questionable",
          detail: `${nameOf(m)} into ${load} is ${ratio.toFixed(2)}× the maker's ${formatReadingValue(r)}: check the load, the distortion limit and that the figure is average, not peak, power.`,
          refs,
          compared: compared_,
        });
      } else if (ratio < 1) {
        const short = (1 - ratio) * 100;
        const detail = `${nameOf(m)} into ${load} falls short of the maker's ${formatReadingValue(r)} by ${pct(short)}.`;
        out.result({ outcome: "consistent", detail, refs, compared: compared_ });
        out.shortfall({ detail, percent: Number(short.toFixed(1)), refs });
      } else {
        out.result({
          outcome: "consistent",
          detail: `${nameOf(m)} into ${load} meets the maker's ${formatReadingValue(r)} (${pct((ratio - 1) * 100)} above).`,
          refs,
          compared: compared_,
        });
      }
    }
    if (!compared) return "No measured power at a rated load.";
  },
};

/** "0.05 % THD" */
function limitText(r: Item): string {
  const d = r.conditions.atDistortion!;
  return `${formatValue(d.ratio, "ratio", { trimZeros: true })} ${d.measure === "thd" ? "THD" : "THD+N"}`;
}

// The rating holds at a tighter distortion limit than the measurement: at that limit the unit can only give
// less, so a measured figure below the rating is a shortfall; one above it proves nothing either way.
function differentLimits(r: Item, m: Item, out: Emit) {
  const ratio = m.value / r.value;
  const load = formatValue(r.conditions.loadOhm!, "resistance");
  const refs = [r.ref, m.ref];
  const head = `${nameOf(m)} into ${load} was measured at ${limitText(m)}, the maker's ${formatReadingValue(r)} at ${limitText(r)}: the distortion limits differ`;
  const detail =
    ratio < 1
      ? `${head}, and even at the looser limit it falls ${pct((1 - ratio) * 100)} short of the rating.`
      : `${head}, so the measurement does not show the rating at its own limit; measure the power at ${limitText(r)} to compare.`;
  out.result({
    outcome: "consistent",
    detail,
    refs,
    compared: [
      fig("rated power", r.value, "power"),
      fig("rated at distortion", r.conditions.atDistortion!.ratio, "ratio", { trimZeros: true }),
      fig("measured power (weakest channel)", m.value, "power"),
      fig("measured at distortion", m.conditions.atDistortion!.ratio, "ratio", { trimZeros: true }),
    ],
  });
  if (ratio < 1) out.shortfall({ detail, percent: Number(((1 - ratio) * 100).toFixed(1)), refs });
}
