// "Numbers for readers" in the write-up editor: attach a cable run or a weight move, see the result
// before attaching it, remove one. The forms post to the editor's action (intents calc-cable,
// calc-move, calc-remove) through fetchers, so nothing typed in the write-up itself is touched.
import { useEffect, useRef, useState, type ReactNode } from "react";
import { useFetcher } from "react-router";
import { CableRunResult } from "~/components/cable-run-result";
import { buttonClass, FieldError, FormMessage, inputClass, quietButtonClass } from "~/components/ui/field";
import { WeightMoveResult } from "~/components/weight-move-result";
import type { ShownCalculation } from "~/components/writeup-calculations";
import { ALLOWED_DROPS, SYSTEM_VOLTAGES } from "~/domain/boat-forms";
import type { CalculationFormValue } from "~/domain/calculation-forms";
import { DROP_CATEGORIES, INSULATION_RATINGS_C } from "~/domain/conductors";
import type { LengthUnit } from "~/domain/units";

export type NumbersActionData =
  | { kind: "cable-run" | "weight-move"; errors: Record<string, string> }
  | { kind: "cable-run" | "weight-move"; preview: CalculationFormValue }
  | { kind: "cable-run" | "weight-move"; attached: number }
  | { removed: number }
  | { error: string };

function Field({ id, name, label, hint, errors, inputMode }: { id: string; name: string; label: string; hint?: ReactNode; errors: Record<string, string>; inputMode?: "decimal" }) {
  const error = errors[name];
  return (
    <div>
      <label htmlFor={id} className="block font-medium">{label}</label>
      <input
        id={id}
        name={name}
        autoComplete="off"
        inputMode={inputMode}
        aria-invalid={error ? true : undefined}
        aria-describedby={`${hint ? `${id}-hint` : ""}${error ? ` ${id}-error` : ""}`.trim() || undefined}
        className={`mt-1 ${inputClass}`}
      />
      {hint && <p id={`${id}-hint`} className="mt-0.5 text-step--1 text-ink-soft">{hint}</p>}
      <FieldError id={`${id}-error`} errors={error ? [error] : undefined} />
    </div>
  );
}

function Select({ id, name, label, options, defaultValue, errors }: { id: string; name: string; label: string; options: { value: string; label: string }[]; defaultValue?: string; errors: Record<string, string> }) {
  const error = errors[name];
  return (
    <div>
      <label htmlFor={id} className="block font-medium">{label}</label>
      <select id={id} name={name} defaultValue={defaultValue} aria-invalid={error ? true : undefined} className={`mt-1 ${inputClass}`}>
        {options.map((o) => <option key={o.value} value={o.value}>{o.label}</option>)}
      </select>
      <FieldError id={`${id}-error`} errors={error ? [error] : undefined} />
    </div>
  );
}

const SIDE_OPTIONS = [
  { value: "port", label: "to port" },
  { value: "centre", label: "on the centreline" },
  { value: "starboard", label: "to starboard" },
];

/** One of the two forms, with its own fetcher: check, show the result, then attach. */
function CalculationForm({ kind, unit, weightWord, classNote }: { kind: "cable-run" | "weight-move"; unit: LengthUnit; weightWord: string; classNote: string | null }) {
  const fetcher = useFetcher<NumbersActionData>();
  const formRef = useRef<HTMLFormElement>(null);
  const [stale, setStale] = useState(false);
  const d = fetcher.data;
  const errors = d && "errors" in d ? d.errors : {};
  const preview = d && "preview" in d && !stale ? d.preview : null;
  const attached = d && "attached" in d;
  const busy = fetcher.state !== "idle";
  useEffect(() => {
    if (attached) formRef.current?.reset();
  }, [d]);
  const p = kind === "cable-run" ? "numbers-cable" : "numbers-move";
  const lengthWord = unit === "mm" ? "millimetres" : "inches";
  return (
    <div className="space-y-4">
      <fetcher.Form
        method="post"
        ref={formRef}
        onInput={() => setStale(true)}
        onChange={() => setStale(true)}
        onSubmit={() => setStale(false)}
        className="space-y-4 rounded-lg bg-cloth-100 p-4"
        aria-label={kind === "cable-run" ? "A cable run" : "A weight move"}
      >
        <input type="hidden" name="intent" value={kind === "cable-run" ? "calc-cable" : "calc-move"} />
        {kind === "cable-run" ? (
          <>
            <Field id={`${p}-label`} name="label" label="What the run feeds" hint="Shown as its title, e.g. House battery to the switch panel" errors={errors} />
            <div className="grid gap-4 sm:grid-cols-2">
              <Field id={`${p}-current`} name="current" label="Current" hint="What the load draws at most, in amps (e.g. 30)" errors={errors} inputMode="decimal" />
              <Field id={`${p}-length`} name="length" label="Run length, one way" hint={`From the source to the load, in ${unit === "mm" ? "metres" : "feet"} unless you type a unit`} errors={errors} />
            </div>
            <div className="grid gap-4 sm:grid-cols-3">
              <Select id={`${p}-voltage`} name="voltage" label="System voltage" defaultValue="12" errors={errors} options={SYSTEM_VOLTAGES.map((v) => ({ value: String(v), label: `${v} V` }))} />
              <Select id={`${p}-drop`} name="drop" label="Voltage drop allowed" defaultValue="3" errors={errors} options={ALLOWED_DROPS.map((x) => ({ value: String(x), label: `${x} %: ${DROP_CATEGORIES[x].toLowerCase()}` }))} />
              <Select id={`${p}-insulation`} name="insulation" label="Insulation rating" defaultValue="105" errors={errors} options={INSULATION_RATINGS_C.map((c) => ({ value: String(c), label: `${c} °C` }))} />
            </div>
            <label className="flex min-h-11 items-center gap-2 font-medium">
              <input type="checkbox" name="engineSpace" value="true" className="size-5 accent-deep-700" />
              The run passes through an engine space
            </label>
            <FieldError id={`${p}-engineSpace-error`} errors={errors.engineSpace ? [errors.engineSpace] : undefined} />
          </>
        ) : (
          <>
            {classNote && <p className="text-step--1 text-ink-soft">{classNote}</p>}
            <div className="grid gap-4 sm:grid-cols-2">
              <Field id={`${p}-name`} name="name" label="What moves" hint="e.g. House battery" errors={errors} />
              <Field id={`${p}-weight`} name="weight" label="Its weight" hint={`In ${weightWord} unless you type a unit, e.g. 62 lb`} errors={errors} />
            </div>
            {(["from", "to"] as const).map((end) => (
              <fieldset key={end} className="grid gap-4 sm:grid-cols-3">
                <legend className="font-medium">{end === "from" ? "Where it was" : "Where it goes"}</legend>
                <Field id={`${p}-${end}Aft`} name={`${end}Aft`} label="Aft of the bow" hint={`In ${lengthWord} unless you type a unit`} errors={errors} />
                <Select id={`${p}-${end}Side`} name={`${end}Side`} label="Side" defaultValue={end === "from" ? "starboard" : "port"} errors={errors} options={SIDE_OPTIONS} />
                <Field id={`${p}-${end}Off`} name={`${end}Off`} label="Off the centreline" hint="Leave empty on the centreline" errors={errors} />
              </fieldset>
            ))}
            <Field id={`${p}-label`} name="label" label="Title (optional)" hint="e.g. The second battery to port" errors={errors} />
          </>
        )}
        <FormMessage errors={d && "error" in d ? [d.error] : undefined} />
        <div className="flex flex-wrap gap-3">
          <button type="submit" name="step" value="check" className={quietButtonClass} disabled={busy}>Work it out</button>
          {preview && (
            <button type="submit" name="step" value="attach" className={buttonClass} disabled={busy}>Attach to the write-up</button>
          )}
        </div>
        {attached && <p role="status" className="text-deep-800">Attached. Readers see it under the write-up.</p>}
        {stale && d && "preview" in d && <p className="text-step--1 text-ink-soft">You changed the figures: work it out again to see the new result.</p>}
      </fetcher.Form>
      {preview && (
        <div aria-label="The result, before you attach it" role="region">
          <p className="mb-2 text-step--1 font-medium text-ink-soft">What readers will see:</p>
          {preview.calc.kind === "cable-run" ? (
            <CableRunResult input={preview.calc.input} unit={unit} title={preview.title} />
          ) : (
            <WeightMoveResult input={preview.calc.input} unit={unit} title={preview.title} />
          )}
        </div>
      )}
    </div>
  );
}

function AttachedCalculation({ c, unit }: { c: ShownCalculation; unit: LengthUnit }) {
  const fetcher = useFetcher<NumbersActionData>();
  const title = c.title || (c.kind === "cable-run" ? c.input.label || "Cable for the run" : `Moving the ${c.input.items.find((i) => i.id === c.input.moved)?.name.toLowerCase() ?? "weight"}`);
  const error = fetcher.data && "error" in fetcher.data ? fetcher.data.error : null;
  return (
    <li className="rounded-md border border-cloth-200 bg-white p-3" data-attached-calculation={c.kind}>
      <div className="flex flex-wrap items-center justify-between gap-2">
        <p><strong>{title}</strong> <span className="text-step--1 text-ink-soft">({c.kind === "cable-run" ? "cable run" : "weight move"})</span></p>
        <fetcher.Form method="post">
          <input type="hidden" name="intent" value="calc-remove" />
          <input type="hidden" name="calculationId" value={c.id} />
          <button type="submit" className={quietButtonClass} disabled={fetcher.state !== "idle"} aria-label={`Remove ${title}`}>Remove</button>
        </fetcher.Form>
      </div>
      {error && <FormMessage errors={[error]} />}
      <details className="mt-2">
        <summary className="cursor-pointer text-step--1 font-medium text-deep-700">Show the numbers</summary>
        <div className="mt-2">
          {c.kind === "cable-run" ? <CableRunResult input={c.input} unit={unit} title={c.title} /> : <WeightMoveResult input={c.input} unit={unit} title={c.title} />}
        </div>
      </details>
    </li>
  );
}

export function WriteupNumbersEditor({
  calculations, unit, weightWord, classNote, canAttachMove,
}: {
  calculations: readonly ShownCalculation[];
  unit: LengthUnit;
  weightWord: string;
  classNote: string | null;
  canAttachMove: boolean;
}) {
  const [kind, setKind] = useState<"cable-run" | "weight-move">("cable-run");
  return (
    <section aria-labelledby="numbers-heading" className="space-y-4 border-t border-cloth-200 pt-6">
      <h2 id="numbers-heading" className="text-step-2 font-semibold">Numbers for readers</h2>
      <p className="max-w-3xl text-ink-soft">
        Attach the cable you sized or the weight you moved: readers see the numbers, the drawing and the cautions under the
        write-up, worked out by the same code as the tools. Like the text, they reach readers when the moderators publish this revision.
      </p>
      {calculations.length > 0 ? (
        <ul className="space-y-2" aria-label="Attached numbers">
          {calculations.map((c) => <AttachedCalculation key={c.id} c={c} unit={unit} />)}
        </ul>
      ) : (
        <p className="text-step--1 text-ink-soft">Nothing attached yet.</p>
      )}
      <fieldset className="flex flex-wrap gap-4">
        <legend className="font-medium">Add</legend>
        <label className="flex min-h-11 items-center gap-2">
          <input type="radio" name="numbers-kind" checked={kind === "cable-run"} onChange={() => setKind("cable-run")} className="size-5 accent-deep-700" />
          a cable run
        </label>
        <label className="flex min-h-11 items-center gap-2">
          <input type="radio" name="numbers-kind" checked={kind === "weight-move"} onChange={() => setKind("weight-move")} disabled={!canAttachMove} className="size-5 accent-deep-700" />
          a weight move{canAttachMove ? "" : " (the class particulars are not set yet)"}
        </label>
      </fieldset>
      <CalculationForm key={kind} kind={kind} unit={unit} weightWord={weightWord} classNote={classNote} />
    </section>
  );
}
