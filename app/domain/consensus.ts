/**
 * Several members measure the same space and disagree by a little. This module turns their
 * measurements of one dimension (millimetres) into a consensus value, a spread, and a list of
 * measurements that sit far from the others and deserve a second look.
 *
 * - consensus: the median. One wild value does not move it, unlike the mean.
 * - spread: largest minus smallest, of every measurement, those flagged included: it is the
 *   largest figure shown above it minus the smallest, so the row agrees with the column, and a
 *   flagged value widens it for all to see (docs/decisions/0002-consensus-and-sections.md).
 * - mad: the median absolute deviation, median(|x_i - median(x)|) (NIST/SEMATECH e-Handbook
 *   of Statistical Methods, section 1.3.5.6, "Measures of Scale").
 *
 * Outlier rule. A measurement is flagged when it is farther from the median than
 *
 *     max(3 × 1.4826 × MAD, 6.35 mm)
 *
 * and only when there are at least 3 measurements (with 2, nothing says which one is off).
 * The first term is the Hampel identifier (Hampel 1974): 1.4826 × MAD estimates the standard
 * deviation of normally distributed values, and 3 of those is the usual cut-off. It is the same
 * construction as the "modified z-score" of Iglewicz & Hoaglin (1993). The floor of 1/4 in
 * (6.35 mm) is common practice: when most members agree to the millimetre the MAD is tiny or
 * zero, and a difference smaller than a quarter inch is ordinary tape-measure disagreement, not
 * a mistake. The comparison allows a millionth of a millimetre for floating-point rounding, so
 * a value exactly at the limit is not flagged.
 */
import type { Box } from "./units";

/** Hampel identifier cut-off, in estimated standard deviations. */
export const HAMPEL_CUTOFF = 3;
/** MAD × 1.4826 estimates the standard deviation of normally distributed values. */
export const MAD_TO_STANDARD_DEVIATION = 1.4826;
/** 1/4 in: the smallest distance from the median that is flagged (common practice). */
export const OUTLIER_FLOOR_MM = 6.35;
/** Outliers are flagged only from this many measurements on. */
export const MIN_COUNT_FOR_OUTLIERS = 3;

const ROUNDING_MM = 1e-6;

export interface DimensionConsensus {
  /** The median, mm. */
  consensus: number;
  /** Largest minus smallest, mm, of every value (flagged ones too). */
  spread: number;
  /** Median absolute deviation, mm. */
  mad: number;
  count: number;
  /** Positions (in the input) of the measurements flagged as far from the others. */
  outliers: number[];
  /** The distance from the median beyond which a measurement is flagged; null under 3. */
  outlierLimit: number | null;
}

export interface BoxConsensus {
  length: DimensionConsensus;
  width: DimensionConsensus;
  height: DimensionConsensus;
  count: number;
  /** Positions of the measurements with at least one dimension flagged. */
  outliers: number[];
}

function checked(values: readonly number[]): void {
  for (const v of values) {
    if (!Number.isFinite(v)) throw new RangeError(`Not a measurement: ${v}`);
  }
}

/** The middle value; for an even count, the mean of the two middle values. */
export function median(values: readonly number[]): number {
  if (values.length === 0) throw new RangeError("No values: the median is undefined.");
  checked(values);
  const sorted = [...values].sort((a, b) => a - b);
  const mid = Math.floor(sorted.length / 2);
  return sorted.length % 2 ? sorted[mid] : (sorted[mid - 1] + sorted[mid]) / 2;
}

/** median(|x_i - median(x)|), unscaled (NIST/SEMATECH e-Handbook 1.3.5.6). */
export function medianAbsoluteDeviation(values: readonly number[]): number {
  const m = median(values);
  return median(values.map((v) => Math.abs(v - m)));
}

/**
 * Consensus of several measurements of one dimension, mm. Returns null when there are none.
 * Throws a RangeError on a value that is not a finite number.
 */
export function consensusOf(values: readonly number[]): DimensionConsensus | null {
  if (values.length === 0) return null;
  checked(values);
  const m = median(values);
  const mad = medianAbsoluteDeviation(values);
  const count = values.length;
  let outlierLimit: number | null = null;
  const outliers: number[] = [];
  if (count >= MIN_COUNT_FOR_OUTLIERS) {
    const limit = Math.max(HAMPEL_CUTOFF * MAD_TO_STANDARD_DEVIATION * mad, OUTLIER_FLOOR_MM);
    outlierLimit = limit;
    values.forEach((v, i) => {
      if (Math.abs(v - m) > limit + ROUNDING_MM) outliers.push(i);
    });
  }
  return {
    consensus: m,
    spread: Math.max(...values) - Math.min(...values),
    mad,
    count,
    outliers,
    outlierLimit,
  };
}

/**
 * Consensus of several whole measurements of one space, dimension by dimension. Each dimension
 * is taken on its own, so the consensus box need not be any one member's measurement.
 * Returns null when there are none.
 */
export function boxConsensus(measurements: readonly Box[]): BoxConsensus | null {
  if (measurements.length === 0) return null;
  const of = (axis: keyof Box) => consensusOf(measurements.map((b) => b[axis])) as DimensionConsensus;
  const length = of("length");
  const width = of("width");
  const height = of("height");
  const outliers = [...new Set([...length.outliers, ...width.outliers, ...height.outliers])].sort(
    (a, b) => a - b,
  );
  return { length, width, height, count: measurements.length, outliers };
}

/** One measurement of one section of a space (its position; 0 is the main section). */
export interface SectionMeasurement {
  section: number;
  box: Box;
}

export interface SectionsConsensus {
  /** The consensus of each measured section, by position. */
  bySection: Map<number, BoxConsensus>;
  /** For each measurement (in input order), its dimensions flagged as far from the others of its section. */
  flagged: (keyof Box)[][];
}

/**
 * Consensus section by section: a space's usable volume is one or more sections, and members
 * measure any of them; measurements of different sections are never mixed.
 */
export function consensusBySection(measurements: readonly SectionMeasurement[]): SectionsConsensus {
  const groups = new Map<number, number[]>();
  measurements.forEach((m, i) => {
    if (!Number.isInteger(m.section) || m.section < 0) throw new RangeError(`Not a section: ${m.section}`);
    groups.set(m.section, [...(groups.get(m.section) ?? []), i]);
  });
  const bySection = new Map<number, BoxConsensus>();
  const flagged: (keyof Box)[][] = measurements.map(() => []);
  for (const [section, indexes] of groups) {
    const c = boxConsensus(indexes.map((i) => measurements[i].box)) as BoxConsensus;
    bySection.set(section, c);
    for (const axis of ["length", "width", "height"] as const) {
      for (const k of c[axis].outliers) flagged[indexes[k]].push(axis);
    }
  }
  return { bySection, flagged };
}
