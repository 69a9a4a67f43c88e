import { Form, Link } from "react-router";
import type { Route } from "./+types/spaces";
import { inputClass, quietButtonClass } from "~/components/ui/field";
import { UnitToggle } from "~/components/unit-toggle";
import { db } from "~/db/index.server";
import { describeBox } from "~/domain/fit-search";
import { CLASS_NAME, describeHullRange, FIRST_HULL, LAST_HULL, VARIANTS, variantOf } from "~/domain/hulls";
import { describeSpaceFilter, typesetHullRanges } from "~/domain/space-words";
import { formatLength } from "~/domain/units";
import { listSpaces } from "~/models/spaces.server";
import { readerUnit } from "./reader-unit.server";
import { keepPageForVisitors } from "~/services/page-cache.server";

export function meta() {
  return [
    { title: `Hidden spaces of the ${CLASS_NAME} · Sistership` },
    { name: "description", content: `The measured spaces under berths, in lockers and under the cockpit of the ${CLASS_NAME}.` },
  ];
}

// Visitors who are not signed in may be answered from memory (app/services/page-cache.server.ts).
export const middleware: Route.MiddlewareFunction[] = [keepPageForVisitors];

export async function loader({ request }: Route.LoaderArgs) {
  const url = new URL(request.url);
  const unit = await readerUnit(request);
  const hullText = (url.searchParams.get("hull") ?? "").trim();
  const variantKey = url.searchParams.get("variant") ?? "";
  const hullNumber = /^\d+$/.test(hullText) ? Number(hullText) : null;
  const hull = hullNumber !== null && hullNumber >= FIRST_HULL && hullNumber <= LAST_HULL ? hullNumber : null;
  const hullError = hullText !== "" && hull === null ? `Hull numbers run from ${FIRST_HULL} to ${LAST_HULL}.` : null;
  const variant = VARIANTS.find((v) => v.key === variantKey) ?? null;
  // A hull number is more exact than a variant: when both are given, the hull number applies.
  const spaces = await listSpaces(db, hull !== null ? { hull } : { range: variant });

  const zones: { slug: string; name: string; spaces: ReturnType<typeof row>[] }[] = [];
  function row(sp: (typeof spaces)[number]) {
    const main = sp.sections[0];
    return {
      slug: sp.slug,
      name: typesetHullRanges(sp.name),
      hulls: describeHullRange(sp.hulls),
      size: main ? describeBox(main.fit, unit) : "",
      sections: sp.sections.length,
      opening: sp.opening
        ? `${formatLength(sp.opening.widthMm, unit)} × ${formatLength(sp.opening.heightMm, unit)}, ${sp.opening.face === "top" ? "lid on top" : "in the side"}`
        : "not recorded",
      measurements: sp.measurementCount,
    };
  }
  for (const sp of spaces) {
    let zone = zones.find((z) => z.slug === sp.zone.slug);
    if (!zone) zones.push((zone = { slug: sp.zone.slug, name: sp.zone.name, spaces: [] }));
    zone.spaces.push(row(sp));
  }
  return {
    unit,
    zones,
    count: spaces.length,
    filter: { hull: hullText, variant: variant?.key ?? "", hullError },
    summary: describeSpaceFilter({
      count: spaces.length,
      hull,
      hullVariant: hull !== null ? (variantOf(hull)?.label ?? null) : null,
      variant: variant ? { label: variant.label, from: variant.from, to: variant.to } : null,
    }),
    variants: VARIANTS.map((v) => ({ key: v.key, label: `${v.label} (hulls ${v.from}–${v.to})` })),
  };
}

export default function SpacesPage({ loaderData }: Route.ComponentProps) {
  const { unit, zones, summary, filter, variants } = loaderData;
  return (
    <div className="space-y-8">
      <header className="max-w-3xl">
        <h1 className="text-step-4 font-semibold leading-tight">Hidden spaces</h1>
        <p className="mt-3 font-serif text-step-1 leading-relaxed text-ink-soft">
          What members found under the berths, in the lockers and under the cockpit, and how big it is. Sizes are
          inside sizes of the main part of each space: length fore and aft × width athwartships × height, from the
          members' measurements where there are some.
        </p>
        <p className="mt-3">
          <Link to="/fit" className="font-medium">Check what fits where →</Link>
        </p>
      </header>

      <Form method="get" className="flex flex-wrap items-end gap-4 rounded-lg bg-cloth-100 p-4" aria-label="Filter the spaces">
        <input type="hidden" name="unit" value={unit} />
        <div>
          <label htmlFor="hull" className="block font-medium">Your hull number</label>
          <input
            id="hull" name="hull" inputMode="numeric" defaultValue={filter.hull} placeholder="e.g. 402"
            aria-invalid={filter.hullError ? true : undefined} aria-describedby={filter.hullError ? "hull-error" : undefined}
            className={`mt-1 w-36 ${inputClass}`}
          />
          {filter.hullError && <p id="hull-error" className="mt-1 text-step--1 font-medium text-bootstripe-600">{filter.hullError}</p>}
        </div>
        <div>
          <label htmlFor="variant" className="block font-medium">Or a variant</label>
          <select id="variant" name="variant" defaultValue={filter.variant} className={`mt-1 ${inputClass}`}>
            <option value="">All hulls</option>
            {variants.map((v) => <option key={v.key} value={v.key}>{v.label}</option>)}
          </select>
        </div>
        <button type="submit" className={quietButtonClass}>Show</button>
        <div className="ml-auto"><UnitToggle unit={unit} /></div>
      </Form>

      <p className="text-ink-soft" aria-live="polite" data-summary>{summary}</p>

      {zones.map((zone) => (
        <section key={zone.slug} aria-labelledby={`zone-${zone.slug}`}>
          <h2 id={`zone-${zone.slug}`} className="text-step-2 font-semibold">{zone.name}</h2>
          <ul className="mt-3 grid gap-3 md:grid-cols-2">
            {zone.spaces.map((sp) => (
              <li key={sp.slug} className="rounded-lg border border-cloth-200 bg-white/70 p-4">
                <Link to={`/spaces/${sp.slug}${unit === "mm" ? "?unit=mm" : ""}`} className="font-serif text-step-1 font-semibold text-deep-900 no-underline hover:underline">
                  {sp.name}
                </Link>
                <dl className="mt-2 grid grid-cols-[auto_1fr] gap-x-3 gap-y-1 text-step--1">
                  <dt className="text-ink-soft">Size</dt>
                  <dd className="tabular-nums">{sp.size}{sp.sections > 1 ? ` (and ${sp.sections - 1} smaller ${sp.sections === 2 ? "part" : "parts"})` : ""}</dd>
                  <dt className="text-ink-soft">Opening</dt>
                  <dd>{sp.opening}</dd>
                  <dt className="text-ink-soft">Applies to</dt>
                  <dd>{sp.hulls}</dd>
                  <dt className="text-ink-soft">Measured</dt>
                  <dd>{sp.measurements === 0 ? "not yet" : `${sp.measurements} ${sp.measurements === 1 ? "time" : "times"}`}</dd>
                </dl>
              </li>
            ))}
          </ul>
        </section>
      ))}
    </div>
  );
}
