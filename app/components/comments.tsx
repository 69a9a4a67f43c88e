// Comments under a published write-up: plain text (no Markdown), shown with its line breaks and
// escaped by React like any other text. Posted and removed through /api/writeups/:slug/comments
// with a fetcher; the same forms work as plain HTML forms before the page's script has loaded.
import { getFormProps, getTextareaProps, type SubmissionResult, useForm } from "@conform-to/react";
import { parseWithZod } from "@conform-to/zod/v4";
import { useEffect, useMemo, useState } from "react";
import { Link, useFetcher } from "react-router";
import { buttonClass, FieldError, FormMessage, Honeypot, inputClass, quietButtonClass } from "~/components/ui/field";
import { formatDate } from "~/components/writeup-card";
import { COMMENT_MAX, COMMENT_MIN, commentSchema } from "~/domain/conversation-forms";

export type CommentView = { id: number; authorName: string; body: string; createdAt: Date; mine: boolean; canDelete: boolean };
/** A comment refused on a page without JavaScript, back in the form with its message. */
export type CommentDraft = { body: string; error: string };

/** What /api/writeups/:slug/comments answers (JSON). */
export type CommentReply = {
  ok?: true;
  error?: string;
  parameter?: string;
  message?: string;
  result?: SubmissionResult<string[]>;
};

const apiPath = (slug: string) => `/api/writeups/${encodeURIComponent(slug)}/comments`;

export function Comments({ slug, comments, signedIn, draft }: { slug: string; comments: CommentView[]; signedIn: boolean; draft: CommentDraft | null }) {
  return (
    <section id="comments" aria-labelledby="comments-heading" className="scroll-mt-6">
      <h2 id="comments-heading" className="text-step-2 font-semibold">
        Comments{comments.length > 0 ? <span className="font-normal text-ink-soft"> ({comments.length})</span> : null}
      </h2>
      {comments.length === 0 ? (
        <p className="mt-3 text-ink-soft">No comments yet. Questions, corrections and what you found on your own hull are all welcome.</p>
      ) : (
        <ol className="mt-4 space-y-4">
          {comments.map((c) => <CommentItem key={c.id} slug={slug} comment={c} />)}
        </ol>
      )}
      {signedIn ? (
        <CommentForm slug={slug} draft={draft} />
      ) : (
        <p id="comment-form" className="mt-6 rounded-lg bg-cloth-100 p-4">
          <Link to={`/sign-in?redirectTo=${encodeURIComponent(`/writeups/${slug}#comment-form`)}`} className="font-medium">Sign in</Link>
          {" "}to comment. Comments are open to members of the class association.
        </p>
      )}
    </section>
  );
}

function CommentItem({ slug, comment }: { slug: string; comment: CommentView }) {
  const fetcher = useFetcher<CommentReply>();
  // Removed at once; it comes back, with the reason, if the server refused.
  if (fetcher.formData?.get("intent") === "delete") return null;
  const refused = fetcher.state === "idle" && fetcher.data && !fetcher.data.ok ? fetcher.data.message : undefined;
  return (
    <li id={`comment-${comment.id}`} className="scroll-mt-6 rounded-lg border border-cloth-200 bg-white/70 p-4">
      <p className="text-step--1 text-ink-soft">
        <span className="font-medium text-ink">{comment.authorName}</span>
        {comment.mine ? " (you)" : ""}
        {" · "}
        <time dateTime={new Date(comment.createdAt).toISOString()}>{formatDate(comment.createdAt)}</time>
      </p>
      <p className="mt-2 whitespace-pre-wrap break-words font-serif leading-relaxed">{comment.body}</p>
      {comment.canDelete && (
        <details className="mt-2 text-step--1">
          <summary className="cursor-pointer text-ink-soft hover:text-deep-700">Remove</summary>
          <fetcher.Form method="post" action={apiPath(slug)} className="mt-2 flex flex-wrap items-center gap-3">
            <input type="hidden" name="intent" value="delete" />
            <input type="hidden" name="commentId" value={comment.id} />
            <span>{comment.mine ? "Remove your comment for good?" : `Remove ${comment.authorName}'s comment for good?`}</span>
            <button type="submit" className={quietButtonClass}>Remove the comment</button>
          </fetcher.Form>
        </details>
      )}
      {refused && <p role="alert" className="mt-2 text-step--1 font-medium text-bootstripe-600">{refused}</p>}
    </li>
  );
}

function CommentForm({ slug, draft }: { slug: string; draft: CommentDraft | null }) {
  const fetcher = useFetcher<CommentReply>();
  const reply = fetcher.state === "idle" ? fetcher.data : undefined;
  // The same object while the page's data stays the same (conform reports each new result once).
  const draftResult = useMemo<SubmissionResult<string[]> | undefined>(
    () => (draft ? { status: "error", initialValue: { body: draft.body }, error: { body: [draft.error] } } : undefined),
    [draft],
  );
  const [form, fields] = useForm({
    id: "comment-form",
    lastResult: fetcher.data?.result ?? draftResult,
    defaultValue: draft ? { body: draft.body } : undefined,
    defaultNoValidate: false,
    onValidate: ({ formData }) => parseWithZod(formData, { schema: commentSchema }),
    shouldValidate: "onSubmit",
    shouldRevalidate: "onInput",
  });
  const [length, setLength] = useState(draft?.body.length ?? 0);
  const posted = reply?.ok === true;
  useEffect(() => {
    if (posted) setLength(0);
  }, [posted, reply]);
  const busy = fetcher.state !== "idle";
  // A refusal that belongs to no field (the honeypot, a write-up that went away, a lost session).
  const formError = reply && !reply.ok && reply.parameter !== "body" ? reply.message : undefined;
  const hintId = `${fields.body.id}-hint`;
  return (
    <fetcher.Form
      method="post"
      action={apiPath(slug)}
      {...getFormProps(form)}
      className="relative mt-6 scroll-mt-6 space-y-3 rounded-lg bg-cloth-100 p-4"
      aria-label="Add a comment"
    >
      <input type="hidden" name="intent" value="post" />
      <div>
        <label htmlFor={fields.body.id} className="block font-medium">Your comment</label>
        <p id={hintId} className="text-step--1 text-ink-soft">
          Plain text: line breaks are kept, Markdown is not. {COMMENT_MIN} to {COMMENT_MAX.toLocaleString("en-US")} characters.
        </p>
        <textarea
          {...getTextareaProps(fields.body, { ariaDescribedBy: hintId })}
          key={fields.body.key}
          required
          minLength={COMMENT_MIN}
          maxLength={COMMENT_MAX}
          rows={5}
          onInput={(e) => setLength(e.currentTarget.value.length)}
          className={`mt-1 font-serif ${inputClass}`}
        />
        {length > COMMENT_MAX - 500 && (
          <p className="text-step--1 text-ink-soft" aria-live="polite">{(COMMENT_MAX - length).toLocaleString("en-US")} characters left.</p>
        )}
        <FieldError id={fields.body.errorId} errors={fields.body.errors} />
      </div>
      <Honeypot />
      <FormMessage errors={formError ? [formError] : undefined} />
      <div className="flex flex-wrap items-center gap-3">
        <button type="submit" className={buttonClass} disabled={busy}>{busy ? "Posting…" : "Post the comment"}</button>
        <p role="status" className="text-step--1 text-ink-soft">{posted ? "Your comment is posted." : ""}</p>
      </div>
    </fetcher.Form>
  );
}
