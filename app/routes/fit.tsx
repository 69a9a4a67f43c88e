import { useEffect, useRef, useState } from "react";
import { Form, Link, useFetcher } from "react-router";
import type { Route } from "./+types/fit";
import { CautionList } from "~/components/cautions";
import { DrawingKey, SpaceDrawing } from "~/components/space-drawing";
import { buttonClass, FieldError, inputClass } from "~/components/ui/field";
import { UnitToggle } from "~/components/unit-toggle";
import { useRevealAnswer } from "~/components/use-reveal-answer";
import { db } from "~/db/index.server";
import {
  DEFAULT_LIMIT, fitAnswerJson, readFitParams, type FitAnswerJson, type FitParams, type FitResultJson,
} from "~/domain/fit-search";
import { CLASS_NAME, describeHullRange, variantOf } from "~/domain/hulls";
import { cautionsForItem, isBattery } from "~/domain/items";
import { formatLength, inchesToMm, parseLength, type Box, type LengthUnit } from "~/domain/units";
import { listItems } from "~/models/items.server";
import { findFittingSpaces } from "~/models/spaces.server";
import { readerUnit } from "./reader-unit.server";

type FitForm = {
  item: string;
  length: string;
  width: string;
  height: string;
  upright: boolean;
  clearance: string;
  count: string;
  hull: string;
};

type ParamProblem = { parameter: string; message: string };

const SIZE_FIELDS = ["length", "width", "height"] as const;

/** A size as typed in the form, in the unit, without the unit: "13", "6 13/16", "330". */
function typed(mm: number, unit: LengthUnit): string {
  return formatLength(mm, unit).replace(/ (in|mm)$/, "");
}

/** The form as the API's query (the page asks GET /api/fit with it). */
function apiQuery(form: FitForm, unit: LengthUnit): URLSearchParams {
  const q = new URLSearchParams({ unit, length: form.length, width: form.width, height: form.height, upright: String(form.upright) });
  if (form.clearance.trim()) q.set("clearance", form.clearance);
  if (form.count.trim()) q.set("count", form.count);
  if (form.hull.trim()) q.set("hull", form.hull);
  return q;
}

/** The page's own address for the form (shareable), optionally in another unit. */
function pageQuery(form: FitForm, unit: LengthUnit, to: LengthUnit = unit): string {
  const convert = (value: string) => {
    if (to === unit || !value.trim()) return value;
    const r = parseLength(value, unit);
    return r.ok ? typed(r.mm, to) : value;
  };
  const q = new URLSearchParams({ unit: to });
  if (form.item) q.set("item", form.item);
  for (const f of SIZE_FIELDS) q.set(f, convert(form[f]));
  if (form.upright) q.set("upright", "true");
  if (form.clearance.trim()) q.set("clearance", form.clearance.trim() === "0" ? "0" : convert(form.clearance));
  if (form.count.trim() && form.count.trim() !== "1") q.set("count", form.count);
  if (form.hull.trim()) q.set("hull", form.hull);
  return q.toString();
}

function complete(form: FitForm) {
  return SIZE_FIELDS.every((f) => form[f].trim() !== "");
}

/** Whether the owner has typed any of the three sizes (then the others are asked for too). */
function begun(form: FitForm) {
  return SIZE_FIELDS.some((f) => form[f].trim() !== "");
}

/**
 * Every field checked at once, with the API's reading of the parameters: the parameters to ask
 * the API with, or every problem (each is shown beside its field). A size left empty is a problem
 * only once `askSizes` (a size is typed, or the owner pressed "Show the spaces").
 */
function checkForm(form: FitForm, unit: LengthUnit, askSizes: boolean): { ok: true; params: FitParams } | { ok: false; problems: ParamProblem[] } {
  const r = readFitParams(apiQuery(form, unit));
  if (r.ok) return { ok: true, params: r };
  const problems = r.problems
    .filter((p) => askSizes || !(SIZE_FIELDS as readonly string[]).includes(p.parameter) || form[p.parameter as (typeof SIZE_FIELDS)[number]].trim() !== "")
    .map((p) => ({ parameter: p.parameter, message: p.message }));
  return { ok: false, problems };
}

export function meta() {
  return [
    { title: `Will it fit? · ${CLASS_NAME} · Sistership` },
    { name: "description", content: `Which hidden spaces of the ${CLASS_NAME} take a battery, a tank or a cooler, and through which openings.` },
  ];
}

export async function loader({ request }: Route.LoaderArgs) {
  const q = new URL(request.url).searchParams;
  const unit = await readerUnit(request);
  const items = await listItems(db);
  const picked = items.find((i) => i.slug === q.get("item")) ?? null;
  const size = (name: (typeof SIZE_FIELDS)[number]) => q.get(name) ?? (picked ? typed(picked.box[name], unit) : "");
  const uprightParam = q.get("upright");
  const form: FitForm = {
    item: picked?.slug ?? "",
    length: size("length"),
    width: size("width"),
    height: size("height"),
    upright: picked?.orientation === "upright" || uprightParam === "true" || uprightParam === "on",
    clearance: q.get("clearance") ?? "",
    count: q.get("count") ?? "1",
    hull: q.get("hull") ?? "",
  };
  let answer: FitAnswerJson | null = null;
  const checked = checkForm(form, unit, begun(form));
  if (checked.ok) answer = fitAnswerJson(checked.params, await findFittingSpaces(db, checked.params));
  return {
    unit,
    form,
    answer,
    problems: checked.ok ? [] : checked.problems,
    items: items.map((i) => ({
      slug: i.slug,
      name: i.name,
      kind: i.kind,
      upright: i.orientation === "upright",
      sizes: { in: SIZE_FIELDS.map((f) => typed(i.box[f], "in")), mm: SIZE_FIELDS.map((f) => typed(i.box[f], "mm")) },
    })),
  };
}

const FIELD_LABELS: Record<string, string> = {
  length: "Length",
  width: "Width",
  height: "Height",
  clearance: "Clearance on every side",
  count: "How many, end to end",
  hull: "Your hull number",
};

/**
 * A problem as a sentence beside its field: the API's message without its "parameter: " prefix,
 * and an empty size asked for by name.
 */
function fieldMessage(p: ParamProblem): string {
  if (/^[a-z]+: required\b/.test(p.message)) return `Enter the ${(FIELD_LABELS[p.parameter] ?? p.parameter).toLowerCase()}, e.g. 13 or 13 1/2.`;
  return p.message.replace(/^[a-z]+: (.)/, (_, first: string) => first.toUpperCase());
}

/** The loader asked for an empty size (the address has some sizes and not others). */
function sizesAskedFor(data: { problems: ParamProblem[]; form: FitForm }): boolean {
  return data.problems.some((p) => (SIZE_FIELDS as readonly string[]).includes(p.parameter) && data.form[p.parameter as (typeof SIZE_FIELDS)[number]].trim() === "");
}

/** "the length", "your hull number": a field's label inside a sentence. */
function fieldPhrase(label: string): string {
  const lower = label.toLowerCase();
  return lower.startsWith("your ") ? lower : `the ${lower}`;
}

export default function FitPage({ loaderData }: Route.ComponentProps) {
  const { unit, items, form: initial } = loaderData;
  const [form, setForm] = useState<FitForm>(initial);
  const [live, setLive] = useState<{ problems: ParamProblem[]; fetched: boolean }>({ problems: [], fetched: false });
  // Whether an empty size is asked for while the owner types: once they pressed "Show the spaces"
  // with it empty, or came with an address whose sizes are missing.
  const [asked, setAsked] = useState(() => sizesAskedFor(loaderData));
  const fetcher = useFetcher<FitAnswerJson>();
  const timer = useRef<ReturnType<typeof setTimeout>>(undefined);

  // A navigation (the unit, the Show button, a link) brings a new form from the loader.
  useEffect(() => {
    setForm(initial);
    setLive({ problems: [], fetched: false });
    setAsked(sizesAskedFor(loaderData));
  }, [initial]);
  // After "Show the spaces", the answer is brought into view (on a phone it is below the form).
  const revealOnSubmit = useRevealAnswer("results-heading", initial, loaderData.answer !== null);
  useEffect(() => () => clearTimeout(timer.current), []);

  const picked = items.find((i) => i.slug === form.item) ?? null;

  function update(patch: Partial<FitForm>) {
    const next = { ...form, ...patch };
    if (picked?.upright && next.item === form.item) next.upright = true;
    setForm(next);
    clearTimeout(timer.current);
    // The same reading of the parameters as the API: every problem is shown at once, beside its field.
    const checked = checkForm(next, unit, asked);
    if (!checked.ok) {
      setLive({ problems: checked.problems, fetched: true });
      return;
    }
    timer.current = setTimeout(() => {
      setLive({ problems: [], fetched: true });
      fetcher.load(`/api/fit?${apiQuery(next, unit)}`);
    }, 200);
  }

  function submit(event: React.FormEvent<HTMLFormElement>) {
    // Nothing typed yet: each size is asked for beside its field (the loader would not ask).
    if (!begun(form)) {
      event.preventDefault();
      setAsked(true);
      const checked = checkForm(form, unit, true);
      setLive({ problems: checked.ok ? [] : checked.problems, fetched: true });
      // As after a submit that the loader answered with messages: the first field marked takes the focus.
      requestAnimationFrame(() => {
        const first = document.getElementById("fit-length");
        first?.scrollIntoView({ block: "center" });
        first?.focus({ preventScroll: true });
      });
      return;
    }
    revealOnSubmit();
  }

  function pick(slug: string) {
    const item = items.find((i) => i.slug === slug);
    if (!item) return update({ item: "" });
    const [length, width, height] = item.sizes[unit];
    update({ item: slug, length, width, height, upright: item.upright });
  }

  const problems = live.fetched ? live.problems : loaderData.problems;
  const answer = !complete(form) || problems.length ? null : live.fetched ? (fetcher.data ?? loaderData.answer) : loaderData.answer;
  const busy = fetcher.state === "loading" || (live.fetched && !fetcher.data && complete(form) && !problems.length);
  const error = (field: string) => {
    const p = problems.find((x) => x.parameter === field);
    return p ? [fieldMessage(p)] : undefined;
  };
  const hullVariant = /^\d+$/.test(form.hull.trim()) ? variantOf(Number(form.hull))?.label : undefined;
  const cautions = cautionsForItem(picked ? { kind: picked.kind, name: picked.name } : null);
  // A battery's cautions (hydrogen, securing it, never above or below a fuel tank) come before the
  // spaces, not after a long list of them; other items keep theirs at the end.
  const cautionsFirst = picked !== null && isBattery(picked);

  const textField = (name: keyof typeof FIELD_LABELS, hint: string, extra: { inputMode?: "numeric" | "text"; className?: string } = {}) => (
    <div className={extra.className}>
      <label htmlFor={`fit-${name}`} className="block font-medium">{FIELD_LABELS[name]}</label>
      <input
        id={`fit-${name}`}
        name={name}
        value={String(form[name as keyof FitForm])}
        onChange={(e) => update({ [name]: e.target.value } as Partial<FitForm>)}
        inputMode={extra.inputMode}
        autoComplete="off"
        aria-invalid={error(name) ? true : undefined}
        aria-describedby={`fit-${name}-hint${error(name) ? ` fit-${name}-error` : ""}`}
        className={`mt-1 ${inputClass}`}
      />
      <p id={`fit-${name}-hint`} className="mt-0.5 text-step--1 text-ink-soft">{hint}</p>
      <FieldError id={`fit-${name}-error`} errors={error(name)} />
    </div>
  );

  const unitWord = unit === "in" ? "inches" : "millimetres";
  const results = answer?.results ?? [];
  const outright = results.filter((r) => r.verdict === "fits").length;
  const enlarge = results.length - outright;

  return (
    <div className="space-y-10">
      <header className="max-w-3xl">
        <h1 className="text-step-4 font-semibold leading-tight">Will it fit?</h1>
        <p className="mt-3 font-serif text-step-1 leading-relaxed text-ink-soft">
          Give the outside size of a battery, a tank, a cooler or any box, and see every hidden space of the {CLASS_NAME} that
          takes it, the snuggest first, and whether it goes in through the opening.
        </p>
      </header>

      <Form method="get" action="/fit" className="space-y-5 rounded-lg bg-cloth-100 p-4 sm:p-6" aria-label="The item to fit" onSubmit={submit}>
        <input type="hidden" name="unit" value={unit} />
        <div className="flex flex-wrap items-end justify-between gap-4">
          <div className="min-w-0 flex-1 basis-64">
            <label htmlFor="fit-item" className="block font-medium">From the catalogue</label>
            <select id="fit-item" name="item" value={form.item} onChange={(e) => pick(e.target.value)} className={`mt-1 max-w-md ${inputClass}`}>
              <option value="">My own sizes</option>
              <optgroup label="Batteries (BCI group, largest case)">
                {items.filter((i) => i.kind === "battery-group").map((i) => <option key={i.slug} value={i.slug}>{i.name}</option>)}
              </optgroup>
              <optgroup label="Members' items">
                {items.filter((i) => i.kind !== "battery-group").map((i) => <option key={i.slug} value={i.slug}>{i.name}</option>)}
              </optgroup>
            </select>
            <p className="mt-0.5 text-step--1 text-ink-soft"><Link to="/items">The catalogue</Link>: members add what they have measured.</p>
          </div>
          <UnitToggle unit={unit} search={(to) => pageQuery(form, unit, to)} />
        </div>

        <fieldset>
          <legend className="font-medium">Outside size of the item, in {unitWord} unless you type a unit</legend>
          <div className="mt-1 grid gap-4 sm:grid-cols-3">
            {textField("length", "Its longest side as it stands")}
            {textField("width", "Across")}
            {textField("height", "Up, as it stands")}
          </div>
        </fieldset>

        <div className="grid gap-4 sm:grid-cols-3">
          {textField("clearance", `Kept free all round, e.g. 1/2 (${unit === "in" ? "inches" : "mm"}); empty for none`)}
          {textField("count", "Identical items in a row", { inputMode: "numeric" })}
          {textField("hull", hullVariant ? `${hullVariant}: only the spaces of your hull` : "Empty for every hull", { inputMode: "numeric" })}
        </div>

        <div className="flex flex-wrap items-center gap-4">
          <label className="flex min-h-11 items-center gap-2 font-medium">
            <input
              type="checkbox"
              name="upright"
              value="true"
              checked={form.upright}
              disabled={picked?.upright}
              onChange={(e) => update({ upright: e.target.checked })}
              className="size-5 accent-deep-700"
            />
            Must stay upright
          </label>
          {picked?.upright && (
            <>
              <input type="hidden" name="upright" value="true" />
              <span className="text-step--1 text-ink-soft">This item must stand the right way up.</span>
            </>
          )}
          <button type="submit" className={`${buttonClass} ml-auto`}>Show the spaces</button>
        </div>
      </Form>

      <section aria-labelledby="results-heading" className="space-y-4">
        <h2 id="results-heading" tabIndex={-1} className="scroll-mt-4 text-step-2 font-semibold focus:outline-none">Where it fits</h2>
        <div aria-live="polite" aria-busy={busy} className="space-y-1">
          {problems.length > 1 ? (
            <p className="text-ink-soft">Correct the {problems.length} fields marked above to see the spaces.</p>
          ) : problems.length === 1 ? (
            <p className="text-ink-soft">Correct {fieldPhrase(FIELD_LABELS[problems[0].parameter] ?? problems[0].parameter)} above to see the spaces.</p>
          ) : !complete(form) ? (
            <p className="text-ink-soft">Pick an item or type its three sizes.</p>
          ) : answer ? (
            <p id="fit-summary">
              {results.length === 0
                ? "No space of the class takes it."
                : results.length >= DEFAULT_LIMIT
                  ? `The ${results.length} snuggest spaces that take it${enlarge ? `; in ${enlarge} of them the opening must be enlarged first` : ""}. Give your hull number to see only your boat's.`
                  : `${results.length} ${results.length === 1 ? "space takes" : "spaces take"} it${enlarge ? `; in ${enlarge} of them the opening must be enlarged first` : ""}.`}
              {answer.hull ? ` Hull ${answer.hull}.` : ""}
            </p>
          ) : null}
          {busy && <p className="text-step--1 text-ink-soft">Checking…</p>}
        </div>
        {cautionsFirst && <CautionList cautions={cautions} about="figures" />}
        {answer && results.length > 0 && (
          <>
            <DrawingKey item />
            <ol className="grid gap-4 lg:grid-cols-2" data-testid="fit-results">
              {results.map((r, i) => (
                <FitResultCard key={r.spaceId} result={r} rank={i + 1} unit={answer.unit} item={answer.item} count={answer.count} clearance={answer.clearance} />
              ))}
            </ol>
          </>
        )}
        {!cautionsFirst && <CautionList cautions={cautions} about="figures" />}
      </section>
    </div>
  );
}

function toMm(value: number, unit: LengthUnit) {
  return unit === "in" ? inchesToMm(value) : value;
}

function boxToMm(b: Box, unit: LengthUnit): Box {
  return { length: toMm(b.length, unit), width: toMm(b.width, unit), height: toMm(b.height, unit) };
}

function FitResultCard({ result: r, rank, unit, item, count, clearance }: {
  result: FitResultJson; rank: number; unit: LengthUnit; item: Box; count: number; clearance: number;
}) {
  const len = (v: number) => formatLength(toMm(v, unit), unit);
  const opening = r.opening
    ? `${len(r.opening.width)} × ${len(r.opening.height)} ${r.opening.face === "top" ? "lid" : "opening in the side"}`
    : null;
  const section = { position: r.section.position, label: r.section.label, box: boxToMm(r.section, unit) };
  return (
    <li className="rounded-lg border border-cloth-200 bg-white/70 p-4" data-space={r.slug} data-verdict={r.verdict}>
      <div className="flex flex-wrap items-baseline justify-between gap-2">
        <h3 className="text-step-1 font-semibold leading-snug">
          <span className="mr-2 text-ink-soft tabular-nums">{rank}.</span>
          <Link to={`/spaces/${r.slug}${unit === "mm" ? "?unit=mm" : ""}`} className="text-deep-900">{r.name}</Link>
        </h3>
        {r.verdict === "fits" ? (
          <span className="rounded-sm bg-deep-50 px-2 py-0.5 text-step--1 font-medium text-deep-700">Fits</span>
        ) : (
          <span className="rounded-sm border border-varnish-600 px-2 py-0.5 text-step--1 font-medium text-varnish-700">Opening too small</span>
        )}
      </div>
      <p className="mt-1 text-step--1 text-ink-soft">{r.zone} · {describeHullRange(r.hulls)}{r.section.position > 0 ? ` · in the ${r.section.label}` : ""}</p>
      <dl className="mt-3 grid grid-cols-[auto_1fr] gap-x-3 gap-y-1 text-step--1">
        <dt className="text-ink-soft">Lies</dt>
        <dd>{r.orientation.text}{count > 1 ? `; ${count} in a row ${r.row.axis === "length" ? "fore and aft" : "athwartships"}` : ""}</dd>
        <dt className="text-ink-soft">Room left</dt>
        <dd className="tabular-nums">
          {len(r.clearances.length)} fore and aft, {len(r.clearances.width)} across, {len(r.clearances.height)} up
          {clearance > 0 ? <span className="text-ink-soft"> (your {len(clearance)} on each side comes out of this)</span> : null}
        </dd>
        <dt className="text-ink-soft">Opening</dt>
        <dd>
          {r.throughOpening === null
            ? "not recorded: check it yourself"
            : r.throughOpening
              ? `${opening}: it goes through`
              : (
                <>
                  <strong className="font-semibold">{opening}: too small. The opening must be enlarged.</strong>
                  {clearance > 0 ? <span className="text-ink-soft"> It is checked for the item with your {len(clearance)} on each side; with less clearance it may go through.</span> : null}
                </>
              )}
        </dd>
      </dl>
      <div className="mt-3">
        <SpaceDrawing
          unit={unit}
          widthPx={170}
          label={`${r.name}, with the item in place`}
          input={{
            sections: [{ label: section.label, box: section.box }],
            opening: r.opening ? { width: toMm(r.opening.width, unit), height: toMm(r.opening.height, unit), face: r.opening.face } : undefined,
            item: {
              box: boxToMm(item, unit),
              section: 0,
              clearanceMm: toMm(clearance, unit),
              row: { count, axis: r.row.axis, placement: r.orientation.placement, leftoverMm: boxToMm(r.clearances, unit) },
            },
          }}
        />
      </div>
    </li>
  );
}
