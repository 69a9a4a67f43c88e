import { getFormProps, getTextareaProps, useForm } from "@conform-to/react";
import { getZodConstraint, parseWithZod } from "@conform-to/zod/v4";
import { data, Form, Link, redirect, useNavigation } from "react-router";
import type { Route } from "./+types/secretary.digest.$year";
import { buttonClass, FieldError, FormMessage, inputClass, Notice, quietButtonClass } from "~/components/ui/field";
import { db } from "~/db/index.server";
import { digestTitle, formatDigestDate, issueProblems } from "~/domain/digest";
import { entrySchema, letterSchema } from "~/domain/digest-forms";
import { addNewlyPublished, changeEntry, DigestError, discardDraft, getDraft, saveLetter } from "~/models/digests.server";
import { readNotice, redirectWithNotice, requirePermission } from "~/services/session.server";
import { readForm } from "~/services/form-body.server";
import { digestYear } from "./digest-params.server";

export function meta({ loaderData }: Route.MetaArgs) {
  return [{ title: loaderData ? `${digestTitle(loaderData.year, loaderData.edition)}: draft · Sistership` : "Digest draft · Sistership" }];
}

export async function loader({ request, params }: Route.LoaderArgs) {
  await requirePermission(request, "digest:compile");
  const year = digestYear(params);
  const draft = await getDraft(db, year);
  if (!draft) throw redirect("/secretary/digest");
  const { notice, headers } = await readNotice(request);
  const entries = draft.entries;
  const sections = draft.sections
    .map((sec) => ({ slug: sec.slug, name: sec.name, entries: entries.filter((e) => e.sectionSlug === sec.slug) }))
    .filter((sec) => sec.entries.length > 0);
  const included = entries.filter((e) => e.included && e.stillPublished).length;
  return data({
    year,
    edition: draft.edition.edition,
    letter: draft.edition.editorLetter,
    correctionNote: draft.edition.correctionNote,
    updatedAt: draft.edition.updatedAt.toISOString(),
    sections,
    included,
    total: entries.length,
    problems: issueProblems({ edition: draft.edition.edition, included, correctionNote: draft.edition.correctionNote }),
    notice,
  }, { headers });
}

export async function action({ request, params }: Route.ActionArgs) {
  await requirePermission(request, "digest:compile");
  const year = digestYear(params);
  const draft = await getDraft(db, year);
  if (!draft) throw redirect("/secretary/digest");
  const formData = await readForm(request);
  const intent = String(formData.get("intent") ?? "");
  try {
    if (intent === "letter") {
      const submission = parseWithZod(formData, { schema: letterSchema });
      if (submission.status !== "success") return data({ intent, result: submission.reply(), error: null }, { status: 400 });
      await saveLetter(db, draft.edition.id, submission.value);
      return redirectWithNotice(request, `/secretary/digest/${year}`, "The letter is saved.");
    }
    if (intent === "refresh") {
      const added = await addNewlyPublished(db, draft.edition.id);
      return redirectWithNotice(request, `/secretary/digest/${year}`, added ? `${added} write-up${added === 1 ? "" : "s"} published since the draft was compiled added at the end of their systems.` : "No write-up of the year is missing from the draft.");
    }
    if (intent === "discard") {
      await discardDraft(db, draft.edition.id);
      return redirectWithNotice(request, "/secretary/digest", `The draft of ${digestTitle(year, draft.edition.edition).toLowerCase()} was thrown away.`);
    }
    const submission = parseWithZod(formData, { schema: entrySchema });
    if (submission.status !== "success") return data({ intent, result: null, error: "That change was not understood; reload the page and try again." }, { status: 400 });
    await changeEntry(db, draft.edition.id, submission.value);
    return data({ intent, result: null, error: null });
  } catch (error) {
    if (error instanceof DigestError) return data({ intent, result: null, error: error.message }, { status: error.status });
    throw error;
  }
}

function ArrowButton({ intent, title, disabled }: { intent: "up" | "down"; title: string; disabled: boolean }) {
  return (
    <button
      type="submit"
      name="intent"
      value={intent}
      disabled={disabled}
      aria-label={`Move “${title}” ${intent}`}
      title={intent === "up" ? "Move up" : "Move down"}
      className="h-8 w-8 rounded-md border border-deep-200 bg-white text-deep-700 hover:border-deep-500 disabled:opacity-30"
    >
      <span aria-hidden="true">{intent === "up" ? "↑" : "↓"}</span>
    </button>
  );
}

export default function DigestDraft({ loaderData, actionData }: Route.ComponentProps) {
  const { year, edition, letter, correctionNote, sections, included, total, problems, notice } = loaderData;
  const navigation = useNavigation();
  const busy = navigation.state !== "idle";
  const [form, fields] = useForm({
    id: "letter",
    lastResult: actionData?.intent === "letter" ? actionData.result : undefined,
    constraint: getZodConstraint(letterSchema),
    defaultValue: { letter, correctionNote },
    onValidate: ({ formData }) => parseWithZod(formData, { schema: letterSchema }),
    shouldValidate: "onBlur",
  });
  return (
    <div className="space-y-8">
      <header className="flex flex-wrap items-end justify-between gap-4">
        <div>
          <p className="text-step--1"><Link to="/secretary/digest">← The yearly digest</Link></p>
          <h1 className="mt-1 text-step-3 font-semibold">{digestTitle(year, edition)}</h1>
          <p className="mt-1 text-ink-soft">
            Draft{edition > 1 ? " of a correction" : ""} · {included} of {total} write-ups in · members see nothing until you issue it.
          </p>
        </div>
        <Link to={`/secretary/digest/${year}/preview`} className={buttonClass}>Preview and issue</Link>
      </header>
      {notice && <Notice>{notice}</Notice>}
      {actionData?.error && <FormMessage errors={[actionData.error]} />}

      <div className="grid gap-10 lg:grid-cols-[minmax(0,1fr)_24rem]">
        <section aria-labelledby="entries-heading" className="min-w-0">
          <h2 id="entries-heading" className="text-step-2 font-semibold">Write-ups, by system</h2>
          <p className="mt-1 text-step--1 text-ink-soft">The digest prints them in this order. Arrows move a write-up within its system.</p>
          {sections.map((sec) => {
            const ins = sec.entries;
            return (
              <section key={sec.slug} aria-label={sec.name} className="mt-6">
                <h3 className="border-b-2 border-deep-900 pb-1 text-step-1 font-semibold">{sec.name}</h3>
                <ol className="divide-y divide-cloth-200">
                  {ins.map((e, i) => (
                    <li key={e.writeupId} className="flex items-start gap-3 py-3" data-entry={e.slug}>
                      <Form method="post" preventScrollReset className="flex shrink-0 gap-1">
                        <input type="hidden" name="writeupId" value={e.writeupId} />
                        <ArrowButton intent="up" title={e.title} disabled={busy || i === 0} />
                        <ArrowButton intent="down" title={e.title} disabled={busy || i === ins.length - 1} />
                      </Form>
                      <div className={`min-w-0 flex-1 ${e.included ? "" : "opacity-60"}`}>
                        <p className={`font-serif font-semibold ${e.included ? "text-deep-900" : "line-through"}`}>
                          <Link to={`/writeups/${e.slug}`} className="text-inherit no-underline hover:underline">{e.title}</Link>
                        </p>
                        <p className="text-step--1 text-ink-soft">
                          {e.credit}{e.hullNumber !== null && !e.credit.includes(String(e.hullNumber)) ? `, hull ${e.hullNumber}` : ""}
                          {e.publishedAt ? ` · published ${formatDigestDate(e.publishedAt)}` : ""}
                          {!e.included && " · left out"}
                          {!e.stillPublished && " · no longer published: it will not be printed"}
                        </p>
                      </div>
                      <Form method="post" preventScrollReset className="shrink-0">
                        <input type="hidden" name="writeupId" value={e.writeupId} />
                        <button
                          type="submit"
                          name="intent"
                          value={e.included ? "leave-out" : "put-back"}
                          disabled={busy}
                          aria-label={`${e.included ? "Leave out" : "Put back"} “${e.title}”`}
                          className={quietButtonClass}
                        >
                          {e.included ? "Leave out" : "Put back"}
                        </button>
                      </Form>
                    </li>
                  ))}
                </ol>
              </section>
            );
          })}
          <Form method="post" className="mt-6">
            <button type="submit" name="intent" value="refresh" className={quietButtonClass} disabled={busy}>Add write-ups published since</button>
          </Form>
        </section>

        <aside className="space-y-6">
          <Form method="post" {...getFormProps(form)} className="space-y-4 rounded-lg border border-cloth-200 bg-white p-4">
            <input type="hidden" name="intent" value="letter" />
            <div>
              <label htmlFor={fields.letter.id} className="block font-medium">The editor's letter</label>
              <p id={`${fields.letter.id}-hint`} className="text-step--1 text-ink-soft">Markdown: blank lines between paragraphs, **bold**, lists with “-”.</p>
              <textarea
                {...getTextareaProps(fields.letter, { ariaDescribedBy: `${fields.letter.id}-hint` })}
                key={fields.letter.key}
                rows={12}
                className={`mt-1 font-serif ${inputClass}`}
              />
              <FieldError id={fields.letter.errorId} errors={fields.letter.errors} />
            </div>
            {edition > 1 && (
              <div>
                <label htmlFor={fields.correctionNote.id} className="block font-medium">What this edition corrects</label>
                <p id={`${fields.correctionNote.id}-hint`} className="text-step--1 text-ink-soft">Printed on the cover and at the top of the e-mail.</p>
                <textarea
                  {...getTextareaProps(fields.correctionNote, { ariaDescribedBy: `${fields.correctionNote.id}-hint` })}
                  key={fields.correctionNote.key}
                  rows={3}
                  className={`mt-1 ${inputClass}`}
                />
                <FieldError id={fields.correctionNote.errorId} errors={fields.correctionNote.errors} />
              </div>
            )}
            {edition === 1 && <input type="hidden" name="correctionNote" value="" />}
            <button type="submit" className={`${buttonClass} w-full`} disabled={busy}>Save the letter</button>
          </Form>

          {problems.length > 0 && (
            <div className="rounded-md border-l-4 border-varnish-500 bg-cloth-100 p-3 text-step--1">
              <p className="font-medium">Before issuing</p>
              <ul className="mt-1 list-disc pl-5">{problems.map((p) => <li key={p}>{p}</li>)}</ul>
            </div>
          )}

          <Form method="post" onSubmit={(event) => { if (!confirm("Throw this draft away? The write-ups are not touched.")) event.preventDefault(); }}>
            <button type="submit" name="intent" value="discard" className="text-step--1 text-bootstripe-600 underline" disabled={busy}>Throw the draft away</button>
          </Form>
        </aside>
      </div>
    </div>
  );
}
