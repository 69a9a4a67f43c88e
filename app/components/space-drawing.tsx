import { drawSpace, type DrawingInput, type Shape, type View } from "~/domain/drawing";
import { formatLength, type LengthUnit } from "~/domain/units";

const PAD = { left: 8, right: 70, top: 8, bottom: 30 };

// Colours as Tailwind classes, so that the theme's colours are the ones drawn.
const STYLE: Record<Shape["kind"], { className: string; dash?: string; width: number }> = {
  main: { className: "fill-cloth-100 stroke-deep-700", width: 1.5 },
  section: { className: "fill-none stroke-deep-500", dash: "5 4", width: 1.25 },
  opening: { className: "fill-none stroke-varnish-600", dash: "2 3", width: 2.5 },
  item: { className: "fill-deep-200 stroke-deep-900", width: 1.25 },
};

const TITLES: Record<View["name"], string> = {
  above: "From above, bow to the left",
  side: "From the side, bow to the left",
};

function ViewSvg({ view, scale, unit, label }: { view: View; scale: number; unit: LengthUnit; label: string }) {
  const h = view.height * scale;
  const w = view.width * scale;
  const main = view.shapes.find((s) => s.kind === "main");
  const len = (mm: number) => formatLength(mm, unit);
  // The side view is drawn with height upwards.
  const y = (s: Shape) => (view.name === "side" ? h - (s.y + s.h) * scale : s.y * scale);
  const boxW = w + PAD.left + PAD.right;
  const boxH = h + PAD.top + PAD.bottom;
  return (
    <figure className="min-w-0">
      {/* Drawn at one unit a pixel, so the labels read at 12 px; narrower screens scale it down. */}
      <svg role="img" aria-label={label} viewBox={`0 0 ${boxW} ${boxH}`} width={boxW} height={boxH} className="h-auto max-w-full">
        <g transform={`translate(${PAD.left} ${PAD.top})`}>
          {view.shapes.map((s, i) => {
            const st = STYLE[s.kind];
            return (
              <rect
                key={i}
                x={s.x * scale}
                y={y(s)}
                width={Math.max(0.5, s.w * scale)}
                height={Math.max(0.5, s.h * scale)}
                className={st.className}
                fillOpacity={s.kind === "item" ? 0.85 : 1}
                strokeWidth={st.width}
                strokeDasharray={st.dash}
              />
            );
          })}
          {main && (
            <>
              <text x={(main.w * scale) / 2} y={h + 18} textAnchor="middle" fontSize="12" className="fill-ink">
                {len(main.w)}
              </text>
              <text x={main.w * scale + 6} y={view.name === "side" ? h - (main.h * scale) / 2 : (main.h * scale) / 2} dominantBaseline="middle" fontSize="12" className="fill-ink">
                {len(main.h)}
              </text>
            </>
          )}
        </g>
      </svg>
      <figcaption className="mt-1 text-step--1 text-ink-soft">{TITLES[view.name]}</figcaption>
    </figure>
  );
}

/** A space drawn from above and from the side, at one scale, with its opening and any item placed in it. */
export function SpaceDrawing({ input, unit, label, widthPx = 300 }: { input: DrawingInput; unit: LengthUnit; label: string; widthPx?: number }) {
  const views = drawSpace(input);
  const widest = Math.max(...views.map((v) => v.width));
  // One scale for both views; a very deep space is kept from towering over the page.
  const tallest = Math.max(...views.map((v) => v.height));
  const scale = Math.min(widthPx / widest, (widthPx * 1.1) / tallest);
  return (
    <div className="grid gap-4 sm:grid-cols-2">
      {views.map((v) => (
        <ViewSvg key={v.name} view={v} scale={scale} unit={unit} label={`${label}, ${TITLES[v.name].toLowerCase()}`} />
      ))}
    </div>
  );
}

export function DrawingKey({ item }: { item?: boolean }) {
  const swatch = (kind: Shape["kind"]) => {
    const st = STYLE[kind];
    return (
      <svg aria-hidden="true" width="22" height="12" className="mr-1 inline-block align-middle">
        <rect x="1" y="1" width="20" height="10" className={st.className} strokeWidth={st.width} strokeDasharray={st.dash} />
      </svg>
    );
  };
  return (
    <ul className="flex flex-wrap gap-x-4 gap-y-1 text-step--1 text-ink-soft">
      <li>{swatch("main")}main section</li>
      <li>{swatch("section")}other sections (from the same corner)</li>
      <li>{swatch("opening")}opening</li>
      {item && <li>{swatch("item")}the item</li>}
    </ul>
  );
}
