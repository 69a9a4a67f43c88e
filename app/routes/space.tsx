import { getFormProps, getInputProps, useForm } from "@conform-to/react";
import { getZodConstraint, parseWithZod } from "@conform-to/zod/v4";
import { data, Form, Link, useLoaderData, useNavigation } from "react-router";
import type { Route } from "./+types/space";
import { CautionList } from "~/components/cautions";
import { DrawingKey, SpaceDrawing } from "~/components/space-drawing";
import { buttonClass, FieldError, FormMessage, inputClass, Notice } from "~/components/ui/field";
import { UnitToggle } from "~/components/unit-toggle";
import { db } from "~/db/index.server";
import { CAUTIONS } from "~/domain/cautions";
import { fitItem, VERDICT_TEXT, type Verdict } from "~/domain/fit";
import { describeBox, describePlacement } from "~/domain/fit-search";
import { describeHullRange, FIRST_HULL, LAST_HULL } from "~/domain/hulls";
import { measurementSchema, METHOD_LABELS, type MeasureMethod } from "~/domain/items";
import { can } from "~/domain/permissions";
import { formatLength, type LengthUnit } from "~/domain/units";
import { listItems } from "~/models/items.server";
import { addMeasurement, asFitSpace, getSpace, hullsOfUser } from "~/models/spaces.server";
import { mediaUrl, parsePhotoUpload, PhotoRejectedError, storeUploadedPhoto, thumbnailKey } from "~/services/photos.server";
import { getUser, readNotice, redirectWithNotice, requirePermission } from "~/services/session.server";
import { readerUnit } from "./reader-unit.server";
import { flaggedDimensions } from "./spaces-json.server";

const AXES = ["length", "width", "height"] as const;
const AXIS_HEADINGS = { length: "Length", width: "Width", height: "Height" } as const;

function today() {
  return new Date().toISOString().slice(0, 10);
}

export async function loader({ request, params }: Route.LoaderArgs) {
  const user = await getUser(request);
  const unit = await readerUnit(request, user);
  const space = await getSpace(db, params.slug);
  if (!space) throw data("No such space", { status: 404 });
  const [items, hulls, { notice, headers }] = await Promise.all([
    listItems(db),
    user ? hullsOfUser(db, user.id) : Promise.resolve([]),
    readNotice(request),
  ]);
  const len = (mm: number) => formatLength(mm, unit);
  const fitSpace = asFitSpace(space);

  const itemFits = items.map((item) => {
    const r = fitItem({ item: item.box, orientation: item.orientation, clearanceMm: 0, space: fitSpace });
    const best = r.snuggestSection !== null ? r.sections[r.snuggestSection] : null;
    return {
      slug: item.slug,
      name: item.name,
      size: describeBox(item.box, unit),
      upright: item.orientation === "upright",
      verdict: r.verdict,
      how: best ? describePlacement(best.placement) : "",
      room: best ? describeBox(best.leftoverMm, unit) : "",
      inARow: best?.row?.count ?? 0,
      section: best && space.sections.length > 1 ? space.sections[best.section].label : "",
    };
  });

  const c = space.consensus;
  return data(
    {
      unit,
      notice,
      space: {
        slug: space.slug,
        name: space.name,
        zone: space.zone.name,
        hulls: describeHullRange(space.hulls),
        aftOfBow: len(space.position.aftOfBowMm),
        side:
          Math.abs(space.position.offCentreMm) < 1
            ? "on the centreline"
            : `${len(Math.abs(space.position.offCentreMm))} to ${space.position.offCentreMm < 0 ? "port" : "starboard"} of the centreline`,
        obstructions: space.obstructions,
        opening: space.opening
          ? `${len(space.opening.widthMm)} × ${len(space.opening.heightMm)}, ${space.opening.face === "top" ? "a lid on top" : "in the side"}`
          : null,
        sections: space.sections.map((sec) => ({
          label: sec.label,
          described: describeBox(sec.described, unit),
          fit: describeBox(sec.fit, unit),
          changed: AXES.some((a) => Math.abs(sec.fit[a] - sec.described[a]) > 0.01),
        })),
        writeups: space.writeups,
      },
      drawing: {
        sections: space.sections.map((sec) => ({ label: sec.label, box: sec.fit })),
        opening: fitSpace.opening,
      },
      measurements: space.measurements.map((m, i) => {
        const flagged = flaggedDimensions(i, c);
        return {
          id: m.id,
          by: m.by,
          hull: m.hullNumber,
          method: METHOD_LABELS[m.method],
          date: m.measuredOn,
          photo: m.photoKey ? { url: mediaUrl(m.photoKey), thumb: mediaUrl(thumbnailKey(m.photoKey)) } : null,
          cells: AXES.map((a) => ({ axis: a, text: len(m.box[a]), flagged: flagged.includes(a) })),
        };
      }),
      consensus: c
        ? AXES.map((a) => ({
            axis: a,
            value: len(c[a].consensus),
            spread: len(c[a].spread),
            limit: c[a].outlierLimit === null ? null : len(c[a].outlierLimit),
          }))
        : null,
      itemFits,
      canMeasure: user ? can(user.roles, "space:measure") : false,
      signedIn: user !== null,
      defaults: { hullNumber: hulls[0] ? String(hulls[0]) : "", measuredOn: today() },
      cautions: [CAUTIONS.battery, CAUTIONS.stability, CAUTIONS.dust],
    },
    { headers },
  );
}

export function meta({ loaderData }: Route.MetaArgs) {
  if (!loaderData) return [{ title: "Space not found · Sistership" }];
  return [
    { title: `${loaderData.space.name} · Sistership` },
    { name: "description", content: `Measured size of ${loaderData.space.name.toLowerCase()}, and what fits there.` },
  ];
}

export async function action({ request, params }: Route.ActionArgs) {
  const user = await requirePermission(request, "space:measure");
  const space = await getSpace(db, params.slug);
  if (!space) throw data("No such space", { status: 404 });
  const upload = await parsePhotoUpload(request);
  const asked = upload.formData.get("unit");
  const unit: LengthUnit = asked === "mm" || asked === "in" ? asked : user.units;
  const submission = parseWithZod(upload.formData, { schema: measurementSchema(unit, today()) });
  if (submission.status !== "success" || upload.error) {
    return data(
      { result: submission.reply({ fieldErrors: upload.error ? { photo: [upload.error] } : undefined }) },
      { status: 400 },
    );
  }
  let photoId: number | null = null;
  if (upload.file) {
    try {
      photoId = (await storeUploadedPhoto(db, { file: upload.file, userId: user.id, caption: `${space.name}, hull ${submission.value.hullNumber}` })).id;
    } catch (error) {
      if (!(error instanceof PhotoRejectedError)) throw error;
      return data({ result: submission.reply({ fieldErrors: { photo: [error.message] } }) }, { status: 400 });
    }
  }
  const v = submission.value;
  await addMeasurement(db, {
    spaceId: space.id,
    userId: user.id,
    hullNumber: v.hullNumber,
    method: v.method,
    measuredOn: v.measuredOn,
    box: { length: v.length, width: v.width, height: v.height },
    photoId,
  });
  const back = `/spaces/${space.slug}${unit !== user.units ? `?unit=${unit}` : ""}#measurements`;
  return redirectWithNotice(request, back, "Thank you: your measurement is added and the consensus is updated.");
}

const VERDICT_LABEL: Record<Verdict, string> = {
  fits: "Fits",
  "opening-too-small": "Opening too small",
  "does-not-fit": "Does not fit",
};

export default function SpacePage({ loaderData, actionData }: Route.ComponentProps) {
  const { unit, notice, space, drawing, measurements, consensus, itemFits } = loaderData;
  const fitting = itemFits.filter((i) => i.verdict !== "does-not-fit");
  const notFitting = itemFits.filter((i) => i.verdict === "does-not-fit");
  const withPhotos = measurements.some((m) => m.photo);
  return (
    <article className="space-y-12">
      <header className="max-w-3xl">
        <p className="text-step--1 font-medium uppercase tracking-wide text-deep-700">{space.zone}</p>
        <h1 className="mt-1 text-step-4 font-semibold leading-tight">{space.name}</h1>
        <p className="mt-3 text-ink-soft">
          {space.hulls} · about {space.aftOfBow} aft of the bow, {space.side}
        </p>
        {space.obstructions && <p className="mt-4 font-serif text-step-0 leading-relaxed">{space.obstructions}</p>}
        <div className="mt-4"><UnitToggle unit={unit} /></div>
      </header>

      {notice && <Notice>{notice}</Notice>}

      <section aria-labelledby="size-heading" className="space-y-4">
        <h2 id="size-heading" className="text-step-2 font-semibold">Its size</h2>
        <SpaceDrawing input={drawing} unit={unit} label={`Drawing of ${space.name.toLowerCase()}`} />
        <DrawingKey />
        <div className="overflow-x-auto">
          <table className="w-full min-w-[28rem] border-collapse text-step--1">
            <caption className="sr-only">Sections of the space</caption>
            <thead>
              <tr className="border-b border-cloth-300 text-left">
                <th scope="col" className="py-1 pr-3 font-medium">Part</th>
                <th scope="col" className="py-1 pr-3 font-medium">Size used by the fit check</th>
                <th scope="col" className="py-1 font-medium">As first recorded</th>
              </tr>
            </thead>
            <tbody>
              {space.sections.map((sec, i) => (
                <tr key={i} className="border-b border-cloth-200 align-top">
                  <td className="py-1.5 pr-3">{sec.label}</td>
                  <td className="py-1.5 pr-3 tabular-nums">{sec.fit}{sec.changed ? " (members' consensus)" : ""}</td>
                  <td className="py-1.5 tabular-nums text-ink-soft">{sec.described}</td>
                </tr>
              ))}
            </tbody>
          </table>
        </div>
        <p className="text-step--1 text-ink-soft">
          Length fore and aft × width athwartships × height. Opening: {space.opening ?? "not recorded"}.
          The parts are alternatives inside the space: an item must fit wholly inside one of them.
        </p>
      </section>

      <section id="measurements" aria-labelledby="measurements-heading" className="space-y-4">
        <h2 id="measurements-heading" className="text-step-2 font-semibold">Members' measurements of the main part</h2>
        {measurements.length === 0 ? (
          <p className="text-ink-soft">Nobody has measured it yet. The fit check uses the size first recorded.</p>
        ) : (
          <div className="overflow-x-auto">
            <table className="w-full min-w-[36rem] border-collapse text-step--1">
              <caption className="sr-only">Measurements, the consensus (median) and the spread of each dimension</caption>
              <thead>
                <tr className="border-b border-cloth-300 text-left">
                  <th scope="col" className="py-1 pr-3 font-medium">Measured</th>
                  <th scope="col" className="py-1 pr-3 font-medium">Hull</th>
                  <th scope="col" className="py-1 pr-3 font-medium">By</th>
                  <th scope="col" className="py-1 pr-3 font-medium">With</th>
                  {(["length", "width", "height"] as const).map((a) => (
                    <th key={a} scope="col" className="py-1 pr-3 text-right font-medium">{AXIS_HEADINGS[a]}</th>
                  ))}
                  {withPhotos && <th scope="col" className="py-1 font-medium">Photo</th>}
                </tr>
              </thead>
              <tbody>
                {measurements.map((m) => (
                  <tr key={m.id} className="border-b border-cloth-200 align-top">
                    <td className="py-1.5 pr-3 whitespace-nowrap tabular-nums">{m.date}</td>
                    <td className="py-1.5 pr-3 tabular-nums">{m.hull}</td>
                    <td className="py-1.5 pr-3">{m.by}</td>
                    <td className="py-1.5 pr-3">{m.method}</td>
                    {m.cells.map((cell) => (
                      <td key={cell.axis} className="py-1.5 pr-3 text-right whitespace-nowrap tabular-nums" data-flagged={cell.flagged || undefined}>
                        {cell.flagged ? (
                          <span className="inline-block rounded-sm border border-dashed border-deep-500 px-1.5 py-0.5 text-right">
                            <span className="block font-semibold text-deep-900">{cell.text}</span>
                            <span className="block text-[0.75rem] text-ink-soft">far from the others</span>
                          </span>
                        ) : cell.text}
                      </td>
                    ))}
                    {withPhotos && (
                      <td className="py-1.5">
                        {m.photo && (
                          <a href={m.photo.url}>
                            <img src={m.photo.thumb} alt={`Photo of the measurement on hull ${m.hull}`} className="h-12 w-16 rounded-sm object-cover" loading="lazy" />
                          </a>
                        )}
                      </td>
                    )}
                  </tr>
                ))}
              </tbody>
              {consensus && (
                <tfoot>
                  <tr className="border-t-2 border-deep-700 font-semibold">
                    <th scope="row" colSpan={4} className="py-1.5 pr-3 text-left">Consensus (median)</th>
                    {consensus.map((d) => <td key={d.axis} className="py-1.5 pr-3 text-right whitespace-nowrap tabular-nums">{d.value}</td>)}
                    {withPhotos && <td />}
                  </tr>
                  <tr className="text-ink-soft">
                    <th scope="row" colSpan={4} className="py-1 pr-3 text-left font-normal">Spread (largest − smallest)</th>
                    {consensus.map((d) => <td key={d.axis} className="py-1 pr-3 text-right whitespace-nowrap tabular-nums">{d.spread}</td>)}
                    {withPhotos && <td />}
                  </tr>
                </tfoot>
              )}
            </table>
          </div>
        )}
        <p className="max-w-3xl text-step--1 text-ink-soft">
          The consensus is the median of each dimension, so one slip of the tape does not move it; the fit check uses it.
          A measurement is marked “far from the others” when it sits more than three estimated standard deviations
          (from the median absolute deviation), and at least 1/4 in, from the median; only from three measurements on.
        </p>
        {/* A new form (empty again) once a measurement is added. */}
        <AddMeasurement key={measurements.length} actionData={actionData} />
      </section>

      <section aria-labelledby="fits-heading" className="space-y-4">
        <h2 id="fits-heading" className="text-step-2 font-semibold">What fits here</h2>
        <p className="max-w-3xl text-ink-soft">
          Items of the catalogue at their listed sizes, with no clearance: leave room for straps, ventilation and your hands.{" "}
          <Link to={`/fit?unit=${unit}`}>Check with a clearance, or your own sizes</Link>.
        </p>
        {fitting.length === 0 ? (
          <p>None of the catalogue's items fits here.</p>
        ) : (
          <ul className="grid gap-3 md:grid-cols-2">
            {fitting.map((i) => (
              <li key={i.slug} className="rounded-lg border border-cloth-200 bg-white/70 p-4 text-step--1">
                <p className="flex flex-wrap items-baseline justify-between gap-2">
                  <Link to={`/fit?item=${i.slug}&unit=${unit}`} className="text-step-0 font-semibold">{i.name}</Link>
                  <span className={`rounded-sm px-2 py-0.5 font-medium ${i.verdict === "fits" ? "bg-deep-50 text-deep-700" : "border border-varnish-600 text-varnish-700"}`}>
                    {VERDICT_LABEL[i.verdict]}
                  </span>
                </p>
                <p className="mt-1 text-ink-soft tabular-nums">{i.size}{i.upright ? ", upright only" : ""}</p>
                <p className="mt-1">{i.how}{i.section ? `, in the ${i.section}` : ""}; room left {i.room}{i.inARow > 1 ? `; ${i.inARow} would fit in a row` : ""}.</p>
                {i.verdict === "opening-too-small" && <p className="mt-1 font-medium">{VERDICT_TEXT["opening-too-small"]}</p>}
              </li>
            ))}
          </ul>
        )}
        {notFitting.length > 0 && (
          <p className="text-step--1 text-ink-soft">Too big for this space: {notFitting.map((i) => i.name).join("; ")}.</p>
        )}
        <CautionList cautions={loaderData.cautions} />
      </section>

      {space.writeups.length > 0 && (
        <section aria-labelledby="writeups-heading">
          <h2 id="writeups-heading" className="text-step-2 font-semibold">Write-ups that used this space</h2>
          <ul className="mt-3 list-disc pl-6">
            {space.writeups.map((w) => <li key={w.slug}><Link to={`/writeups/${w.slug}`}>{w.title}</Link></li>)}
          </ul>
        </section>
      )}

      <p><Link to="/spaces">← All spaces</Link></p>
    </article>
  );
}

function AddMeasurement({ actionData }: { actionData: Route.ComponentProps["actionData"] }) {
  const { unit, canMeasure, signedIn, defaults, space } = useLoaderDataOf();
  const navigation = useNavigation();
  const schema = measurementSchema(unit);
  const [form, fields] = useForm({
    id: "measurement-form",
    lastResult: actionData?.result,
    constraint: getZodConstraint(schema),
    defaultValue: { ...defaults, method: "tape" },
    onValidate: ({ formData }) => parseWithZod(formData, { schema }),
    shouldValidate: "onBlur",
    shouldRevalidate: "onInput",
  });
  if (!canMeasure) {
    const back = encodeURIComponent(`/spaces/${space.slug}#add-measurement`);
    return (
      <p className="rounded-lg bg-cloth-100 p-4">
        {signedIn ? "Your account cannot add measurements." : <><Link to={`/sign-in?redirectTo=${back}`} className="font-medium">Sign in</Link> to add your own measurement of this space.</>}
      </p>
    );
  }
  const unitWord = unit === "in" ? "inches" : "millimetres";
  const sizeField = (name: "length" | "width" | "height", label: string) => {
    const f = fields[name];
    const props = getInputProps(f, { type: "text", ariaDescribedBy: `${f.id}-hint` });
    return (
      <div>
        <label htmlFor={f.id} className="block text-step-0 font-medium">{label}</label>
        <p id={`${f.id}-hint`} className="text-step--1 text-ink-soft">In {unitWord} unless you type a unit.</p>
        <input {...props} key={props.key} autoComplete="off" enterKeyHint="next" className={`mt-1 text-step-1 ${inputClass}`} />
        <FieldError id={f.errorId} errors={f.errors} />
      </div>
    );
  };
  const methods = Object.entries(METHOD_LABELS) as [MeasureMethod, string][];
  return (
    <div id="add-measurement" className="max-w-2xl scroll-mt-4 rounded-lg border border-cloth-200 bg-white/70 p-4 sm:p-6">
      <h3 className="text-step-1 font-semibold">Add your measurement</h3>
      <p className="mt-1 text-step--1 text-ink-soft">
        Measure the main part inside, wall to wall. Type sizes as you read them: 13 1/2, 13.5 in, 343 mm or 1 ft 1 1/2 in.
      </p>
      <Form method="post" encType="multipart/form-data" {...getFormProps(form)} className="mt-4 space-y-5">
        <input type="hidden" name="unit" value={unit} />
        <FormMessage id={form.errorId} errors={form.errors} />
        <div className="grid gap-4 sm:grid-cols-3">
          {sizeField("length", "Length (fore and aft)")}
          {sizeField("width", "Width (athwartships)")}
          {sizeField("height", "Height")}
        </div>
        <fieldset>
          <legend className="text-step-0 font-medium">Measured with</legend>
          <div className="mt-1 grid grid-cols-2 gap-2 sm:grid-cols-4">
            {methods.map(([value, label]) => {
              const props = getInputProps(fields.method, { type: "radio", value });
              return (
                <label key={value} className="flex min-h-12 cursor-pointer items-center gap-2 rounded-md border border-cloth-300 bg-white px-3 py-2 has-[:checked]:border-deep-700 has-[:checked]:bg-deep-50">
                  <input {...props} key={props.key} id={`${fields.method.id}-${value}`} className="size-5 accent-deep-700" />
                  {label}
                </label>
              );
            })}
          </div>
          <FieldError id={fields.method.errorId} errors={fields.method.errors} />
        </fieldset>
        <div className="grid gap-4 sm:grid-cols-2">
          <div>
            <label htmlFor={fields.hullNumber.id} className="block text-step-0 font-medium">Hull number of the boat measured</label>
            {(() => {
              const props = getInputProps(fields.hullNumber, { type: "text" });
              return <input {...props} key={props.key} inputMode="numeric" autoComplete="off" placeholder={`${FIRST_HULL}–${LAST_HULL}`} className={`mt-1 text-step-1 ${inputClass}`} />;
            })()}
            <FieldError id={fields.hullNumber.errorId} errors={fields.hullNumber.errors} />
          </div>
          <div>
            <label htmlFor={fields.measuredOn.id} className="block text-step-0 font-medium">Date measured</label>
            {(() => {
              const props = getInputProps(fields.measuredOn, { type: "date" });
              return <input {...props} key={props.key} className={`mt-1 text-step-1 ${inputClass}`} />;
            })()}
            <FieldError id={fields.measuredOn.errorId} errors={fields.measuredOn.errors} />
          </div>
        </div>
        <div>
          <label htmlFor="measurement-photo" className="block text-step-0 font-medium">A photo (optional)</label>
          <p id="measurement-photo-hint" className="text-step--1 text-ink-soft">Of the tape in place, or the space with its opening. JPEG, PNG, WebP or HEIC, up to 15 MB.</p>
          <input
            id="measurement-photo" name="photo" type="file" accept="image/jpeg,image/png,image/webp,image/heic,image/heif"
            aria-describedby="measurement-photo-hint" aria-invalid={actionData?.result?.error?.photo ? true : undefined}
            className="mt-1 block w-full text-step--1 file:mr-3 file:rounded-md file:border-0 file:bg-deep-50 file:px-3 file:py-2.5 file:font-medium file:text-deep-700"
          />
          <FieldError id="measurement-photo-error" errors={actionData?.result?.error?.photo ?? undefined} />
        </div>
        <button type="submit" className={`${buttonClass} w-full py-3 text-step-1 sm:w-auto`} disabled={navigation.state === "submitting"}>
          {navigation.state === "submitting" ? "Adding…" : "Add my measurement"}
        </button>
      </Form>
    </div>
  );
}

function useLoaderDataOf() {
  return useLoaderData<typeof loader>();
}
