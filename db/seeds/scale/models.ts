import type { Category } from "@shared/catalogue";

// The scale seed's model lines: every demo maker's range, each model named in its maker's own
// scheme (MODEL_SCHEMES in ../demo-cast.ts) with the figures a typical sample of it measures. Units
// are drawn around these, so a hundred units of one model look like a hundred units of one model.

export interface AmpType {
  rated8: number;
  rated4?: number;
  ratedThdPct: number;
  thdPct: number;
  snrDb: number;
  f3HighHz: number;
  f3LowHz: number;
  dampingFactor: number;
}
export interface LineType {
  gainDb: number;
  thdPct: number;
  snrDb: number;
  f3HighHz: number;
  f3LowHz: number;
}
export interface PhonoType {
  gainDb: number;
  snrDb: number;
  thdPct: number;
  wobbleDb: number;
}
export interface TurntableType {
  wowFlutterPct: number;
  rumbleDb: number;
  direct: boolean;
}
export interface TapeType {
  wowFlutterPct: number;
  snrDb: number;
  f3HighHz: number;
  tapeSpeedCmS: number;
}
export interface SpeakerType {
  ratedOhm: number;
  minOhm: number;
  minAtHz: number;
  sensitivityDb: number;
  f3LowHz: number;
}

type Types = {
  integrated_amplifier: AmpType;
  power_amplifier: AmpType;
  receiver: AmpType;
  preamplifier: LineType;
  phono_stage: PhonoType;
  turntable: TurntableType;
  tape_deck: TapeType;
  loudspeaker: SpeakerType;
};

export type ScaleModel = {
  [C in Category]: {
    category: C;
    maker: string;
    /** As listed; loudspeakers end in " (pair)", which the sheet's equipment leaves off. */
    model: string;
    year: number;
    /** What a clean, working sample fetches, in euros. */
    priceEur: number;
    weightKg: number;
    /** Boxed, cm. */
    box: [number, number, number];
    /** How often it turns up, relative to the others of its category. */
    popularity: number;
    type: Types[C];
  };
}[Category];

/** The used market's mix: amplifiers and loudspeakers lead, phono stages and preamplifiers trail. */
export const CATEGORY_SHARE: Record<Category, number> = {
  integrated_amplifier: 22,
  loudspeaker: 19,
  turntable: 14,
  receiver: 12,
  power_amplifier: 9,
  tape_deck: 9,
  preamplifier: 8,
  phono_stage: 7,
};

export { SCALE_MODELS } from "./model-lines";
