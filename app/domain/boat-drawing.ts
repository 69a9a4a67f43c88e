/**
 * Geometry of the boat drawings, in inches (no drawing code: app/components/boat-drawings.tsx
 * turns these points into SVG).
 *
 *  - The section looking forward: x across (+ starboard, to the right as you look forward), y up
 *    from the waterline. The hull is an invented simple shape (a canoe body on a fin keel, with a
 *    cabin trunk), scaled to the class's beam; it is not any builder's lines. It is heeled by the
 *    computed angle about the centreline at the waterline, which stays level; the weights heel
 *    with the hull.
 *  - The plan view from above: x aft of the bow, y + starboard (the component puts the bow on the
 *    left and starboard at the top, as seen from above).
 */

export interface Pt {
  x: number;
  y: number;
}

/** The invented section is drawn for this beam and scaled to the class's. */
const DESIGN_BEAM_IN = 94;

/** Starboard half of the section, keel to centreline of the cabin top, for a 94 in beam. */
const HALF_SECTION: readonly Pt[] = [
  { x: 0, y: -39 },
  { x: 2.5, y: -39 },
  { x: 3.5, y: -28 },
  { x: 4, y: -13 },
  { x: 10, y: -12.5 },
  { x: 20, y: -11 },
  { x: 30, y: -8 },
  { x: 38, y: -4 },
  { x: 43, y: 0 },
  { x: 46, y: 8 },
  { x: 47, y: 16 },
  { x: 46.5, y: 24 },
  { x: 40, y: 25.5 },
  { x: 30, y: 26.5 },
  { x: 27, y: 42 },
  { x: 14, y: 44.5 },
  { x: 0, y: 45 },
];

/** Heights aboard are measured from the inside of the hull bottom at the keel stub: this far below the waterline. */
export const HEIGHT_DATUM_Y_IN = -11;

/** Where a weight of unknown height is drawn: settee level. */
export const DEFAULT_HEIGHT_IN = 18;

const MAST_STUB_IN = 26;

/** Rotate a point of the boat by the heel: + starboard side down (clockwise as seen looking forward). */
export function heelPoint(p: Pt, heelDeg: number): Pt {
  const t = (heelDeg * Math.PI) / 180;
  const c = Math.cos(t);
  const s = Math.sin(t);
  return { x: p.x * c + p.y * s, y: -p.x * s + p.y * c };
}

export interface DrawnWeight {
  id: string;
  label: string;
  /** Inches, + starboard. */
  offCentreIn: number;
  heightIn: number | null;
  weightLb: number;
  /** "before": where a moved item was; "after": where it goes; "item": everything else. */
  role?: "item" | "before" | "after";
}

export interface PlacedWeight {
  id: string;
  label: string;
  x: number;
  y: number;
  r: number;
  heightKnown: boolean;
  role: "item" | "before" | "after";
}

/** Marker radius in inches: its area grows with the weight. */
export function markerRadius(weightLb: number): number {
  return 2 + 0.6 * Math.sqrt(Math.max(0, weightLb));
}

export interface SectionGeometry {
  hull: Pt[];
  mast: [Pt, Pt];
  /** The waterline, level, wider than the boat. */
  waterline: [Pt, Pt];
  weights: PlacedWeight[];
  /** The drawing's extent, inches. */
  bounds: { minX: number; maxX: number; minY: number; maxY: number };
}

export function sectionGeometry(input: { beamIn: number; heelDeg: number; weights: readonly DrawnWeight[] }): SectionGeometry {
  const k = input.beamIn / DESIGN_BEAM_IN;
  const starboard = HALF_SECTION.map((p) => ({ x: p.x * k, y: p.y * k }));
  const port = [...starboard].reverse().map((p) => ({ x: -p.x, y: p.y }));
  // Keel bottom → up the starboard side → cabin top → down the port side → keel bottom.
  const hull = dedupe([...starboard, ...port]).map((p) => heelPoint(p, input.heelDeg));
  const top = HALF_SECTION[HALF_SECTION.length - 1].y * k;
  const mast: [Pt, Pt] = [heelPoint({ x: 0, y: top }, input.heelDeg), heelPoint({ x: 0, y: top + MAST_STUB_IN * k }, input.heelDeg)];
  const half = input.beamIn / 2;
  const waterline: [Pt, Pt] = [{ x: -half * 1.45, y: 0 }, { x: half * 1.45, y: 0 }];
  const weights = input.weights.map((w): PlacedWeight => {
    const p = heelPoint({ x: w.offCentreIn, y: HEIGHT_DATUM_Y_IN * k + (w.heightIn ?? DEFAULT_HEIGHT_IN) }, input.heelDeg);
    return { id: w.id, label: w.label, x: p.x, y: p.y, r: markerRadius(w.weightLb), heightKnown: w.heightIn !== null, role: w.role ?? "item" };
  });
  const xs = [...hull, ...mast, ...waterline].map((p) => p.x);
  const ys = [...hull, ...mast].map((p) => p.y);
  return {
    hull,
    mast,
    waterline,
    weights,
    bounds: { minX: Math.min(...xs), maxX: Math.max(...xs), minY: Math.min(...ys), maxY: Math.max(...ys) },
  };
}

function dedupe(points: Pt[]): Pt[] {
  return points.filter((p, i) => i === 0 || p.x !== points[i - 1].x || p.y !== points[i - 1].y);
}

// ---------------------------------------------------------------------------------------------
// Plan view.

/** Half-breadth of the invented deck outline at a fraction t of the length (0 bow, 1 transom). */
export function deckHalfBreadth(t: number, beamIn: number): number {
  const half = beamIn / 2;
  const widest = 0.55;
  if (t <= 0) return 0;
  if (t <= widest) return half * Math.sin((Math.PI / 2) * (t / widest)) ** 0.8;
  const u = Math.min(1, (t - widest) / (1 - widest));
  return half * (1 - 0.28 * u * u);
}

export interface PlanWeight {
  id: string;
  label: string;
  aftOfBowIn: number;
  offCentreIn: number;
  weightLb: number;
  role?: "item" | "before" | "after";
}

export interface PlanGeometry {
  /** Closed deck outline, starting at the bow. */
  deck: Pt[];
  waterlineEnds: [number, number];
  lcfIn: number;
  weights: PlacedWeight[];
  bounds: { minX: number; maxX: number; minY: number; maxY: number };
}

export function planGeometry(input: {
  loaIn: number;
  beamIn: number;
  waterlineForwardEndIn: number;
  lwlIn: number;
  lcfIn: number;
  weights: readonly PlanWeight[];
}): PlanGeometry {
  const n = 40;
  const starboard: Pt[] = [];
  for (let i = 0; i <= n; i++) {
    const t = i / n;
    starboard.push({ x: t * input.loaIn, y: deckHalfBreadth(t, input.beamIn) });
  }
  const port = [...starboard].reverse().map((p) => ({ x: p.x, y: -p.y }));
  const deck = [...starboard, ...port];
  const weights = input.weights.map((w): PlacedWeight => ({
    id: w.id,
    label: w.label,
    x: w.aftOfBowIn,
    y: w.offCentreIn,
    r: markerRadius(w.weightLb),
    heightKnown: true,
    role: w.role ?? "item",
  }));
  const xs = [0, input.loaIn, ...weights.map((w) => w.x + w.r), ...weights.map((w) => w.x - w.r)];
  const half = input.beamIn / 2;
  return {
    deck,
    waterlineEnds: [input.waterlineForwardEndIn, input.waterlineForwardEndIn + input.lwlIn],
    lcfIn: input.lcfIn,
    weights,
    bounds: { minX: Math.min(...xs), maxX: Math.max(...xs), minY: -half, maxY: half },
  };
}
