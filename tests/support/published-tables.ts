// Values transcribed from published tables, for tests that must not compare the bench with itself.
// Each table names its source; docs/references.md §1–§2 says how sure each value is.

/**
 * RIAA playback (de-emphasis) response, dB re 1 kHz, IEC 60098 (time constants 3180, 318 and 75 µs),
 * at the frequencies the published RIAA tables print, rounded to 0.01 dB as printed.
 */
export const RIAA_PLAYBACK_TABLE: readonly (readonly [hz: number, db: number])[] = [
  [20, 19.27],
  [50, 16.95],
  [100, 13.09],
  [500, 2.65],
  [1000, 0],
  [2000, -2.59],
  [5000, -8.21],
  [10000, -13.73],
  [20000, -19.62],
];

/**
 * The same curve with the IEC amendment's 7950 µs playback pole, dB re 1 kHz (IEC 60098 amendment),
 * below 1 kHz; above 1 kHz the pole moves the curve by under 0.003 dB, so the plain table stands.
 */
export const RIAA_IEC_TABLE: readonly (readonly [hz: number, db: number])[] = [
  [10, 12.75],
  [20, 16.26],
  [30, 17.0],
  [50, 16.3],
  [100, 12.92],
  [500, 2.64],
  ...RIAA_PLAYBACK_TABLE.filter(([f]) => f >= 1000),
];

/**
 * IEC 61672-1:2013 Table 3: nominal frequency, A-weighting (dB) and the class 1 acceptance limits
 * (dB above and below the nominal value; −Infinity where the table has no lower limit).
 */
export const A_WEIGHTING_TABLE_3: readonly (readonly [hz: number, db: number, plus: number, minus: number])[] = [
  [31.5, -39.4, 1.5, 1.5],
  [63, -26.2, 1.0, 1.0],
  [100, -19.1, 1.0, 1.0],
  [125, -16.1, 1.0, 1.0],
  [250, -8.6, 1.0, 1.0],
  [500, -3.2, 1.0, 1.0],
  [1000, 0.0, 0.7, 0.7],
  [2000, 1.2, 1.0, 1.0],
  [4000, 1.0, 1.0, 1.0],
  [8000, -1.1, 1.5, 2.5],
  [10000, -2.5, 2.0, 3.0],
  [16000, -6.6, 2.5, 16],
  [20000, -9.3, 3.0, Infinity],
];

/** A sweep typed from a table, shifted by `offsetDb` (the stage's gain) and bent by `tiltDb`. */
export function sweepFromTable(
  table: readonly (readonly [number, number])[],
  o: { offsetDb?: number; tiltDb?: (f: number) => number } = {},
): { frequencyHz: number; levelDb: number }[] {
  return table.map(([f, db]) => ({ frequencyHz: f, levelDb: (o.offsetDb ?? 0) + db + (o.tiltDb?.(f) ?? 0) }));
}
