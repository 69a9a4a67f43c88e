import { data, Form, Link } from "react-router";
import type { Route } from "./+types/tools.cable";
import { CableRunResult } from "~/components/cable-run-result";
import { buttonClass, FieldError, inputClass } from "~/components/ui/field";
import { UnitToggle } from "~/components/unit-toggle";
import { useRevealAnswer } from "~/components/use-reveal-answer";
import { ALLOWED_DROPS, cableToolSchema, firstErrors, queryObject, SYSTEM_VOLTAGES, unitsFor, withRunUnit } from "~/domain/boat-forms";
import { cableRunFormSchema } from "~/domain/calculation-forms";
import type { CableRunStored } from "~/domain/calculations";
import { DROP_CATEGORIES, INSULATION_RATINGS_C } from "~/domain/conductors";
import { can } from "~/domain/permissions";
import { MM_PER_FOOT, type LengthUnit } from "~/domain/units";
import { db } from "~/db/index.server";
import { attachCalculation, EditingError, listWriteupsOpenForNumbers } from "~/models/writeup-editing.server";
import { getUser, redirectWithNotice, requirePermission } from "~/services/session.server";
import { readerUnit } from "./reader-unit.server";
import { readForm } from "~/services/form-body.server";

const FIELDS = ["current", "length", "voltage", "drop", "insulation", "engineSpace", "label"] as const;

/** The same query in the other unit: a bare run length keeps its meaning by taking its unit along. */
function toggleQuery(form: Record<string, string>, unit: LengthUnit, to: LengthUnit): string {
  const q = new URLSearchParams({ ...form, unit: to });
  if (form.length) q.set("length", withRunUnit(form.length, unit));
  return q.toString();
}

export function meta() {
  return [{ title: "Cable for a DC run · Sistership" }];
}

export async function loader({ request }: Route.LoaderArgs) {
  // Open to every reader, as the fit check is; only attaching the answer asks for a member.
  const user = await getUser(request);
  const unit = await readerUnit(request, user);
  const q = new URL(request.url).searchParams;
  const values = queryObject(q, FIELDS);
  const form: Record<string, string> = { voltage: "12", drop: "3", insulation: "105", ...values };
  let errors: Record<string, string> = {};
  let input: CableRunStored | null = null;
  if (values.current !== undefined || values.length !== undefined) {
    const r = cableToolSchema(unit).safeParse(form);
    if (r.success) {
      input = {
        currentA: r.data.currentA,
        oneWayLengthMm: r.data.oneWayLengthFt * MM_PER_FOOT,
        systemVoltage: r.data.systemVoltage,
        allowedDropPct: r.data.allowedDropPct,
        insulationRatingC: r.data.insulationRatingC,
        inEngineSpace: r.data.inEngineSpace,
        label: (values.label ?? "").slice(0, 120),
      };
    } else errors = firstErrors(r.error);
  }
  // A member who writes can attach the answer to one of their write-ups (Numbers for readers).
  const mine = input && user && can(user.roles, "writeup:write") ? await listWriteupsOpenForNumbers(db, user.id) : [];
  return { unit, form, errors, input, mine, signedIn: Boolean(user), here: `/tools/cable?${q.toString()}` };
}

/** POST: attach the answer to a write-up of the member's own; the editor checks who may. */
export async function action({ request }: Route.ActionArgs) {
  const user = await requirePermission(request, "writeup:write");
  const formData = await readForm(request);
  const values: Record<string, string> = {};
  for (const [k, v] of formData.entries()) if (typeof v === "string") values[k] = v;
  const writeupId = Number(values.writeupId);
  if (!Number.isInteger(writeupId) || writeupId <= 0) return data({ attachErrors: { writeupId: "Choose one of your write-ups." } }, { status: 400 });
  // The lengths come from the answer shown, in millimetres with their unit: the reader's unit does not matter.
  const parsed = cableRunFormSchema(unitsFor(user.units)).safeParse(values);
  if (!parsed.success) return data({ attachErrors: firstErrors(parsed.error) }, { status: 400 });
  try {
    await attachCalculation(db, { writeupId, userId: user.id, calc: parsed.data.calc, title: parsed.data.title });
  } catch (error) {
    if (error instanceof EditingError) return data({ attachErrors: { writeupId: error.message } }, { status: error.status });
    throw error;
  }
  return redirectWithNotice(request, `/my/writeups/${writeupId}`, "The cable run is attached to your revision: readers see it under the write-up once the moderators publish it.");
}

export default function CableTool({ loaderData, actionData }: Route.ComponentProps) {
  const { unit, form, errors, input, mine, signedIn, here } = loaderData;
  // After "Size the cable", the answer is brought into view (on a phone it is below the form).
  const revealOnSubmit = useRevealAnswer("cable-answer", loaderData, input !== null);
  const attachErrors: Record<string, string> = actionData && "attachErrors" in actionData ? actionData.attachErrors : {};
  const field = (name: "current" | "length" | "label", label: string, hint: string, inputMode?: "decimal") => (
    <div>
      <label htmlFor={`cable-${name}`} className="block font-medium">{label}</label>
      <input
        id={`cable-${name}`}
        name={name}
        defaultValue={form[name as keyof typeof form] ?? ""}
        inputMode={inputMode}
        autoComplete="off"
        aria-invalid={errors[name] ? true : undefined}
        aria-describedby={`cable-${name}-hint${errors[name] ? ` cable-${name}-error` : ""}`}
        className={`mt-1 ${inputClass}`}
      />
      <p id={`cable-${name}-hint`} className="mt-0.5 text-step--1 text-ink-soft">{hint}</p>
      <FieldError id={`cable-${name}-error`} errors={errors[name] ? [errors[name]] : undefined} />
    </div>
  );
  const select = (name: "voltage" | "drop" | "insulation", label: string, options: { value: string; label: string }[]) => (
    <div>
      <label htmlFor={`cable-${name}`} className="block font-medium">{label}</label>
      <select
        id={`cable-${name}`}
        name={name}
        defaultValue={form[name]}
        aria-invalid={errors[name] ? true : undefined}
        className={`mt-1 ${inputClass}`}
      >
        {options.map((o) => <option key={o.value} value={o.value}>{o.label}</option>)}
      </select>
      <FieldError id={`cable-${name}-error`} errors={errors[name] ? [errors[name]] : undefined} />
    </div>
  );
  return (
    <div className="space-y-8">
      <header className="max-w-3xl">
        <h1 className="text-step-4 font-semibold leading-tight">Cable for a DC run</h1>
        <p className="mt-3 font-serif text-step-1 leading-relaxed text-ink-soft">
          The conductor size a 12 or 24 V run needs, by voltage drop and by the current it carries, and the fuse or breaker
          that protects it. For planning: the installation follows ABYC E-11, and a qualified marine electrician has the last word.
        </p>
      </header>
      <Form method="get" action="/tools/cable" className="space-y-5 rounded-lg bg-cloth-100 p-4 sm:p-6" aria-label="The cable run" onSubmit={revealOnSubmit}>
        <input type="hidden" name="unit" value={unit} />
        <div className="flex justify-end">
          <UnitToggle unit={unit} search={(to) => toggleQuery(form, unit, to)} />
        </div>
        <div className="grid gap-4 sm:grid-cols-2">
          {field("current", "Current", "What the load draws at most, in amps (e.g. 30)", "decimal")}
          {field("length", "Run length, one way", `From the source to the load, in ${unit === "mm" ? "metres" : "feet"} unless you type a unit (${unit === "mm" ? "3.4 or 3350 mm" : "11 or 11 ft 6 in"}); the drop is worked on the round trip`)}
        </div>
        <div className="grid gap-4 sm:grid-cols-3">
          {select("voltage", "System voltage", SYSTEM_VOLTAGES.map((v) => ({ value: String(v), label: `${v} V` })))}
          {select("drop", "Voltage drop allowed", ALLOWED_DROPS.map((d) => ({ value: String(d), label: `${d} %: ${DROP_CATEGORIES[d].toLowerCase()}` })))}
          {select("insulation", "Insulation rating", INSULATION_RATINGS_C.map((c) => ({ value: String(c), label: `${c} °C` })))}
        </div>
        <label className="flex min-h-11 items-center gap-2 font-medium">
          <input type="checkbox" name="engineSpace" value="true" defaultChecked={form.engineSpace === "true" || form.engineSpace === "on"} className="size-5 accent-deep-700" />
          The run passes through an engine space
        </label>
        {errors.engineSpace && <FieldError id="cable-engineSpace-error" errors={[errors.engineSpace]} />}
        {field("label", "What it feeds (optional)", "Shown as the title of the answer, e.g. House battery to the switch")}
        <button type="submit" className={buttonClass}>Size the cable</button>
      </Form>
      <section aria-labelledby="cable-answer" className="space-y-3">
        <h2 id="cable-answer" tabIndex={-1} className="scroll-mt-4 text-step-2 font-semibold focus:outline-none">The answer</h2>
        {input ? (
          <>
            <CableRunResult input={input} unit={unit} />
            {!signedIn && (
              <p className="text-step--1">
                <Link to={`/sign-in?redirectTo=${encodeURIComponent(here)}`} className="font-medium">Sign in</Link> to attach this answer to a write-up of yours.
              </p>
            )}
            {mine.length > 0 && (
              <Form method="post" className="space-y-3 rounded-lg bg-cloth-100 p-4" aria-label="Attach to a write-up of yours">
                <p className="font-medium">Attach this to a write-up of yours, so that readers see the numbers</p>
                {(["current", "voltage", "drop", "insulation"] as const).map((k) => <input key={k} type="hidden" name={k} value={form[k] ?? ""} />)}
                <input type="hidden" name="length" value={`${input.oneWayLengthMm} mm`} />
                {input.inEngineSpace && <input type="hidden" name="engineSpace" value="true" />}
                <div className="grid gap-4 sm:grid-cols-2">
                  <div>
                    <label htmlFor="attach-writeup" className="block font-medium">Write-up</label>
                    <select id="attach-writeup" name="writeupId" aria-invalid={attachErrors.writeupId ? true : undefined} className={`mt-1 ${inputClass}`}>
                      {mine.map((w) => <option key={w.id} value={w.id}>{w.title}</option>)}
                    </select>
                    <FieldError id="attach-writeup-error" errors={attachErrors.writeupId ? [attachErrors.writeupId] : undefined} />
                  </div>
                  <div>
                    <label htmlFor="attach-label" className="block font-medium">What the run feeds</label>
                    <input id="attach-label" name="label" defaultValue={input.label} aria-invalid={attachErrors.label ? true : undefined} className={`mt-1 ${inputClass}`} />
                    <FieldError id="attach-label-error" errors={attachErrors.label ? [attachErrors.label] : undefined} />
                  </div>
                </div>
                {Object.entries(attachErrors).filter(([k]) => k !== "writeupId" && k !== "label").map(([k, m]) => <FieldError key={k} id={`attach-${k}-error`} errors={[m]} />)}
                <button type="submit" className={buttonClass}>Attach to the write-up</button>
              </Form>
            )}
          </>
        ) : (
          <p className="text-ink-soft">
            {Object.keys(errors).length ? "Correct the fields marked above." : "Enter the current and the run length."}
          </p>
        )}
        <p className="text-step--1 text-ink-soft">
          For where a battery can go, see <Link to="/fit">Will it fit?</Link>
        </p>
      </section>
      <p className="text-step--1 text-ink-soft">For developers: the same answer as JSON from <code>GET /api/cable</code> (see the README).</p>
    </div>
  );
}
