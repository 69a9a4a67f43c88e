/**
 * Battery case sizes by BCI group: the maximum case size, length x width x height, from the
 * BCI (Battery Council International) group size chart, in inches as the chart gives them.
 *
 * Cases vary by maker and sit at or under these maxima. A member should enter the measured
 * case of the battery they have; these sizes are the default when they know only the group.
 */
import { inchesToMm, type Box } from "./units";

export interface BatteryGroup {
  group: string;
  /** Maximum case size, inches, as published. */
  inches: Box;
  /** The same size in millimetres (exact conversion). */
  mm: Box;
}

function group(name: string, length: number, width: number, height: number): BatteryGroup {
  return {
    group: name,
    inches: { length, width, height },
    mm: { length: inchesToMm(length), width: inchesToMm(width), height: inchesToMm(height) },
  };
}

export const BCI_GROUPS: readonly BatteryGroup[] = [
  group("24", 10 + 1 / 4, 6 + 13 / 16, 8 + 7 / 8),
  group("27", 12 + 1 / 16, 6 + 13 / 16, 8 + 7 / 8),
  group("31", 13, 6 + 13 / 16, 9 + 7 / 16),
  group("GC2", 10 + 3 / 8, 7 + 3 / 16, 10 + 5 / 8),
  group("4D", 20 + 3 / 4, 8 + 3 / 4, 9 + 7 / 8),
  group("8D", 20 + 3 / 4, 11 + 1 / 8, 9 + 7 / 8),
];

/** The group by name ("27", "gc2"), or undefined. */
export function bciGroup(name: string): BatteryGroup | undefined {
  const key = name.trim().toUpperCase();
  return BCI_GROUPS.find((g) => g.group === key);
}
