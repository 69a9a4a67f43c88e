import { getFormProps, getInputProps, getTextareaProps, useForm } from "@conform-to/react";
import { getZodConstraint, parseWithZod } from "@conform-to/zod/v4";
import { useEffect, useRef, useState } from "react";
import { data, type ShouldRevalidateFunctionArgs, Form, Link, useFetcher, useLocation, useNavigation } from "react-router";
import type { Route } from "./+types/my.writeups.$id";
import { CautionList } from "~/components/cautions";
import { PhotoUploader } from "~/components/photo-uploader";
import { WriteupNumbersEditor } from "~/components/writeup-numbers-editor";
import { buttonClass, FieldError, FormMessage, inputClass, Notice, quietButtonClass, TextField } from "~/components/ui/field";
import { db } from "~/db/index.server";
import { firstErrors, unitsFor } from "~/domain/boat-forms";
import { cableRunFormSchema, weightMoveFormSchema } from "~/domain/calculation-forms";
import { cautionsFor } from "~/domain/cautions";
import { formatGm } from "~/domain/ledger";
import { formatWeight, type LengthUnit } from "~/domain/units";
import { canEdit, DECISION_LABELS, type RevisionState, STATE_LABELS } from "~/domain/writeup-lifecycle";
import { writeupFormSchema } from "~/domain/writeup-form";
import { writeupWarnings } from "~/domain/writeup-checks";
import { getClassParticulars } from "~/models/boats.server";
import { listWriteupCalculations } from "~/models/calculations.server";
import {
  attachCalculation, detachCalculation, EditingError, getForEditing, listSystemAndZoneChoices, requireAuthorsWriteupForNumbers, saveDraft,
  submitForReview, withdraw,
} from "~/models/writeup-editing.server";
import { listBoatsOf } from "~/models/users.server";
import { readNotice, redirectWithNotice, requirePermission } from "~/services/session.server";
import { readForm } from "~/services/form-body.server";
import { formatDate } from "~/components/writeup-card";

export function meta() {
  return [{ title: "Write-up editor · Sistership" }];
}

const weightUnitOf = (units: "in" | "mm"): "lb" | "kg" => (units === "mm" ? "kg" : "lb");

/**
 * After a save of a new write-up or a send for review, the editor's address carries `?kept=<key>`:
 * the copy this device kept under that key is now on the server, and the page clears it.
 */
const KEPT_PARAM = "kept";

type PartValue = { name: string; quantity: string; weight: string; note: string };
type EditorValue = {
  title: string; summary: string; body: string; systems: string[]; zones: string[]; appliesTo: string;
  difficulty?: "easy" | "moderate" | "hard"; hoursSpent?: string; costUsd?: string; parts: PartValue[];
};
type DecisionView = { id: number; decision: "publish" | "request_changes" | "decline" | "withdraw"; reason: string; createdAt: string; by: string; revisionNumber: number };

function appliesToText(from: number, to: number): string {
  if (from === 1 && to === 612) return "all";
  if (from === 1 && to === 298) return "mk1";
  if (from === 299 && to === 612) return "mk2";
  return `${from}-${to}`;
}

export async function loader({ request, params }: Route.LoaderArgs) {
  const user = await requirePermission(request, "writeup:write");
  const [choices, boats, { notice, headers }, particulars] = await Promise.all([
    listSystemAndZoneChoices(db), listBoatsOf(db, user.id), readNotice(request), getClassParticulars(db),
  ]);
  const weightUnit = weightUnitOf(user.units);
  const unit: LengthUnit = user.units;
  const classNote = particulars
    ? `Worked out with the class figures${particulars.demo ? " (invented demo values)" : ""}: light displacement ${formatWeight(particulars.lightDisplacementKg, weightUnit)}, GM ${formatGm(particulars.gmMm, unit)}.`
    : null;
  const numbers = { unit, classNote, canAttachMove: particulars !== null };
  if (params.id === "new") {
    const defaultValue: EditorValue = { title: "", summary: "", body: "", systems: [], zones: [], appliesTo: "all", parts: [] };
    const decisions: DecisionView[] = [];
    const calculations: Awaited<ReturnType<typeof listWriteupCalculations>> = [];
    return data({ id: "new" as const, choices, weightUnit, notice, editable: true, state: "draft" as RevisionState, published: false, slug: null as string | null, decisions, updatedAt: null as string | null, boats: boats.map((b) => b.hullNumber), defaultValue, numbers, calculations }, { headers });
  }
  const id = Number(params.id);
  const found = Number.isInteger(id) && id >= 1 && id <= 2_147_483_647 ? await getForEditing(db, id) : null;
  if (!found || found.writeup.authorId !== user.id) throw data("No such write-up of yours.", { status: 404 });
  const r = found.revision;
  const defaultValue: EditorValue = {
    title: r.title, summary: r.summary, body: r.bodyMarkdown, systems: r.systems, zones: r.zones,
    appliesTo: appliesToText(r.hullFrom, r.hullTo),
    difficulty: r.difficulty ?? undefined, hoursSpent: r.hoursSpent === null ? undefined : String(r.hoursSpent), costUsd: r.costUsd === null ? undefined : String(r.costUsd),
    parts: r.parts.map((p) => ({ name: p.name, quantity: String(p.quantity), weight: p.weightKg === null ? "" : formatWeight(p.weightKg, weightUnit), note: p.note })),
  };
  const decisions: DecisionView[] = found.decisions.map((d) => ({ id: d.id, decision: d.decision, reason: d.reason, by: d.by, revisionNumber: d.revisionNumber, createdAt: d.createdAt.toISOString() }));
  return data(
    {
      id, choices, weightUnit, notice, boats: boats.map((b) => b.hullNumber),
      editable: canEdit(r.status) || r.status === "published" || r.status === "declined",
      state: r.status as RevisionState, published: found.published, slug: found.writeup.slug as string | null,
      updatedAt: r.updatedAt.toISOString() as string | null,
      decisions,
      defaultValue,
      numbers,
      calculations: await listWriteupCalculations(db, id),
    },
    { headers },
  );
}

/**
 * The live preview posts to /api/preview, which changes nothing: the editor's data is not read
 * again after it (that would also take away a notice such as "Draft saved.", which is read once).
 */
export function shouldRevalidate({ formAction, defaultShouldRevalidate }: ShouldRevalidateFunctionArgs) {
  if (formAction === "/api/preview") return false;
  return defaultShouldRevalidate;
}

export async function action({ request, params }: Route.ActionArgs) {
  const user = await requirePermission(request, "writeup:write");
  const formData = await readForm(request);
  const intent = String(formData.get("intent") ?? "save");
  const writeupId = params.id === "new" ? null : Number(params.id);
  if (writeupId !== null && !(Number.isInteger(writeupId) && writeupId >= 1 && writeupId <= 2_147_483_647)) throw data("No such write-up.", { status: 404 });
  try {
    if (intent.startsWith("calc-")) return await numbersAction(formData, intent, writeupId, user);
    if (intent === "withdraw" && writeupId !== null) {
      await withdraw(db, writeupId, { id: user.id, isModerator: false });
      return redirectWithNotice(request, "/my/writeups", "The write-up is withdrawn.");
    }
    const choices = await listSystemAndZoneChoices(db);
    // A draft needs only its title; everything else is asked for when it is sent for review.
    const schema = writeupFormSchema({
      systems: choices.systems.map((x) => x.slug), zones: choices.zones.map((x) => x.slug), weightUnit: weightUnitOf(user.units), draft: intent !== "submit",
    });
    const submission = parseWithZod(formData, { schema });
    if (submission.status !== "success") return data({ result: submission.reply() }, { status: 400 });
    const boats = await listBoatsOf(db, user.id);
    const saved = await saveDraft(db, { authorId: user.id, writeupId, value: submission.value, weightUnit: weightUnitOf(user.units), boatId: boats[0]?.id ?? null });
    // What this device kept is on the server now: the address tells the page to clear it.
    const kept = `?${KEPT_PARAM}=${writeupId ?? "new"}`;
    if (intent === "submit") {
      await submitForReview(db, saved.writeupId, user.id);
      return redirectWithNotice(request, `/my/writeups/${saved.writeupId}${kept}`, "Sent to the moderators. You will get an e-mail when they have read it.");
    }
    if (writeupId === null) return redirectWithNotice(request, `/my/writeups/${saved.writeupId}${kept}`, "Draft saved.");
    return data({ result: submission.reply(), saved: true, savedAt: new Date().toISOString() });
  } catch (error) {
    if (error instanceof EditingError) return data({ result: undefined, error: error.message }, { status: error.status });
    throw error;
  }
}

/** "Numbers for readers": check a cable run or a weight move, attach it, or remove one. */
async function numbersAction(formData: FormData, intent: string, writeupId: number | null, user: { id: number; units: LengthUnit }) {
  if (writeupId === null) return data({ error: "Save the draft first; then you can attach numbers to it." }, { status: 400 });
  // Only the author, and only while the write-up is theirs to change: checked before anything is read.
  await requireAuthorsWriteupForNumbers(db, writeupId, user.id);
  if (intent === "calc-remove") {
    const calculationId = Number(formData.get("calculationId"));
    if (!Number.isInteger(calculationId)) return data({ error: "Which numbers?" }, { status: 400 });
    await detachCalculation(db, { writeupId, userId: user.id, calculationId });
    return { removed: calculationId };
  }
  const kind = intent === "calc-cable" ? ("cable-run" as const) : intent === "calc-move" ? ("weight-move" as const) : null;
  if (!kind) return data({ error: "Unknown request." }, { status: 400 });
  const units = unitsFor(user.units);
  let schema;
  if (kind === "cable-run") schema = cableRunFormSchema(units);
  else {
    const particulars = await getClassParticulars(db);
    if (!particulars) return data({ error: "The class particulars are not set yet: a weight move cannot be worked out." }, { status: 409 });
    schema = weightMoveFormSchema(units, particulars);
  }
  const values: Record<string, string> = {};
  for (const [k, v] of formData.entries()) if (typeof v === "string") values[k] = v;
  const parsed = schema.safeParse(values);
  if (!parsed.success) return data({ kind, errors: firstErrors(parsed.error) }, { status: 400 });
  if (formData.get("step") !== "attach") return { kind, preview: parsed.data };
  const attached = await attachCalculation(db, { writeupId, userId: user.id, calc: parsed.data.calc, title: parsed.data.title });
  return { kind, attached };
}

export default function WriteupEditor({ loaderData, actionData }: Route.ComponentProps) {
  const { id, choices, weightUnit, notice, state, published, slug, decisions, defaultValue, editable, numbers, calculations } = loaderData;
  const navigation = useNavigation();
  const location = useLocation();
  const preview = useFetcher<{ html: string; warnings: { key: string; text: string }[] }>();
  const formRef = useRef<HTMLFormElement>(null);
  const storageKey = `sistership:writeup:${id}`;
  const [restored, setRestored] = useState<{ value: EditorValue; savedAt: string } | null>(null);
  const [formKey, setFormKey] = useState(0);
  const [tab, setTab] = useState<"write" | "preview">("write");
  const schemaOptions = { systems: choices.systems.map((x) => x.slug), zones: choices.zones.map((x) => x.slug), weightUnit };
  const schema = writeupFormSchema(schemaOptions);
  const draftSchema = writeupFormSchema({ ...schemaOptions, draft: true });
  const lastResult = actionData && "result" in actionData ? actionData.result : undefined;
  const [form, fields] = useForm({
    id: `writeup-${id}-${formKey}`,
    lastResult: formKey === 0 ? lastResult : undefined,
    defaultValue: restored?.value ?? defaultValue,
    // The browser's own checks (before the script runs) only ask what a draft needs.
    constraint: getZodConstraint(draftSchema),
    // "Save draft" is checked as a draft; "Send for review", and a field left while typing, in full.
    onValidate: ({ formData }) => parseWithZod(formData, { schema: formData.get("intent") === "save" ? draftSchema : schema }),
    shouldValidate: "onBlur",
    shouldRevalidate: "onInput",
  });
  const [body, setBody] = useState(restored?.value.body ?? defaultValue.body);
  const [systemsChecked, setSystemsChecked] = useState<string[]>(restored?.value.systems ?? defaultValue.systems);

  // Keep what is typed on this device, so that a lost connection or a reload loses nothing.
  const saveTimer = useRef<ReturnType<typeof setTimeout> | undefined>(undefined);
  const [pending, setPending] = useState<{ value: EditorValue; savedAt: string } | null>(null);
  useEffect(() => {
    try {
      const kept = new URLSearchParams(location.search).get(KEPT_PARAM);
      if (kept !== null) {
        // Saved or sent for review: what this device kept (under "new" for a new write-up) is on the server.
        window.localStorage.removeItem(`sistership:writeup:${/^(new|\d+)$/.test(kept) ? kept : id}`);
        window.localStorage.removeItem(storageKey);
        setPending(null);
        // Drop the marker from the address, so that a later reload does not clear newer typing.
        const url = new URL(window.location.href);
        url.searchParams.delete(KEPT_PARAM);
        window.history.replaceState(window.history.state, "", `${url.pathname}${url.search}${url.hash}`);
        return;
      }
      const raw = window.localStorage.getItem(storageKey);
      if (!raw) return;
      const stored = JSON.parse(raw) as { value: EditorValue; savedAt: string };
      const serverTime = loaderData.updatedAt ? Date.parse(loaderData.updatedAt) : 0;
      if (Date.parse(stored.savedAt) > serverTime && JSON.stringify(stored.value) !== JSON.stringify(defaultValue)) setPending(stored);
      else window.localStorage.removeItem(storageKey);
    } catch {
      // Storage unavailable (private mode): nothing to restore.
    }
  }, [storageKey, location.search]);
  useEffect(() => {
    if (actionData && "saved" in actionData && actionData.saved) {
      clearTimeout(saveTimer.current);
      latest.current = null;
      try { window.localStorage.removeItem(storageKey); } catch { /* nothing kept */ }
    }
  }, [actionData, storageKey]);

  function snapshot(): EditorValue | null {
    const el = formRef.current;
    if (!el) return null;
    const fd = new FormData(el);
    const parts: PartValue[] = [];
    for (const [k, v] of fd.entries()) {
      const m = /^parts\[(\d+)\]\.(name|quantity|weight|note)$/.exec(k);
      if (m) {
        const i = Number(m[1]);
        parts[i] ??= { name: "", quantity: "", weight: "", note: "" };
        parts[i][m[2] as keyof PartValue] = String(v);
      }
    }
    return {
      title: String(fd.get("title") ?? ""), summary: String(fd.get("summary") ?? ""), body: String(fd.get("body") ?? ""),
      systems: fd.getAll("systems").map(String), zones: fd.getAll("zones").map(String), appliesTo: String(fd.get("appliesTo") ?? ""),
      parts: parts.filter(Boolean),
    };
  }
  // What the form holds is read at every keystroke; it is written to the device at most every
  // 400 ms, and at once when the editor is left (a link, the back button, closing the tab), so that
  // the last words typed before leaving are kept too.
  const latest = useRef<EditorValue | null>(null);
  function writeKept() {
    clearTimeout(saveTimer.current);
    const value = latest.current;
    latest.current = null;
    if (!value) return;
    try { window.localStorage.setItem(storageKey, JSON.stringify({ value, savedAt: new Date().toISOString() })); } catch { /* full or unavailable */ }
  }
  function keepOnDevice() {
    latest.current = snapshot();
    clearTimeout(saveTimer.current);
    saveTimer.current = setTimeout(writeKept, 400);
  }
  useEffect(() => {
    window.addEventListener("pagehide", writeKept);
    return () => {
      window.removeEventListener("pagehide", writeKept);
      writeKept();
    };
  }, [storageKey]);

  // The live preview, through the same pipeline as the published page.
  const previewTimer = useRef<ReturnType<typeof setTimeout> | undefined>(undefined);
  useEffect(() => {
    clearTimeout(previewTimer.current);
    previewTimer.current = setTimeout(() => {
      const fd = new FormData();
      fd.set("body", body);
      for (const sys of systemsChecked) fd.append("systems", sys);
      preview.submit(fd, { method: "post", action: "/api/preview" });
    }, 350);
    return () => clearTimeout(previewTimer.current);
  }, [body, systemsChecked.join(",")]);

  const warnings = preview.data?.warnings ?? writeupWarnings({ systems: systemsChecked, title: "", summary: "", body });
  const cautions = cautionsFor(systemsChecked);
  const partsList = fields.parts.getFieldList();
  const busy = navigation.state !== "idle";
  const bodyRef = useRef<HTMLTextAreaElement>(null);

  function insertIntoBody(markdown: string) {
    const el = bodyRef.current;
    if (!el) return;
    const at = el.selectionStart ?? el.value.length;
    const next = `${el.value.slice(0, at)}\n\n${markdown}\n\n${el.value.slice(at)}`;
    // Through the native setter, so that conform and React both see the change.
    const setter = Object.getOwnPropertyDescriptor(HTMLTextAreaElement.prototype, "value")?.set;
    setter?.call(el, next);
    el.dispatchEvent(new Event("input", { bubbles: true }));
    setBody(next);
    keepOnDevice();
  }

  return (
    <div className="space-y-6">
      <p className="text-step--1"><Link to="/my/writeups">← Your write-ups</Link></p>
      <div className="flex flex-wrap items-baseline justify-between gap-3">
        <h1 className="text-step-3 font-semibold">{id === "new" ? "A new write-up" : "Edit your write-up"}</h1>
        <p className="text-ink-soft">
          State: <strong>{STATE_LABELS[state]}</strong>
          {published && slug && <> · <Link to={`/writeups/${slug}`}>the published version</Link> stays visible until the moderators publish this one</>}
        </p>
      </div>
      {notice ? <Notice>{String(notice)}</Notice> : null}
      {actionData && "error" in actionData && actionData.error ? <FormMessage errors={[String(actionData.error)]} /> : null}
      {actionData && "saved" in actionData && actionData.saved ? <Notice>Draft saved.</Notice> : null}
      {pending && (
        <div role="status" className="rounded-md border-l-4 border-varnish-500 bg-cloth-100 p-3">
          <p>This device kept text you typed at {new Date(pending.savedAt).toLocaleTimeString("en-GB")} that was not saved.</p>
          <div className="mt-2 flex gap-2">
            <button type="button" className={quietButtonClass} onClick={() => { setRestored(pending); setBody(pending.value.body); setSystemsChecked(pending.value.systems); setFormKey((k) => k + 1); setPending(null); }}>
              Put it back
            </button>
            <button type="button" className={quietButtonClass} onClick={() => { window.localStorage.removeItem(storageKey); setPending(null); }}>
              Discard it
            </button>
          </div>
        </div>
      )}
      {decisions.length > 0 && (
        <section aria-labelledby="decisions-heading" className="rounded-lg bg-cloth-100 p-4">
          <h2 id="decisions-heading" className="font-sans text-step-0 font-semibold">What the moderators said</h2>
          <ul className="mt-2 space-y-2">
            {decisions.map((d) => (
              <li key={d.id}>
                <strong>{d.decision === "withdraw" ? "Withdrawn" : DECISION_LABELS[d.decision]}</strong> (revision {d.revisionNumber}, {d.by}, {formatDate(d.createdAt)}){d.reason ? `: ${d.reason}` : ""}
              </li>
            ))}
          </ul>
        </section>
      )}
      {!editable ? (
        <p className="rounded-md bg-cloth-100 p-4">This write-up is with the moderators. You can edit it again once they have replied.</p>
      ) : (
        <Form key={formKey} method="post" {...getFormProps(form)} ref={formRef} onInput={keepOnDevice} onChange={keepOnDevice} className="space-y-6">
          <FormMessage id={form.errorId} errors={form.errors} />
          <TextField field={fields.title} label="Title" hint="What you did, in plain words: “Group 27 battery under the starboard settee”." />
          <div>
            <label htmlFor={fields.summary.id} className="block font-medium">Summary</label>
            <p className="text-step--1 text-ink-soft">One or two sentences: what, where, and what it changed.</p>
            <textarea {...getTextareaProps(fields.summary)} key={fields.summary.key} rows={2} className={`mt-1 ${inputClass}`} />
            <FieldError id={fields.summary.errorId} errors={fields.summary.errors} />
          </div>

          <div className="grid gap-4 lg:grid-cols-2">
            <div>
              <div className="flex items-center justify-between lg:hidden" role="tablist">
                <button type="button" role="tab" aria-selected={tab === "write"} className={quietButtonClass} onClick={() => setTab("write")}>Write</button>
                <button type="button" role="tab" aria-selected={tab === "preview"} className={quietButtonClass} onClick={() => setTab("preview")}>Preview</button>
              </div>
              <div className={tab === "preview" ? "hidden lg:block" : ""}>
                <label htmlFor={fields.body.id} className="block font-medium">The write-up</label>
                <p className="text-step--1 text-ink-soft">Markdown: ## headings, **bold**, lists, | tables |. Measure twice; say how you measured.</p>
                <textarea
                  {...getTextareaProps(fields.body)}
                  key={fields.body.key}
                  ref={bodyRef}
                  rows={22}
                  onInput={(e) => setBody(e.currentTarget.value)}
                  className={`mt-1 font-mono text-step--1 ${inputClass}`}
                />
                <FieldError id={fields.body.errorId} errors={fields.body.errors} />
                <PhotoUploader onUploaded={insertIntoBody} />
              </div>
            </div>
            <div className={tab === "write" ? "hidden lg:block" : ""}>
              <p className="font-medium">Preview</p>
              <div
                aria-live="polite"
                data-testid="preview"
                className="prose mt-1 max-h-[40rem] max-w-none overflow-auto rounded-md border border-cloth-200 bg-white p-4 font-serif"
                dangerouslySetInnerHTML={{ __html: preview.data?.html ?? "<p><em>The preview appears as you type.</em></p>" }}
              />
            </div>
          </div>

          {warnings.length > 0 && (
            <ul className="space-y-1 rounded-md border-l-4 border-varnish-500 bg-cloth-100 p-3" aria-label="Before you send it">
              {warnings.map((w) => <li key={w.key}>{w.text}</li>)}
            </ul>
          )}

          <fieldset>
            <legend className="font-medium">Boat systems</legend>
            <div className="mt-2 flex flex-wrap gap-x-5 gap-y-2">
              {choices.systems.map((sys) => (
                <label key={sys.slug} className="flex items-center gap-2">
                  <input
                    type="checkbox"
                    name="systems"
                    value={sys.slug}
                    defaultChecked={(restored?.value.systems ?? defaultValue.systems).includes(sys.slug)}
                    onChange={(e) => setSystemsChecked((list) => (e.target.checked ? [...list, sys.slug] : list.filter((x) => x !== sys.slug)))}
                  />
                  {sys.name}
                </label>
              ))}
            </div>
            <FieldError id={fields.systems.errorId} errors={fields.systems.errors} />
          </fieldset>
          {cautions.length > 0 && <CautionList cautions={cautions} />}

          <fieldset>
            <legend className="font-medium">Zones of the boat</legend>
            <div className="mt-2 flex flex-wrap gap-x-5 gap-y-2">
              {choices.zones.map((z) => (
                <label key={z.slug} className="flex items-center gap-2">
                  <input type="checkbox" name="zones" value={z.slug} defaultChecked={(restored?.value.zones ?? defaultValue.zones).includes(z.slug)} />
                  {z.name}
                </label>
              ))}
            </div>
            <FieldError id={fields.zones.errorId} errors={fields.zones.errors} />
          </fieldset>

          <div className="grid gap-4 sm:grid-cols-3">
            <TextField field={fields.appliesTo} label="Applies to" hint="all, mk1, mk2, or a hull range such as 120-298" />
            <TextField field={fields.hoursSpent} label="Time spent (hours)" inputMode="decimal" />
            <TextField field={fields.costUsd} label="Cost (US$)" inputMode="decimal" />
          </div>
          <fieldset>
            <legend className="font-medium">Difficulty</legend>
            <div className="mt-2 flex flex-wrap gap-5">
              {(["easy", "moderate", "hard"] as const).map((d) => (
                <label key={d} className="flex items-center gap-2">
                  <input {...getInputProps(fields.difficulty, { type: "radio", value: d })} key={`${fields.difficulty.key}-${d}`} />
                  {d === "easy" ? "Straightforward" : d === "moderate" ? "Takes some skill" : "Demanding"}
                </label>
              ))}
            </div>
          </fieldset>

          <fieldset>
            <legend className="font-medium">Parts</legend>
            <p className="text-step--1 text-ink-soft">Weight per item, in {weightUnit === "lb" ? "pounds (58 lb, 12 oz)" : "kilograms (26.3 kg)"}.</p>
            <table className="mt-2 w-full text-step--1">
              <thead>
                <tr className="text-left">
                  <th scope="col" className="pr-2 font-medium">Part</th>
                  <th scope="col" className="w-20 pr-2 font-medium">Qty</th>
                  <th scope="col" className="w-28 pr-2 font-medium">Weight</th>
                  <th scope="col" className="pr-2 font-medium">Note</th>
                  <th scope="col"><span className="sr-only">Remove</span></th>
                </tr>
              </thead>
              <tbody>
                {partsList.map((row, index) => {
                  const f = row.getFieldset();
                  return (
                    <tr key={row.key} className="align-top">
                      <td className="py-1 pr-2">
                        <input {...getInputProps(f.name, { type: "text" })} key={f.name.key} aria-label={`Part ${index + 1} name`} className={inputClass} />
                        <FieldError id={f.name.errorId} errors={f.name.errors} />
                      </td>
                      <td className="py-1 pr-2">
                        <input {...getInputProps(f.quantity, { type: "text" })} key={f.quantity.key} aria-label={`Part ${index + 1} quantity`} inputMode="decimal" className={inputClass} />
                        <FieldError id={f.quantity.errorId} errors={f.quantity.errors} />
                      </td>
                      <td className="py-1 pr-2">
                        <input {...getInputProps(f.weight, { type: "text" })} key={f.weight.key} aria-label={`Part ${index + 1} weight`} className={inputClass} />
                        <FieldError id={f.weight.errorId} errors={f.weight.errors} />
                      </td>
                      <td className="py-1 pr-2">
                        <input {...getInputProps(f.note, { type: "text" })} key={f.note.key} aria-label={`Part ${index + 1} note`} className={inputClass} />
                      </td>
                      <td className="py-1">
                        <button {...form.remove.getButtonProps({ name: fields.parts.name, index })} className={quietButtonClass} aria-label={`Remove part ${index + 1}`}>✕</button>
                      </td>
                    </tr>
                  );
                })}
              </tbody>
            </table>
            <button {...form.insert.getButtonProps({ name: fields.parts.name, defaultValue: { quantity: "1" } })} className={`mt-2 ${quietButtonClass}`}>
              Add a part
            </button>
            <FieldError id={fields.parts.errorId} errors={fields.parts.errors} />
          </fieldset>

          <div className="flex flex-wrap gap-3 border-t border-cloth-200 pt-4">
            <button type="submit" name="intent" value="save" className={quietButtonClass} disabled={busy}>{busy ? "Saving…" : "Save draft"}</button>
            <button type="submit" name="intent" value="submit" className={buttonClass} disabled={busy}>Send for review</button>
          </div>
          <p className="text-step--1 text-ink-soft">Moderators read every write-up before the class sees it.</p>
        </Form>
      )}
      {editable && id !== "new" && (
        <WriteupNumbersEditor
          calculations={calculations}
          unit={numbers.unit}
          weightWord={weightUnit === "kg" ? "kilograms" : "pounds"}
          classNote={numbers.classNote}
          canAttachMove={numbers.canAttachMove}
        />
      )}
      {editable && id === "new" && (
        <p className="text-step--1 text-ink-soft">Numbers for readers (a cable run, a weight move) can be attached once the draft is saved.</p>
      )}
      {id !== "new" && state !== "withdrawn" && (
        <Form method="post" onSubmit={(e) => { if (!window.confirm("Withdraw this write-up? Readers will no longer see it.")) e.preventDefault(); }}>
          <button type="submit" name="intent" value="withdraw" className="text-step--1 text-bootstripe-600 underline">Withdraw this write-up</button>
        </Form>
      )}
    </div>
  );
}

