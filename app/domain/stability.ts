/**
 * Heel and trim from a ledger of weights: initial stability only.
 *
 * Two layers:
 *
 * 1. Core relations, unit-agnostic. Weights in any one unit (lb, long tons, tonnes) and
 *    distances in feet. Heel and GM calibration are pure ratios and work in any length unit
 *    used consistently; the trim relations carry the 12 of "per inch" and so need feet for
 *    lengths and moments (trim comes out in inches).
 *
 * 2. The ledger, in the product's canonical units: weights in pounds, positions in inches
 *    (as members measure them aboard), GM and waterline length in feet (as designers
 *    publish them). Moments come out in ft·lb, heel in degrees, trim in inches.
 *
 * Sign conventions (internal; the UI shows words):
 *   offCentreIn  + starboard, − port.        heel   + starboard side down, − port side down.
 *   aftOfBowIn   measured aft from the bow.  trim   + by the stern (stern down), − by the bow.
 *   draft change + deeper, − shallower.
 *
 * Displacement: the ledger's displacement is the boat's light displacement plus every
 * ledger weight. The given GM (and GM_L) are used as they stand for that displacement: the
 * small change of G from the added weights' heights is not modelled (it would need KG and KM),
 * except for a what-if move of an item whose height is known (see whatIfMove).
 * Parallel sinkage from added weight is not modelled (it would need pounds per inch immersion).
 *
 * Validity: tan θ = w·d / (Δ·GM) and GZ = GM·sin θ hold for initial stability, at small
 * angles (under about 10 degrees). Every figure is an estimate; the product says so.
 */

/** Beyond this heel the initial-stability relations stop being a fair estimate (common practice). */
export const SMALL_ANGLE_LIMIT_DEG = 10;

export const STABILITY_CAUTIONS: readonly string[] = [
  "These heel and trim figures are estimates from initial-stability relations; they hold only for small angles (under about 10 degrees).",
  "The GM used is a class figure or a member's calibration; a boat's own GM differs with its gear, tanks and crew.",
  "Weight changes change stability. For significant changes to ballast, tankage or rig, consult a naval architect; boats in the US follow the ABYC standards.",
];

const DEG = Math.PI / 180;

export function degToRad(deg: number): number {
  return deg * DEG;
}

export function radToDeg(rad: number): number {
  return rad / DEG;
}

function requirePositive(name: string, value: number): void {
  if (!(Number.isFinite(value) && value > 0)) throw new RangeError(`${name} must be a positive number (got ${value})`);
}

// ---------------------------------------------------------------------------------------
// Core relations (unit-agnostic)

/**
 * Heel from a transverse moment: θ = atan(M / (Δ·GM)), degrees.
 * M and GM in the same length unit; M and Δ in the same weight unit.
 */
export function heelFromMoment(moment: number, displacement: number, gm: number): number {
  requirePositive("displacement", displacement);
  requirePositive("GM", gm);
  return radToDeg(Math.atan(moment / (displacement * gm)));
}

/** The transverse moment that holds a heel: M = Δ·GM·tan θ. */
export function momentForHeel(heelDeg: number, displacement: number, gm: number): number {
  return displacement * gm * Math.tan(degToRad(heelDeg));
}

/** A measured heel: an angle, or a plumb line's deflection over its length (same unit). */
export type HeelObservation = { degrees: number } | { deflection: number; plumbLength: number };

/** tan θ of an observation; for a plumb line tan θ = deflection / length. */
export function tanHeel(heel: HeelObservation): number {
  if ("degrees" in heel) return Math.tan(degToRad(heel.degrees));
  requirePositive("plumb length", heel.plumbLength);
  return heel.deflection / heel.plumbLength;
}

/**
 * GM from an inclining: GM = w·d / (Δ·tan θ) (ASTM F1321).
 * w the weight moved, d the distance moved athwartships, Δ the displacement during the test.
 * The result is in the unit of d.
 */
export function gmFromInclining(input: {
  weight: number;
  distance: number;
  displacement: number;
  heel: HeelObservation;
}): number {
  requirePositive("displacement", input.displacement);
  const tan = tanHeel(input.heel);
  if (tan === 0) throw new RangeError("The measured heel must not be zero");
  return (input.weight * input.distance) / (input.displacement * tan);
}

/** Righting lever at small angles: GZ = GM·sin θ. */
export function gzSmallAngle(gm: number, heelDeg: number): number {
  return gm * Math.sin(degToRad(heelDeg));
}

/** Righting moment at small angles: Δ·GZ. */
export function rightingMoment(displacement: number, gm: number, heelDeg: number): number {
  return displacement * gzSmallAngle(gm, heelDeg);
}

/**
 * Moment to change trim one inch: MCT1 = Δ·GM_L / (12·L).
 * GM_L and L in feet; the result is in (weight unit)·ft per inch of trim.
 */
export function mct1(displacement: number, gmLongitudinalFt: number, lengthFt: number): number {
  requirePositive("displacement", displacement);
  requirePositive("GM_L", gmLongitudinalFt);
  requirePositive("length", lengthFt);
  return (displacement * gmLongitudinalFt) / (12 * lengthFt);
}

/** Change of trim in inches: longitudinal moment (weight·ft) / MCT1 (weight·ft per inch). */
export function trimChangeIn(longitudinalMoment: number, mct1Value: number): number {
  requirePositive("MCT1", mct1Value);
  return longitudinalMoment / mct1Value;
}

/**
 * Split a change of trim into the draft changes at the two ends of the waterline, the boat
 * pivoting about the LCF: change at the bow = trim × (LCF from the forward end) / L, at the
 * stern = trim × (LCF from the aft end) / L. Trim + by the stern: the bow rises, the stern sinks.
 * Draft changes: + deeper. Lengths in any one unit.
 */
export function splitTrim(
  trimIn: number,
  lcfFromForwardEnd: number,
  length: number,
): { bowChangeIn: number; sternChangeIn: number } {
  requirePositive("length", length);
  return {
    bowChangeIn: -(trimIn * lcfFromForwardEnd) / length,
    sternChangeIn: (trimIn * (length - lcfFromForwardEnd)) / length,
  };
}

/** Signed athwartships shift of a weight that cancels a transverse moment: d = −M / w. */
export function shiftToLevel(moment: number, weight: number): number {
  requirePositive("weight", weight);
  return -moment / weight;
}

/**
 * Weight that, placed at a signed offset, cancels a transverse moment: w = −M / y.
 * Null when no positive weight can do it (offset on the side the boat already heels to, or
 * on the centreline).
 */
export function weightToLevel(moment: number, offset: number): number | null {
  if (offset === 0) return null;
  const w = -moment / offset;
  return w > 0 ? w : null;
}

// ---------------------------------------------------------------------------------------
// The ledger (pounds, inches; GM and waterline length in feet)

export interface LedgerItem {
  id: string;
  name?: string;
  weightLb: number;
  /** Position of the item's centre of gravity, inches aft of the bow. */
  aftOfBowIn: number;
  /** Inches off the centreline: + starboard, − port. */
  offCentreIn: number;
  /** Height of the item's centre of gravity above any fixed datum, inches; used for moves. */
  heightIn?: number;
}

export interface BoatParticulars {
  lightDisplacementLb: number;
  /** Transverse metacentric height, ft. */
  gmFt: number;
  /** Waterline length, ft. */
  lwlFt: number;
  /** Longitudinal centre of flotation, inches aft of the bow. */
  lcfAftOfBowIn: number;
  /** Forward end of the waterline, inches aft of the bow (overhang); 0 when not given. */
  waterlineForwardEndAftOfBowIn?: number;
  /** Longitudinal metacentric height, ft; without it (or MCT1) no trim is computed. */
  gmLongitudinalFt?: number;
  /**
   * Moment to change trim one inch, ft·lb per inch, when it is known directly rather than
   * through GM_L; used as it stands, for any displacement. GM_L wins when both are given.
   */
  mct1FtLbPerIn?: number;
  /** Maximum beam, ft; when given, moves are checked against the half-beam. */
  beamFt?: number;
}

export type HeelSide = "starboard" | "port" | "upright";
export type TrimSense = "by the stern" | "by the bow" | "level";

/** Words for a signed heel; within epsilonDeg of zero counts as upright. */
export function heelSide(heelDeg: number, epsilonDeg = 0.005): HeelSide {
  if (Math.abs(heelDeg) < epsilonDeg) return "upright";
  return heelDeg > 0 ? "starboard" : "port";
}

/** Words for a signed trim change; within epsilonIn of zero counts as level. */
export function trimSense(trimIn: number, epsilonIn = 0.005): TrimSense {
  if (Math.abs(trimIn) < epsilonIn) return "level";
  return trimIn > 0 ? "by the stern" : "by the bow";
}

export interface TrimResult {
  /** ft·lb per inch of trim. */
  mct1FtLbPerIn: number;
  /** Inches, + by the stern. */
  changeIn: number;
  sense: TrimSense;
  /** Draft change at the forward end of the waterline, inches, + deeper. */
  bowChangeIn: number;
  /** Draft change at the aft end of the waterline, inches, + deeper. */
  sternChangeIn: number;
}

export interface LedgerCondition {
  displacementLb: number;
  gmFt: number;
  /** Σ w·y, ft·lb, + to starboard. */
  transverseMomentFtLb: number;
  heelDeg: number;
  heelSide: HeelSide;
  /** Σ w·(x − LCF), ft·lb, + aft of the LCF. */
  longitudinalMomentFtLb: number;
  trim: TrimResult | null;
  /** False when the heel passes the small-angle limit and the figure is not to be trusted. */
  withinSmallAngleRange: boolean;
}

export function ledgerDisplacementLb(particulars: BoatParticulars, items: readonly LedgerItem[]): number {
  return items.reduce((sum, item) => sum + item.weightLb, particulars.lightDisplacementLb);
}

/** Σ w·y in ft·lb. */
export function transverseMomentFtLb(items: readonly LedgerItem[]): number {
  return items.reduce((sum, item) => sum + (item.weightLb * item.offCentreIn) / 12, 0);
}

/** Σ w·(x − LCF) in ft·lb, + aft of the LCF. */
export function longitudinalMomentFtLb(items: readonly LedgerItem[], lcfAftOfBowIn: number): number {
  return items.reduce((sum, item) => sum + (item.weightLb * (item.aftOfBowIn - lcfAftOfBowIn)) / 12, 0);
}

/**
 * Heel and trim of the boat with its ledger. gmFt overrides the particulars' GM (a what-if
 * move that raises or lowers a weight passes the corrected GM).
 */
export function ledgerCondition(
  particulars: BoatParticulars,
  items: readonly LedgerItem[],
  gmFt: number = particulars.gmFt,
): LedgerCondition {
  const displacementLb = ledgerDisplacementLb(particulars, items);
  const tMoment = transverseMomentFtLb(items);
  const heelDeg = heelFromMoment(tMoment, displacementLb, gmFt);
  const lMoment = longitudinalMomentFtLb(items, particulars.lcfAftOfBowIn);

  let trim: TrimResult | null = null;
  if (particulars.gmLongitudinalFt !== undefined || particulars.mct1FtLbPerIn !== undefined) {
    const m =
      particulars.gmLongitudinalFt !== undefined
        ? mct1(displacementLb, particulars.gmLongitudinalFt, particulars.lwlFt)
        : (particulars.mct1FtLbPerIn as number);
    const changeIn = trimChangeIn(lMoment, m);
    const lcfFromForwardEndFt = (particulars.lcfAftOfBowIn - (particulars.waterlineForwardEndAftOfBowIn ?? 0)) / 12;
    trim = {
      mct1FtLbPerIn: m,
      changeIn,
      sense: trimSense(changeIn),
      ...splitTrim(changeIn, lcfFromForwardEndFt, particulars.lwlFt),
    };
  }

  return {
    displacementLb,
    gmFt,
    transverseMomentFtLb: tMoment,
    heelDeg,
    heelSide: heelSide(heelDeg),
    longitudinalMomentFtLb: lMoment,
    trim,
    withinSmallAngleRange: Math.abs(heelDeg) <= SMALL_ANGLE_LIMIT_DEG,
  };
}

export type ItemPosition = Partial<Pick<LedgerItem, "aftOfBowIn" | "offCentreIn" | "heightIn">>;

export interface WhatIfResult {
  before: LedgerCondition;
  after: LedgerCondition;
  items: LedgerItem[];
  /** False when the new position is more than half the beam off the centreline; null without a beam. */
  withinBeam: boolean | null;
}

function findItem(items: readonly LedgerItem[], itemId: string): LedgerItem {
  const item = items.find((i) => i.id === itemId);
  if (!item) throw new RangeError(`No ledger item ${itemId}`);
  return item;
}

function withinBeam(particulars: BoatParticulars, offCentreIn: number): boolean | null {
  return particulars.beamFt === undefined ? null : Math.abs(offCentreIn) <= (particulars.beamFt * 12) / 2;
}

/**
 * Move one item to a new position and compare. When the item's old and new heights are both
 * known, the GM after the move is corrected for the rise of G: GM − w·Δh/Δ (the shift of G,
 * GG₁ = w·d/Δ, common practice in any stability text).
 */
export function whatIfMove(
  particulars: BoatParticulars,
  items: readonly LedgerItem[],
  itemId: string,
  to: ItemPosition,
): WhatIfResult {
  const item = findItem(items, itemId);
  const moved: LedgerItem = { ...item, ...to };
  const newItems = items.map((i) => (i.id === itemId ? moved : i));
  const before = ledgerCondition(particulars, items);

  let gmAfter = particulars.gmFt;
  if (item.heightIn !== undefined && moved.heightIn !== undefined) {
    const riseFt = (moved.heightIn - item.heightIn) / 12;
    gmAfter = particulars.gmFt - (item.weightLb * riseFt) / before.displacementLb;
  }

  return {
    before,
    after: ledgerCondition(particulars, newItems, gmAfter),
    items: newItems,
    withinBeam: withinBeam(particulars, moved.offCentreIn),
  };
}

/** How far (signed, inches, + to starboard) one item must move athwartships to bring the heel to zero. */
export function levelByMoving(
  particulars: BoatParticulars,
  items: readonly LedgerItem[],
  itemId: string,
): { shiftIn: number; newOffCentreIn: number; withinBeam: boolean | null } {
  const item = findItem(items, itemId);
  const shiftIn = shiftToLevel(transverseMomentFtLb(items) * 12, item.weightLb);
  const newOffCentreIn = item.offCentreIn + shiftIn;
  return { shiftIn, newOffCentreIn, withinBeam: withinBeam(particulars, newOffCentreIn) };
}

/** Weight (lb) to add at a signed offset (inches) to bring the heel to zero; null when none can. */
export function levelByAdding(items: readonly LedgerItem[], offCentreIn: number): number | null {
  return weightToLevel(transverseMomentFtLb(items) * 12, offCentreIn);
}

/**
 * Calibrate GM (ft) from an inclining aboard: a known weight (lb) moved a known distance
 * athwartships (inches), the displacement during the test (lb), and the heel measured as an
 * angle or as a plumb line's deflection over its length (the two in the same unit).
 */
export function calibrateGm(input: {
  weightLb: number;
  shiftIn: number;
  displacementLb: number;
  heel: HeelObservation;
}): number {
  return gmFromInclining({
    weight: input.weightLb,
    distance: input.shiftIn / 12,
    displacement: input.displacementLb,
    heel: input.heel,
  });
}
