/**
 * Published copper-conductor tables, as data. No computation lives here; see cable.ts.
 *
 * Sizes run from the smallest conductor to the largest. "1/0" and "2/0" are the
 * AWG sizes above 1 (gauge numbers 0 and -1 in the ASTM B258 formula).
 */

export const AWG_SIZES = ["16", "14", "12", "10", "8", "6", "4", "2", "1/0", "2/0"] as const;

export type Awg = (typeof AWG_SIZES)[number];

export interface ConductorProperties {
  /** Cross-section area in circular mils. */
  circularMils: number;
  /** DC resistance, ohms per 1000 ft, at 75 °C. */
  ohmsPerKft: number;
}

/**
 * NEC (NFPA 70) Chapter 9, Table 8, conductor properties: uncoated copper, stranded,
 * DC resistance in ohms per 1000 ft at 75 °C.
 *
 * These are AWG areas. Marine (SAE-sized) cable carries less copper than the
 * AWG area for the same gauge number, so a size chosen against this table is an AWG size.
 */
export const NEC_CH9_TABLE8: Readonly<Record<Awg, ConductorProperties>> = {
  "16": { circularMils: 2_580, ohmsPerKft: 4.99 },
  "14": { circularMils: 4_110, ohmsPerKft: 3.14 },
  "12": { circularMils: 6_530, ohmsPerKft: 1.98 },
  "10": { circularMils: 10_380, ohmsPerKft: 1.24 },
  "8": { circularMils: 16_510, ohmsPerKft: 0.778 },
  "6": { circularMils: 26_240, ohmsPerKft: 0.491 },
  "4": { circularMils: 41_740, ohmsPerKft: 0.308 },
  "2": { circularMils: 66_360, ohmsPerKft: 0.194 },
  "1/0": { circularMils: 105_600, ohmsPerKft: 0.122 },
  "2/0": { circularMils: 133_100, ohmsPerKft: 0.0967 },
};

export type InsulationRatingC = 60 | 75 | 90 | 105;

export const INSULATION_RATINGS_C: readonly InsulationRatingC[] = [60, 75, 90, 105];

export interface AmpacityRow {
  /** Outside engine spaces, by the conductor's insulation temperature rating. */
  outside: Readonly<Record<InsulationRatingC, number>>;
  /** Inside engine spaces, 105 °C insulation. */
  engineSpace105: number;
}

/**
 * 33 CFR 183.425, Table 5: allowable amperage of conductors (amps), by insulation
 * temperature rating outside engine spaces, and for 105 °C insulation inside engine spaces.
 */
export const CFR_183_425_TABLE5: Readonly<Record<Awg, AmpacityRow>> = {
  "16": { outside: { 60: 15, 75: 15, 90: 25, 105: 25 }, engineSpace105: 21 },
  "14": { outside: { 60: 20, 75: 20, 90: 30, 105: 35 }, engineSpace105: 30 },
  "12": { outside: { 60: 25, 75: 25, 90: 40, 105: 45 }, engineSpace105: 38 },
  "10": { outside: { 60: 40, 75: 40, 90: 55, 105: 60 }, engineSpace105: 51 },
  "8": { outside: { 60: 55, 75: 65, 90: 70, 105: 80 }, engineSpace105: 68 },
  "6": { outside: { 60: 80, 75: 95, 90: 100, 105: 120 }, engineSpace105: 102 },
  "4": { outside: { 60: 105, 75: 125, 90: 135, 105: 160 }, engineSpace105: 136 },
  "2": { outside: { 60: 140, 75: 170, 90: 180, 105: 210 }, engineSpace105: 178 },
  "1/0": { outside: { 60: 195, 75: 230, 90: 245, 105: 285 }, engineSpace105: 242 },
  "2/0": { outside: { 60: 225, 75: 265, 90: 285, 105: 330 }, engineSpace105: 280 },
};

/** Allowed voltage drop, percent of system voltage (ABYC E-11, as widely reproduced). */
export type AllowedDropPct = 3 | 10;

/** Which loads take which allowed drop (ABYC E-11, as widely reproduced). */
export const DROP_CATEGORIES: Readonly<Record<AllowedDropPct, string>> = {
  3: "Main feeders to a panelboard, bilge blowers, electronics and navigation lights",
  10: "Other lighting and non-critical loads",
};
