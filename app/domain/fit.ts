/**
 * Does a box (a battery, a tank, a cooler) fit a measured space, and through its opening?
 *
 * All sizes in millimetres.
 *
 * Space. A hidden space is rarely a clean box: the hull side slopes in, the cockpit floor
 * lowers the headroom at one end. It is described by one or more sections, each a box that lies
 * wholly inside the space (for example the full length at the low headroom, and the shorter
 * part at full headroom). An item fits the space when it fits wholly inside one section;
 * sections are alternatives, an item never straddles two.
 *
 * Orientation. "any": the item may be turned by 90 degrees about any axis (6 placements).
 * "upright": the item's height stays vertical (2 placements: its length along the section's
 * length or along its width).
 *
 * Clearance. `clearanceMm` is the gap kept on every side of the item, so along each axis the
 * section must be at least the item plus twice the clearance. In a row of identical items the
 * gap between two neighbours is one clearance: n items of size d need n·d + (n + 1)·c.
 *
 * Choice of placement. Among the allowed placements, the one that leaves the most room on its
 * tightest side is chosen (the largest smallest leftover): the most even clearance all round.
 * Ties go to the placement listed first (upright before on its side, the item's length along
 * the section's length first). When nothing fits, the same rule picks the placement that misses
 * by the least, and its negative leftovers say by how much.
 *
 * Opening. The item has to get in. It passes when some allowed placement's cross-section fits
 * the opening with the clearance on each side:
 *  - "any": the smallest face first, the two smallest dimensions against the opening's two
 *    sides (whichever way round);
 *  - "upright" through a top opening (a hatch or a lid): the footprint, length and width, against
 *    the two sides;
 *  - "upright" through a front opening (a door in a vertical face): the narrower footprint
 *    side against the opening's width and the item's height against its height.
 * The opening's `face` defaults to "front". Deliberately simple: tilting an item through
 * diagonally, and turning it inside after it passes, are not modelled.
 */
import type { Box } from "./units";

export type { Box };

export type Axis = keyof Box;
export type Orientation = "any" | "upright";
export type OpeningFace = "top" | "front";

export interface Opening {
  /** For a front opening, the horizontal side; for a top opening, either side. */
  width: number;
  /** For a front opening, the vertical side; for a top opening, the other side. */
  height: number;
  face?: OpeningFace;
}

export interface Space {
  sections: readonly Box[];
  opening?: Opening;
}

export interface FitRequest {
  item: Box;
  orientation: Orientation;
  clearanceMm: number;
  space: Space;
}

/** Which of the item's dimensions lies along each axis of the section. */
export interface Placement {
  length: Axis;
  width: Axis;
  height: Axis;
}

/** Identical items end to end along one horizontal axis of a section. */
export interface Row {
  count: number;
  axis: "length" | "width";
  placement: Placement;
}

export interface SectionFit {
  /** Position of the section in `space.sections`. */
  section: number;
  fits: boolean;
  /** The placement chosen (or, when nothing fits, the one that misses by the least). */
  placement: Placement;
  /** Section minus item along each axis of the section, for that placement. Fits when every
   * value is at least twice the clearance; a negative value is a shortfall. */
  leftoverMm: Box;
  /** The longest row of identical items that fits; null when not even one fits. */
  row: Row | null;
  /** Section volume minus item volume, mm³. */
  leftoverVolumeMm3: number;
}

export type Verdict = "fits" | "opening-too-small" | "does-not-fit";

export interface FitResult {
  verdict: Verdict;
  sections: SectionFit[];
  /** Whether the item passes the opening; null when the space has no opening recorded. */
  passesOpening: boolean | null;
  /** The fitting section with the least leftover volume; null when none fits. */
  snuggestSection: number | null;
}

export const VERDICT_TEXT: Record<Verdict, string> = {
  fits: "Fits.",
  "opening-too-small": "Fits the space, but not through the opening: the opening must be enlarged.",
  "does-not-fit": "Does not fit.",
};

/** Allows for floating-point rounding in sums of converted sizes: a millionth of a millimetre. */
const ROUNDING_MM = 1e-6;

const AXES: readonly Axis[] = ["length", "width", "height"];

/** Upright placements first, so they win ties. */
const ALL_PLACEMENTS: readonly Placement[] = [
  { length: "length", width: "width", height: "height" },
  { length: "width", width: "length", height: "height" },
  { length: "length", width: "height", height: "width" },
  { length: "height", width: "length", height: "width" },
  { length: "width", width: "height", height: "length" },
  { length: "height", width: "width", height: "length" },
];

export function placementsFor(orientation: Orientation): readonly Placement[] {
  return orientation === "upright" ? ALL_PLACEMENTS.slice(0, 2) : ALL_PLACEMENTS;
}

/** Whether the placement keeps the item's height vertical. */
export function isUpright(p: Placement): boolean {
  return p.height === "height";
}

function checkBox(box: Box, what: string): void {
  for (const axis of AXES) {
    const v = box[axis];
    if (!Number.isFinite(v) || v <= 0) {
      throw new RangeError(`${what}: ${axis} must be a positive number of millimetres, not ${v}.`);
    }
  }
}

function checkRequest(r: FitRequest): void {
  checkBox(r.item, "Item");
  if (!Number.isFinite(r.clearanceMm) || r.clearanceMm < 0) {
    throw new RangeError(`Clearance must be zero or more millimetres, not ${r.clearanceMm}.`);
  }
  r.space.sections.forEach((s, i) => checkBox(s, `Section ${i + 1}`));
  const o = r.space.opening;
  if (o) {
    for (const v of [o.width, o.height]) {
      if (!Number.isFinite(v) || v <= 0) {
        throw new RangeError(`Opening sizes must be positive numbers of millimetres, not ${v}.`);
      }
    }
  }
}

function volume(b: Box): number {
  return b.length * b.width * b.height;
}

function leftover(item: Box, section: Box, p: Placement): Box {
  return {
    length: section.length - item[p.length],
    width: section.width - item[p.width],
    height: section.height - item[p.height],
  };
}

function tightest(b: Box): number {
  return Math.min(b.length, b.width, b.height);
}

/** How many items of size d fit end to end in s, with gap c at both ends and between. */
function countInRow(d: number, s: number, c: number): number {
  return Math.max(0, Math.floor((s - c + ROUNDING_MM) / (d + c)));
}

function fitSection(
  item: Box,
  section: Box,
  index: number,
  placements: readonly Placement[],
  c: number,
): SectionFit {
  let best = placements[0];
  let bestLeft = leftover(item, section, best);
  for (const p of placements.slice(1)) {
    const left = leftover(item, section, p);
    if (tightest(left) > tightest(bestLeft) + ROUNDING_MM) {
      best = p;
      bestLeft = left;
    }
  }
  const fits = tightest(bestLeft) + ROUNDING_MM >= 2 * c;

  let row: Row | null = null;
  if (fits) {
    // The chosen placement first, so it wins ties.
    for (const p of [best, ...placements.filter((q) => q !== best)]) {
      if (tightest(leftover(item, section, p)) + ROUNDING_MM < 2 * c) continue;
      for (const axis of ["length", "width"] as const) {
        const count = countInRow(item[p[axis]], section[axis], c);
        if (!row || count > row.count) row = { count, axis, placement: p };
      }
    }
  }
  return {
    section: index,
    fits,
    placement: best,
    leftoverMm: bestLeft,
    row,
    leftoverVolumeMm3: volume(section) - volume(item),
  };
}

function ascending(values: number[]): number[] {
  return [...values].sort((a, b) => a - b);
}

/** Whether the item passes the opening; see the rules at the top of this module. */
export function passesOpening(
  item: Box,
  orientation: Orientation,
  opening: Opening,
  clearanceMm: number,
): boolean {
  const within = (size: number, room: number) => size + 2 * clearanceMm <= room + ROUNDING_MM;
  const [o1, o2] = ascending([opening.width, opening.height]);
  if (orientation === "any") {
    const [a, b] = ascending([item.length, item.width, item.height]);
    return within(a, o1) && within(b, o2);
  }
  if ((opening.face ?? "front") === "top") {
    const [a, b] = ascending([item.length, item.width]);
    return within(a, o1) && within(b, o2);
  }
  return (
    within(Math.min(item.length, item.width), opening.width) &&
    within(item.height, opening.height)
  );
}

/** Fit one item into one space: every section, the opening, and a verdict. */
export function fitItem(request: FitRequest): FitResult {
  checkRequest(request);
  const { item, orientation, clearanceMm, space } = request;
  const placements = placementsFor(orientation);
  const sections = space.sections.map((s, i) => fitSection(item, s, i, placements, clearanceMm));
  const fitting = sections.filter((s) => s.fits);
  const snuggest = fitting.reduce<SectionFit | null>(
    (a, s) => (a === null || s.leftoverVolumeMm3 < a.leftoverVolumeMm3 ? s : a),
    null,
  );
  const opening =
    space.opening === undefined ? null : passesOpening(item, orientation, space.opening, clearanceMm);
  const verdict: Verdict =
    fitting.length === 0 ? "does-not-fit" : opening === false ? "opening-too-small" : "fits";
  return {
    verdict,
    sections,
    passesOpening: opening,
    snuggestSection: snuggest?.section ?? null,
  };
}

/** `count` identical items end to end in one section: how they lie and the room left. */
export interface RowPlacement {
  count: number;
  /** The horizontal axis of the section the row runs along. */
  axis: "length" | "width";
  placement: Placement;
  /** Section minus the row along each axis of the section (along the row: minus all the
   * items; across and up: minus one). The gaps between neighbours are part of it. */
  leftoverMm: Box;
}

/**
 * Places `count` identical items in a row in one section, with the clearance all round and
 * between neighbours (n·d + (n + 1)·c along the row, d + 2c across and up). Among the allowed
 * placements and both horizontal axes, the one with the most room on its tightest side wins,
 * ties to the first listed: for one item this is the placement `fitItem` chooses. Null when
 * the row does not fit.
 */
export function placeRow(
  item: Box,
  section: Box,
  orientation: Orientation,
  clearanceMm: number,
  count = 1,
): RowPlacement | null {
  checkBox(item, "Item");
  checkBox(section, "Section");
  if (!Number.isInteger(count) || count < 1) throw new RangeError(`Count must be a whole number from 1, not ${count}.`);
  const c = clearanceMm;
  let best: RowPlacement | null = null;
  for (const p of placementsFor(orientation)) {
    for (const axis of ["length", "width"] as const) {
      const left = leftover(item, section, p);
      left[axis] = section[axis] - count * item[p[axis]];
      const rowFits = left[axis] + ROUNDING_MM >= (count + 1) * c;
      const restFits = AXES.every((a) => a === axis || left[a] + ROUNDING_MM >= 2 * c);
      if (!rowFits || !restFits) continue;
      if (!best || tightest(left) > tightest(best.leftoverMm) + ROUNDING_MM) {
        best = { count, axis, placement: p, leftoverMm: left };
      }
    }
  }
  return best;
}

export interface RankedSpace<S extends Space> {
  space: S;
  /** Position of the space in the list given. */
  index: number;
  result: FitResult;
  /** The snuggest section that takes the item (or the row of `count`). */
  section: number;
  /** Its volume minus the item's, mm³. */
  leftoverVolumeMm3: number;
  /** How the item (or the row) lies in that section. */
  row: RowPlacement;
}

/**
 * The spaces that can take the item (or `count` of them in a row), snuggest first (least
 * leftover volume in the best section). Spaces that fit the item but whose opening must be
 * enlarged come after all those that fit outright. Spaces that cannot take the item are left out. Equal spaces keep their
 * order.
 */
export function rankSpaces<S extends Space>(
  item: Box,
  spaces: readonly S[],
  options: { orientation?: Orientation; clearanceMm?: number; count?: number } = {},
): RankedSpace<S>[] {
  const orientation = options.orientation ?? "any";
  const clearanceMm = options.clearanceMm ?? 0;
  const count = options.count ?? 1;
  const ranked: RankedSpace<S>[] = [];
  spaces.forEach((space, index) => {
    const result = fitItem({ item, orientation, clearanceMm, space });
    if (result.snuggestSection === null) return;
    // With count 1, every fitting section takes a row of one; with more, only some may.
    let best: { fit: SectionFit; row: RowPlacement } | null = null;
    for (const fit of result.sections) {
      if (!fit.fits || (best && fit.leftoverVolumeMm3 >= best.fit.leftoverVolumeMm3)) continue;
      const row = placeRow(item, space.sections[fit.section], orientation, clearanceMm, count);
      if (row) best = { fit, row };
    }
    if (!best) return;
    ranked.push({
      space,
      index,
      result,
      section: best.fit.section,
      leftoverVolumeMm3: best.fit.leftoverVolumeMm3,
      row: best.row,
    });
  });
  const needsWork = (r: RankedSpace<S>) => (r.result.verdict === "fits" ? 0 : 1);
  return ranked.sort(
    (a, b) =>
      needsWork(a) - needsWork(b) ||
      a.leftoverVolumeMm3 - b.leftoverVolumeMm3 ||
      a.index - b.index,
  );
}

/**
 * Dimensions in a form that does not depend on how the box was measured, for an index:
 * - "any": the three dimensions, largest first;
 * - "upright": the footprint, larger side first, then the height.
 * An item fits a box with some allowed 90-degree placement exactly when each of its sorted
 * dimensions plus twice the clearance is at most the box's sorted dimension in the same place
 * (see `fitsSorted`).
 */
export function sortedDims(box: Box, orientation: Orientation = "any"): [number, number, number] {
  if (orientation === "upright") {
    return [Math.max(box.length, box.width), Math.min(box.length, box.width), box.height];
  }
  const [a, b, c] = ascending([box.length, box.width, box.height]);
  return [c, b, a];
}

/** The index test: item and space dims from `sortedDims` with the same orientation. */
export function fitsSorted(
  item: readonly [number, number, number],
  space: readonly [number, number, number],
  clearanceMm: number,
): boolean {
  return item.every((d, i) => d + 2 * clearanceMm <= space[i] + ROUNDING_MM);
}
