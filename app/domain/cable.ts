/**
 * Conductor size for a DC cable run: by allowed voltage drop and by ampacity.
 *
 * Units: current in amps, lengths in feet, areas in circular mils, resistance in ohms.
 * The run length a member enters is one way (source to load); the drop is computed on the
 * round trip (out on the positive, back on the negative), twice the one-way length.
 *
 * Every size here is an AWG size, chosen against the AWG areas of NEC Chapter 9 Table 8.
 * Marine (SAE-sized) cable has less copper than the AWG area for the same gauge number.
 *
 * These are estimates to plan a job with. The installation follows ABYC E-11 and, when in
 * doubt, a qualified marine electrician.
 */
import {
  AWG_SIZES,
  CFR_183_425_TABLE5,
  NEC_CH9_TABLE8,
  type AllowedDropPct,
  type Awg,
  type InsulationRatingC,
} from "./conductors";

/** ABYC E-11 (as widely reproduced): K for copper in CM = K·I·L/E. */
export const K_COPPER = 10.75;

/** Overcurrent device at most 150 % of the conductor's Table 5 ampacity (33 CFR 183.455(c), under 50 V). */
export const MAX_OVERCURRENT_FACTOR = 1.5;

/** Copper resistivity at 20 °C, ohm·cmil/ft, for the ASTM B258 resistance estimate. */
export const COPPER_RESISTIVITY_20C_OHM_CMIL_PER_FT = 10.371;

export type SystemVoltage = 12 | 24;

export interface CableRunInput {
  currentA: number;
  /** Source to load, feet. The drop is computed on twice this length. */
  oneWayLengthFt: number;
  systemVoltage: SystemVoltage;
  allowedDropPct: AllowedDropPct;
  insulationRatingC: InsulationRatingC;
  inEngineSpace: boolean;
}

export type DropMethod = "area" | "resistance";
export type Criterion = "voltage drop" | "ampacity";

export interface CableRunSizes {
  /** Smallest AWG whose Table 8 area ≥ the required circular mils, or null if none listed is. */
  byArea: Awg | null;
  /** Smallest AWG whose Table 8 resistance keeps the drop within the allowance, or null. */
  byResistance: Awg | null;
  /** Smallest AWG whose Table 5 ampacity ≥ the current, or null. */
  byAmpacity: Awg | null;
}

export interface CableRunResult {
  ok: true;
  roundTripFt: number;
  allowedDropV: number;
  /** CM = K·I·L/E, L the round trip. */
  requiredCircularMils: number;
  sizes: CableRunSizes;
  /** The larger of the two voltage-drop sizes. */
  dropSize: Awg;
  /** The drop method that gave the larger conductor ("both" when they agree). */
  dropGovernedBy: DropMethod | "both";
  ampacitySize: Awg;
  /** The larger of the drop size and the ampacity size. */
  chosen: Awg;
  /** The criterion that gave the chosen conductor ("both" when they agree). */
  governedBy: Criterion | "both";
  chosenCircularMils: number;
  chosenOhmsPerKft: number;
  /** Table 5 ampacity of the chosen conductor in the column used. */
  chosenAmpacityA: number;
  ampacityColumn: string;
  actualDropV: number;
  actualDropPct: number;
  /** Largest fuse or breaker rating allowed for the chosen conductor, amps. */
  maxOvercurrentA: number;
  sizedAgainst: string;
  cautions: string[];
}

export type CableRunFailureReason = "invalid-input" | "engine-space-rating" | "nothing-large-enough";

export interface CableRunFailure {
  ok: false;
  reason: CableRunFailureReason;
  message: string;
  /** Filled in where the computation got that far. */
  requiredCircularMils?: number;
  sizes?: CableRunSizes;
  cautions: string[];
}

export const SIZED_AGAINST =
  "AWG conductor areas and resistances (NEC Chapter 9, Table 8, stranded uncoated copper, 75 °C). " +
  "Marine SAE-sized cable has less copper than the AWG area for the same gauge number: " +
  "check the cable's marked area, and go up a size if it falls short.";

export const CABLE_CAUTIONS: readonly string[] = [
  // 33 CFR 183.455
  "Put the fuse or breaker at the source: within 7 in of the connection, or within 40 in if the conductor is in a sheath (33 CFR 183.455).",
  // ABYC E-11 as reproduced; exact wording from memory (memory)
  "ABYC E-11 allows up to 72 in for a sheathed conductor connected directly to a battery terminal; confirm the distance against the current edition.",
  // 33 CFR 183.455(c) for the ceiling; a rating near the load's draw is common practice.
  "The fuse or breaker rating may not exceed 150 % of the conductor's ampacity (33 CFR 183.455(c), circuits under 50 V): that ceiling protects the cable, it is not the fuse to fit. " +
    "Pick a standard rating at or just above what the load draws, or the one the equipment's maker calls for (common practice), and never above the maximum shown.",
  // 33 CFR 183.420, 183.445(b)
  "Secure the battery so that it cannot move more than 1 in when pulled with 90 lb or twice its weight, whichever is less (33 CFR 183.420); vent its hydrogen; cover its terminals (33 CFR 183.445(b)).",
  "These sizes are estimates for planning. Follow ABYC E-11 and have the installation checked by a qualified marine electrician.",
];

const ENGINE_SPACE_COLUMN = "105 °C insulation, inside engine spaces (33 CFR 183.425 Table 5)";

function ampacityColumnLabel(rating: InsulationRatingC, inEngineSpace: boolean): string {
  return inEngineSpace
    ? ENGINE_SPACE_COLUMN
    : `${rating} °C insulation, outside engine spaces (33 CFR 183.425 Table 5)`;
}

/**
 * Table 5 ampacity of one conductor in the applicable column, or null when the column is not
 * supported: inside engine spaces only the 105 °C column is supported, because the regulation
 * derives the other engine-space values with correction factors this product does not carry.
 */
export function tableAmpacity(awg: Awg, rating: InsulationRatingC, inEngineSpace: boolean): number | null {
  const row = CFR_183_425_TABLE5[awg];
  if (inEngineSpace) return rating === 105 ? row.engineSpace105 : null;
  return row.outside[rating];
}

/** CM = K·I·L/E, L the round-trip length in ft, E the allowed drop in volts (ABYC E-11). */
export function requiredCircularMils(currentA: number, roundTripFt: number, allowedDropV: number): number {
  return (K_COPPER * currentA * roundTripFt) / allowedDropV;
}

/** Voltage drop on a round trip of roundTripFt through a conductor of ohmsPerKft. */
export function dropVolts(currentA: number, roundTripFt: number, ohmsPerKft: number): number {
  return (currentA * ohmsPerKft * roundTripFt) / 1000;
}

function smallestWhere(test: (awg: Awg) => boolean): Awg | null {
  return AWG_SIZES.find(test) ?? null;
}

/** The larger conductor of two (AWG numbers run backwards). */
export function largerConductor(a: Awg, b: Awg): Awg {
  return AWG_SIZES.indexOf(a) >= AWG_SIZES.indexOf(b) ? a : b;
}

function governing<T extends string>(a: Awg, b: Awg, nameA: T, nameB: T): T | "both" {
  if (a === b) return "both";
  return largerConductor(a, b) === a ? nameA : nameB;
}

export function sizeCableRun(input: CableRunInput): CableRunResult | CableRunFailure {
  const { currentA, oneWayLengthFt, systemVoltage, allowedDropPct, insulationRatingC, inEngineSpace } = input;
  const cautions = [...CABLE_CAUTIONS];

  if (!(Number.isFinite(currentA) && currentA > 0) || !(Number.isFinite(oneWayLengthFt) && oneWayLengthFt > 0)) {
    return { ok: false, reason: "invalid-input", message: "Current and run length must be positive numbers.", cautions };
  }
  if (inEngineSpace && insulationRatingC !== 105) {
    return {
      ok: false,
      reason: "engine-space-rating",
      message:
        `Inside an engine space this tool sizes only 105 °C insulated conductors (33 CFR 183.425 Table 5). ` +
        `For ${insulationRatingC} °C insulation the regulation applies an engine-space correction that this tool does not carry: ` +
        `use 105 °C rated cable, or consult ABYC E-11 and a qualified marine electrician.`,
      cautions,
    };
  }

  const roundTripFt = 2 * oneWayLengthFt;
  const allowedDropV = (systemVoltage * allowedDropPct) / 100;
  const cm = requiredCircularMils(currentA, roundTripFt, allowedDropV);

  const sizes: CableRunSizes = {
    byArea: smallestWhere((awg) => NEC_CH9_TABLE8[awg].circularMils >= cm),
    byResistance: smallestWhere((awg) => dropVolts(currentA, roundTripFt, NEC_CH9_TABLE8[awg].ohmsPerKft) <= allowedDropV),
    byAmpacity: smallestWhere((awg) => (tableAmpacity(awg, insulationRatingC, inEngineSpace) ?? 0) >= currentA),
  };

  const { byArea, byResistance, byAmpacity } = sizes;
  if (byArea === null || byResistance === null || byAmpacity === null) {
    const largest = AWG_SIZES[AWG_SIZES.length - 1];
    const short: string[] = [];
    if (byArea === null || byResistance === null) short.push(`the ${allowedDropPct} % voltage drop`);
    if (byAmpacity === null) short.push(`${currentA} A of ampacity`);
    return {
      ok: false,
      reason: "nothing-large-enough",
      message:
        `No conductor up to ${largest} AWG meets ${short.join(" and ")} on this run. ` +
        `Shorten the run, raise the system voltage, split the load, or ask a qualified marine electrician.`,
      requiredCircularMils: cm,
      sizes,
      cautions,
    };
  }

  const dropSize = largerConductor(byArea, byResistance);
  const chosen = largerConductor(dropSize, byAmpacity);
  const props = NEC_CH9_TABLE8[chosen];
  // Non-null: byAmpacity was found in this same column, so the column is supported.
  const chosenAmpacityA = tableAmpacity(chosen, insulationRatingC, inEngineSpace) as number;
  const actualDropV = dropVolts(currentA, roundTripFt, props.ohmsPerKft);

  return {
    ok: true,
    roundTripFt,
    allowedDropV,
    requiredCircularMils: cm,
    sizes,
    dropSize,
    dropGovernedBy: governing(byArea, byResistance, "area", "resistance"),
    ampacitySize: byAmpacity,
    chosen,
    governedBy: governing(dropSize, byAmpacity, "voltage drop", "ampacity"),
    chosenCircularMils: props.circularMils,
    chosenOhmsPerKft: props.ohmsPerKft,
    chosenAmpacityA,
    ampacityColumn: ampacityColumnLabel(insulationRatingC, inEngineSpace),
    actualDropV,
    actualDropPct: (actualDropV / systemVoltage) * 100,
    maxOvercurrentA: MAX_OVERCURRENT_FACTOR * chosenAmpacityA,
    sizedAgainst: SIZED_AGAINST,
    cautions,
  };
}

// ---------------------------------------------------------------------------------------
// ASTM B258: AWG diameters from the gauge number, and resistance from resistivity.

/** Gauge number n for the ASTM B258 formula: "1/0" → 0, "2/0" → -1, "3/0" → -2, "4/0" → -3. */
export function awgGaugeNumber(awg: string): number {
  const aught = /^([1-4])\/0$/.exec(awg);
  if (aught) return 1 - Number(aught[1]);
  const n = Number(awg);
  if (!Number.isInteger(n) || n < 1 || n > 40) throw new RangeError(`Not an AWG size: ${awg}`);
  return n;
}

/** ASTM B258: d = 0.005 in × 92^((36 − n)/39), in inches. */
export function awgDiameterIn(awg: string): number {
  const n = awgGaugeNumber(awg);
  return 0.005 * 92 ** ((36 - n) / 39);
}

/** Area of a solid round conductor of the ASTM B258 diameter, circular mils (d in mils, squared). */
export function awgCircularMils(awg: string): number {
  const mils = awgDiameterIn(awg) * 1000;
  return mils * mils;
}

/** Resistance at 20 °C from copper resistivity 10.371 ohm·cmil/ft, ohms per 1000 ft. */
export function awgOhmsPerKft20C(awg: string): number {
  return (COPPER_RESISTIVITY_20C_OHM_CMIL_PER_FT / awgCircularMils(awg)) * 1000;
}
