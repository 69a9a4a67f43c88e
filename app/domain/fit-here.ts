/**
 * "What fits here" on a space's page: one item of the catalogue against one space, in words.
 *
 *   "Upright, length fore and aft, in the main; room left 14 15/16 × 6 11/16 × 12 1/8 in;
 *    3 would fit in a row fore and aft, each upright, turned: width fore and aft."
 *
 * The first part is how one item lies in the snuggest section that takes it (the placement
 * `fitItem` chooses: the most room on its tightest side) and the room it leaves. The row is the
 * longest row of identical items that fits in that section, over every allowed placement, so it
 * may lie another way than the one item: the sentence then says how each item of the row lies,
 * as `placeRow` places that many (the placement the fit search gives for that count). A count is
 * only ever stated beside the placement in which that many fit.
 */
import { fitItem, placeRow, type Box, type Orientation, type Placement, type Row, type Space, type Verdict } from "./fit";
import { describeBox, describePlacement } from "./fit-search";
import type { LengthUnit } from "./units";

export interface FitHereSection {
  label: string;
  box: Box;
}

export interface FitHere {
  verdict: Verdict;
  /** The section the item goes in (its position), null when it fits none. */
  section: number | null;
  /** How one item lies there. */
  placement: Placement | null;
  /** The section minus one item, along each axis of the section. */
  leftoverMm: Box | null;
  /** The longest row there (count 2 or more), with the placement in which that many fit. */
  row: Row | null;
  /** The sentence for the page; empty when the item fits none of the sections. */
  text: string;
}

function samePlacement(a: Placement, b: Placement): boolean {
  return a.length === b.length && a.width === b.width && a.height === b.height;
}

function lowerFirst(text: string): string {
  return text.charAt(0).toLowerCase() + text.slice(1);
}

/** "3 would fit in a row fore and aft" or "…, each upright, turned: width fore and aft". */
export function describeRow(row: Row, onePlacement: Placement): string {
  const along = row.axis === "length" ? "fore and aft" : "athwartships";
  const how = samePlacement(row.placement, onePlacement) ? "" : `, each ${lowerFirst(describePlacement(row.placement))}`;
  return `${row.count} would fit in a row ${along}${how}`;
}

/**
 * One item against one space, with `clearanceMm` all round (the page uses none). Sections are
 * named in the sentence only when the space has more than one.
 */
export function fitHere(
  item: Box,
  orientation: Orientation,
  sections: readonly FitHereSection[],
  opening: Space["opening"],
  unit: LengthUnit,
  clearanceMm = 0,
): FitHere {
  const space: Space = { sections: sections.map((s) => s.box), opening };
  const result = fitItem({ item, orientation, clearanceMm, space });
  const best = result.snuggestSection !== null ? result.sections[result.snuggestSection] : null;
  if (!best) return { verdict: result.verdict, section: null, placement: null, leftoverMm: null, row: null, text: "" };

  let row: Row | null = null;
  const longest = best.row?.count ?? 0;
  if (longest > 1) {
    // The placement in which that many fit, as the fit search places them; the longest row's
    // own placement is the fallback (both fit `longest` items by construction).
    const placed = placeRow(item, sections[best.section].box, orientation, clearanceMm, longest);
    row = placed ? { count: placed.count, axis: placed.axis, placement: placed.placement } : best.row;
  }
  const where = sections.length > 1 ? `, in the ${sections[best.section].label}` : "";
  const text =
    `${describePlacement(best.placement)}${where}; room left ${describeBox(best.leftoverMm, unit)}` +
    `${row ? `; ${describeRow(row, best.placement)}` : ""}.`;
  return { verdict: result.verdict, section: best.section, placement: best.placement, leftoverMm: best.leftoverMm, row, text };
}
