// Turntables and tape decks: speed error, and wow & flutter with its weighting and test tone.
import { formatReadingValue, describeConditions } from "../describe";
import { WEIGHTING_LABELS } from "../schema";
import { formatValue } from "../format";
import { conditionsCompatible, nameOf, near, pct } from "./match";
import { fig, type Rule } from "./types";

/** DIN 45500 speed tolerance: turntables +1.5 %/−1 %, tape ±1.5 %. */
export const DIN_SPEED = { turntable: { fast: 0.015, slow: 0.01 }, tape_deck: { fast: 0.015, slow: 0.015 } };
/** About a semitone: a figure this far off is more likely a slip of units than a running machine (common practice). */
export const SEMITONE = 0.06;
/** DIN 45500 weighted wow & flutter, turntables and tape. */
export const DIN_WOW_FLUTTER = 0.002;
/** IEC 60386 tone; 3000 Hz is the JIS/NAB tone used with WRMS readings (from memory). */
export const WF_TONES_HZ = [3150, 3000];

export const speedError: Rule = {
  id: "speed-error",
  title: "Speed error within tolerance",
  explanation:
    "Speed error is (measured − nominal) / nominal, e.g. a 3150 Hz tone read back at 3156 Hz is 0.19 % fast. A turntable's figure must say which speed it was taken at. It is held against the maker's tolerance, or DIN 45500's (+1.5/−1 % for turntables, ±1.5 % for tape) when the sheet has none; running outside is reported, not held against the sheet.",
  source: "Speed error definition; DIN 45500 (turntables +1.5 %/−1 %, tape ±1.5 %)",
  categories: ["turntable", "tape_deck"],
  evaluate(ix, out) {
    const ms = ix.measured("speed_error");
    if (!ms.length) return "No measured speed error.";
    const rated = ix.rated("speed_error");
    for (const m of ms) {
      if (ix.category === "turntable" && m.conditions.speedRpm === undefined) {
        out.result({
          outcome: "missing",
          detail: `Speed error ${formatReadingValue(m)} does not state the speed (33⅓, 45 or 78 rpm).`,
          refs: [m.ref],
        });
        continue;
      }
      const e = m.value;
      if (Math.abs(e) > SEMITONE) {
        out.result({
          outcome: "questionable",
          detail: `Speed error ${formatReadingValue(m)} is more than a semitone: check the figure and its unit.`,
          refs: [m.ref],
          compared: [fig("speed error", e, "ratio", { signed: true })],
        });
        continue;
      }
      const r = rated.find((r) => conditionsCompatible(r.conditions, m.conditions, ["speedRpm"]));
      const din = DIN_SPEED[ix.category as "turntable" | "tape_deck"];
      const fast = r ? Math.abs(r.value) : din.fast;
      const slow = r ? Math.abs(r.value) : din.slow;
      const within = e <= fast + 1e-12 && -e <= slow + 1e-12;
      const against = r
        ? `the maker's ±${formatValue(Math.abs(r.value), "ratio")}`
        : `DIN 45500's +${formatValue(fast, "ratio")}/−${formatValue(slow, "ratio")}`;
      const at = m.conditions.speedRpm !== undefined ? ` at ${formatValue(m.conditions.speedRpm, "number")} rpm` : "";
      const dir = e >= 0 ? "fast" : "slow";
      const detail = `Runs ${formatValue(Math.abs(e), "ratio")} ${dir}${at}, ${within ? "within" : "outside"} ${against}.`;
      const refs = r ? [m.ref, r.ref] : [m.ref];
      out.result({
        outcome: "consistent",
        detail,
        refs,
        compared: [
          fig("speed error", e, "ratio", { signed: true }),
          fig("allowed fast", fast, "ratio"),
          fig("allowed slow", slow, "ratio"),
        ],
      });
      if (!within) {
        const limit = e >= 0 ? fast : slow;
        out.shortfall({ detail, percent: Number((((Math.abs(e) - limit) / limit) * 100).toFixed(1)), refs });
      }
    }
  },
};

export const wowFlutter: Rule = {
  id: "wow-flutter",
  title: "Wow & flutter with weighting and test tone",
  explanation:
    "Wow & flutter depends on how it is read: IEC 60386 uses a 3150 Hz tone and a weighted peak reading, the WRMS convention a 3000 Hz tone and a weighted rms reading that comes out lower for the same machine. A figure must state both, and is compared with the maker's only when the weighting matches.",
  source: "IEC 60386 / AES6 (3150 Hz test tone, weighted, peak); DIN 45500 ±0.2 % weighted; WRMS at 3000 Hz (from memory)",
  categories: ["turntable", "tape_deck"],
  evaluate(ix, out) {
    const ms = ix.measured("wow_flutter");
    if (!ms.length) return "No measured wow & flutter.";
    const rated = ix.rated("wow_flutter");
    for (const m of ms) {
      const c = m.conditions;
      const missing = [c.weighting ? "" : "weighting", c.testToneHz === undefined ? "test tone" : ""].filter(Boolean);
      if (missing.length) {
        out.result({
          outcome: "missing",
          detail: `Wow & flutter ${formatReadingValue(m)} does not state its ${missing.join(" and ")}.`,
          refs: [m.ref],
        });
        continue;
      }
      if (!WF_TONES_HZ.some((t) => near(t, c.testToneHz!, 0.01))) {
        out.result({
          outcome: "questionable",
          detail: `A ${formatValue(c.testToneHz!, "frequency")} tone is not a wow & flutter test tone (3150 Hz IEC 60386, 3000 Hz WRMS).`,
          refs: [m.ref],
        });
        continue;
      }
      const r = rated.find((r) => r.conditions.weighting === c.weighting && conditionsCompatible(r.conditions, c, ["speedRpm"]));
      const notes: string[] = [];
      const compared = [fig("wow & flutter", m.value, "ratio")];
      const refs = [m.ref];
      if (r) {
        refs.push(r.ref);
        compared.push(fig("maker's figure", r.value, "ratio"));
        if (m.value > r.value * 1.1) {
          const over = (m.value / r.value - 1) * 100;
          const d = `${nameOf(m)} (${describeConditions(c)}) is ${pct(over)} above the maker's ${formatReadingValue(r)}.`;
          notes.push(d);
          out.shortfall({ detail: d, percent: Number(over.toFixed(1)), refs });
        } else notes.push(`Within the maker's ${formatReadingValue(r)}.`);
      } else if (rated.length) notes.push("The maker's figure uses another weighting, so the two are not compared.");
      if (c.weighting === "IEC-60386-peak" && m.value > DIN_WOW_FLUTTER) notes.push("Above DIN 45500's ±0.2 % weighted.");
      out.result({
        outcome: "consistent",
        detail:
          `Wow & flutter ${formatReadingValue(m)}, ${WEIGHTING_LABELS[c.weighting!]}, ${formatValue(c.testToneHz!, "frequency")} tone. ${notes.join(" ")}`.trim(),
        refs,
        compared,
      });
    }
  },
};
