import { getFormProps, getInputProps, useForm } from "@conform-to/react";
import { getZodConstraint, parseWithZod } from "@conform-to/zod/v4";
import { data, Form, Link, redirect, useNavigation } from "react-router";
import type { Route } from "./+types/secretary.digest.$year.preview";
import { DigestDocument } from "~/components/digest-document";
import { DIGEST_CSS } from "~/components/digest-style";
import { buttonClass, FieldError, FormMessage } from "~/components/ui/field";
import { db } from "~/db/index.server";
import { DIGEST_MAIL_BATCH_GAP_MS, DIGEST_MAIL_BATCH_SIZE, digestTitle, issueProblems } from "~/domain/digest";
import { issueSchema } from "~/domain/digest-forms";
import { CLASS_NAME } from "~/domain/hulls";
import { buildSnapshot, DigestError, digestRecipients, getDraft, issueDraft } from "~/models/digests.server";
import { env } from "~/services/env.server";
import { kickOutbox } from "~/services/outbox-worker.server";
import { redirectWithNotice, requirePermission } from "~/services/session.server";
import { unsubscribeUrl } from "~/services/unsubscribe.server";
import { readForm } from "~/services/form-body.server";
import { digestYear } from "./digest-params.server";

export function meta({ loaderData }: Route.MetaArgs) {
  return [{ title: loaderData ? `Preview: ${digestTitle(loaderData.snapshot.year, loaderData.snapshot.edition)} · Sistership` : "Digest preview · Sistership" }];
}

export async function loader({ request, params }: Route.LoaderArgs) {
  await requirePermission(request, "digest:compile");
  const year = digestYear(params);
  const draft = await getDraft(db, year);
  if (!draft) throw redirect("/secretary/digest");
  const [snapshot, recipients] = await Promise.all([buildSnapshot(db, draft.edition.id), digestRecipients(db)]);
  const included = snapshot.sections.reduce((n, x) => n + x.entries.length, 0);
  return {
    snapshot,
    className: CLASS_NAME,
    appUrl: env.APP_URL,
    recipients: recipients.length,
    problems: issueProblems({ edition: snapshot.edition, included, correctionNote: snapshot.correctionNote }),
  };
}

export async function action({ request, params }: Route.ActionArgs) {
  const user = await requirePermission(request, "digest:compile");
  const year = digestYear(params);
  const draft = await getDraft(db, year);
  if (!draft) throw redirect("/secretary/digest");
  const formData = await readForm(request);
  const submission = parseWithZod(formData, { schema: issueSchema });
  if (submission.status !== "success") return data({ result: submission.reply(), error: null }, { status: 400 });
  const appUrl = env.APP_URL;
  const link = (path: string) => new URL(path, appUrl).toString();
  try {
    const issued = await issueDraft(db, {
      editionId: draft.edition.id,
      userId: user.id,
      mailing: submission.value.sendEmail
        ? {
          className: CLASS_NAME,
          batchSize: DIGEST_MAIL_BATCH_SIZE,
          batchGapMs: DIGEST_MAIL_BATCH_GAP_MS,
          links: (userId) => ({
            web: link(`/digest/${year}?edition=${draft.edition.edition}`),
            pdf: link(`/digest/${year}/pdf?edition=${draft.edition.edition}`),
            unsubscribe: unsubscribeUrl(appUrl, userId),
            account: link("/account"),
            writeup: (slug) => link(`/writeups/${slug}`),
          }),
        }
        : null,
    });
    kickOutbox();
    const mailed = submission.value.sendEmail
      ? ` The e-mail is on its way to ${issued.recipients} member${issued.recipients === 1 ? "" : "s"}${issued.batches > 1 ? `, in ${issued.batches} batches a minute apart` : ""}.`
      : " It was not e-mailed.";
    return redirectWithNotice(request, `/digest/${year}?edition=${issued.edition}`, `${digestTitle(year, issued.edition)} is issued.${mailed}`);
  } catch (error) {
    if (error instanceof DigestError) return data({ result: null, error: error.message }, { status: error.status });
    throw error;
  }
}

export default function DigestPreview({ loaderData, actionData }: Route.ComponentProps) {
  const { snapshot, className, appUrl, recipients, problems } = loaderData;
  const navigation = useNavigation();
  const [form, fields] = useForm({
    id: "issue",
    lastResult: actionData?.result ?? undefined,
    constraint: getZodConstraint(issueSchema),
    defaultValue: { sendEmail: "on" },
    onValidate: ({ formData }) => parseWithZod(formData, { schema: issueSchema }),
    shouldValidate: "onSubmit",
  });
  return (
    <div className="space-y-8">
      <style dangerouslySetInnerHTML={{ __html: DIGEST_CSS }} />
      <header className="no-print flex flex-wrap items-end justify-between gap-4">
        <div>
          <p className="text-step--1"><Link to={`/secretary/digest/${snapshot.year}`}>← Back to the draft</Link></p>
          <h1 className="mt-1 text-step-3 font-semibold">Preview: {digestTitle(snapshot.year, snapshot.edition)}</h1>
          <p className="mt-1 text-ink-soft">This is what members will read, on the web, in the PDF and (shorter) in the e-mail.</p>
        </div>
      </header>

      <section aria-labelledby="issue-heading" className="no-print rounded-lg border border-cloth-200 bg-white p-4">
        <h2 id="issue-heading" className="font-sans text-step-1 font-semibold">Issue the digest</h2>
        {problems.length > 0 ? (
          <div className="mt-2">
            <FormMessage errors={problems} />
            <p className="mt-2"><Link to={`/secretary/digest/${snapshot.year}`}>Back to the draft to fix it</Link></p>
          </div>
        ) : (
          <Form method="post" {...getFormProps(form)} className="mt-3 space-y-3">
            {actionData?.error && <FormMessage errors={[actionData.error]} />}
            <label className="flex items-start gap-2">
              <input {...getInputProps(fields.sendEmail, { type: "checkbox" })} key={fields.sendEmail.key} className="mt-1 h-5 w-5" />
              <span>E-mail it to the {recipients} member{recipients === 1 ? "" : "s"} who asked for the digest (in batches, each with their own unsubscribe link)</span>
            </label>
            <div>
              <label className="flex items-start gap-2">
                <input {...getInputProps(fields.confirm, { type: "checkbox", value: "on" })} key={fields.confirm.key} className="mt-1 h-5 w-5" />
                <span>I have read the preview. Once issued, this edition cannot change; a correction makes a new edition.</span>
              </label>
              <FieldError id={fields.confirm.errorId} errors={fields.confirm.errors} />
            </div>
            <button type="submit" className={buttonClass} disabled={navigation.state !== "idle"}>Issue the digest</button>
          </Form>
        )}
      </section>

      <div className="rounded-lg border border-cloth-200 bg-white p-6 shadow-sm sm:p-10">
        <DigestDocument snapshot={snapshot} className={className} appUrl={appUrl} photoSrc={(key) => `/media/${key}`} draft embedded />
      </div>
    </div>
  );
}
