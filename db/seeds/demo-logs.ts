import type { DemoLogEntry } from "./demo-data";

// Shared pieces of the demo scenario: the workshops' names on bench sheets, dates, mains, and the
// restoration logs several units share.

export const corrowmere = "Corrowmere Audio Bench";
export const keswater = "Keswater Valve & Transistor";
export const pennick = "Pennick Turntable Works";
export const on = (daysAgo: number) => new Date(Date.now() - daysAgo * 86_400_000).toISOString().slice(0, 10);
export const who = (maker: string, model: string, year: number, measuredBy: string, daysAgo: number) => ({
  maker,
  model,
  year,
  measuredBy,
  measuredOn: on(daysAgo),
});

export const ampRecap = (tech: string, daysAgo: number, idleBefore: number): DemoLogEntry[] => [
  {
    daysAgo: daysAgo + 9,
    work: "Bench inspection: DC offset and idle current on both channels, power-supply ripple under load, a listen for crackle on every control.",
    technician: tech,
    before: [
      {
        quantity: "Idle current, left",
        value: idleBefore,
        unit: "mA",
        conditions: "after 30 min warm-up, across the 0.22 Ω emitter resistors",
      },
      { quantity: "DC offset, left", value: 38, unit: "mV", conditions: "speaker terminals, no input, 8 Ω load" },
    ],
  },
  {
    daysAgo: daysAgo + 4,
    work: "Recapped the power supply and driver boards, replaced both bias trimmers, cleaned the speaker relay contacts and the selector switch.",
    technician: tech,
    parts: [
      { part: "Electrolytic capacitor 10 000 µF 63 V", quantity: 2, reference: "C801, C802" },
      { part: "Electrolytic capacitor 47 µF 100 V", quantity: 6 },
      { part: "Cermet trimmer 220 Ω", quantity: 2, reference: "VR401, VR402" },
    ],
  },
  {
    daysAgo: daysAgo + 1,
    work: "Set idle current and offset, soak test for five days, measured into 8 Ω and 4 Ω dummy loads.",
    technician: tech,
    after: [
      { quantity: "Idle current, left", value: 22, unit: "mA", conditions: "after 30 min warm-up, across the 0.22 Ω emitter resistors" },
      { quantity: "DC offset, left", value: 6, unit: "mV", conditions: "speaker terminals, no input, 8 Ω load" },
    ],
  },
];

export const belts = (tech: string, daysAgo: number): DemoLogEntry[] => [
  {
    daysAgo: daysAgo + 3,
    work: "New drive belt, main bearing cleaned and re-oiled, tonearm bearings checked for play, speed re-trimmed with a 3150 Hz test record.",
    technician: tech,
    parts: [
      { part: "Flat drive belt", quantity: 1 },
      { part: "Bearing oil, 5 ml", quantity: 1 },
    ],
    before: [{ quantity: "Speed error", value: -1.4, unit: "%", conditions: "33⅓ rpm, 3150 Hz test record" }],
    after: [{ quantity: "Speed error", value: 0.1, unit: "%", conditions: "33⅓ rpm, 3150 Hz test record" }],
  },
];

export const refoam = (tech: string, daysAgo: number): DemoLogEntry[] => [
  {
    daysAgo: daysAgo + 6,
    work: "Woofer surrounds replaced with new foam, voice coils checked for rub, crossover electrolytics replaced with film capacitors of the same value.",
    technician: tech,
    parts: [
      { part: "Foam surround, 8 in", quantity: 2 },
      { part: "Film capacitor 4.7 µF 250 V", quantity: 2, reference: "C1 (both cabinets)" },
    ],
  },
];

export const tapeService = (tech: string, daysAgo: number): DemoLogEntry[] => [
  {
    daysAgo: daysAgo + 5,
    work: "New pinch roller and belts, heads cleaned and demagnetised, azimuth set, bias and level calibrated for Type II tape.",
    technician: tech,
    parts: [
      { part: "Pinch roller", quantity: 1 },
      { part: "Capstan and reel belt set", quantity: 1 },
    ],
    before: [{ quantity: "Wow & flutter", value: 0.31, unit: "%", conditions: "3150 Hz test tape, weighted peak (IEC 60386)" }],
    after: [{ quantity: "Wow & flutter", value: 0.07, unit: "%", conditions: "3150 Hz test tape, weighted peak (IEC 60386)" }],
  },
];

export const UK = { v: 230, hz: 50 as const, switchable: false };
export const SWITCH = { v: 230, hz: 50 as const, switchable: true };
