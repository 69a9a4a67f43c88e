// The boat drawn for heel and trim: a section looking forward, heeled by the computed angle, and a
// plan view from above. Geometry from app/domain/boat-drawing.ts (inches); drawn here in SVG with
// the theme's colours.
import {
  planGeometry,
  sectionGeometry,
  type DrawnWeight,
  type PlacedWeight,
  type PlanWeight,
  type Pt,
} from "~/domain/boat-drawing";
import { describeHeel } from "~/domain/ledger";

const WEIGHT_STYLE: Record<PlacedWeight["role"], string> = {
  item: "fill-deep-200 stroke-deep-900",
  before: "fill-none stroke-deep-700",
  after: "fill-varnish-400 stroke-deep-900",
};

function path(points: Pt[], flip = true): string {
  return points.map((p, i) => `${i ? "L" : "M"}${p.x.toFixed(2)} ${(flip ? -p.y : p.y).toFixed(2)}`).join(" ") + " Z";
}

function Marker({ w, font, flipY, showLabel }: { w: PlacedWeight; font: number; flipY: boolean; showLabel: boolean }) {
  const y = flipY ? -w.y : w.y;
  return (
    <g data-weight={w.id} data-role={w.role}>
      <circle
        cx={w.x}
        cy={y}
        r={w.r}
        className={WEIGHT_STYLE[w.role]}
        strokeWidth={font / 8}
        strokeDasharray={w.role === "before" || !w.heightKnown ? `${font / 4} ${font / 5}` : undefined}
        fillOpacity={w.role === "item" ? 0.9 : 1}
      />
      {showLabel && (
        <text x={w.x + w.r + font * 0.2} y={y - w.r * 0.2} fontSize={font} className="fill-ink" dominantBaseline="middle">
          {w.label}
        </text>
      )}
    </g>
  );
}

/**
 * Section looking forward: the invented hull outline heeled by `heelDeg` (+ starboard down) with
 * its level waterline and the weights, numbered by `label`.
 */
export function SectionDrawing({
  beamIn,
  heelDeg,
  weights,
  caption,
  widthPx = 380,
}: {
  beamIn: number;
  heelDeg: number;
  weights: readonly DrawnWeight[];
  caption?: string;
  widthPx?: number;
}) {
  const g = sectionGeometry({ beamIn, heelDeg, weights });
  const pad = beamIn * 0.12;
  const minX = g.bounds.minX - pad;
  const maxX = g.bounds.maxX + pad;
  const top = g.bounds.maxY + pad * 1.8;
  const bottom = g.bounds.minY - pad * 0.6;
  const w = maxX - minX;
  const h = top - bottom;
  const font = w / 30;
  const heelText = describeHeel(heelDeg);
  return (
    <figure className="min-w-0" data-drawing="section" data-heel={heelDeg.toFixed(4)}>
      <svg
        role="img"
        aria-label={`Section looking forward, heeled ${heelText === "upright" ? "upright" : heelText}, with the weights aboard`}
        viewBox={`${minX.toFixed(2)} ${(-top).toFixed(2)} ${w.toFixed(2)} ${h.toFixed(2)}`}
        width={widthPx}
        height={(widthPx * h) / w}
        className="h-auto max-w-full"
      >
        {/* Water below the level waterline. */}
        <rect x={minX} y={0} width={w} height={-bottom} className="fill-deep-50" />
        {/* A true vertical through the centreline, to read the heel against. */}
        <line x1={0} y1={-top} x2={0} y2={-bottom} className="stroke-ink-soft" strokeWidth={font / 12} strokeDasharray={`${font / 2} ${font / 3}`} />
        <path d={path(g.hull)} className="fill-cloth-100 stroke-deep-700" strokeWidth={font / 7} strokeLinejoin="round" />
        {/* The immersed part of the hull, seen through the water. */}
        <rect x={minX} y={0} width={w} height={-bottom} className="fill-deep-500" fillOpacity={0.12} />
        <line x1={g.mast[0].x} y1={-g.mast[0].y} x2={g.mast[1].x} y2={-g.mast[1].y} className="stroke-deep-900" strokeWidth={font / 4} />
        <line
          x1={g.waterline[0].x}
          y1={0}
          x2={g.waterline[1].x}
          y2={0}
          className="stroke-deep-500"
          strokeWidth={font / 6}
          data-waterline
        />
        {g.weights.map((wt) => (
          <Marker key={`${wt.id}-${wt.role}`} w={wt} font={font} flipY showLabel={wt.role !== "before"} />
        ))}
        <text x={minX + font * 0.5} y={-top + font * 1.3} fontSize={font} className="fill-ink-soft">Port</text>
        <text x={maxX - font * 0.5} y={-top + font * 1.3} fontSize={font} textAnchor="end" className="fill-ink-soft">Starboard</text>
        <text x={maxX - font * 0.5} y={-font * 0.5} fontSize={font} textAnchor="end" className="fill-deep-700">waterline</text>
        <text x={0} y={-top + font * 1.3} fontSize={font * 1.1} textAnchor="middle" className="fill-deep-900 font-semibold">
          {heelText === "upright" ? "upright" : heelText}
        </text>
      </svg>
      <figcaption className="mt-1 text-step--1 text-ink-soft">
        {caption ?? "Looking forward. The hull is a simple invented shape, heeled by the computed angle (true to scale, not exaggerated)."}
      </figcaption>
    </figure>
  );
}

/** Plan view from above, bow to the left and starboard at the top, with the weights numbered by `label`. */
export function PlanDrawing({
  loaIn,
  beamIn,
  waterlineForwardEndIn,
  lwlIn,
  lcfIn,
  weights,
  caption,
  widthPx = 520,
}: {
  loaIn: number;
  beamIn: number;
  waterlineForwardEndIn: number;
  lwlIn: number;
  lcfIn: number;
  weights: readonly PlanWeight[];
  caption?: string;
  widthPx?: number;
}) {
  const g = planGeometry({ loaIn, beamIn, waterlineForwardEndIn, lwlIn, lcfIn, weights });
  const pad = beamIn * 0.18;
  const minX = g.bounds.minX - pad;
  const maxX = g.bounds.maxX + pad;
  const half = beamIn / 2 + pad;
  const w = maxX - minX;
  const h = half * 2;
  const font = w / 48;
  // Starboard at the top: y on the page is −offCentre.
  const moves = weights.filter((x) => x.role === "after").map((after) => ({ after, before: weights.find((b) => b.id === after.id && b.role === "before") }));
  return (
    <figure className="min-w-0" data-drawing="plan">
      <svg
        role="img"
        aria-label="Plan view from above, bow to the left, starboard at the top, with the weights aboard"
        viewBox={`${minX.toFixed(2)} ${(-half).toFixed(2)} ${w.toFixed(2)} ${h.toFixed(2)}`}
        width={widthPx}
        height={(widthPx * h) / w}
        className="h-auto max-w-full"
      >
        <path d={path(g.deck)} className="fill-cloth-100 stroke-deep-700" strokeWidth={font / 7} strokeLinejoin="round" />
        <line x1={0} y1={0} x2={loaIn} y2={0} className="stroke-ink-soft" strokeWidth={font / 14} strokeDasharray={`${font / 2} ${font / 3}`} />
        {g.waterlineEnds.map((x, i) => (
          <line key={i} x1={x} y1={-font * 0.8} x2={x} y2={font * 0.8} className="stroke-deep-500" strokeWidth={font / 6} />
        ))}
        <path
          d={`M${g.lcfIn} ${-font * 0.7} L${g.lcfIn + font * 0.7} 0 L${g.lcfIn} ${font * 0.7} L${g.lcfIn - font * 0.7} 0 Z`}
          className="fill-deep-500"
        />
        <text x={g.lcfIn} y={font * 2} fontSize={font * 0.9} textAnchor="middle" className="fill-deep-700">LCF</text>
        {moves.map(({ before, after }) =>
          before ? (
            <line
              key={`move-${after.id}`}
              x1={before.aftOfBowIn}
              y1={-before.offCentreIn}
              x2={after.aftOfBowIn}
              y2={-after.offCentreIn}
              className="stroke-varnish-600"
              strokeWidth={font / 5}
              markerEnd="url(#plan-arrow)"
            />
          ) : null,
        )}
        <defs>
          <marker id="plan-arrow" viewBox="0 0 10 10" refX="9" refY="5" markerWidth="4" markerHeight="4" orient="auto-start-reverse">
            <path d="M 0 0 L 10 5 L 0 10 z" className="fill-varnish-600" />
          </marker>
        </defs>
        {g.weights.map((wt) => (
          <Marker key={`${wt.id}-${wt.role}`} w={{ ...wt, y: -wt.y }} font={font} flipY={false} showLabel={wt.role !== "before"} />
        ))}
        <text x={minX + font * 0.4} y={-half + font * 1.2} fontSize={font} className="fill-ink-soft">Starboard</text>
        <text x={minX + font * 0.4} y={half - font * 0.5} fontSize={font} className="fill-ink-soft">Port</text>
        <text x={-font * 0.3} y={font * 0.35} fontSize={font} textAnchor="end" className="fill-ink-soft">Bow</text>
      </svg>
      <figcaption className="mt-1 text-step--1 text-ink-soft">
        {caption ?? "From above, bow to the left. Ticks on the centreline mark the ends of the waterline; the diamond is the centre of flotation (LCF)."}
      </figcaption>
    </figure>
  );
}

export function WeightKey({ moved }: { moved?: boolean }) {
  const swatch = (role: PlacedWeight["role"], dashed = false) => (
    <svg aria-hidden="true" width="14" height="14" className="mr-1 inline-block align-middle">
      <circle cx="7" cy="7" r="5.5" className={WEIGHT_STYLE[role]} strokeWidth="1.25" strokeDasharray={dashed ? "2 2" : undefined} />
    </svg>
  );
  return (
    <ul className="flex flex-wrap gap-x-4 gap-y-1 text-step--1 text-ink-soft">
      <li>{swatch("item")}a weight (area by weight)</li>
      <li>{swatch("item", true)}height not given: drawn at settee level</li>
      {moved && <li>{swatch("before", true)}where it was</li>}
      {moved && <li>{swatch("after")}where it goes</li>}
    </ul>
  );
}
