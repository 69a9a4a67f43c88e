import { diffWords } from "diff";
import { data, Form, Link, useNavigation } from "react-router";
import type { Route } from "./+types/review.$revisionId";
import { CautionList } from "~/components/cautions";
import { calculationName, WriteupCalculations } from "~/components/writeup-calculations";
import { buttonClass, FieldError, FormMessage, inputClass } from "~/components/ui/field";
import { db } from "~/db/index.server";
import { cautionsFor } from "~/domain/cautions";
import { describeHullRange } from "~/domain/hulls";
import { renderMarkdown } from "~/domain/markdown";
import { writeupWarnings } from "~/domain/writeup-checks";
import { CHECKLIST, DECISION_LABELS, DECISIONS, type Decision, STATE_LABELS } from "~/domain/writeup-lifecycle";
import { decide, EditingError, getForReview } from "~/models/writeup-editing.server";
import { compareRevisionCalculations } from "~/models/calculations.server";
import { readerUnit } from "./reader-unit.server";
import { env } from "~/services/env.server";
import { kickOutbox } from "~/services/outbox-worker.server";
import { redirectWithNotice, requirePermission } from "~/services/session.server";
import { readForm } from "~/services/form-body.server";
import { formatDate } from "~/components/writeup-card";

export function meta({ loaderData }: Route.MetaArgs) {
  return [{ title: loaderData ? `Review: ${loaderData.revision.title} · Sistership` : "Review · Sistership" }];
}

/** The revision's number from the address, or null when it cannot be one (a PostgreSQL integer). */
function revisionIdOf(raw: string): number | null {
  const id = Number(raw);
  return /^\d{1,10}$/.test(raw) && id >= 1 && id <= 2_147_483_647 ? id : null;
}

export async function loader({ request, params }: Route.LoaderArgs) {
  const moderator = await requirePermission(request, "writeup:review");
  const id = revisionIdOf(params.revisionId);
  const found = id === null ? null : await getForReview(db, id);
  if (!found) throw data("No such revision.", { status: 404 });
  const { revision: r, previous } = found;
  const changes = previous
    ? diffWords(`${previous.title}\n\n${previous.summary}\n\n${previous.bodyMarkdown}`, `${r.title}\n\n${r.summary}\n\n${r.bodyMarkdown}`).map((p) => ({ value: p.value, added: !!p.added, removed: !!p.removed }))
    : null;
  // The revision's numbers for readers, and what they add or take off against the published ones.
  const numbers = await compareRevisionCalculations(db, r.id, previous?.id ?? null);
  return {
    numbers: { list: numbers.numbers, added: numbers.numbers.filter((c) => c.added).map((c) => c.id), removed: numbers.removed },
    unit: await readerUnit(request, moderator),
    revision: {
      id: r.id, number: r.number, status: r.status, title: r.title, summary: r.summary, systems: r.systems, zones: r.zones,
      appliesTo: describeHullRange({ from: r.hullFrom, to: r.hullTo }), parts: r.parts, html: renderMarkdown(r.bodyMarkdown).html,
      submittedAt: r.submittedAt?.toISOString() ?? null,
    },
    author: found.author,
    ownWork: r.authorId === moderator.id,
    warnings: writeupWarnings({ systems: r.systems, title: r.title, summary: r.summary, body: r.bodyMarkdown }),
    cautions: cautionsFor(r.systems),
    changes,
    previousNumber: previous?.number ?? null,
    decisions: found.decisions.map((d) => ({ ...d, createdAt: d.createdAt.toISOString() })),
  };
}

export async function action({ request, params }: Route.ActionArgs) {
  const moderator = await requirePermission(request, "writeup:review");
  const revisionId = revisionIdOf(params.revisionId);
  if (revisionId === null) throw data("No such revision.", { status: 404 });
  const form = await readForm(request);
  const decision = String(form.get("decision") ?? "");
  const reason = String(form.get("reason") ?? "");
  const checklist = Object.fromEntries(CHECKLIST.map((c) => [c.key, form.get(`check.${c.key}`) === "on"]));
  const errors: Record<string, string> = {};
  if (!(DECISIONS as readonly string[]).includes(decision)) errors.decision = "Choose a decision.";
  if (decision === "publish" && !Object.values(checklist).every(Boolean)) errors.checklist = "Tick every point of the checklist before publishing, or ask for changes.";
  if (decision && decision !== "publish" && reason.trim().length < 10) errors.reason = "Tell the author why, in a sentence or more.";
  if (reason.length > 4000) errors.reason = `Keep it under 4,000 characters (this is ${reason.length.toLocaleString("en-US")}).`;
  if (Object.keys(errors).length) return data({ errors, values: { decision, reason, checklist } }, { status: 400 });
  try {
    const result = await decide(db, { revisionId, moderatorId: moderator.id, decision: decision as Decision, reason, checklist, appUrl: env.APP_URL });
    kickOutbox();
    const done = result.status === "published" ? "Published" : result.status === "needs_changes" ? "Sent back for changes" : "Declined";
    return redirectWithNotice(request, "/review", `${done}. The author has been e-mailed.`);
  } catch (error) {
    if (error instanceof EditingError) return data({ errors: { form: error.message }, values: { decision, reason, checklist } }, { status: error.status });
    throw error;
  }
}

export default function ReviewPage({ loaderData, actionData }: Route.ComponentProps) {
  const { revision: r, author, warnings, cautions, changes, previousNumber, decisions, ownWork, numbers, unit } = loaderData;
  const navigation = useNavigation();
  const errors: Record<string, string> = actionData?.errors ?? {};
  const values = actionData?.values;
  return (
    <div className="grid gap-10 lg:grid-cols-[minmax(0,1fr)_22rem]">
      <article className="min-w-0">
        <p className="text-step--1"><Link to="/review">← Waiting for review</Link></p>
        <p className="mt-2 text-ink-soft">Revision {r.number} by {author} · {STATE_LABELS[r.status]} · applies to {r.appliesTo}</p>
        <h1 className="mt-2 text-step-3 font-semibold">{r.title}</h1>
        <p className="mt-2 font-serif text-step-1 text-ink-soft">{r.summary}</p>
        {warnings.length > 0 && (
          <ul className="mt-4 space-y-1 rounded-md border-l-4 border-varnish-500 bg-cloth-100 p-3" aria-label="Checks">
            {warnings.map((w) => <li key={w.key}>{w.text}</li>)}
          </ul>
        )}
        {cautions.length > 0 && <div className="mt-6"><CautionList cautions={cautions} /></div>}
        <div className="prose mt-6 max-w-none font-serif" dangerouslySetInnerHTML={{ __html: r.html }} />
        {r.parts.length > 0 && (
          <>
            <h2 className="mt-8 text-step-1 font-semibold">Parts</h2>
            <ul className="mt-2 list-disc pl-5">
              {r.parts.map((p, i) => <li key={i}>{p.quantity} × {p.name}{p.note ? ` (${p.note})` : ""}</li>)}
            </ul>
          </>
        )}
        <WriteupCalculations calculations={numbers.list} unit={unit} added={previousNumber === null ? undefined : numbers.added}
          intro="What readers will see under the write-up once this revision is published, worked out by Sistership from the author's figures." />
        {changes && (
          <section className="mt-10" aria-labelledby="changes-heading">
            <h2 id="changes-heading" className="text-step-1 font-semibold">Changes since the published revision {previousNumber}</h2>
            {numbers.added.length + numbers.removed.length > 0 ? (
              <ul className="mt-2 space-y-1 text-step--1" aria-label="Changes to the numbers">
                {numbers.list.filter((c) => numbers.added.includes(c.id)).map((c) => (
                  <li key={`a${c.id}`}><ins className="bg-deep-100 no-underline">Numbers added: {calculationName(c)}</ins></li>
                ))}
                {numbers.removed.map((c) => (
                  <li key={`r${c.id}`}><del className="bg-bootstripe-50 text-bootstripe-800">Numbers taken off: {calculationName(c)}</del></li>
                ))}
              </ul>
            ) : (
              <p className="mt-2 text-step--1 text-ink-soft">The numbers for readers are the same as in the published revision.</p>
            )}
            <pre className="mt-2 whitespace-pre-wrap rounded-md border border-cloth-200 bg-white p-3 text-step--1">
              {changes.map((c, i) =>
                c.added ? <ins key={i} className="bg-deep-100 no-underline">{c.value}</ins>
                : c.removed ? <del key={i} className="bg-bootstripe-50 text-bootstripe-800">{c.value}</del>
                : <span key={i}>{c.value}</span>)}
            </pre>
          </section>
        )}
      </article>
      <aside className="space-y-6">
        {r.status !== "awaiting_review" ? (
          <p className="rounded-md bg-cloth-100 p-3">This revision is “{STATE_LABELS[r.status]}”; there is nothing to decide.</p>
        ) : ownWork ? (
          <p className="rounded-md bg-cloth-100 p-3">This is your own write-up: another moderator must review it.</p>
        ) : (
          <Form method="post" className="space-y-4 rounded-lg border border-cloth-200 bg-white p-4">
            <h2 className="font-sans text-step-1 font-semibold">Your decision</h2>
            <FormMessage errors={errors.form ? [errors.form] : undefined} />
            <fieldset aria-describedby={errors.checklist ? "checklist-error" : undefined}>
              <legend className="font-medium">Checklist</legend>
              {CHECKLIST.map((c) => (
                <label key={c.key} className="mt-2 flex gap-2 text-step--1">
                  <input type="checkbox" name={`check.${c.key}`} defaultChecked={values?.checklist?.[c.key] ?? false} className="mt-1" />
                  {c.label}
                </label>
              ))}
              <FieldError id="checklist-error" errors={errors.checklist ? [errors.checklist] : undefined} />
            </fieldset>
            <fieldset aria-describedby={errors.decision ? "decision-error" : undefined}>
              <legend className="font-medium">Decision</legend>
              {DECISIONS.map((d) => (
                <label key={d} className="mt-1 flex items-center gap-2">
                  <input type="radio" name="decision" value={d} defaultChecked={values?.decision === d} />
                  {DECISION_LABELS[d]}
                </label>
              ))}
              <FieldError id="decision-error" errors={errors.decision ? [errors.decision] : undefined} />
            </fieldset>
            <div>
              <label htmlFor="reason" className="block font-medium">Why (sent to the author)</label>
              <textarea id="reason" name="reason" rows={5} defaultValue={values?.reason ?? ""} aria-invalid={errors.reason ? true : undefined} aria-describedby={errors.reason ? "reason-error" : undefined} className={`mt-1 ${inputClass}`} />
              <FieldError id="reason-error" errors={errors.reason ? [errors.reason] : undefined} />
            </div>
            <button type="submit" className={`${buttonClass} w-full`} disabled={navigation.state !== "idle"}>Record the decision</button>
          </Form>
        )}
        {decisions.length > 0 && (
          <section>
            <h2 className="font-sans text-step-0 font-semibold">Earlier decisions</h2>
            <ul className="mt-2 space-y-2 text-step--1">
              {decisions.map((d) => (
                <li key={d.id}><strong>{d.decision === "withdraw" ? "Withdrawn" : DECISION_LABELS[d.decision]}</strong>, revision {d.revisionNumber}, by {d.by} on {formatDate(d.createdAt)}{d.reason ? `: ${d.reason}` : ""}</li>
              ))}
            </ul>
          </section>
        )}
      </aside>
    </div>
  );
}
