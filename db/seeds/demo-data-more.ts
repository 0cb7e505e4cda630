import type { DemoUnit } from "./demo-data";
import { ampRecap, belts, corrowmere, keswater, pennick, refoam, SWITCH, tapeService, UK, who } from "./demo-logs";
import { amplifierSheet, loudspeakerSheet, phonoSheet, preamplifierSheet, tapeSheet, turntableSheet } from "./demo-sheets";

// The demo scenario's second batch: sixteen more invented units, one or two per category, so the
// market has depth in every aisle. Same makers, workshops and private sellers as the first batch.

export const MORE_DEMO_UNITS: DemoUnit[] = [
  // Integrated amplifiers
  {
    serial: "KL-90-412208", seller: "workshop", category: "integrated_amplifier", maker: "Kelloran", model: "ZK 9.0",
    years: [1983, 1983], price: 740, offers: true, grade: "clean", service: "serviced_measured", daysAgo: 27,
    note: "Brushed front without scratches; a faint ring mark on the top cover from a mug. Headphone socket re-soldered.",
    weightKg: 12.4, box: [54, 46, 22], mains: UK, includes: ["manual"], handlingDays: 2, photos: 2,
    sheet: amplifierSheet("integrated_amplifier", who("Kelloran", "ZK 9.0", 1983, corrowmere, 28), {
      rated8: 90, rated4: 130, meas8: [96, 95], meas4: [138, 136], thdPct: [0.011, 0.012], snrDb: 100, f3HighHz: 100_000, f3LowHz: 5, dampingFactor: 160,
    }),
    log: ampRecap("Ottilie Varn", 28, 7),
  },
  {
    serial: "CW-54I-220931", seller: "seller2", category: "integrated_amplifier", maker: "Carrowain", model: "WQ 54i",
    years: [1980, 1980], price: 310, offers: true, grade: "lived_in", service: "working_unserviced", daysAgo: 24,
    note: "Daily amplifier for years, never opened. Loudness switch sticks now and then. Power measured into a borrowed dummy load.",
    weightKg: 9.6, box: [50, 42, 20], mains: UK, handlingDays: 4, photos: 1,
    sheet: amplifierSheet("integrated_amplifier", who("Carrowain", "WQ 54i", 1980, "Anneke Sollum", 25), {
      rated8: 55, meas8: [57, 55], thdPct: [0.04, 0.05], snrDb: 88, f3HighHz: 45_000, f3LowHz: 12, basic: true,
    }),
  },

  // Power amplifiers
  {
    serial: "VT-100-503377", seller: "workshop2", category: "power_amplifier", maker: "Vantrell", model: "Velt P100",
    years: [1982, 1982], price: 890, grade: "clean", service: "serviced_measured", daysAgo: 19,
    note: "Output relays replaced, both channels rebiased. Small scuff on the left rack handle.",
    weightKg: 16.5, box: [56, 50, 24], mains: UK, includes: ["manual"], handlingDays: 3, photos: 1,
    sheet: amplifierSheet("power_amplifier", who("Vantrell", "Velt P100", 1982, keswater, 20), {
      rated8: 100, rated4: 140, meas8: [107, 105], meas4: [152, 149], thdPct: [0.01, 0.011], snrDb: 103, f3HighHz: 110_000, f3LowHz: 4, dampingFactor: 190,
    }),
    log: ampRecap("Bram Keswater", 20, 4),
  },
  {
    serial: "KL-80-390664", seller: "workshop", category: "power_amplifier", maker: "Kelloran", model: "ZK 8.2",
    years: [1979, 1979], price: 560, grade: "lived_in", service: "serviced_measured", daysAgo: 31,
    note: "Electrically sorted; the black finish is worn through at the front corners and one foot is a matched replacement.",
    weightKg: 11.8, box: [52, 44, 20], mains: UK, handlingDays: 2, photos: 1,
    sheet: amplifierSheet("power_amplifier", who("Kelloran", "ZK 8.2", 1979, corrowmere, 32), {
      rated8: 80, rated4: 110, meas8: [84, 83], meas4: [118, 116], thdPct: [0.015, 0.016], snrDb: 98, f3HighHz: 90_000, f3LowHz: 5,
    }),
  },

  // Preamplifiers
  {
    serial: "CV-2-618840", seller: "workshop2", category: "preamplifier", maker: "Calvorne", model: "Tellis II",
    years: [1983, 1983], price: 620, grade: "clean", service: "serviced_measured", daysAgo: 22,
    note: "Regulators and all electrolytics replaced, input selector cleaned. Light marks on the end cheeks.",
    weightKg: 6.2, box: [50, 38, 16], mains: UK, includes: ["manual"], handlingDays: 2, photos: 1,
    sheet: preamplifierSheet(who("Calvorne", "Tellis II", 1983, keswater, 23), { gainDb: 19, thdPct: 0.003, snrDb: 99, f3HighHz: 150_000, f3LowHz: 3, outputOhm: 68 }),
  },
  {
    serial: "KL-C5-048812", seller: "seller", category: "preamplifier", maker: "Kelloran", model: "ZK 5.1",
    years: [1981, 1981], price: 180, grade: "clean", service: "working_unserviced", daysAgo: 28,
    note: "Works on every input. I could measure gain and distortion but have nothing quiet enough for a noise figure.",
    weightKg: 4.3, box: [46, 34, 14], mains: UK, handlingDays: 4, photos: 1,
    // Honest but incomplete: no noise figure, so the sheet stays short of the mark.
    sheet: preamplifierSheet(who("Kelloran", "ZK 5.1", 1981, "Jory Fenwright", 29), { gainDb: 21, thdPct: 0.015, snrDb: 90, f3HighHz: 70_000, noNoise: true }),
  },

  // Receivers
  {
    serial: "VT-R85-27514", seller: "workshop", category: "receiver", maker: "Vantrell", model: "Velt R85",
    years: [1978, 1978], price: 980, offers: true, grade: "clean", service: "serviced_measured", daysAgo: 33,
    note: "Tuner aligned on the bench, dial and meter lamps replaced with warm LEDs. Walnut case refinished with oil.",
    weightKg: 17.2, box: [64, 48, 24], mains: UK, includes: ["manual"], handlingDays: 3, photos: 2,
    sheet: amplifierSheet("receiver", who("Vantrell", "Velt R85", 1978, corrowmere, 34), {
      rated8: 85, rated4: 110, meas8: [90, 89], meas4: [122, 120], thdPct: [0.025, 0.026], snrDb: 93, f3HighHz: 65_000, f3LowHz: 7,
    }),
    log: ampRecap("Ottilie Varn", 34, 9),
  },
  {
    serial: "CW-45R-81177", seller: "seller2", category: "receiver", maker: "Carrowain", model: "WQ 45r",
    years: [1981, 1981], price: 340, grade: "clean", service: "working_unserviced", daysAgo: 1,
    note: "Clean receiver, FM and phono both work. Figures from a friend's scope and dummy load.",
    weightKg: 10.1, box: [54, 42, 20], mains: UK, handlingDays: 3, photos: 1,
    // Doctored for the review desk: the output voltage gives well under half the power on the same sheet.
    sheet: amplifierSheet("receiver", who("Carrowain", "WQ 45r", 1981, "Anneke Sollum", 2), {
      rated8: 45, rated4: 60, meas8: [48, 47], meas4: [66, 64], thdPct: [0.03, 0.032], snrDb: 90, f3HighHz: 55_000, f3LowHz: 9, doctor: "voltage",
    }),
  },

  // Phono stages
  {
    serial: "CV-PH3-41208", seller: "workshop", category: "phono_stage", maker: "Calvorne", model: "Tellis Phono III MM/MC",
    years: [1987, 1987], price: 450, grade: "clean", service: "serviced_measured", daysAgo: 13,
    note: "Switchable MM/MC stage. Equalisation capacitors replaced with 1 % film parts; RIAA swept after.",
    weightKg: 2.8, box: [34, 28, 12], mains: UK, includes: ["manual"], handlingDays: 2, photos: 1,
    sheet: phonoSheet(who("Calvorne", "Tellis Phono III MM/MC", 1987, corrowmere, 14), { gainDb: 42, snrDb: 80, thdPct: 0.007, wobbleDb: 0.12 }),
  },
  {
    serial: "VT-PH1-60033", seller: "seller", category: "phono_stage", maker: "Vantrell", model: "Velt Ph1",
    years: [1982, 1982], price: 110, grade: "lived_in", service: "working_unserviced", daysAgo: 16,
    note: "Small moving-magnet stage. I swept it with a test generator and an inverse-RIAA network.",
    weightKg: 1.4, box: [28, 22, 10], mains: UK, handlingDays: 4, photos: 1,
    sheet: phonoSheet(who("Vantrell", "Velt Ph1", 1982, "Jory Fenwright", 17), { gainDb: 37, snrDb: 76, thdPct: 0.015, wobbleDb: 0.3 }),
  },

  // Turntables
  {
    serial: "QV-T4-33019", seller: "workshop3", category: "turntable", maker: "Quorvane", model: "Orrel Four",
    years: [1978, 1978], price: 390, grade: "clean", service: "serviced_measured", daysAgo: 6,
    note: "Belt drive with auto return. New belt, bearing re-oiled, arm lift damped again. Cartridge not included.",
    weightKg: 8.9, box: [54, 44, 22], mains: UK, includes: ["manual"], handlingDays: 3, photos: 2,
    sheet: turntableSheet(who("Quorvane", "Orrel Four", 1978, pennick, 7), { speedErrorPct: 0.12, wowFlutterPct: 0.055, rumbleDb: 66, ratedWowFlutterPct: 0.06 }),
    log: belts("Isolde Pennick", 7),
  },
  {
    serial: "QV-T8-70452", seller: "seller2", category: "turntable", maker: "Quorvane", model: "Orrel Eight Direct",
    years: [1982, 1982], price: 290, offers: true, grade: "lived_in", service: "working_unserviced", daysAgo: 21,
    note: "Direct drive, quartz lock holds. Lid hinges stiff. Measured with a test record and a flutter meter at a local club.",
    weightKg: 10.5, box: [56, 46, 22], mains: UK, handlingDays: 4, photos: 1,
    sheet: turntableSheet(who("Quorvane", "Orrel Eight Direct", 1982, "Anneke Sollum", 22), { speedErrorPct: 0.03, wowFlutterPct: 0.03, weighting: "WRMS", rumbleDb: 70 }),
  },

  // Tape decks
  {
    serial: "PQ-D650-14760", seller: "workshop2", category: "tape_deck", maker: "Pellquist", model: "XQ/65",
    years: [1985, 1985], price: 720, grade: "clean", service: "serviced_measured", daysAgo: 18,
    note: "Three-head cassette deck with auto-calibration that works again after the service. Door window has a fine hairline.",
    weightKg: 8.2, box: [52, 40, 20], mains: SWITCH, includes: ["manual", "remote"], handlingDays: 2, photos: 1,
    sheet: tapeSheet(who("Pellquist", "XQ/65", 1985, keswater, 19), { speedErrorPct: 0.15, wowFlutterPct: 0.045, snrDb: 61, f3HighHz: 19_000, tapeSpeedCmS: 4.76 }),
    log: tapeService("Bram Keswater", 19),
  },
  {
    serial: "PQ-R1-00917", seller: "workshop2", category: "tape_deck", maker: "Pellquist", model: "XQ/R1 Reel-to-Reel",
    years: [1977, 1978], price: 1180, grade: "lived_in", service: "serviced_measured", daysAgo: 35,
    note: "Open-reel deck at 9.5 and 19 cm/s, measured at 19. 23 kg: lift with two people. Side panels have light wear.",
    weightKg: 23, box: [60, 52, 36], mains: SWITCH, includes: ["manual"], handlingDays: 4, photos: 2,
    sheet: tapeSheet(who("Pellquist", "XQ/R1 Reel-to-Reel", 1977, keswater, 36), { speedErrorPct: 0.08, wowFlutterPct: 0.05, snrDb: 63, f3HighHz: 22_000, tapeSpeedCmS: 19.05 }),
    log: tapeService("Bram Keswater", 36),
  },

  // Loudspeakers
  {
    serial: "BV-30-52260", seller: "workshop2", category: "loudspeaker", maker: "Brisvale", model: "30/8 (pair)",
    years: [1983, 1983], price: 540, grade: "clean", service: "serviced_measured", daysAgo: 12,
    note: "Stand-mount pair, refoamed, crossovers recapped. Veneer even on both cabinets; grilles included.",
    weightKg: 22, box: [56, 44, 66], handlingDays: 3, photos: 2,
    sheet: loudspeakerSheet(who("Brisvale", "30/8", 1983, keswater, 13), { ratedOhm: 8, minOhm: 6.6, minAtHz: 170, sensitivityDb: 87, f3LowHz: 48 }),
    log: refoam("Bram Keswater", 13),
  },
  {
    serial: "HX-L9-00318", seller: "workshop", category: "loudspeaker", maker: "Hexlund", model: "90L Tower (pair)",
    years: [1987, 1987], price: 1350, offers: true, grade: "clean", service: "serviced_measured", daysAgo: 29,
    note: "Three-way towers, 27 kg each: two people per cabinet, freight only. Tweeter domes unmarked.",
    weightKg: 54, box: [112, 46, 44], includes: ["manual"], handlingDays: 5, photos: 1,
    sheet: loudspeakerSheet(who("Hexlund", "90L Tower", 1987, corrowmere, 30), { ratedOhm: 4, minOhm: 3.3, minAtHz: 95, sensitivityDb: 90, f3LowHz: 32 }),
  },
];
