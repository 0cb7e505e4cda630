// Every rule the bench runs, in the order the verdict lists them: completeness first, then physics.
import { channelBalance } from "./balance";
import { analyserResolution, distortionConditions, noiseConditions, thdnNotBelowThd } from "./distortion";
import { speakerImpedanceMinimum, speakerSensitivity } from "./loudspeaker";
import { riaaAccuracy } from "./phono";
import { halfLoadPower, peakWithinRails, powerRatingConditions, powerVoltageLoad } from "./power";
import { ratedVsMeasuredPower } from "./rated-power";
import { requiredReadings } from "./required";
import { dampingVsImpedance, riseTimeBandwidth, slewRateFullPower } from "./response";
import { speedError, wowFlutter } from "./transport";
import type { Rule } from "./types";
import { gainSensitivityOutput, snrNoiseReference } from "./cross-levels";
import { powerAtDistortionLimit } from "./cross-distortion";
import { typedVsCapture } from "./cross-capture";
import { analyserFloor, instrumentBandwidth, slewRateRiseTime, thermalNoiseFloor } from "./floors";
import { dcOffsetSafe, outputOscillation, turntableFarOffSpeed } from "./hazards";

export const RULES: readonly Rule[] = [
  requiredReadings,
  powerRatingConditions,
  distortionConditions,
  noiseConditions,
  powerVoltageLoad,
  halfLoadPower,
  peakWithinRails,
  ratedVsMeasuredPower,
  thdnNotBelowThd,
  analyserResolution,
  riseTimeBandwidth,
  slewRateFullPower,
  dampingVsImpedance,
  channelBalance,
  speakerImpedanceMinimum,
  speakerSensitivity,
  riaaAccuracy,
  speedError,
  wowFlutter,
  // Cross-checks: figures physics ties together, physical floors, and faults that make a unit unsafe to connect.
  snrNoiseReference,
  gainSensitivityOutput,
  powerAtDistortionLimit,
  slewRateRiseTime,
  typedVsCapture,
  thermalNoiseFloor,
  analyserFloor,
  instrumentBandwidth,
  dcOffsetSafe,
  outputOscillation,
  turntableFarOffSpeed,
];

/** Rule ids are stable: listings, flags and the API refer to them. */
export const RULE_IDS = RULES.map((r) => r.id);

export type { Rule } from "./types";
