/**
 * The shapes of a space's drawing, two views in millimetres:
 *  - from above: across, the space's length (fore and aft); down the page, its width;
 *  - from the side (looking inboard): across, the length; up the page, the height.
 * Sections are alternatives inside one space (see fit.ts); with no record of where each lies,
 * all are drawn from the same corner, the main section first. An opening in the top is drawn in
 * the view from above, one in a side in the view from the side, centred on the main section.
 * An item (or a row of them) is drawn in its section, a clearance in from the corner.
 */
import type { Opening, RowPlacement } from "./fit";
import type { Box } from "./units";

export type Shape = {
  kind: "main" | "section" | "opening" | "item";
  /** From the corner, mm; y grows down the page in the view from above and up in the side view. */
  x: number;
  y: number;
  w: number;
  h: number;
  label?: string;
};

export type View = { name: "above" | "side"; width: number; height: number; shapes: Shape[] };

export interface DrawingInput {
  sections: readonly { label: string; box: Box }[];
  opening?: Opening;
  item?: { box: Box; row: RowPlacement; section: number; clearanceMm: number };
}

export function drawSpace(input: DrawingInput): View[] {
  const { sections, opening, item } = input;
  const main = sections[0]?.box;
  const views: View[] = [];
  for (const name of ["above", "side"] as const) {
    const across = (b: Box) => (name === "above" ? b.width : b.height);
    const shapes: Shape[] = sections.map((s, i) => ({
      kind: i === 0 ? "main" : "section",
      x: 0,
      y: 0,
      w: s.box.length,
      h: across(s.box),
      label: s.label,
    }));
    if (main && opening) {
      const top = opening.face === "top";
      if ((name === "above") === top) {
        // A lid: its longer side along the longer side of the section. A door: its width along the length.
        let [w, h] = [opening.width, opening.height];
        if (top && (w > h) !== (main.length >= main.width)) [w, h] = [h, w];
        shapes.push({ kind: "opening", x: (main.length - w) / 2, y: (across(main) - h) / 2, w, h, label: "opening" });
      }
    }
    if (item) {
      const { box, row, clearanceMm: c } = item;
      const p = row.placement;
      const along = box[p.length];
      const acrossSize = name === "above" ? box[p.width] : box[p.height];
      const alongRow = name === "above" || row.axis === "length" ? row.count : 1;
      for (let k = 0; k < alongRow; k++) {
        const step = k * ((row.axis === "length" ? along : acrossSize) + c);
        shapes.push({
          kind: "item",
          x: c + (row.axis === "length" ? step : 0),
          y: c + (row.axis === "width" ? step : 0),
          w: along,
          h: acrossSize,
        });
      }
    }
    const width = Math.max(1, ...shapes.map((s) => s.x + s.w));
    const height = Math.max(1, ...shapes.map((s) => s.y + s.h));
    views.push({ name, width, height, shapes });
  }
  return views;
}
