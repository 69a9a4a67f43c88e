import { useState } from "react";
import { Form, Link } from "react-router";
import type { Route } from "./+types/tools.heel";
import { SectionDrawing } from "~/components/boat-drawings";
import { buttonClass, FieldError, inputClass } from "~/components/ui/field";
import { useRevealAnswer } from "~/components/use-reveal-answer";
import { db } from "~/db/index.server";
import { firstErrors, heelToolSchema, queryObject, unitsFor } from "~/domain/boat-forms";
import { describeHeel, formatGm, formatMoment, weightUnitFor } from "~/domain/ledger";
import { calibrateGm, heelFromMoment, SMALL_ANGLE_LIMIT_DEG, STABILITY_CAUTIONS } from "~/domain/stability";
import { formatLength, formatWeight, kgToPounds, mmToInches, MM_PER_FOOT } from "~/domain/units";
import { getClassParticulars } from "~/models/boats.server";
import { readerUnit } from "./reader-unit.server";

const FIELDS = ["find", "displacement", "weight", "distance", "side", "gm", "method", "heel", "deflection", "plumbLength"] as const;

export function meta() {
  return [{ title: "Heel from a weight moved across · Sistership" }];
}

type Answer =
  | { find: "heel"; heelDeg: number; momentFtLb: number; gmMm: number }
  | { find: "gm"; gmMm: number; momentFtLb: number };

export async function loader({ request }: Route.LoaderArgs) {
  // Open to every reader, as the fit check is.
  const unit = await readerUnit(request);
  const units = unitsFor(unit);
  const particulars = await getClassParticulars(db);
  const q = new URL(request.url).searchParams;
  const values = queryObject(q, FIELDS);
  const form: Record<string, string> = {
    find: "heel",
    side: "starboard",
    method: "angle",
    displacement: particulars ? formatWeight(particulars.lightDisplacementKg, units.weight) : "",
    gm: particulars ? formatGm(particulars.gmMm, unit) : "",
    ...values,
  };
  let errors: Record<string, string> = {};
  let answer: Answer | null = null;
  if (values.weight !== undefined || values.distance !== undefined) {
    const r = heelToolSchema(units).safeParse(form);
    if (!r.success) errors = firstErrors(r.error);
    else {
      const v = r.data;
      const sign = form.side === "port" ? -1 : 1;
      const momentFtLb = (kgToPounds(v.weightKg) * mmToInches(v.distanceMm)) / 12;
      const displacementLb = kgToPounds(v.displacementKg);
      if (v.find === "heel") {
        answer = { find: "heel", heelDeg: heelFromMoment(sign * momentFtLb, displacementLb, v.gmMm / MM_PER_FOOT), momentFtLb: sign * momentFtLb, gmMm: v.gmMm };
      } else {
        const heel = "degrees" in v.heel ? { degrees: v.heel.degrees } : { deflection: v.heel.deflectionMm, plumbLength: v.heel.plumbLengthMm };
        const gmFt = calibrateGm({ weightLb: kgToPounds(v.weightKg), shiftIn: mmToInches(v.distanceMm), displacementLb, heel });
        answer = { find: "gm", gmMm: gmFt * MM_PER_FOOT, momentFtLb };
      }
    }
  }
  return {
    unit,
    form,
    errors,
    answer,
    beamMm: particulars?.beamMm ?? 94 * 25.4,
    classNote: particulars
      ? `Filled in with the class figures${particulars.demo ? " (invented demo values)" : ""}: light displacement ${formatWeight(particulars.lightDisplacementKg, units.weight)}, GM ${formatGm(particulars.gmMm, unit)}.`
      : null,
  };
}

export default function HeelTool({ loaderData }: Route.ComponentProps) {
  const { unit, form, errors, answer, beamMm, classNote } = loaderData;
  const [find, setFind] = useState(form.find);
  const [method, setMethod] = useState(form.method);
  // After "Work it out", the answer is brought into view (on a phone it is below the form).
  const revealOnSubmit = useRevealAnswer("heel-answer", loaderData, answer !== null);
  const weightWord = weightUnitFor(unit) === "kg" ? "kilograms" : "pounds";
  const lengthWord = unit === "mm" ? "millimetres" : "inches";
  // The class's light displacement is filled in; the heel is worked against the boat as she floats.
  const displacementHint = classNote
    ? `Light displacement is filled in: add the crew, gear, water and fuel aboard. In ${weightWord} unless you type a unit`
    : `As she floats, with the crew, gear, water and fuel aboard; in ${weightWord} unless you type a unit`;
  const field = (name: string, label: string, hint: string) => (
    <div>
      <label htmlFor={`heel-${name}`} className="block font-medium">{label}</label>
      <input
        id={`heel-${name}`}
        name={name}
        defaultValue={form[name] ?? ""}
        autoComplete="off"
        aria-invalid={errors[name] ? true : undefined}
        aria-describedby={`heel-${name}-hint${errors[name] ? ` heel-${name}-error` : ""}`}
        className={`mt-1 ${inputClass}`}
      />
      <p id={`heel-${name}-hint`} className="mt-0.5 text-step--1 text-ink-soft">{hint}</p>
      <FieldError id={`heel-${name}-error`} errors={errors[name] ? [errors[name]] : undefined} />
    </div>
  );
  return (
    <div className="space-y-8">
      <header className="max-w-3xl">
        <h1 className="text-step-4 font-semibold leading-tight">Heel from a weight moved across</h1>
        <p className="mt-3 font-serif text-step-1 leading-relaxed text-ink-soft">
          How far a boat heels when a weight moves from one side to the other; or, from the list you measured after moving a
          known weight, the boat's GM. For your own boat's whole ledger, use your boat's page (from <Link to="/account">your account</Link>).
        </p>
      </header>
      <Form method="get" action="/tools/heel" className="space-y-5 rounded-lg bg-cloth-100 p-4 sm:p-6" aria-label="The weight moved" onSubmit={revealOnSubmit}>
        <input type="hidden" name="unit" value={unit} />
        <fieldset className="flex flex-wrap gap-4">
          <legend className="font-medium">Work out</legend>
          <label className="flex min-h-11 items-center gap-2">
            <input type="radio" name="find" value="heel" checked={find === "heel"} onChange={() => setFind("heel")} className="size-5 accent-deep-700" />
            the heel, from the GM
          </label>
          <label className="flex min-h-11 items-center gap-2">
            <input type="radio" name="find" value="gm" checked={find === "gm"} onChange={() => setFind("gm")} className="size-5 accent-deep-700" />
            the GM, from a measured list
          </label>
        </fieldset>
        {classNote && <p className="text-step--1 text-ink-soft">{classNote}</p>}
        <div className="grid gap-4 sm:grid-cols-3">
          {field("displacement", "Displacement", displacementHint)}
          {field("weight", "Weight moved", `In ${weightWord} unless you type a unit, e.g. 62 lb`)}
          {field("distance", "Moved across by", `In ${lengthWord} unless you type a unit, e.g. 51 in`)}
        </div>
        {find === "heel" ? (
          <div className="grid gap-4 sm:grid-cols-3">
            <div>
              <label htmlFor="heel-side" className="block font-medium">Moved towards</label>
              <select id="heel-side" name="side" defaultValue={form.side} className={`mt-1 ${inputClass}`}>
                <option value="starboard">starboard</option>
                <option value="port">port</option>
              </select>
            </div>
            {field("gm", "GM", "In feet (or metres) unless you type a unit, e.g. 2.8 ft")}
          </div>
        ) : (
          <div className="space-y-4">
            <fieldset className="flex flex-wrap gap-4">
              <legend className="font-medium">The list you measured, as</legend>
              <label className="flex min-h-11 items-center gap-2">
                <input type="radio" name="method" value="angle" checked={method === "angle"} onChange={() => setMethod("angle")} className="size-5 accent-deep-700" />
                an angle
              </label>
              <label className="flex min-h-11 items-center gap-2">
                <input type="radio" name="method" value="plumb" checked={method === "plumb"} onChange={() => setMethod("plumb")} className="size-5 accent-deep-700" />
                a plumb line's deflection
              </label>
            </fieldset>
            {method === "angle" ? (
              <div className="grid gap-4 sm:grid-cols-3">{field("heel", "Change of list, degrees", "From a level or an inclinometer, e.g. 1.6")}</div>
            ) : (
              <div className="grid gap-4 sm:grid-cols-3">
                {field("deflection", "Deflection", "How far the line moved along its batten")}
                {field("plumbLength", "Plumb line length", "From its pivot to the batten")}
              </div>
            )}
          </div>
        )}
        <button type="submit" className={buttonClass}>Work it out</button>
      </Form>

      <section aria-labelledby="heel-answer" className="space-y-4">
        <h2 id="heel-answer" tabIndex={-1} className="scroll-mt-4 text-step-2 font-semibold focus:outline-none">The answer</h2>
        {!answer ? (
          <p className="text-ink-soft">{Object.keys(errors).length ? "Correct the fields marked above." : "Enter the weight and how far it moves."}</p>
        ) : answer.find === "heel" ? (
          <div className="grid gap-6 md:grid-cols-[minmax(0,1fr)_minmax(0,1fr)]">
            <div className="space-y-2">
              <p className="text-step-1" data-heel-degrees={answer.heelDeg.toFixed(4)}>
                She heels <strong className="font-semibold">{describeHeel(answer.heelDeg)}</strong>.
              </p>
              <p className="text-step--1 text-ink-soft">
                tan θ = w·d / (Δ·GM): a moment of {formatMoment(answer.momentFtLb, unit)} against Δ·GM (GM {formatGm(answer.gmMm, unit)}).
              </p>
              {Math.abs(answer.heelDeg) > SMALL_ANGLE_LIMIT_DEG && (
                <p role="alert" className="font-medium text-bootstripe-600">Past about {SMALL_ANGLE_LIMIT_DEG} degrees this estimate no longer holds.</p>
              )}
            </div>
            <SectionDrawing
              beamIn={mmToInches(beamMm)}
              heelDeg={answer.heelDeg}
              weights={[]}
              caption="Looking forward: a simple invented hull, heeled by the computed angle."
              widthPx={320}
            />
          </div>
        ) : (
          <div className="space-y-2">
            <p className="text-step-1" data-gm-mm={answer.gmMm.toFixed(1)}>
              GM <strong className="font-semibold">{formatGm(answer.gmMm, unit)}</strong> ({formatLength(answer.gmMm, unit)}).
            </p>
            <p className="text-step--1 text-ink-soft">GM = w·d / (Δ·tan θ), the inclining relation (ASTM F1321). Owners can store it for their boat on the boat's page.</p>
          </div>
        )}
        <aside className="rounded-lg border-l-4 border-bootstripe-600 bg-bootstripe-50 p-4 text-step--1">
          <h3 className="font-sans font-semibold text-bootstripe-800">Weight and stability</h3>
          <ul className="mt-1 list-disc space-y-1 pl-5">
            {STABILITY_CAUTIONS.map((t) => <li key={t}>{t}</li>)}
          </ul>
        </aside>
      </section>
      <p className="text-step--1 text-ink-soft">For developers: the same answer as JSON from <code>GET /api/heel</code> (see the README).</p>
    </div>
  );
}
