/**
 * A boat's weight ledger in the product's canonical units (kg, mm), and the words it is shown in.
 *
 * The computation lives in stability.ts (pounds, inches, feet, as naval architecture and members
 * aboard use them); this module converts the stored figures to those units and back, and says the
 * results in words: port and starboard, never a sign.
 */
import {
  heelSide,
  ledgerCondition,
  levelByAdding,
  levelByMoving,
  trimSense,
  whatIfMove,
  type BoatParticulars,
  type LedgerCondition,
  type LedgerItem,
  type WhatIfResult,
} from "./stability";
import {
  formatLength,
  formatWeight,
  inchesToMm,
  kgToPounds,
  MM_PER_FOOT,
  mmToInches,
  poundsToKg,
  type LengthUnit,
  type WeightUnit,
} from "./units";

/** The class particulars as stored (kg, mm; MCT1 in the trade's ft·lb per inch). */
export interface ClassFigures {
  lightDisplacementKg: number;
  gmMm: number;
  lwlMm: number;
  beamMm: number;
  loaMm: number;
  lcfAftOfBowMm: number;
  waterlineForwardEndMm: number;
  gmLongitudinalMm: number | null;
  mct1FtLbPerIn: number | null;
  demo: boolean;
}

/** One entry of the ledger as stored. */
export interface LedgerEntry {
  id: string;
  name: string;
  weightKg: number;
  aftOfBowMm: number;
  /** + starboard, − port. */
  offCentreMm: number;
  heightMm: number | null;
}

export type Side = "port" | "starboard" | "centre";

export const FT_LB_TO_KG_M = 0.3048 * 0.45359237; // exact by definition (NIST HB 44 App. C)

export function weightUnitFor(unit: LengthUnit): WeightUnit {
  return unit === "mm" ? "kg" : "lb";
}

export function toStabilityParticulars(c: ClassFigures, gmMm: number = c.gmMm): BoatParticulars {
  return {
    lightDisplacementLb: kgToPounds(c.lightDisplacementKg),
    gmFt: gmMm / MM_PER_FOOT,
    lwlFt: c.lwlMm / MM_PER_FOOT,
    lcfAftOfBowIn: mmToInches(c.lcfAftOfBowMm),
    waterlineForwardEndAftOfBowIn: mmToInches(c.waterlineForwardEndMm),
    gmLongitudinalFt: c.gmLongitudinalMm === null ? undefined : c.gmLongitudinalMm / MM_PER_FOOT,
    mct1FtLbPerIn: c.mct1FtLbPerIn ?? undefined,
    beamFt: c.beamMm / MM_PER_FOOT,
  };
}

export function toStabilityItem(e: LedgerEntry): LedgerItem {
  return {
    id: e.id,
    name: e.name,
    weightLb: kgToPounds(e.weightKg),
    aftOfBowIn: mmToInches(e.aftOfBowMm),
    offCentreIn: mmToInches(e.offCentreMm),
    heightIn: e.heightMm === null ? undefined : mmToInches(e.heightMm),
  };
}

export function toStabilityItems(entries: readonly LedgerEntry[]): LedgerItem[] {
  return entries.map(toStabilityItem);
}

/** Heel and trim of the boat with its ledger (GM: the boat's calibration when given, else the class's). */
export function boatCondition(c: ClassFigures, entries: readonly LedgerEntry[], gmMm?: number | null): LedgerCondition {
  return ledgerCondition(toStabilityParticulars(c, gmMm ?? c.gmMm), toStabilityItems(entries));
}

export interface Position {
  aftOfBowMm: number;
  offCentreMm: number;
  heightMm: number | null;
}

/** Move one entry to a new position and compare (see stability.whatIfMove). */
export function boatWhatIf(
  c: ClassFigures,
  entries: readonly LedgerEntry[],
  entryId: string,
  to: Position,
  gmMm?: number | null,
): WhatIfResult {
  return whatIfMove(toStabilityParticulars(c, gmMm ?? c.gmMm), toStabilityItems(entries), entryId, {
    aftOfBowIn: mmToInches(to.aftOfBowMm),
    offCentreIn: mmToInches(to.offCentreMm),
    heightIn: to.heightMm === null ? undefined : mmToInches(to.heightMm),
  });
}

export interface LevelByMovingPlan {
  entryId: string;
  name: string;
  weightKg: number;
  /** Signed athwartships shift, mm, + to starboard. */
  shiftMm: number;
  /** The offset that brings the heel to zero, mm, + starboard. */
  newOffCentreMm: number;
  /** False when that offset is outside the half-beam: this item alone cannot level her. */
  withinBeam: boolean;
}

/** For every entry: how far it must move athwartships, alone, to bring the heel to zero. */
export function levelPlans(c: ClassFigures, entries: readonly LedgerEntry[]): LevelByMovingPlan[] {
  const particulars = toStabilityParticulars(c);
  const items = toStabilityItems(entries);
  return entries.map((e) => {
    const plan = levelByMoving(particulars, items, e.id);
    return {
      entryId: e.id,
      name: e.name,
      weightKg: e.weightKg,
      shiftMm: inchesToMm(plan.shiftIn),
      newOffCentreMm: inchesToMm(plan.newOffCentreIn),
      withinBeam: plan.withinBeam !== false,
    };
  });
}

/** Weight (kg) to add at a signed offset (mm, + starboard) that brings the heel to zero; null when none can. */
export function weightToLevelAt(entries: readonly LedgerEntry[], offCentreMm: number): number | null {
  const lb = levelByAdding(toStabilityItems(entries), mmToInches(offCentreMm));
  return lb === null ? null : poundsToKg(lb);
}

// ---------------------------------------------------------------------------------------------
// Words.

export function sideOf(offCentreMm: number): Side {
  if (Math.abs(offCentreMm) < 0.5) return "centre";
  return offCentreMm > 0 ? "starboard" : "port";
}

/** "25 in to starboard", "635 mm to port", "on the centreline". */
export function describeOffset(offCentreMm: number, unit: LengthUnit): string {
  const side = sideOf(offCentreMm);
  if (side === "centre") return "on the centreline";
  return `${formatLength(Math.abs(offCentreMm), unit)} to ${side}`;
}

/** "51 in to port", for a move across. */
export function describeShift(shiftMm: number, unit: LengthUnit): string {
  return describeOffset(shiftMm, unit).replace("on the centreline", "no move needed");
}

/** Degrees to two decimals below 1°, one decimal above: "0.75°", "1.5°". */
export function formatDegrees(deg: number): string {
  const a = Math.abs(deg);
  return `${a < 1 ? a.toFixed(2) : a.toFixed(1)}°`;
}

/** "upright", "1.5° to starboard" (the starboard side down), "0.75° to port". */
export function describeHeel(heelDeg: number): string {
  const side = heelSide(heelDeg);
  if (side === "upright" || formatDegrees(heelDeg) === "0.00°") return "upright";
  return `${formatDegrees(heelDeg)} to ${side}`;
}

/** "7/16 in by the stern", "11 mm by the bow", "level". */
export function describeTrim(trimIn: number, unit: LengthUnit): string {
  const text = formatLength(Math.abs(inchesToMm(trimIn)), unit, { denominator: 32 });
  const sense = trimSense(trimIn);
  if (sense === "level" || text === "0 in" || text === "0 mm") return "level";
  return `${text} ${sense}`;
}

/** A draft change at one end: "7/16 in deeper", "3 mm higher", "no change". */
export function describeDraftChange(changeIn: number, unit: LengthUnit): string {
  const text = formatLength(Math.abs(inchesToMm(changeIn)), unit, { denominator: 32 });
  if (text === "0 in" || text === "0 mm") return "no change";
  return `${text} ${changeIn > 0 ? "deeper" : "higher"}`;
}

/** GM in feet (two decimals) or metres (three): "2.80 ft", "0.853 m". */
export function formatGm(gmMm: number, unit: LengthUnit): string {
  return unit === "mm" ? `${(gmMm / 1000).toFixed(3)} m` : `${(gmMm / MM_PER_FOOT).toFixed(2)} ft`;
}

/** A moment from ft·lb: "212.7 ft·lb" or "29.4 kg·m". */
export function formatMoment(ftLb: number, unit: LengthUnit): string {
  return unit === "mm" ? `${Math.abs(ftLb * FT_LB_TO_KG_M).toFixed(1)} kg·m` : `${Math.abs(ftLb).toFixed(1)} ft·lb`;
}

/** MCT1: "446 ft·lb per inch" or "24.3 kg·m per cm". */
export function formatMct1(ftLbPerIn: number, unit: LengthUnit): string {
  return unit === "mm"
    ? `${((ftLbPerIn * FT_LB_TO_KG_M) / 2.54).toFixed(1)} kg·m per cm`
    : `${ftLbPerIn.toFixed(0)} ft·lb per inch`;
}

export function formatPounds(lb: number, unit: LengthUnit): string {
  return formatWeight(poundsToKg(lb), weightUnitFor(unit));
}

/** Where an entry sits, in words: "135 in aft of the bow, 25 in to starboard, 18 in up". */
export function describePosition(p: Position, unit: LengthUnit): string {
  const parts = [`${formatLength(p.aftOfBowMm, unit)} aft of the bow`, describeOffset(p.offCentreMm, unit)];
  if (p.heightMm !== null) parts.push(`${formatLength(p.heightMm, unit)} up`);
  return parts.join(", ");
}
