import { type FieldMetadata, getFormProps, getInputProps, getSelectProps, getTextareaProps, useForm } from "@conform-to/react";
import { getZodConstraint, parseWithZod } from "@conform-to/zod/v4";
import { Fragment } from "react";
import { data, Form, Link, useLoaderData, useNavigation } from "react-router";
import type { Route } from "./+types/space";
import { CautionList } from "~/components/cautions";
import { DrawingKey, SpaceDrawing } from "~/components/space-drawing";
import { buttonClass, FieldError, FormMessage, inputClass, Notice } from "~/components/ui/field";
import { UnitToggle } from "~/components/unit-toggle";
import { db } from "~/db/index.server";
import { CAUTIONS } from "~/domain/cautions";
import { VERDICT_TEXT, type Verdict } from "~/domain/fit";
import { fitHere } from "~/domain/fit-here";
import { describeBox } from "~/domain/fit-search";
import { describeHullRange, FIRST_HULL, LAST_HULL } from "~/domain/hulls";
import { measurementDeleteSchema, measurementEditSchema, measurementSchema, METHOD_LABELS, type MeasureMethod } from "~/domain/items";
import { can, canChangeMeasurement } from "~/domain/permissions";
import { editableLength, formatLength, type LengthUnit } from "~/domain/units";
import { OUTLIER_FLOOR_MM, type BoxConsensus } from "~/domain/consensus";
import type { MeasurementRecord } from "~/db/schema";
import { listItems } from "~/models/items.server";
import { addMeasurement, asFitSpace, deleteMeasurement, getMeasurement, getSpace, hullsOfUser, updateMeasurement } from "~/models/spaces.server";
import { mediaUrl, parsePhotoUpload, PhotoRejectedError, storeUploadedPhoto, thumbnailKey } from "~/services/photos.server";
import { getUser, readNotice, redirectWithNotice, requireUser } from "~/services/session.server";
import { readerUnit } from "./reader-unit.server";
import { keepPageForVisitors } from "~/services/page-cache.server";
import { formatDate } from "~/components/writeup-card";
import { creditWithoutHulls, typesetHullRanges } from "~/domain/space-words";

const AXES = ["length", "width", "height"] as const;
const AXIS_HEADINGS = { length: "Length", width: "Width", height: "Height" } as const;

function today() {
  return new Date().toISOString().slice(0, 10);
}

// Visitors who are not signed in may be answered from memory (app/services/page-cache.server.ts).
export const middleware: Route.MiddlewareFunction[] = [keepPageForVisitors];

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
  const many = space.sections.length > 1;
  const partName = (position: number) => space.sections.find((sec) => sec.position === position)?.label ?? `part ${position + 1}`;

  const fitSectionsHere = space.sections.map((sec, i) => ({ label: sec.label, box: fitSpace.sections[i] }));
  const itemFits = items.map((item) => {
    const here = fitHere(item.box, item.orientation, fitSectionsHere, fitSpace.opening, unit);
    return {
      slug: item.slug,
      name: item.name,
      size: describeBox(item.box, unit),
      upright: item.orientation === "upright",
      verdict: here.verdict,
      text: here.text,
    };
  });

  // ?edit=<id>: the form to change a measurement, for its author or a moderator.
  const editId = Number(new URL(request.url).searchParams.get("edit"));
  const editable = space.measurements.find((m) => m.id === editId && user && canChangeMeasurement(user, m.userId));
  const editing = editable
    ? {
        id: editable.id,
        by: editable.by,
        byOther: editable.userId !== user?.id,
        photo: editable.photoKey ? mediaUrl(thumbnailKey(editable.photoKey)) : null,
        values: {
          section: String(editable.section),
          length: editableLength(editable.box.length, unit),
          width: editableLength(editable.box.width, unit),
          height: editableLength(editable.box.height, unit),
          method: editable.method,
          hullNumber: String(editable.hullNumber),
          measuredOn: editable.measuredOn,
        },
      }
    : null;

  const consensusRows = (c: BoxConsensus | null) =>
    c
      ? AXES.map((a) => ({
          axis: a,
          value: len(c[a].consensus),
          spread: len(c[a].spread),
          limit: c[a].outlierLimit === null ? null : len(c[a].outlierLimit),
        }))
      : null;

  const describeRecord = (r: MeasurementRecord) =>
    `${many ? `${partName(r.section)}, ` : ""}hull ${r.hullNumber}, ${METHOD_LABELS[r.method as MeasureMethod] ?? r.method}, ${formatDate(r.measuredOn)}: ${describeBox({ length: r.lengthMm, width: r.widthMm, height: r.heightMm }, unit)}`;

  return data(
    {
      unit,
      notice,
      space: {
        slug: space.slug,
        name: typesetHullRanges(space.name),
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
          changed: sec.consensus !== null,
        })),
        writeups: space.writeups,
      },
      drawing: {
        sections: space.sections.map((sec) => ({ label: sec.label, box: sec.fit })),
        opening: fitSpace.opening,
      },
      // Measurements section by section, each with its own consensus.
      parts: space.sections.map((sec) => ({
        position: sec.position,
        label: sec.label,
        consensus: consensusRows(sec.consensus),
        measurements: space.measurements
          .filter((m) => m.section === sec.position)
          .map((m) => ({
            id: m.id,
            // The hull measured has a place of its own: the credit without the hull numbers it names.
            by: creditWithoutHulls(m.by),
            hull: m.hullNumber,
            method: METHOD_LABELS[m.method],
            date: formatDate(m.measuredOn),
            photo: m.photoKey ? { url: mediaUrl(m.photoKey), thumb: mediaUrl(thumbnailKey(m.photoKey)) } : null,
            cells: AXES.map((a) => ({ axis: a, text: len(m.box[a]), flagged: m.flagged.includes(a) })),
            changed: m.updated ? `changed ${formatDate(m.updated.at)}${m.updated.by ? ` by ${m.updated.by}` : ""}` : null,
            mine: m.userId === user?.id,
            canChange: user ? canChangeMeasurement(user, m.userId) : false,
          })),
      })),
      sectionChoices: space.sections.map((sec) => ({ position: sec.position, label: sec.label })),
      changes: space.changes.map((c) => ({
        id: c.id,
        date: formatDate(c.at),
        text:
          `${c.by ?? "A former member"} ${c.kind === "edited" ? "changed" : "removed"} ` +
          `${c.by !== null && c.by === c.takenBy ? "their own" : `${c.takenBy ?? "a former member"}'s`} measurement`,
        before: describeRecord(c.before),
        after: c.after ? describeRecord(c.after) : null,
        reason: c.reason,
      })),
      editing,
      itemFits,
      canMeasure: user ? can(user.roles, "space:measure") : false,
      signedIn: user !== null,
      defaults: { hullNumber: hulls[0] ? String(hulls[0]) : "", measuredOn: today(), section: "0" },
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

type Intent = "add" | "edit" | "delete";

export async function action({ request, params }: Route.ActionArgs) {
  const user = await requireUser(request);
  const space = await getSpace(db, params.slug);
  if (!space) throw data("No such space", { status: 404 });
  const upload = await parsePhotoUpload(request);
  const form = upload.formData;
  const intent: Intent = form.get("intent") === "edit" ? "edit" : form.get("intent") === "delete" ? "delete" : "add";
  const asked = form.get("unit");
  const unit: LengthUnit = asked === "mm" || asked === "in" ? asked : user.units;
  const back = `/spaces/${space.slug}${unit !== user.units ? `?unit=${unit}` : ""}#measurements`;
  const refused = () =>
    data("Only the member who took a measurement, or a moderator, can change or remove it.", { status: 403 });

  if (intent === "delete") {
    const submission = parseWithZod(form, { schema: measurementDeleteSchema });
    if (submission.status !== "success") return data({ intent, result: submission.reply() }, { status: 400 });
    const target = await getMeasurement(db, space.id, submission.value.measurementId);
    if (!target) return redirectWithNotice(request, back, "That measurement was already removed.");
    if (!canChangeMeasurement(user, target.userId)) throw refused();
    if (target.userId !== user.id && !submission.value.reason) {
      return data(
        { intent, result: submission.reply({ fieldErrors: { reason: ["Say why you remove another member's measurement; they will see it in the history."] } }) },
        { status: 400 },
      );
    }
    await deleteMeasurement(db, { spaceId: space.id, id: target.id }, { userId: user.id, reason: submission.value.reason });
    return redirectWithNotice(request, back, "The measurement is removed and the consensus is updated.");
  }

  const today_ = today();
  if (intent === "edit") {
    const submission = parseWithZod(form, { schema: measurementEditSchema(unit, today_, space.sections.length) });
    const id = Number(form.get("measurementId"));
    const target = Number.isSafeInteger(id) ? await getMeasurement(db, space.id, id) : null;
    if (!target) return redirectWithNotice(request, back, "That measurement was removed in the meantime.");
    if (!canChangeMeasurement(user, target.userId)) throw refused();
    const fieldErrors: Record<string, string[]> = {};
    if (upload.error) fieldErrors.photo = [upload.error];
    if (submission.status === "success" && target.userId !== user.id && !submission.value.reason) {
      fieldErrors.reason = ["Say why you change another member's measurement; they will see it in the history."];
    }
    if (submission.status !== "success" || Object.keys(fieldErrors).length) {
      return data({ intent, result: submission.reply({ fieldErrors }) }, { status: 400 });
    }
    const v = submission.value;
    let photoId: number | null | undefined = v.removePhoto ? null : undefined;
    if (upload.file) {
      try {
        photoId = (await storeUploadedPhoto(db, { file: upload.file, userId: user.id, caption: `${space.name}, hull ${v.hullNumber}` })).id;
      } catch (error) {
        if (!(error instanceof PhotoRejectedError)) throw error;
        return data({ intent, result: submission.reply({ fieldErrors: { photo: [error.message] } }) }, { status: 400 });
      }
    }
    await updateMeasurement(
      db,
      { spaceId: space.id, id: target.id },
      { section: v.section, hullNumber: v.hullNumber, method: v.method, measuredOn: v.measuredOn, box: { length: v.length, width: v.width, height: v.height }, photoId },
      { userId: user.id, reason: v.reason },
    );
    return redirectWithNotice(request, back, "The measurement is changed and the consensus is updated.");
  }

  if (!can(user.roles, "space:measure")) {
    throw data("Your account does not have the role this page needs. Ask an administrator if you think it should.", { status: 403 });
  }
  const submission = parseWithZod(form, { schema: measurementSchema(unit, today_, space.sections.length) });
  if (submission.status !== "success" || upload.error) {
    return data(
      { intent, result: submission.reply({ fieldErrors: upload.error ? { photo: [upload.error] } : undefined }) },
      { status: 400 },
    );
  }
  let photoId: number | null = null;
  if (upload.file) {
    try {
      photoId = (await storeUploadedPhoto(db, { file: upload.file, userId: user.id, caption: `${space.name}, hull ${submission.value.hullNumber}` })).id;
    } catch (error) {
      if (!(error instanceof PhotoRejectedError)) throw error;
      return data({ intent, result: submission.reply({ fieldErrors: { photo: [error.message] } }) }, { status: 400 });
    }
  }
  const v = submission.value;
  await addMeasurement(db, {
    spaceId: space.id,
    section: v.section,
    userId: user.id,
    hullNumber: v.hullNumber,
    method: v.method,
    measuredOn: v.measuredOn,
    box: { length: v.length, width: v.width, height: v.height },
    photoId,
  });
  return redirectWithNotice(request, back, "Thank you: your measurement is added and the consensus is updated.");
}

const VERDICT_LABEL: Record<Verdict, string> = {
  fits: "Fits",
  "opening-too-small": "Opening too small",
  "does-not-fit": "Does not fit",
};

type ActionData = Route.ComponentProps["actionData"];
type LoaderData = Route.ComponentProps["loaderData"];
type Part = LoaderData["parts"][number];

export default function SpacePage({ loaderData, actionData }: Route.ComponentProps) {
  const { unit, notice, space, drawing, parts, changes, editing, itemFits } = loaderData;
  const fitting = itemFits.filter((i) => i.verdict !== "does-not-fit");
  const notFitting = itemFits.filter((i) => i.verdict === "does-not-fit");
  const many = parts.length > 1;
  const count = parts.reduce((n, p) => n + p.measurements.length, 0);
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
        {/* No fixed width: on a phone the sizes wrap between dimensions, never inside one. */}
        <table className="w-full border-collapse text-step--1">
          <caption className="sr-only">Sections of the space</caption>
          <thead>
            <tr className="border-b border-cloth-300 text-left align-bottom">
              <th scope="col" className="py-1 pr-3 font-medium">Part</th>
              <th scope="col" className="py-1 pr-3 font-medium">Used by the fit check</th>
              <th scope="col" className="py-1 font-medium">First recorded</th>
            </tr>
          </thead>
          <tbody>
            {space.sections.map((sec, i) => (
              <tr key={i} className="border-b border-cloth-200 align-top">
                <td className="py-1.5 pr-3">{sec.label}</td>
                <td className="py-1.5 pr-3 tabular-nums"><BoxText text={sec.fit} />{sec.changed ? " (members' consensus)" : ""}</td>
                <td className="py-1.5 tabular-nums text-ink-soft"><BoxText text={sec.described} /></td>
              </tr>
            ))}
          </tbody>
        </table>
        <p className="text-step--1 text-ink-soft">
          Length fore and aft × width athwartships × height. Opening: {space.opening ?? "not recorded"}.
          {many && " The parts are alternatives inside the space: an item must fit wholly inside one of them."}
        </p>
      </section>

      <section id="measurements" aria-labelledby="measurements-heading" className="scroll-mt-4 space-y-6">
        <h2 id="measurements-heading" className="text-step-2 font-semibold">Members' measurements</h2>
        {count === 0 && <p className="text-ink-soft">Nobody has measured it yet. The fit check uses the size first recorded.</p>}
        {count > 0 && parts.map((part) => <PartMeasurements key={part.position} part={part} many={many} unit={unit} />)}
        <div className="max-w-3xl space-y-2 text-step--1 text-ink-soft" data-consensus-note>
          <p>
            {many ? "Each part has its own consensus: the median of each dimension of the measurements of that part. " : "The consensus is the median of each dimension. "}
            One slip of the tape does not move it; the fit check uses it.
          </p>
          <p>
            A measurement far from the others is marked so: check it before you rely on it. It still counts, in the
            median (which it hardly moves) and in the spread (which it widens: the spread is the largest figure above it
            minus the smallest).
          </p>
          <p>
            The rule: more than three estimated standard deviations from the median (estimated from the median absolute
            deviation), and at least {formatLength(OUTLIER_FLOOR_MM, unit)}; only from three measurements on.
            You can change or remove your own measurements; moderators can change or remove any, and every change is kept below.
          </p>
        </div>
        {editing ? (
          <EditMeasurement key={editing.id} actionData={actionData} />
        ) : (
          // A new form (empty again) once a measurement is added.
          <AddMeasurement key={count} actionData={actionData} />
        )}
        {changes.length > 0 && (
          <div>
            <h3 className="text-step-1 font-semibold">Changes to the measurements</h3>
            <ol className="mt-2 space-y-3 text-step--1">
              {changes.map((c) => (
                <li key={c.id} className="border-l-2 border-cloth-300 pl-3">
                  <p><span className="tabular-nums">{c.date}</span>: {c.text}.</p>
                  <p className="text-ink-soft">{c.after ? "Was" : "It said"}: {c.before}</p>
                  {c.after && <p className="text-ink-soft">Now: {c.after}</p>}
                  {c.reason && <p>Why: “{c.reason}”</p>}
                </li>
              ))}
            </ol>
          </div>
        )}
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
                <p className="mt-1">{i.text}</p>
                {i.verdict === "opening-too-small" && <p className="mt-1 font-medium">{VERDICT_TEXT["opening-too-small"]}</p>}
              </li>
            ))}
          </ul>
        )}
        {notFitting.length > 0 && (
          <p className="text-step--1 text-ink-soft">Too big for this space: {notFitting.map((i) => i.name).join("; ")}.</p>
        )}
        <CautionList cautions={loaderData.cautions} about="figures" />
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

/** The measurements of one part of the space, with their consensus and spread. */
function PartMeasurements({ part, many, unit }: { part: Part; many: boolean; unit: LengthUnit }) {
  const { measurements, consensus } = part;
  const headingId = `part-${part.position}-heading`;
  // On a phone the table has four columns: hull, tool and date sit in the first one, under the
  // member's credit, so the three sizes and their flags stay in view (390 px wide). The photo is
  // under the credit at every width.
  return (
    <div aria-labelledby={many ? headingId : undefined} role={many ? "group" : undefined} className="space-y-2">
      {many && <h3 id={headingId} className="text-step-1 font-semibold">{part.label[0].toUpperCase() + part.label.slice(1)}</h3>}
      {measurements.length === 0 ? (
        <p className="text-step--1 text-ink-soft">Nobody has measured this part yet. The fit check uses the size first recorded.</p>
      ) : (
        <div className="overflow-x-auto">
          <table className="w-full border-collapse text-step--1" data-part={part.position}>
            <caption className="sr-only">Measurements of the {part.label}, the consensus (median) and the spread of each dimension</caption>
            <thead>
              <tr className="border-b border-cloth-300 text-left align-bottom">
                <th scope="col" className="hidden py-1 pr-3 font-medium sm:table-cell">Measured</th>
                <th scope="col" className="py-1 pr-2 font-medium sm:pr-3">By</th>
                <th scope="col" className="hidden py-1 pr-3 font-medium sm:table-cell">Hull</th>
                <th scope="col" className="hidden py-1 pr-3 font-medium sm:table-cell">With</th>
                {AXES.map((a) => (
                  <th key={a} scope="col" className="py-1 pr-1 text-right font-medium sm:pr-2">
                    {AXIS_HEADINGS[a]}<span className="sm:hidden">, {unit}</span>
                  </th>
                ))}
              </tr>
            </thead>
            <tbody>
              {measurements.map((m) => (
                <tr key={m.id} id={`measurement-${m.id}`} className="border-b border-cloth-200 align-top" data-measurement={m.id}>
                  <td className="hidden py-1.5 pr-3 whitespace-nowrap tabular-nums sm:table-cell">{m.date}</td>
                  <td className="py-1.5 pr-2 sm:pr-3">
                    <span data-by>{m.by}</span>
                    {/* On a phone, the hull, the tool and the date sit under the credit. */}
                    <span className="block text-ink-soft sm:hidden">hull {m.hull} · {m.method}</span>
                    <span className="block text-ink-soft tabular-nums sm:hidden">{m.date}</span>
                    {m.photo && (
                      <a href={m.photo.url} className="mt-1 block w-fit">
                        <img src={m.photo.thumb} alt={`Photo of the measurement on hull ${m.hull}`} className="h-12 w-16 rounded-sm object-cover" loading="lazy" />
                      </a>
                    )}
                    {m.canChange && (
                      <Link
                        to={`?edit=${m.id}&unit=${unit}#edit-measurement`}
                        className="mt-1 flex min-h-11 items-center font-medium"
                        aria-label={`Change or remove the measurement of ${m.date} by ${m.mine ? "you" : m.by}`}
                      >
                        Change or remove
                      </Link>
                    )}
                    {m.changed && <span className="block text-[0.75rem] text-ink-soft">{m.changed}</span>}
                  </td>
                  <td className="hidden py-1.5 pr-3 tabular-nums sm:table-cell">{m.hull}</td>
                  <td className="hidden py-1.5 pr-3 sm:table-cell">{m.method}</td>
                  {m.cells.map((cell) => (
                    <td key={cell.axis} className="py-1.5 pr-1 text-right tabular-nums sm:pr-2" data-axis={cell.axis} data-flagged={cell.flagged || undefined}>
                      {cell.flagged ? (
                        <span className="inline-block rounded-sm border border-dashed border-deep-500 px-1 py-0.5 text-right sm:px-1.5">
                          <span className="block font-semibold whitespace-nowrap text-deep-900"><Length text={cell.text} /></span>
                          <span className="block text-[0.75rem] leading-tight text-ink-soft">far from the others</span>
                        </span>
                      ) : <span className="whitespace-nowrap"><Length text={cell.text} /></span>}
                    </td>
                  ))}
                </tr>
              ))}
            </tbody>
            {consensus && (
              <tfoot>
                <tr className="border-t-2 border-deep-700 font-semibold">
                  <th scope="row" className="py-1.5 pr-2 text-left sm:hidden">Consensus (median)</th>
                  <th scope="row" colSpan={4} className="hidden py-1.5 pr-3 text-left sm:table-cell">Consensus (median)</th>
                  {consensus.map((d) => <td key={d.axis} className="py-1.5 pr-1 text-right whitespace-nowrap tabular-nums sm:pr-2" data-consensus={d.axis}><Length text={d.value} /></td>)}
                </tr>
                <tr className="text-ink-soft">
                  <th scope="row" className="py-1 pr-2 text-left font-normal sm:hidden">Spread (largest − smallest)</th>
                  <th scope="row" colSpan={4} className="hidden py-1 pr-3 text-left font-normal sm:table-cell">Spread (largest − smallest)</th>
                  {consensus.map((d) => <td key={d.axis} className="py-1 pr-1 text-right whitespace-nowrap tabular-nums sm:pr-2" data-spread={d.axis}><Length text={d.spread} /></td>)}
                </tr>
              </tfoot>
            )}
          </table>
        </div>
      )}
    </div>
  );
}

/** "27 × 13 1/2 × 21 in", free to break after a "×" but never inside a dimension ("13 1/2"). */
function BoxText({ text }: { text: string }) {
  const dims = text.split(" × ");
  return (
    <>
      {dims.map((d, i) => (
        <Fragment key={i}>
          {i > 0 && " "}
          <span className="whitespace-nowrap">{d}{i < dims.length - 1 ? " ×" : ""}</span>
        </Fragment>
      ))}
    </>
  );
}

/** "13 1/2 in": on a phone the unit is in the column's heading, and read out only to screen readers. */
function Length({ text }: { text: string }) {
  const m = /^(.*) (in|mm)$/.exec(text);
  if (!m) return <>{text}</>;
  return <>{m[1]}<span className="max-sm:sr-only"> {m[2]}</span></>;
}

type FieldName = "section" | "length" | "width" | "height" | "method" | "hullNumber" | "measuredOn";

/** The fields a measurement is made of, for adding one and for changing one. */
function MeasurementFields({ fields, prefix }: { fields: Record<FieldName, FieldMetadata<any>>; prefix: string }) {
  const { unit, sectionChoices } = useLoaderDataOf();
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
  const section = fields.section;
  return (
    <>
      {sectionChoices.length > 1 ? (
        <div>
          <label htmlFor={section.id} className="block text-step-0 font-medium">Part of the space you measured</label>
          {(() => {
            const props = getSelectProps(section);
            return (
              <select {...props} key={props.key} className={`mt-1 text-step-0 ${inputClass}`}>
                {sectionChoices.map((c) => <option key={c.position} value={String(c.position)}>{c.label}</option>)}
              </select>
            );
          })()}
          <FieldError id={section.errorId} errors={section.errors} />
        </div>
      ) : (
        <input type="hidden" name={section.name} value="0" />
      )}
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
                <input {...props} key={props.key} id={`${prefix}-${fields.method.id}-${value}`} className="size-5 accent-deep-700" />
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
    </>
  );
}

function PhotoField({ id, label, hint, errors }: { id: string; label: string; hint: string; errors?: string[] | null }) {
  return (
    <div>
      <label htmlFor={id} className="block text-step-0 font-medium">{label}</label>
      <p id={`${id}-hint`} className="text-step--1 text-ink-soft">{hint}</p>
      <input
        id={id} name="photo" type="file" accept="image/jpeg,image/png,image/webp,image/heic,image/heif"
        aria-describedby={`${id}-hint`} aria-invalid={errors?.length ? true : undefined}
        className="mt-1 block w-full text-step--1 file:mr-3 file:rounded-md file:border-0 file:bg-deep-50 file:px-3 file:py-2.5 file:font-medium file:text-deep-700"
      />
      <FieldError id={`${id}-error`} errors={errors ?? undefined} />
    </div>
  );
}

const PHOTO_HINT = "Of the tape in place, or the space with its opening. JPEG, PNG, WebP or HEIC, up to 15 MB.";

function AddMeasurement({ actionData }: { actionData: ActionData }) {
  const { unit, canMeasure, signedIn, defaults, space, sectionChoices } = useLoaderDataOf();
  const navigation = useNavigation();
  const schema = measurementSchema(unit, undefined, sectionChoices.length);
  const lastResult = actionData?.intent === "add" ? actionData.result : undefined;
  const [form, fields] = useForm({
    id: "measurement-form",
    lastResult,
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
  const submitting = navigation.state === "submitting" && navigation.formData?.get("intent") === "add";
  return (
    <div id="add-measurement" className="max-w-2xl scroll-mt-4 rounded-lg border border-cloth-200 bg-white/70 p-4 sm:p-6">
      <h3 className="text-step-1 font-semibold">Add your measurement</h3>
      <p className="mt-1 text-step--1 text-ink-soft">
        Measure {sectionChoices.length > 1 ? "one part" : "the space"} inside, wall to wall. Type sizes as you read them: 13 1/2, 13.5 in, 343 mm or 1 ft 1 1/2 in.
      </p>
      <Form method="post" encType="multipart/form-data" {...getFormProps(form)} className="mt-4 space-y-5">
        <input type="hidden" name="intent" value="add" />
        <input type="hidden" name="unit" value={unit} />
        <FormMessage id={form.errorId} errors={form.errors} />
        <MeasurementFields fields={fields} prefix="add" />
        <PhotoField id="measurement-photo" label="A photo (optional)" hint={PHOTO_HINT} errors={lastResult?.error?.photo} />
        <button type="submit" className={`${buttonClass} w-full py-3 text-step-1 sm:w-auto`} disabled={submitting}>
          {submitting ? "Adding…" : "Add my measurement"}
        </button>
      </Form>
    </div>
  );
}

/** Changing or removing a measurement: its author, or a moderator (who says why). */
function EditMeasurement({ actionData }: { actionData: ActionData }) {
  const { unit, editing, space, sectionChoices } = useLoaderDataOf();
  const navigation = useNavigation();
  const schema = measurementEditSchema(unit, undefined, sectionChoices.length);
  const lastResult = actionData?.intent === "edit" ? actionData.result : undefined;
  const deleteResult = actionData?.intent === "delete" ? actionData.result : undefined;
  const [form, fields] = useForm({
    id: "edit-measurement-form",
    lastResult,
    constraint: getZodConstraint(schema),
    defaultValue: editing ? { ...editing.values, measurementId: String(editing.id) } : undefined,
    onValidate: ({ formData }) => parseWithZod(formData, { schema }),
    shouldValidate: "onBlur",
    shouldRevalidate: "onInput",
  });
  const [removeForm, removeFields] = useForm({
    id: "remove-measurement-form",
    lastResult: deleteResult,
    constraint: getZodConstraint(measurementDeleteSchema),
    defaultValue: editing ? { measurementId: String(editing.id) } : undefined,
    onValidate: ({ formData }) => parseWithZod(formData, { schema: measurementDeleteSchema }),
    shouldValidate: "onBlur",
  });
  if (!editing) return null;
  const cancel = `/spaces/${space.slug}?unit=${unit}#measurement-${editing.id}`;
  const saving = navigation.state === "submitting" && navigation.formData?.get("intent") === "edit";
  const removing = navigation.state === "submitting" && navigation.formData?.get("intent") === "delete";
  const whyLabel = editing.byOther ? `Why (${editing.by} will see it in the history)` : "Why (optional)";
  return (
    <div id="edit-measurement" className="max-w-2xl scroll-mt-4 rounded-lg border-2 border-deep-500 bg-white p-4 sm:p-6">
      <h3 className="text-step-1 font-semibold">{editing.byOther ? `Change ${editing.by}'s measurement` : "Change your measurement"}</h3>
      <p className="mt-1 text-step--1 text-ink-soft">
        Correct what was typed, then save: the consensus and what fits are worked out again at once. What it said before is kept in the history below.
      </p>
      <Form method="post" encType="multipart/form-data" {...getFormProps(form)} className="mt-4 space-y-5">
        <input type="hidden" name="intent" value="edit" />
        <input type="hidden" name="unit" value={unit} />
        <input type="hidden" name={fields.measurementId.name} value={String(editing.id)} />
        <FormMessage id={form.errorId} errors={form.errors} />
        <MeasurementFields fields={fields} prefix="edit" />
        {editing.photo && (
          <div className="flex items-center gap-3">
            <img src={editing.photo} alt="The photo with this measurement" className="h-16 w-20 rounded-sm object-cover" />
            <label className="flex min-h-11 items-center gap-2">
              {(() => {
                const props = getInputProps(fields.removePhoto, { type: "checkbox" });
                return <input {...props} key={props.key} className="size-5 accent-deep-700" />;
              })()}
              Remove the photo
            </label>
          </div>
        )}
        <PhotoField
          id="edit-measurement-photo"
          label={editing.photo ? "A new photo in its place (optional)" : "A photo (optional)"}
          hint={`${PHOTO_HINT}${lastResult ? " If you had chosen one, choose it again." : ""}`}
          errors={lastResult?.error?.photo}
        />
        <div>
          <label htmlFor={fields.reason.id} className="block text-step-0 font-medium">{whyLabel}</label>
          {(() => {
            const props = getTextareaProps(fields.reason);
            return <textarea {...props} key={props.key} rows={2} className={`mt-1 ${inputClass}`} />;
          })()}
          <FieldError id={fields.reason.errorId} errors={fields.reason.errors} />
        </div>
        <div className="flex flex-col gap-3 sm:flex-row sm:items-center">
          <button type="submit" className={`${buttonClass} w-full py-3 text-step-1 sm:w-auto`} disabled={saving}>
            {saving ? "Saving…" : "Save the change"}
          </button>
          <Link to={cancel} className="flex min-h-11 items-center justify-center">Cancel</Link>
        </div>
      </Form>

      <details className="mt-6 border-t border-cloth-200 pt-4" open={deleteResult ? true : undefined}>
        <summary className="flex min-h-11 cursor-pointer items-center font-medium text-bootstripe-700">Remove this measurement…</summary>
        <Form method="post" encType="multipart/form-data" {...getFormProps(removeForm)} className="mt-3 space-y-4">
          <input type="hidden" name="intent" value="delete" />
          <input type="hidden" name="unit" value={unit} />
          <input type="hidden" name={removeFields.measurementId.name} value={String(editing.id)} />
          <FormMessage id={removeForm.errorId} errors={removeForm.errors} />
          <div>
            <label htmlFor={removeFields.reason.id} className="block text-step-0 font-medium">{whyLabel}</label>
            {(() => {
              const props = getTextareaProps(removeFields.reason);
              return <textarea {...props} key={props.key} rows={2} className={`mt-1 ${inputClass}`} />;
            })()}
            <FieldError id={removeFields.reason.errorId} errors={removeFields.reason.errors} />
          </div>
          <button type="submit" className="inline-flex w-full items-center justify-center rounded-md border border-bootstripe-600 bg-white px-4 py-3 font-medium text-bootstripe-700 hover:bg-bootstripe-50 sm:w-auto" disabled={removing}>
            {removing ? "Removing…" : "Remove it for good"}
          </button>
        </Form>
      </details>
    </div>
  );
}

function useLoaderDataOf() {
  return useLoaderData<typeof loader>();
}
