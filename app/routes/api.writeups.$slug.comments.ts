import { parseWithZod } from "@conform-to/zod/v4";
import type { Route } from "./+types/api.writeups.$slug.comments";
import { db } from "~/db/index.server";
import { commentSchema, deleteCommentSchema } from "~/domain/conversation-forms";
import { addComment, deleteComment, findPublishedWriteupRef, getComment, listComments } from "~/models/comments.server";
import { hitLimit, LIMITS } from "~/models/rate-limits.server";
import { redirectWithNotice } from "~/services/session.server";
import { notFound } from "./api-errors.server";
import { canModerateComments, conversationPoster, json, redirectWithDraft, writeupPath } from "./conversation.server";
import { readForm } from "~/services/form-body.server";

// GET /api/writeups/:slug/comments: the comments of a published write-up, oldest first.
export async function loader({ params }: Route.LoaderArgs) {
  const writeup = await findPublishedWriteupRef(db, params.slug);
  if (!writeup) return notFound("There is no published write-up at this address.");
  const comments = await listComments(db, writeup.id);
  return json({
    comments: comments.map((c) => ({ id: c.id, author: c.authorName, body: c.body, createdAt: c.createdAt.toISOString() })),
  });
}

// POST /api/writeups/:slug/comments
//   intent=post, body=...           a signed-in member comments (plain text, 2 to 4000 characters)
//   intent=delete, commentId=...    its author or a moderator removes a comment
// Answers JSON to the page's fetcher; a plain HTML form (no JavaScript) is sent back to the page.
export async function action({ request, params }: Route.ActionArgs) {
  const poster = await conversationPoster(request, params.slug, "comment-form", "Sign in to comment.");
  if ("answer" in poster) return poster.answer;
  const { document, writeup, user } = poster;
  const formData = await readForm(request);

  if (formData.get("intent") === "delete") {
    const submission = parseWithZod(formData, { schema: deleteCommentSchema });
    if (submission.status !== "success") return json({ error: "bad-parameter", parameter: "commentId", message: "Choose a comment." }, 400);
    const comment = await getComment(db, writeup.id, submission.value.commentId);
    const back = writeupPath(writeup.slug, "comments");
    if (!comment) {
      if (document) return redirectWithNotice(request, back, "That comment was already removed.");
      return notFound("That comment was already removed.");
    }
    if (comment.userId !== user.id && !canModerateComments(user)) {
      const message = "Only the member who wrote a comment, or a moderator, can remove it.";
      if (document) return redirectWithNotice(request, back, message);
      return json({ error: "forbidden", message }, 403);
    }
    await deleteComment(db, writeup.id, comment.id);
    if (document) return redirectWithNotice(request, back, "The comment is removed.");
    return json({ ok: true, removed: comment.id });
  }

  // Software that fills in every field fills in the honeypot too.
  const honeypot = formData.get("website");
  if (typeof honeypot === "string" && honeypot !== "") {
    const message = "This comment could not be posted.";
    if (document) return redirectWithNotice(request, writeupPath(writeup.slug, "comments"), message);
    return json({ error: "bad-parameter", parameter: "website", message }, 400);
  }

  const submission = parseWithZod(formData, { schema: commentSchema });
  if (submission.status !== "success") {
    const [field, messages] = Object.entries(submission.error ?? {}).find(([, m]) => m?.length) ?? ["body", ["Write your comment first."]];
    const message = messages?.[0] ?? "Write your comment first.";
    if (document) return redirectWithDraft(writeup.slug, { body: String(formData.get("body") ?? ""), error: message });
    return json({ error: "bad-parameter", parameter: field, message, result: submission.reply() }, 400);
  }

  const limit = await hitLimit(db, `comment:account:${user.id}`, LIMITS.commentPerAccount);
  if (!limit.allowed) {
    const minutes = Math.max(1, Math.ceil(limit.retryAfterSeconds / 60));
    const message = `You have posted many comments in the last hour. Try again in ${minutes} ${minutes === 1 ? "minute" : "minutes"}; your text is still here.`;
    if (document) return redirectWithDraft(writeup.slug, { body: submission.value.body, error: message });
    return json(
      { error: "too-many", parameter: "body", message, result: submission.reply({ fieldErrors: { body: [message] } }) },
      429,
      { "Retry-After": String(limit.retryAfterSeconds) },
    );
  }

  const comment = await addComment(db, { writeupId: writeup.id, userId: user.id, body: submission.value.body });
  if (document) return redirectWithNotice(request, writeupPath(writeup.slug, `comment-${comment.id}`), "Your comment is posted.");
  return json({ ok: true, comment: { id: comment.id, createdAt: comment.createdAt.toISOString() }, result: submission.reply({ resetForm: true }) }, 201);
}
