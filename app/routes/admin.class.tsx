import { getFormProps, getInputProps, useForm } from "@conform-to/react";
import { getZodConstraint, parseWithZod } from "@conform-to/zod/v4";
import { data, Form } from "react-router";
import type { Route } from "./+types/admin.class";
import { buttonClass, FormMessage, Notice, TextField } from "~/components/ui/field";
import { db } from "~/db/index.server";
import { classParticularsSchema, fieldsOf, unitsFor } from "~/domain/boat-forms";
import { CLASS_NAME } from "~/domain/hulls";
import { describePosition, formatGm, formatMct1 } from "~/domain/ledger";
import { mct1 } from "~/domain/stability";
import { formatLength, formatWeight, kgToPounds, MM_PER_FOOT, type LengthUnit } from "~/domain/units";
import { getClassParticulars, listStandardItems, setClassParticulars } from "~/models/boats.server";
import { readNotice, redirectWithNotice, requirePermission } from "~/services/session.server";
import { readerUnit } from "./reader-unit.server";
import { readForm } from "~/services/form-body.server";

export function meta() {
  return [{ title: `Class particulars · ${CLASS_NAME} · Sistership` }];
}

function unitOf(value: FormDataEntryValue | null): LengthUnit {
  return value === "mm" ? "mm" : "in";
}

export async function loader({ request }: Route.LoaderArgs) {
  const user = await requirePermission(request, "class:configure");
  const unit = await readerUnit(request, user);
  const units = unitsFor(unit);
  const [particulars, standardItems, { notice, headers }] = await Promise.all([getClassParticulars(db), listStandardItems(db), readNotice(request)]);
  const defaults = particulars
    ? {
        lightDisplacement: formatWeight(particulars.lightDisplacementKg, units.weight),
        gm: formatGm(particulars.gmMm, unit),
        loa: formatLength(particulars.loaMm, unit),
        lwl: formatLength(particulars.lwlMm, unit),
        beam: formatLength(particulars.beamMm, unit),
        lcf: formatLength(particulars.lcfAftOfBowMm, unit),
        waterlineForwardEnd: formatLength(particulars.waterlineForwardEndMm, unit),
        gmLongitudinal: particulars.gmLongitudinalMm === null ? "" : formatGm(particulars.gmLongitudinalMm, unit),
        mct1: particulars.mct1FtLbPerIn === null ? "" : String(particulars.mct1FtLbPerIn),
        demo: particulars.demo ? "on" : undefined,
      }
    : { demo: undefined };
  const derivedMct1 =
    particulars?.gmLongitudinalMm != null
      ? mct1(kgToPounds(particulars.lightDisplacementKg), particulars.gmLongitudinalMm / MM_PER_FOOT, particulars.lwlMm / MM_PER_FOOT)
      : null;
  return data(
    {
      unit,
      defaults,
      demo: particulars?.demo ?? false,
      updatedAt: particulars?.updatedAt.toISOString() ?? null,
      derivedMct1: derivedMct1 === null ? null : formatMct1(derivedMct1, unit),
      standardItems: standardItems.map((i) => ({
        slug: i.slug,
        name: i.name,
        weight: formatWeight(i.weightKg, units.weight),
        where: describePosition(i, unit),
        note: i.note,
      })),
      notice,
    },
    { headers },
  );
}

export async function action({ request }: Route.ActionArgs) {
  const user = await requirePermission(request, "class:configure");
  const formData = await readForm(request);
  const units = unitsFor(unitOf(formData.get("unit")));
  const submission = parseWithZod(formData, { schema: classParticularsSchema(units) });
  if (submission.status !== "success") return data({ result: submission.reply() }, { status: 400 });
  await setClassParticulars(db, submission.value, user.id);
  return redirectWithNotice(request, "/admin/class", "The class particulars are saved. Every boat's heel and trim now uses them.");
}

export default function AdminClass({ loaderData, actionData }: Route.ComponentProps) {
  const { unit, defaults, demo, updatedAt, derivedMct1, standardItems, notice } = loaderData;
  const schema = classParticularsSchema(unitsFor(unit));
  const [form, f] = useForm({
    id: "class-particulars",
    lastResult: actionData?.result,
    constraint: getZodConstraint(fieldsOf(schema)),
    defaultValue: defaults,
    onValidate: ({ formData }) => parseWithZod(formData, { schema }),
    shouldValidate: "onBlur",
    shouldRevalidate: "onInput",
  });
  const len = unit === "mm" ? "millimetres" : "inches";
  return (
    <div className="mx-auto max-w-3xl space-y-8">
      <header>
        <h1 className="text-step-3 font-semibold">Class particulars</h1>
        <p className="mt-2 text-ink-soft">
          The figures every {CLASS_NAME} boat's heel and trim are worked out from, until an owner measures their own GM. Lengths in{" "}
          {len} unless you type a unit; GM and GM_L in {unit === "mm" ? "metres" : "feet"}.
        </p>
      </header>
      {notice && <Notice>{notice}</Notice>}
      {demo && (
        <p className="rounded-md border-l-4 border-varnish-500 bg-cloth-100 p-3" data-demo-values>
          These are <strong>invented demo values</strong>, not a designer's figures. Replace them with the class's published particulars.
        </p>
      )}
      <Form method="post" {...getFormProps(form)} className="space-y-5 rounded-lg border border-cloth-200 bg-white/70 p-5">
        <input type="hidden" name="unit" value={unit} />
        <FormMessage errors={form.errors} id={form.errorId} />
        <div className="grid gap-4 sm:grid-cols-2">
          <TextField field={f.lightDisplacement} label="Light displacement" hint="The boat empty, e.g. 2,850 lb" />
          <TextField field={f.gm} label="GM (transverse metacentric height)" hint="e.g. 2.8 ft" />
          <TextField field={f.loa} label="Length overall" hint="e.g. 22 ft" />
          <TextField field={f.lwl} label="Waterline length" hint="e.g. 19 ft 2 in" />
          <TextField field={f.beam} label="Beam" hint="e.g. 7 ft 10 in" />
          <TextField field={f.lcf} label="Centre of flotation (LCF), aft of the bow" hint="The point she trims about" />
          <TextField field={f.waterlineForwardEnd} label="Forward end of the waterline, aft of the bow" hint="The bow overhang; 0 if none" />
        </div>
        <fieldset className="space-y-3">
          <legend className="font-medium">For trim: GM_L or MCT1</legend>
          <div className="grid gap-4 sm:grid-cols-2">
            <TextField field={f.gmLongitudinal} label="GM_L (longitudinal metacentric height)" hint="e.g. 36 ft; wins when both are given" />
            <TextField field={f.mct1} label="MCT1, ft·lb per inch" hint="The moment to change trim one inch, if known directly" />
          </div>
          {derivedMct1 && <p className="text-step--1 text-ink-soft">At light displacement the GM_L above gives MCT1 = Δ·GM_L / (12·L) = {derivedMct1}.</p>}
        </fieldset>
        <label className="flex items-center gap-2">
          <input {...getInputProps(f.demo, { type: "checkbox" })} key={f.demo.key} className="h-5 w-5" />
          These are invented demo values (every page that uses them says so)
        </label>
        <button type="submit" className={buttonClass}>Save the particulars</button>
        {updatedAt && <p className="text-step--1 text-ink-soft">Last saved {new Date(updatedAt).toISOString().slice(0, 10)}.</p>}
      </Form>
      <section>
        <h2 className="text-step-2 font-semibold">Items offered to owners</h2>
        <p className="mt-1 text-ink-soft">Owners add these to their ledger and adjust the weight and place to their boat. They come from content-seed/ledger.yaml.</p>
        <ul className="mt-3 divide-y divide-cloth-200 rounded-lg border border-cloth-200 bg-white/70">
          {standardItems.map((i) => (
            <li key={i.slug} className="p-3">
              <p className="font-medium">{i.name} <span className="text-ink-soft">· {i.weight}</span></p>
              <p className="text-step--1 text-ink-soft">{i.where}{i.note ? `. ${i.note}` : ""}</p>
            </li>
          ))}
        </ul>
      </section>
    </div>
  );
}
