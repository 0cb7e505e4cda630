import type { DemoUnit } from "./demo-cast";
import { MORE_DEMO_UNITS } from "./demo-data-more";
import { SEARCH_DEMO_UNITS } from "./demo-data-search";
import { ampRecap, belts, corrowmere, keswater, pennick, refoam, SWITCH, tapeService, UK, who } from "./demo-logs";
import { amplifierSheet, loudspeakerSheet, phonoSheet, preamplifierSheet, tapeSheet, turntableSheet } from "./demo-sheets";

// The demo scenario. Everything here is invented: makers, models, workshops, people, towns and
// regions. Countries are real ISO codes so shipping zones and country names work.

export * from "./demo-cast";

export const DEMO_UNITS: DemoUnit[] = [
  // Integrated amplifiers
  {
    serial: "CW-46I-017924", seller: "workshop", category: "integrated_amplifier", maker: "Carrowain", model: "WQ 46i",
    years: [1979, 1979], price: 685, offers: true, grade: "clean", service: "serviced_measured", daysAgo: 1,
    note: "Light marks on the top cover, front panel clean. All inputs and the tone controls work without crackle.",
    weightKg: 11.2, box: [52, 44, 22], mains: UK, includes: ["manual"], handlingDays: 2, photos: 2,
    sheet: amplifierSheet("integrated_amplifier", who("Carrowain", "WQ 46i", 1979, corrowmere, 2), {
      rated8: 60, rated4: 90, ratedThdPct: 0.05, meas8: [66, 65], meas4: [98, 96], thdPct: [0.012, 0.014], snrDb: 98, f3HighHz: 95_000, f3LowHz: 7, dampingFactor: 150,
    }),
    log: ampRecap("Ottilie Varn", 2, 4),
  },
  {
    serial: "CW-72I-004113", seller: "workshop2", category: "integrated_amplifier", maker: "Carrowain", model: "WQ 72i",
    years: [1982, 1982], price: 1150, grade: "showroom", service: "serviced_measured", daysAgo: 3,
    note: "Exceptional: original box and inserts, no marks under raking light. Phono input measured too.",
    weightKg: 17.5, box: [58, 50, 26], mains: UK, includes: ["manual", "remote", "packing"], handlingDays: 3, photos: 2,
    sheet: amplifierSheet("integrated_amplifier", who("Carrowain", "WQ 72i", 1982, keswater, 4), {
      rated8: 100, rated4: 150, meas8: [108, 106], meas4: [162, 158], thdPct: [0.009, 0.011], snrDb: 101, f3HighHz: 110_000, f3LowHz: 5, dampingFactor: 200, sweep: true,
    }),
    log: ampRecap("Bram Keswater", 4, 2),
  },
  {
    serial: "VT-35-553190", seller: "seller", category: "integrated_amplifier", maker: "Vantrell", model: "Velt 35",
    years: [1975, 1977], price: 240, offers: true, grade: "lived_in", service: "working_unserviced", daysAgo: 5,
    note: "Works and sounds fine on my speakers. Scratches on the top, one knob cap slightly loose. Measured with a dummy load and a meter I borrowed.",
    weightKg: 7.4, box: [48, 36, 18], mains: UK, handlingDays: 4, photos: 1,
    sheet: amplifierSheet("integrated_amplifier", who("Vantrell", "Velt 35", 1976, "Jory Fenwright", 6), {
      rated8: 35, meas8: [36, 33], thdPct: [0.08, 0.1], snrDb: 84, f3HighHz: 40_000, f3LowHz: 15, basic: true,
    }),
  },
  {
    serial: "VT-80-210877", seller: "workshop", category: "integrated_amplifier", maker: "Vantrell", model: "Velt 80 Mk II",
    years: [1984, 1984], price: 890, grade: "clean", service: "serviced_measured", daysAgo: 8,
    note: "Small chip on the volume knob's skirt, otherwise clean. Remote works; new batteries included.",
    weightKg: 13.8, box: [54, 46, 22], mains: UK, includes: ["manual", "remote"], handlingDays: 2, photos: 1,
    sheet: amplifierSheet("integrated_amplifier", who("Vantrell", "Velt 80 Mk II", 1984, corrowmere, 9), {
      rated8: 80, rated4: 120, meas8: [86, 85], meas4: [124, 121], thdPct: [0.01, 0.012], snrDb: 99, f3HighHz: 85_000, f3LowHz: 6, sweep: true,
    }),
    log: ampRecap("Ottilie Varn", 9, 3),
  },
  {
    serial: "CW-30I-998201", seller: "seller2", category: "integrated_amplifier", maker: "Carrowain", model: "WQ 30i",
    years: [1977, 1977], price: 95, offers: true, grade: "rough", service: "needs_work", daysAgo: 11,
    note: "Right channel drops out once warm; probably the speaker relay. Dent in the top cover. Sold for repair by someone qualified.",
    weightKg: 6.9, box: [46, 36, 18], mains: UK, handlingDays: 5, photos: 1,
  },
  {
    serial: "KL-50-301556", seller: "workshop2", category: "integrated_amplifier", maker: "Kelloran", model: "ZK 5.0",
    years: [1981, 1981], price: 520, grade: "clean", service: "serviced_measured", daysAgo: 2,
    note: "Recapped, new bias trimmers. Minor rub marks on the side cheeks.",
    weightKg: 9.8, box: [50, 42, 20], mains: UK, includes: ["manual"], handlingDays: 2, photos: 1,
    // Doctored for the review desk: its 4 Ω figures are three times the 8 Ω ones.
    sheet: amplifierSheet("integrated_amplifier", who("Kelloran", "ZK 5.0", 1981, keswater, 3), {
      rated8: 50, rated4: 70, meas8: [54, 53], thdPct: [0.015, 0.016], snrDb: 96, f3HighHz: 70_000, f3LowHz: 8, doctor: "half-load",
    }),
  },
  {
    serial: "VT-120-660014", seller: "workshop", category: "integrated_amplifier", maker: "Vantrell", model: "Velt 120 Studio",
    years: [1988, 1988], price: 760, grade: "lived_in", service: "serviced_measured", daysAgo: 16,
    note: "Electrically as new after service; the front panel has honest wear around the selector and a faint scratch across the badge.",
    weightKg: 15.1, box: [56, 48, 24], mains: SWITCH, includes: ["remote"], handlingDays: 2, photos: 1,
    sheet: amplifierSheet("integrated_amplifier", who("Vantrell", "Velt 120 Studio", 1988, corrowmere, 17), {
      rated8: 120, rated4: 180, meas8: [128, 127], meas4: [188, 185], thdPct: [0.006, 0.007], snrDb: 103, f3HighHz: 120_000, f3LowHz: 4, dampingFactor: 250, sweep: true,
    }),
    log: ampRecap("Ottilie Varn", 17, 5),
  },

  // Power amplifiers
  {
    serial: "KL-200-118440", seller: "workshop2", category: "power_amplifier", maker: "Kelloran", model: "ZK 20.2",
    years: [1980, 1980], price: 1450, offers: true, grade: "clean", service: "serviced_measured", daysAgo: 4,
    note: "Meters relamped with warm-white LEDs matched to the original colour. Heatsink fins straight.",
    weightKg: 24, box: [60, 54, 30], mains: UK, includes: ["manual", "packing"], handlingDays: 3, photos: 2,
    sheet: amplifierSheet("power_amplifier", who("Kelloran", "ZK 20.2", 1980, keswater, 5), {
      rated8: 100, rated4: 150, meas8: [112, 110], meas4: [170, 166], thdPct: [0.008, 0.009], snrDb: 104, f3HighHz: 130_000, f3LowHz: 3, dampingFactor: 180,
    }),
    log: ampRecap("Bram Keswater", 5, 1),
  },
  {
    serial: "KL-400-000871", seller: "workshop", category: "power_amplifier", maker: "Kelloran", model: "ZK 40.2 Monitor",
    years: [1985, 1985], price: 2350, grade: "showroom", service: "serviced_measured", daysAgo: 6,
    note: "34 kg: two people to lift, shipped on a pallet. Handles intact, rack ears included.",
    weightKg: 34, box: [66, 62, 34], mains: SWITCH, includes: ["manual", "packing"], handlingDays: 4, photos: 2,
    sheet: amplifierSheet("power_amplifier", who("Kelloran", "ZK 40.2 Monitor", 1985, corrowmere, 7), {
      rated8: 200, rated4: 300, meas8: [215, 212], meas4: [330, 325], thdPct: [0.005, 0.006], snrDb: 108, f3HighHz: 150_000, f3LowHz: 2, dampingFactor: 300,
    }),
    log: ampRecap("Ottilie Varn", 7, 2),
  },
  {
    serial: "CW-70P-443019", seller: "seller", category: "power_amplifier", maker: "Carrowain", model: "WQ 70p",
    years: [1978, 1978], price: 380, grade: "lived_in", service: "working_unserviced", daysAgo: 12,
    note: "Used daily until last month. One meter lamp out. Typed figures from my own dummy-load test.",
    weightKg: 12.5, box: [52, 44, 22], mains: UK, handlingDays: 4, photos: 1,
    sheet: amplifierSheet("power_amplifier", who("Carrowain", "WQ 70p", 1978, "Jory Fenwright", 13), {
      rated8: 70, meas8: [71, 68], thdPct: [0.05, 0.06], snrDb: 90, f3HighHz: 50_000, f3LowHz: 10, basic: true,
    }),
  },
  {
    serial: "KL-150-227305", seller: "workshop2", category: "power_amplifier", maker: "Kelloran", model: "ZK 15.2",
    years: [1983, 1983], price: 980, grade: "clean", service: "serviced_measured", daysAgo: 1,
    note: "Serviced, new output-stage thermal pads. Listed with its sheet; awaiting the bench's check.",
    weightKg: 19, box: [58, 50, 26], mains: UK, includes: ["manual"], handlingDays: 3, photos: 1,
    // Doctored: the power claimed needs more swing than the rails on the same sheet allow.
    sheet: amplifierSheet("power_amplifier", who("Kelloran", "ZK 15.2", 1983, keswater, 2), {
      rated8: 150, rated4: 220, meas8: [158, 156], meas4: [232, 228], thdPct: [0.007, 0.008], snrDb: 105, f3HighHz: 100_000, f3LowHz: 3, doctor: "rails",
    }),
  },
  {
    serial: "VT-60-871120", seller: "workshop", category: "power_amplifier", maker: "Vantrell", model: "Velt P60",
    years: [1979, 1979], price: 640, grade: "clean", service: "serviced_measured", daysAgo: 21,
    note: "Compact stereo power amplifier, new fan-free heatsink compound, input sockets re-tensioned.",
    weightKg: 9.5, box: [50, 40, 18], mains: UK, handlingDays: 2, photos: 1,
    sheet: amplifierSheet("power_amplifier", who("Vantrell", "Velt P60", 1979, corrowmere, 22), {
      rated8: 60, rated4: 85, meas8: [64, 63], meas4: [92, 90], thdPct: [0.014, 0.015], snrDb: 97, f3HighHz: 80_000, f3LowHz: 5,
    }),
  },

  // Preamplifiers
  {
    serial: "CV-1-331872", seller: "workshop", category: "preamplifier", maker: "Calvorne", model: "Tellis I",
    years: [1981, 1981], price: 540, grade: "clean", service: "serviced_measured", daysAgo: 7,
    note: "All pots cleaned and sealed, new power-supply regulators. Faint marks on the top cover only.",
    weightKg: 5.2, box: [50, 36, 14], mains: UK, includes: ["manual"], handlingDays: 2, photos: 1,
    sheet: preamplifierSheet(who("Calvorne", "Tellis I", 1981, corrowmere, 8), { gainDb: 20, thdPct: 0.004, snrDb: 96, f3HighHz: 120_000, f3LowHz: 4 }),
  },
  {
    serial: "CV-3-100245", seller: "workshop2", category: "preamplifier", maker: "Calvorne", model: "Tellis III Reference",
    years: [1986, 1986], price: 980, grade: "showroom", service: "serviced_measured", daysAgo: 10,
    note: "Separate power supply included. Looks unused.",
    weightKg: 8.1, box: [54, 44, 20], mains: UK, includes: ["manual", "packing"], handlingDays: 3, photos: 2,
    sheet: preamplifierSheet(who("Calvorne", "Tellis III Reference", 1986, keswater, 11), { gainDb: 18, thdPct: 0.002, snrDb: 102, f3HighHz: 200_000, f3LowHz: 2, outputOhm: 47 }),
  },
  {
    serial: "VT-C10-772390", seller: "seller2", category: "preamplifier", maker: "Vantrell", model: "Velt C10",
    years: [1978, 1978], price: 210, offers: true, grade: "lived_in", service: "working_unserviced", daysAgo: 14,
    note: "Works; balance control is a little scratchy. I only have the figures below.",
    weightKg: 4.6, box: [48, 34, 14], mains: UK, handlingDays: 5, photos: 1,
    sheet: preamplifierSheet(who("Vantrell", "Velt C10", 1978, "Anneke Sollum", 15), { gainDb: 22, thdPct: 0.02, snrDb: 88, f3HighHz: 60_000, noNoise: true }),
  },
  {
    serial: "VT-C20-450981", seller: "seller2", category: "preamplifier", maker: "Vantrell", model: "Velt C20",
    years: [1980, 1980], price: 330, grade: "clean", service: "working_unserviced", daysAgo: 2,
    note: "Clean unit from a non-smoking home. Figures from a friend's analyser.",
    weightKg: 5, box: [48, 34, 14], mains: UK, handlingDays: 3, photos: 1,
    // Doctored: THD+N reads well below THD at the same conditions.
    sheet: preamplifierSheet(who("Vantrell", "Velt C20", 1980, "Anneke Sollum", 3), { gainDb: 20, thdPct: 0.01, snrDb: 92, f3HighHz: 90_000, doctor: "thdn-below-thd" }),
  },

  // Receivers
  {
    serial: "VT-R50-38812", seller: "workshop", category: "receiver", maker: "Vantrell", model: "Velt R50",
    years: [1977, 1977], price: 795, offers: true, grade: "clean", service: "serviced_measured", daysAgo: 9,
    note: "Dial lamps replaced with warm LEDs, tuner aligned, FM stereo locks cleanly. Walnut case has two small marks.",
    weightKg: 12.9, box: [60, 42, 22], mains: UK, includes: ["manual"], handlingDays: 2, photos: 2,
    sheet: amplifierSheet("receiver", who("Vantrell", "Velt R50", 1977, corrowmere, 10), {
      rated8: 50, rated4: 70, meas8: [54, 53], meas4: [76, 74], thdPct: [0.03, 0.03], snrDb: 90, f3HighHz: 60_000, f3LowHz: 8,
    }),
    log: ampRecap("Ottilie Varn", 10, 6),
  },
  {
    serial: "VT-R120-10293", seller: "workshop2", category: "receiver", maker: "Vantrell", model: "Velt R120",
    years: [1978, 1978], price: 1250, grade: "lived_in", service: "serviced_measured", daysAgo: 13,
    note: "21 kg flagship. Case veneer has lifted slightly at one rear corner; electronics fully serviced.",
    weightKg: 21, box: [68, 50, 26], mains: UK, includes: ["manual"], handlingDays: 3, photos: 1,
    sheet: amplifierSheet("receiver", who("Vantrell", "Velt R120", 1978, keswater, 14), {
      rated8: 120, rated4: 160, meas8: [126, 124], meas4: [178, 174], thdPct: [0.02, 0.022], snrDb: 95, f3HighHz: 70_000, f3LowHz: 6,
    }),
  },
  {
    serial: "CW-33R-66120", seller: "seller", category: "receiver", maker: "Carrowain", model: "WQ 33r",
    years: [1980, 1980], price: 260, grade: "clean", service: "working_unserviced", daysAgo: 18,
    note: "Bought for the kitchen, never really used. FM works, AM untested.",
    weightKg: 8.2, box: [52, 40, 20], mains: UK, handlingDays: 4, photos: 1,
    sheet: amplifierSheet("receiver", who("Carrowain", "WQ 33r", 1980, "Jory Fenwright", 19), {
      rated8: 30, meas8: [31, 28], thdPct: [0.1, 0.12], snrDb: 82, f3HighHz: 30_000, f3LowHz: 20, basic: true,
    }),
  },
  {
    serial: "VT-R25-00412", seller: "seller2", category: "receiver", maker: "Vantrell", model: "Velt R25",
    years: [1975, 1975], price: 60, grade: "rough", service: "parts_only", daysAgo: 20,
    note: "Does not power up. Dial glass cracked. Good source of knobs, meter and dial parts.",
    weightKg: 9, box: [54, 40, 20], handlingDays: 5, photos: 1,
  },
  {
    serial: "CW-61R-52008", seller: "workshop", category: "receiver", maker: "Carrowain", model: "WQ 61r",
    years: [1982, 1982], price: 540, grade: "clean", service: "serviced_measured", daysAgo: 25,
    note: "Recapped amplifier section, tuner realigned, new dial cord.",
    weightKg: 11, box: [56, 42, 22], mains: UK, handlingDays: 2, photos: 1,
    sheet: amplifierSheet("receiver", who("Carrowain", "WQ 61r", 1982, corrowmere, 26), {
      rated8: 60, rated4: 80, meas8: [63, 62], meas4: [88, 86], thdPct: [0.025, 0.027], snrDb: 92, f3HighHz: 65_000, f3LowHz: 7,
    }),
  },

  // Phono stages
  {
    serial: "CV-PH1-20077", seller: "workshop", category: "phono_stage", maker: "Calvorne", model: "Tellis Phono I MM",
    years: [1984, 1984], price: 320, grade: "clean", service: "serviced_measured", daysAgo: 4,
    note: "Moving-magnet stage. RIAA response swept 20 Hz–20 kHz after replacing the equalisation capacitors with 1 % film parts.",
    weightKg: 2.1, box: [32, 26, 12], mains: UK, handlingDays: 2, photos: 1,
    sheet: phonoSheet(who("Calvorne", "Tellis Phono I MM", 1984, corrowmere, 5), { gainDb: 40, snrDb: 82, thdPct: 0.006, wobbleDb: 0.15 }),
  },
  {
    serial: "CV-PH2-00913", seller: "workshop2", category: "phono_stage", maker: "Calvorne", model: "Tellis Phono II MC",
    years: [1989, 1989], price: 690, grade: "showroom", service: "serviced_measured", daysAgo: 15,
    note: "Moving-coil stage with switchable loading. Boxed.",
    weightKg: 3.4, box: [36, 30, 14], mains: UK, includes: ["manual", "packing"], handlingDays: 3, photos: 1,
    sheet: phonoSheet(who("Calvorne", "Tellis Phono II MC", 1989, keswater, 16), { gainDb: 62, snrDb: 76, thdPct: 0.008, wobbleDb: 0.1 }),
  },
  {
    serial: "CW-5PH-74410", seller: "seller2", category: "phono_stage", maker: "Carrowain", model: "WQ 5ph",
    years: [1980, 1980], price: 140, grade: "lived_in", service: "working_unserviced", daysAgo: 19,
    note: "Works. I have no sweep, only the gain and noise I measured.",
    weightKg: 1.6, box: [30, 24, 10], mains: UK, handlingDays: 4, photos: 1,
    sheet: phonoSheet(who("Carrowain", "WQ 5ph", 1980, "Anneke Sollum", 20), { gainDb: 38, snrDb: 78, thdPct: 0.02, wobbleDb: 0, noSweep: true }),
  },

  // Turntables
  {
    serial: "QV-T3-118070", seller: "workshop3", category: "turntable", maker: "Quorvane", model: "Orrel Three",
    years: [1976, 1976], price: 420, offers: true, grade: "clean", service: "serviced_measured", daysAgo: 3,
    note: "Belt drive. New belt, bearing serviced. Dust cover has fine hairlines. Cartridge not included.",
    weightKg: 8.5, box: [54, 44, 22], mains: UK, includes: ["manual"], handlingDays: 3, photos: 2,
    sheet: turntableSheet(who("Quorvane", "Orrel Three", 1976, pennick, 4), { speedErrorPct: 0.1, wowFlutterPct: 0.05, rumbleDb: 68, ratedWowFlutterPct: 0.06 }),
    log: belts("Isolde Pennick", 4),
  },
  {
    serial: "QV-T5-20441", seller: "workshop3", category: "turntable", maker: "Quorvane", model: "Orrel Five Direct",
    years: [1979, 1979], price: 560, grade: "lived_in", service: "serviced_measured", daysAgo: 8,
    note: "Direct drive, quartz lock works. Plinth veneer worn at the front edge.",
    weightKg: 11, box: [56, 46, 22], mains: UK, handlingDays: 3, photos: 1,
    sheet: turntableSheet(who("Quorvane", "Orrel Five Direct", 1979, pennick, 9), { speedErrorPct: 0.02, wowFlutterPct: 0.035, rumbleDb: 72 }),
  },
  {
    serial: "QV-T1-90012", seller: "seller", category: "turntable", maker: "Quorvane", model: "Orrel One",
    years: [1974, 1974], price: 180, grade: "lived_in", service: "working_unserviced", daysAgo: 10,
    note: "Plays; I checked the speed with a strobe disc. No wow & flutter meter here.",
    weightKg: 6.2, box: [50, 40, 20], mains: UK, handlingDays: 4, photos: 1,
    sheet: turntableSheet(who("Quorvane", "Orrel One", 1974, "Jory Fenwright", 11), { speedErrorPct: 0.4 }),
  },
  {
    serial: "QV-T9-00077", seller: "workshop", category: "turntable", maker: "Quorvane", model: "Orrel Nine Reference",
    years: [1983, 1983], price: 1380, grade: "showroom", service: "serviced_measured", daysAgo: 12,
    note: "18 kg plinth, heavy platter shipped separately in its own box. Arm rewired.",
    weightKg: 18, box: [62, 52, 30], mains: UK, includes: ["manual", "packing"], handlingDays: 4, photos: 2,
    sheet: turntableSheet(who("Quorvane", "Orrel Nine Reference", 1983, corrowmere, 13), { speedErrorPct: -0.03, wowFlutterPct: 0.025, rumbleDb: 75, ratedWowFlutterPct: 0.03 }),
    log: belts("Ottilie Varn", 13),
  },
  {
    serial: "QV-T5-20987", seller: "workshop3", category: "turntable", maker: "Quorvane", model: "Orrel Five Direct",
    years: [1980, 1980], price: 150, grade: "rough", service: "needs_work", daysAgo: 22,
    note: "Motor runs but speed hunts at 45 rpm; control board needs attention. Cracked dust-cover hinge.",
    weightKg: 11, box: [56, 46, 22], mains: UK, handlingDays: 3, photos: 1,
  },
  {
    serial: "QV-T7-41230", seller: "workshop3", category: "turntable", maker: "Quorvane", model: "Orrel Seven",
    years: [1981, 1981], price: 480, grade: "clean", service: "serviced_measured", daysAgo: 17,
    note: "Belt drive with electronic speed control, new belt and idler bushing.",
    weightKg: 9.2, box: [54, 44, 22], mains: UK, handlingDays: 3, photos: 1,
    sheet: turntableSheet(who("Quorvane", "Orrel Seven", 1981, pennick, 18), { speedErrorPct: 0.08, wowFlutterPct: 0.045, rumbleDb: 70 }),
  },

  // Tape decks
  {
    serial: "PQ-D300-61188", seller: "workshop2", category: "tape_deck", maker: "Pellquist", model: "XQ/30",
    years: [1980, 1980], price: 450, grade: "clean", service: "serviced_measured", daysAgo: 5,
    note: "Two-head cassette deck, calibrated for Type II. Door damper works.",
    weightKg: 6.8, box: [52, 40, 20], mains: UK, includes: ["manual"], handlingDays: 2, photos: 1,
    sheet: tapeSheet(who("Pellquist", "XQ/30", 1980, keswater, 6), { speedErrorPct: 0.3, wowFlutterPct: 0.07, snrDb: 58, f3HighHz: 15_000, tapeSpeedCmS: 4.76 }),
    log: tapeService("Bram Keswater", 6),
  },
  {
    serial: "PQ-D550-00318", seller: "workshop2", category: "tape_deck", maker: "Pellquist", model: "XQ/55 Three-Head",
    years: [1983, 1983], price: 890, grade: "showroom", service: "serviced_measured", daysAgo: 11,
    note: "Three-head, dual capstan. Heads measure close to new.",
    weightKg: 9.4, box: [54, 42, 22], mains: UK, includes: ["manual", "remote", "packing"], handlingDays: 3, photos: 2,
    sheet: tapeSheet(who("Pellquist", "XQ/55 Three-Head", 1983, keswater, 12), { speedErrorPct: 0.1, wowFlutterPct: 0.04, snrDb: 62, f3HighHz: 20_000, tapeSpeedCmS: 4.76 }),
    log: tapeService("Bram Keswater", 12),
  },
  {
    serial: "PQ-D200-88231", seller: "seller2", category: "tape_deck", maker: "Pellquist", model: "XQ/20",
    years: [1978, 1978], price: 120, grade: "lived_in", service: "working_unserviced", daysAgo: 23,
    note: "Plays and records. Belts are original, so expect to replace them.",
    weightKg: 5.9, box: [50, 38, 20], mains: UK, handlingDays: 5, photos: 1,
  },
  {
    serial: "PQ-R2-00050", seller: "workshop", category: "tape_deck", maker: "Pellquist", model: "XQ/R2 Reel-to-Reel",
    years: [1975, 1976], price: 1650, grade: "clean", service: "serviced_measured", daysAgo: 14,
    note: "Open-reel deck at 19 cm/s. 28 kg: two people to lift; shipped on a pallet only.",
    weightKg: 28, box: [64, 56, 40], mains: SWITCH, includes: ["manual"], handlingDays: 5, photos: 1,
    sheet: tapeSheet(who("Pellquist", "XQ/R2 Reel-to-Reel", 1975, corrowmere, 15), { speedErrorPct: 0.05, wowFlutterPct: 0.04, snrDb: 64, f3HighHz: 24_000, tapeSpeedCmS: 19.05 }),
  },
  {
    serial: "PQ-D410-30301", seller: "seller", category: "tape_deck", maker: "Pellquist", model: "XQ/41",
    years: [1981, 1981], price: 70, grade: "lived_in", service: "needs_work", daysAgo: 26,
    note: "Eats tapes: the take-up reel does not pull. Everything else lights up.",
    weightKg: 6.1, box: [50, 38, 20], mains: UK, handlingDays: 5, photos: 1,
  },

  // Loudspeakers
  {
    serial: "HX-L3-77002", seller: "workshop", category: "loudspeaker", maker: "Hexlund", model: "12L (pair)",
    years: [1979, 1979], price: 380, grade: "clean", service: "serviced_measured", daysAgo: 6,
    note: "Bookshelf pair, refoamed. Grilles included, one has a small pull in the cloth.",
    weightKg: 14, box: [50, 40, 60], includes: ["manual"], handlingDays: 3, photos: 2,
    sheet: loudspeakerSheet(who("Hexlund", "12L", 1979, corrowmere, 7), { ratedOhm: 8, minOhm: 6.7, minAtHz: 180, sensitivityDb: 86, f3LowHz: 55 }),
    log: refoam("Ottilie Varn", 7),
  },
  {
    serial: "HX-L7-10455", seller: "workshop2", category: "loudspeaker", maker: "Hexlund", model: "64L (pair)",
    years: [1984, 1984], price: 720, offers: true, grade: "lived_in", service: "serviced_measured", daysAgo: 9,
    note: "Floorstanders, 32 kg each: two people per cabinet, freight only. Veneer sun-faded on one side.",
    weightKg: 64, box: [110, 45, 45], handlingDays: 5, photos: 1,
    sheet: loudspeakerSheet(who("Hexlund", "64L", 1984, keswater, 10), { ratedOhm: 8, minOhm: 6.5, minAtHz: 140, sensitivityDb: 89, f3LowHz: 36 }),
    log: refoam("Bram Keswater", 10),
  },
  {
    serial: "BV-22-30114", seller: "seller", category: "loudspeaker", maker: "Brisvale", model: "22/8 (pair)",
    years: [1981, 1981], price: 160, grade: "clean", service: "working_unserviced", daysAgo: 15,
    note: "Original surrounds still soft. I measured the impedance dip with a signal generator and a resistor.",
    weightKg: 11, box: [46, 36, 56], handlingDays: 4, photos: 1,
    sheet: loudspeakerSheet(who("Brisvale", "22/8", 1981, "Jory Fenwright", 16), { ratedOhm: 8, minOhm: 6.9, minAtHz: 200, f3LowHz: 60 }),
  },
  {
    serial: "BV-40-00601", seller: "workshop", category: "loudspeaker", maker: "Brisvale", model: "40/8 Monitor (pair)",
    years: [1986, 1986], price: 1100, grade: "showroom", service: "serviced_measured", daysAgo: 20,
    note: "Studio monitors, crossovers rebuilt with film capacitors. Stands available separately.",
    weightKg: 38, box: [70, 50, 50], includes: ["manual"], handlingDays: 4, photos: 1,
    sheet: loudspeakerSheet(who("Brisvale", "40/8 Monitor", 1986, corrowmere, 21), { ratedOhm: 8, minOhm: 6.6, minAtHz: 160, sensitivityDb: 88, f3LowHz: 42 }),
  },
  {
    serial: "HX-L5-55512", seller: "seller2", category: "loudspeaker", maker: "Hexlund", model: "20L (pair)",
    years: [1982, 1982], price: 240, grade: "lived_in", service: "working_unserviced", daysAgo: 7,
    note: "Sound fine. My measurement shows a deeper impedance dip than the 8 Ω label suggests.",
    weightKg: 18, box: [52, 42, 64], handlingDays: 4, photos: 1,
    sheet: loudspeakerSheet(who("Hexlund", "20L", 1982, "Anneke Sollum", 8), { ratedOhm: 8, minOhm: 4.1, minAtHz: 110, sensitivityDb: 87, f3LowHz: 48 }),
  },

  // Not in the market: a sale, a withdrawal and drafts in progress.
  {
    serial: "CW-46I-017311", seller: "workshop", category: "integrated_amplifier", maker: "Carrowain", model: "WQ 46i",
    years: [1979, 1979], price: 640, grade: "clean", service: "serviced_measured", daysAgo: 40, status: "sold",
    note: "Sister unit of the one listed now; sold.",
    weightKg: 11.2, box: [52, 44, 22], mains: UK, handlingDays: 2, photos: 1,
    sheet: amplifierSheet("integrated_amplifier", who("Carrowain", "WQ 46i", 1979, corrowmere, 41), {
      rated8: 60, rated4: 90, meas8: [65, 65], meas4: [97, 96], thdPct: [0.013, 0.013], snrDb: 97, f3HighHz: 90_000, f3LowHz: 7,
    }),
  },
  {
    serial: "BV-10-77713", seller: "seller2", category: "loudspeaker", maker: "Brisvale", model: "10/8 (pair)",
    years: [1978, 1978], price: 90, grade: "lived_in", service: "working_unserviced", daysAgo: 30, status: "withdrawn",
    note: "Withdrawn: kept them for the spare room after all.",
    weightKg: 8, box: [40, 30, 50], handlingDays: 4, photos: 1,
  },
  {
    serial: "KL-100-DRAFT1", seller: "workshop", category: "power_amplifier", maker: "Kelloran", model: "ZK 10.2",
    years: [1982, 1982], price: 720, grade: "clean", service: "serviced_measured", daysAgo: 1, status: "draft",
    note: "Draft: still on the soak test.", weightKg: 16, box: [56, 48, 24], mains: UK, handlingDays: 3, photos: 0,
  },
  {
    serial: "QV-T3-DRAFT2", seller: "seller", category: "turntable", maker: "Quorvane", model: "Orrel Three",
    years: [1977, 1977], price: 260, grade: "lived_in", service: "working_unserviced", daysAgo: 2, status: "draft",
    note: "Draft.", weightKg: 8.5, box: [54, 44, 22], mains: UK, photos: 0,
  },

  // The scenario's second batch, kept in its own file.
  ...MORE_DEMO_UNITS,
  ...SEARCH_DEMO_UNITS,
];
