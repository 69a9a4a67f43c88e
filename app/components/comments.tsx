// Comments under a published write-up: plain text (no Markdown), shown with its line breaks and
// escaped by React like any other text. Posted and removed through /api/writeups/:slug/comments
// with a fetcher; the same forms work as plain HTML forms before the page's script has loaded.
//
// No zod and no conform in the browser: the page checks a comment's length with commentProblem()
// (app/domain/comment-rules.ts) and shows the server's answer beside the field; the server checks
// it again with the zod schema (docs/decisions/0013-write-up-page-script-within-budget.md).
import { useEffect, useRef, useState } from "react";
import { Link, useFetcher } from "react-router";
import { buttonClass, FieldError, FormMessage, Honeypot, inputClass, quietButtonClass } from "~/components/ui/form-basics";
import { formatDate } from "~/components/writeup-card";
import { COMMENT_MAX, COMMENT_MIN, commentProblem } from "~/domain/comment-rules";

export type CommentView = { id: number; authorName: string; body: string; createdAt: Date; mine: boolean; canDelete: boolean };
/** A comment refused on a page without JavaScript, back in the form with its message. */
export type CommentDraft = { body: string; error: string };

/** What /api/writeups/:slug/comments answers (JSON). */
export type CommentReply = {
  ok?: true;
  error?: string;
  parameter?: string;
  message?: string;
  /** The server's check of the fields (conform's submission reply); the page shows `message`. */
  result?: unknown;
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

const FORM_ID = "comment-form";
const BODY_ID = `${FORM_ID}-body`;

function CommentForm({ slug, draft }: { slug: string; draft: CommentDraft | null }) {
  const fetcher = useFetcher<CommentReply>();
  const box = useRef<HTMLTextAreaElement>(null);
  const reply = fetcher.state === "idle" ? fetcher.data : undefined;
  // The message beside the field: this page's own check, or the server's answer (or, on a page
  // without JavaScript, the refused draft's). Once one is shown it is checked again as the text changes.
  const [error, setError] = useState<string | null>(draft?.error ?? null);
  const [recheck, setRecheck] = useState(draft !== null);
  // The browser's own checks (required, minlength, maxlength) guard the form until this script
  // runs; from then on the messages below take over, in the same words as the server's.
  const [hydrated, setHydrated] = useState(false);
  const [length, setLength] = useState(draft?.body.length ?? 0);
  useEffect(() => {
    setHydrated(true);
    // Text typed before this script came (the form was a plain one until then) is counted too.
    if (box.current) setLength(box.current.value.length);
  }, []);
  useEffect(() => {
    const answer = fetcher.data;
    if (!answer) return;
    if (answer.ok) {
      if (box.current) box.current.value = "";
      setLength(0);
      setError(null);
      setRecheck(false);
    } else if (answer.parameter === "body" && answer.message) {
      setError(answer.message);
      setRecheck(true);
    }
  }, [fetcher.data]);
  const posted = reply?.ok === true;
  const busy = fetcher.state !== "idle";
  // A refusal that belongs to no field (the honeypot, a write-up that went away, a lost session).
  const formError = reply && !reply.ok && reply.parameter !== "body" ? reply.message : undefined;
  const hintId = `${BODY_ID}-hint`;
  const errorId = `${BODY_ID}-error`;
  return (
    <fetcher.Form
      method="post"
      action={apiPath(slug)}
      id={FORM_ID}
      noValidate={hydrated || undefined}
      onSubmit={(e) => {
        const problem = commentProblem(box.current?.value ?? "");
        setRecheck(true);
        setError(problem);
        if (problem) {
          e.preventDefault();
          box.current?.focus();
        }
      }}
      className="relative mt-6 scroll-mt-6 space-y-3 rounded-lg bg-cloth-100 p-4"
      aria-label="Add a comment"
    >
      <input type="hidden" name="intent" value="post" />
      <div>
        <label htmlFor={BODY_ID} className="block font-medium">Your comment</label>
        <p id={hintId} className="text-step--1 text-ink-soft">
          Plain text: line breaks are kept, Markdown is not. {COMMENT_MIN} to {COMMENT_MAX.toLocaleString("en-US")} characters.
        </p>
        <textarea
          ref={box}
          id={BODY_ID}
          name="body"
          defaultValue={draft?.body}
          required
          minLength={COMMENT_MIN}
          maxLength={COMMENT_MAX}
          rows={5}
          aria-invalid={error ? true : undefined}
          aria-describedby={error ? `${errorId} ${hintId}` : hintId}
          onInput={(e) => {
            const text = e.currentTarget.value;
            setLength(text.length);
            if (recheck) setError(commentProblem(text));
          }}
          className={`mt-1 font-serif ${inputClass}`}
        />
        {length > COMMENT_MAX - 500 && (
          <p className="text-step--1 text-ink-soft" aria-live="polite">{(COMMENT_MAX - length).toLocaleString("en-US")} characters left.</p>
        )}
        <FieldError id={errorId} errors={error ? [error] : undefined} />
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
