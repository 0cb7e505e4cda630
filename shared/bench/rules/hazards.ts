// Readings that mean the unit is unsafe to connect: DC at a loudspeaker output, an oscillating output, a
// turntable far off speed. Each blocks the mark and holds the listing for the review desk (app/listings).
import { AMPLIFIER_CATEGORIES, CATEGORY_QUANTITIES, type Category } from "../quantities";
import { formatReadingValue } from "../describe";
import { formatValue } from "../format";
import { nameOf } from "./match";
import { fig, type Rule } from "./types";

/** DC offset at a loudspeaker output a serviced amplifier should stay within: ±50 mV (common practice). */
export const DC_OFFSET_LIMIT_V = 0.05;
/** A turntable this far off speed is not running as designed: ±10 % (common practice; a 50/60 Hz mix-up is −16.7 %/+20 %). */
export const FAR_OFF_SPEED = 0.1;

/** What every hazard's detail ends with: plain cautions, deferring to qualified hands and local rules. */
export const HAZARD_CAUTION = "Do not connect it until a qualified technician has looked at it; follow your local electrical-safety rules.";

export const dcOffsetSafe: Rule = {
  id: "dc-offset-safe",
  title: "No harmful DC at the loudspeaker outputs",
  explanation:
    "A loudspeaker output should carry the music and next to no direct voltage. DC at the terminals heats the woofer's voice coil and pushes its cone off centre; well beyond a few tens of millivolts it points at a failing output stage that can destroy the speakers. Serviced amplifiers are commonly set within ±50 mV.",
  source: "Common practice: output offset within ±50 mV (service manuals commonly set it to a few mV); P = V²/R in the voice coil",
  categories: AMPLIFIER_CATEGORIES,
  evaluate(ix, out) {
    const ms = ix.measured("dc_offset");
    if (!ms.length) return "No measured DC offset.";
    for (const m of ms) {
      const ok = Math.abs(m.value) <= DC_OFFSET_LIMIT_V;
      const compared = [fig("DC offset", m.value, "voltage", { form: "dc", signed: true }), fig("limit", DC_OFFSET_LIMIT_V, "voltage")];
      if (ok) {
        out.result({
          outcome: "consistent",
          detail: `${nameOf(m)} is within ±${formatValue(DC_OFFSET_LIMIT_V, "voltage")}.`,
          refs: [m.ref],
          compared,
        });
        continue;
      }
      const detail = `${nameOf(m)} is beyond ±${formatValue(DC_OFFSET_LIMIT_V, "voltage")}: it can damage the loudspeakers connected to it. ${HAZARD_CAUTION}`;
      out.result({ outcome: "questionable", detail, refs: [m.ref], compared });
      out.hazard({ detail, refs: [m.ref] });
    }
  },
};

const OSCILLATING: readonly Category[] = (Object.keys(CATEGORY_QUANTITIES) as Category[]).filter((c) =>
  CATEGORY_QUANTITIES[c].includes("oscillation"),
);

export const outputOscillation: Rule = {
  id: "output-oscillation",
  title: "The output does not oscillate",
  explanation:
    "An amplifier that oscillates (usually far above the audio band, seen on an oscilloscope as a fuzz on the trace or as a line on the analyser) puts full power into the tweeters and its own output stage without a sound being heard. It overheats and can destroy both.",
  source: "Common practice: any sustained oscillation at the output is a fault (stability of feedback amplifiers, electronics textbooks)",
  categories: OSCILLATING,
  evaluate(ix, out) {
    const ms = ix.measured("oscillation");
    if (!ms.length) return "No oscillation reported.";
    for (const m of ms) {
      const load = m.conditions.loadOhm !== undefined ? ` into ${formatValue(m.conditions.loadOhm, "resistance")}` : "";
      const detail = `The output oscillates at ${formatReadingValue(m)}${load}${m.channel && m.channel !== "both" ? ` (${m.channel} channel)` : ""}. ${HAZARD_CAUTION}`;
      out.result({ outcome: "questionable", detail, refs: [m.ref], compared: [fig("oscillation", m.value, "frequency")] });
      out.hazard({ detail, refs: [m.ref] });
    }
  },
};

export const turntableFarOffSpeed: Rule = {
  id: "turntable-far-off-speed",
  title: "The turntable runs near its speed",
  explanation:
    "A turntable more than 10 % off speed is not running as designed: a synchronous motor set for the other mains frequency runs 16.7 % slow (60 Hz motor on 50 Hz) or 20 % fast, and a unit set for another mains supply may also be set for another mains voltage. Check the voltage selector and the motor before it is used.",
  source: "Common practice: ±10 % as far off speed; synchronous motor speed follows the mains frequency (50/60 = −16.7 %, 60/50 = +20 %)",
  categories: ["turntable"],
  evaluate(ix, out) {
    const ms = ix.measured("speed_error");
    if (!ms.length) return "No measured speed error.";
    for (const m of ms) {
      const compared = [fig("speed error", m.value, "ratio", { signed: true }), fig("limit", FAR_OFF_SPEED, "ratio")];
      if (Math.abs(m.value) <= FAR_OFF_SPEED) {
        out.result({ outcome: "consistent", detail: `Speed error ${formatReadingValue(m)} is within ±10 %.`, refs: [m.ref], compared });
        continue;
      }
      const detail = `Speed error ${formatReadingValue(m)} is more than 10 % off: the motor, its drive or the mains setting is wrong. Check the voltage selector before connecting it to the mains. ${HAZARD_CAUTION}`;
      out.result({ outcome: "questionable", detail, refs: [m.ref], compared });
      out.hazard({ detail, refs: [m.ref] });
    }
  },
};
