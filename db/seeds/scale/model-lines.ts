// Each demo maker's model lines by family (amplifiers, line and phono stages, turntables and tape
// decks, loudspeakers), named in the maker's own scheme, with what a typical sample measures.
import type { AmpType, ScaleModel } from "./models";

const ROMAN = ["I", "II", "III", "IV", "V", "VI"];
const SPELLED = ["One", "Two", "Three", "Four", "Five", "Six", "Seven", "Eight", "Nine"];

function amp(rated8: number, year: number, grade: number): AmpType {
  // Later and dearer designs measure cleaner; big amplifiers reach further down into 4 Ω.
  return {
    rated8,
    rated4: grade > 0.3 ? Math.round((rated8 * (1.35 + grade * 0.3)) / 5) * 5 : undefined,
    ratedThdPct: grade > 0.6 ? 0.02 : grade > 0.3 ? 0.05 : 0.1,
    thdPct: Number((0.06 * Math.pow(0.25, grade) * (year < 1978 ? 1.4 : 1)).toFixed(4)),
    snrDb: Math.round(84 + grade * 18),
    f3HighHz: Math.round((40 + grade * 110) / 5) * 5 * 1000,
    f3LowHz: Math.max(2, Math.round(16 - grade * 13)),
    dampingFactor: Math.round((40 + grade * 260) / 10) * 10,
  };
}

function amplifiers(): ScaleModel[] {
  const out: ScaleModel[] = [];
  const add = (
    category: "integrated_amplifier" | "power_amplifier" | "receiver",
    maker: string,
    model: string,
    rated8: number,
    year: number,
    grade: number,
  ) => {
    const kg = (category === "power_amplifier" ? 6 : 5) + rated8 * (category === "receiver" ? 0.1 : 0.085);
    out.push({
      category,
      maker,
      model,
      year,
      priceEur: Math.round((80 + rated8 * 4.5 * (0.6 + grade)) / 10) * 10,
      weightKg: Math.round(kg * 10) / 10,
      box: [Math.round(46 + kg * 0.6), Math.round(36 + kg * 0.5), Math.round(16 + kg * 0.4)],
      popularity: 1 / Math.sqrt(rated8 / 30),
      type: amp(rated8, year, grade),
    });
  };
  // Carrowain: "WQ", a two-digit number, then i / p / r.
  for (const [n, w, y, g] of [
    [22, 25, 1975, 0.1],
    [30, 30, 1977, 0.2],
    [46, 60, 1979, 0.45],
    [54, 70, 1980, 0.5],
    [72, 100, 1982, 0.65],
    [88, 130, 1985, 0.75],
    [96, 160, 1988, 0.85],
  ])
    add("integrated_amplifier", "Carrowain", `WQ ${n}i`, w, y, g);
  for (const [n, w, y, g] of [
    [50, 50, 1977, 0.35],
    [70, 75, 1978, 0.45],
    [99, 120, 1981, 0.7],
  ])
    add("power_amplifier", "Carrowain", `WQ ${n}p`, w, y, g);
  for (const [n, w, y, g] of [
    [25, 25, 1976, 0.15],
    [33, 35, 1980, 0.3],
    [45, 45, 1981, 0.35],
    [61, 60, 1982, 0.5],
    [80, 85, 1984, 0.6],
  ])
    add("receiver", "Carrowain", `WQ ${n}r`, w, y, g);
  // Vantrell: the Velt range, named by its watts.
  for (const [w, y, g, suffix] of [
    [35, 1976, 0.2, ""],
    [50, 1978, 0.3, ""],
    [65, 1980, 0.45, ""],
    [80, 1982, 0.55, ""],
    [80, 1984, 0.65, " Mk II"],
    [120, 1988, 0.7, " Studio"],
    [150, 1990, 0.8, ""],
  ] as const)
    add("integrated_amplifier", "Vantrell", `Velt ${w}${suffix}`, w, y, g);
  for (const [w, y, g] of [
    [60, 1979, 0.45],
    [100, 1982, 0.6],
    [150, 1985, 0.7],
    [250, 1988, 0.85],
  ])
    add("power_amplifier", "Vantrell", `Velt P${w}`, w, y, g);
  for (const [w, y, g] of [
    [25, 1975, 0.1],
    [50, 1977, 0.3],
    [85, 1978, 0.45],
    [120, 1978, 0.5],
    [160, 1980, 0.55],
  ])
    add("receiver", "Vantrell", `Velt R${w}`, w, y, g);
  // Kelloran: "ZK", the watts in tens, .0 integrated and .2 power.
  for (const [t, y, g] of [
    [3, 1978, 0.35],
    [5, 1981, 0.55],
    [9, 1983, 0.7],
    [12, 1986, 0.8],
  ])
    add("integrated_amplifier", "Kelloran", `ZK ${t}.0`, t * 10, y, g);
  for (const [t, y, g, suffix] of [
    [8, 1979, 0.5, ""],
    [10, 1982, 0.6, ""],
    [15, 1983, 0.7, ""],
    [20, 1980, 0.75, ""],
    [40, 1985, 0.9, " Monitor"],
  ] as const)
    add("power_amplifier", "Kelloran", `ZK ${t}.2${suffix}`, t * 10, y, g);
  return out;
}

function lineStages(): ScaleModel[] {
  const out: ScaleModel[] = [];
  const pre = (maker: string, model: string, year: number, grade: number) =>
    out.push({
      category: "preamplifier",
      maker,
      model,
      year,
      priceEur: Math.round((120 + grade * 900) / 10) * 10,
      weightKg: Math.round((3.5 + grade * 6) * 10) / 10,
      box: [48, 38, 16],
      popularity: 1.2 - grade,
      type: {
        gainDb: Math.round(14 + grade * 8),
        thdPct: Number((0.02 * Math.pow(0.2, grade)).toFixed(4)),
        snrDb: Math.round(88 + grade * 18),
        f3HighHz: Math.round(60 + grade * 140) * 1000,
        f3LowHz: Math.max(2, Math.round(10 - grade * 8)),
      },
    });
  for (const [c, y, g] of [
    [10, 1978, 0.2],
    [20, 1980, 0.4],
    [30, 1983, 0.55],
    [40, 1986, 0.7],
  ])
    pre("Vantrell", `Velt C${c}`, y, g);
  for (const [t, y, g] of [
    [3, 1979, 0.3],
    [5, 1981, 0.5],
    [8, 1984, 0.65],
  ])
    pre("Kelloran", `ZK ${t}.1`, y, g);
  for (const [i, y, g, suffix] of [
    [0, 1981, 0.6, ""],
    [1, 1983, 0.7, ""],
    [2, 1986, 0.85, " Reference"],
    [3, 1989, 0.9, ""],
  ] as const)
    pre("Calvorne", `Tellis ${ROMAN[i]}${suffix}`, y, g);

  const phono = (maker: string, model: string, year: number, grade: number, mc: boolean) =>
    out.push({
      category: "phono_stage",
      maker,
      model,
      year,
      priceEur: Math.round((60 + grade * 700 + (mc ? 150 : 0)) / 10) * 10,
      weightKg: Math.round((1.2 + grade * 3) * 10) / 10,
      box: [32, 26, 12],
      popularity: 1.2 - grade,
      type: {
        gainDb: mc ? 60 + Math.round(grade * 6) : 36 + Math.round(grade * 6),
        snrDb: Math.round((mc ? 68 : 74) + grade * 12),
        thdPct: Number((0.03 * Math.pow(0.2, grade)).toFixed(4)),
        wobbleDb: Number((0.6 - grade * 0.5).toFixed(2)),
      },
    });
  for (const [n, y, g] of [
    [3, 1978, 0.15],
    [5, 1980, 0.3],
    [7, 1983, 0.45],
  ])
    phono("Carrowain", `WQ ${n}ph`, y, g, false);
  for (const [n, y, g] of [
    [1, 1982, 0.25],
    [2, 1984, 0.4],
    [3, 1987, 0.55],
  ])
    phono("Vantrell", `Velt Ph${n}`, y, g, false);
  for (const [i, y, g, input] of [
    [0, 1984, 0.6, "MM"],
    [1, 1989, 0.75, "MC"],
    [2, 1987, 0.8, "MM/MC"],
    [3, 1991, 0.95, "MC"],
  ] as const)
    phono("Calvorne", `Tellis Phono ${ROMAN[i]} ${input}`, y, g, input !== "MM");
  return out;
}

function transports(): ScaleModel[] {
  const out: ScaleModel[] = [];
  // Quorvane: Orrel and the number spelled out; the direct-drive models say so.
  SPELLED.forEach((n, i) => {
    const grade = i / 8;
    const direct = i % 3 === 1 || i >= 7;
    const suffix = i === 8 ? " Reference" : direct ? " Direct" : "";
    out.push({
      category: "turntable",
      maker: "Quorvane",
      model: `Orrel ${n}${suffix}`,
      year: 1974 + i,
      priceEur: Math.round((140 + grade * 1100 + (direct ? 120 : 0)) / 10) * 10,
      weightKg: Math.round((6 + grade * 9) * 10) / 10,
      box: [54, 44, 22],
      popularity: 1.3 - grade,
      type: {
        wowFlutterPct: Number((0.12 - grade * 0.09 - (direct ? 0.01 : 0)).toFixed(3)),
        rumbleDb: Math.round(60 + grade * 15 + (direct ? 3 : 0)),
        direct,
      },
    });
  });
  // Pellquist: "XQ/" and two digits for cassette decks, "XQ/R" and a digit for open reel.
  for (const [n, y, g, heads] of [
    [20, 1978, 0.15, ""],
    [30, 1980, 0.3, ""],
    [41, 1981, 0.35, ""],
    [55, 1983, 0.6, " Three-Head"],
    [65, 1985, 0.65, ""],
    [70, 1987, 0.8, " Three-Head"],
  ] as const)
    out.push({
      category: "tape_deck",
      maker: "Pellquist",
      model: `XQ/${n}${heads}`,
      year: y,
      priceEur: Math.round((90 + g * 800) / 10) * 10,
      weightKg: Math.round((5 + g * 4) * 10) / 10,
      box: [50, 38, 20],
      popularity: 1.3 - g,
      type: {
        wowFlutterPct: Number((0.14 - g * 0.1).toFixed(3)),
        snrDb: Math.round(56 + g * 10),
        f3HighHz: (14 + Math.round(g * 7)) * 1000,
        tapeSpeedCmS: 4.76,
      },
    });
  for (const [n, y, g] of [
    [1, 1977, 0.7],
    [2, 1975, 0.75],
    [4, 1980, 0.9],
  ])
    out.push({
      category: "tape_deck",
      maker: "Pellquist",
      model: `XQ/R${n} Reel-to-Reel`,
      year: y,
      priceEur: Math.round((900 + g * 1200) / 10) * 10,
      weightKg: Math.round((20 + g * 8) * 10) / 10,
      box: [60, 50, 36],
      popularity: 0.25,
      type: {
        wowFlutterPct: Number((0.08 - g * 0.05).toFixed(3)),
        snrDb: Math.round(60 + g * 8),
        f3HighHz: (22 + Math.round(g * 8)) * 1000,
        tapeSpeedCmS: 19.05,
      },
    });
  return out;
}

function loudspeakers(): ScaleModel[] {
  const out: ScaleModel[] = [];
  // Hexlund: the cabinet's volume in litres.
  for (const [l, y, tower] of [
    [12, 1979, false],
    [20, 1982, false],
    [28, 1980, false],
    [40, 1983, false],
    [64, 1984, false],
    [75, 1986, true],
    [90, 1987, true],
  ] as const) {
    const kg = Math.round(6 + l * 0.75);
    out.push({
      category: "loudspeaker",
      maker: "Hexlund",
      model: `${l}L${tower ? " Tower" : ""} (pair)`,
      year: y,
      priceEur: Math.round((120 + l * 14) / 10) * 10,
      weightKg: kg,
      box: tower ? [110, 45, 45] : [Math.round(40 + l * 0.5), 40, Math.round(35 + l * 0.4)],
      popularity: 1 / Math.sqrt(l / 12),
      type: {
        ratedOhm: 8,
        minOhm: Number((6.95 - l * 0.005).toFixed(1)),
        minAtHz: Math.round(200 - l),
        sensitivityDb: Math.round(85 + l * 0.06),
        f3LowHz: Math.round(70 - l * 0.4),
      },
    });
  }
  // Brisvale: bass driver in cm over the nominal impedance.
  for (const [cm, y, monitor] of [
    [10, 1978, false],
    [16, 1980, false],
    [22, 1981, false],
    [30, 1983, false],
    [30, 1985, true],
    [40, 1986, true],
  ] as const) {
    const kg = Math.round(5 + cm * 1.1 + (monitor ? 8 : 0));
    out.push({
      category: "loudspeaker",
      maker: "Brisvale",
      model: `${cm}/8${monitor ? " Monitor" : ""} (pair)`,
      year: y,
      priceEur: Math.round((90 + cm * 22 + (monitor ? 300 : 0)) / 10) * 10,
      weightKg: kg,
      box: [Math.round(40 + cm), 42, Math.round(36 + cm * 0.8)],
      popularity: 1 / Math.sqrt(cm / 10),
      type: {
        ratedOhm: 8,
        minOhm: Number((7.0 - cm * 0.01).toFixed(1)),
        minAtHz: Math.round(220 - cm * 2),
        sensitivityDb: Math.round(86 + cm * 0.15 + (monitor ? 2 : 0)),
        f3LowHz: Math.round(75 - cm * 1.1),
      },
    });
  }
  return out;
}

export const SCALE_MODELS: ScaleModel[] = [...amplifiers(), ...lineStages(), ...transports(), ...loudspeakers()];
