/**
 * The numbers of a calculation attached to a write-up, worked out from its stored input
 * (app/domain/calculations.ts reads and checks that input with zod). Nothing here imports zod, so
 * the pages that only show the numbers do not carry the schemas in their script.
 */
import { sizeCableRun, type CableRunFailure, type CableRunResult } from "./cable";
import type { CableRunStored, WeightMoveInput } from "./calculations";
import { boatWhatIf, type ClassFigures, type LedgerEntry, type Position } from "./ledger";
import type { WhatIfResult } from "./stability";
import { MM_PER_FOOT } from "./units";

export interface WeightMoveComputed extends WhatIfResult {
  item: LedgerEntry;
  from: Position;
  to: Position;
  /** Distance moved across, mm, + to starboard; and fore and aft, + aft. */
  acrossMm: number;
  foreAftMm: number;
}

export function computeWeightMove(input: WeightMoveInput): WeightMoveComputed {
  const particulars = input.particulars as ClassFigures;
  const items = input.items as LedgerEntry[];
  const item = items.find((i) => i.id === input.moved) as LedgerEntry;
  const to: Position = { aftOfBowMm: input.to.aftOfBowMm, offCentreMm: input.to.offCentreMm, heightMm: input.to.heightMm ?? item.heightMm };
  const result = boatWhatIf(particulars, items, input.moved, to, input.gmMm);
  return {
    ...result,
    item,
    from: { aftOfBowMm: item.aftOfBowMm, offCentreMm: item.offCentreMm, heightMm: item.heightMm },
    to,
    acrossMm: to.offCentreMm - item.offCentreMm,
    foreAftMm: to.aftOfBowMm - item.aftOfBowMm,
  };
}

export function toCableRunInput(input: CableRunStored) {
  return {
    currentA: input.currentA,
    oneWayLengthFt: input.oneWayLengthMm / MM_PER_FOOT,
    systemVoltage: input.systemVoltage,
    allowedDropPct: input.allowedDropPct,
    insulationRatingC: input.insulationRatingC as 60 | 75 | 90 | 105,
    inEngineSpace: input.inEngineSpace,
  };
}

export function computeCableRun(input: CableRunStored): CableRunResult | CableRunFailure {
  return sizeCableRun(toCableRunInput(input));
}
