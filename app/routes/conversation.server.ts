// The conversation under a published write-up (comments and "done on my boat too"), as its page
// shows it, and what the two resource routes under /api/writeups/:slug/ share.
import { createCookie, data, redirect } from "react-router";
import type { CommentDraft, CommentView } from "~/components/comments";
import type { DoneTooView } from "~/components/done-too";
import { db } from "~/db/index.server";
import type { HullRange } from "~/domain/hulls";
import { can } from "~/domain/permissions";
import { findPublishedWriteupRef, listComments } from "~/models/comments.server";
import { doneTooSummary } from "~/models/done-too.server";
import { listBoatsOf } from "~/models/users.server";
import { env } from "~/services/env.server";
import { getUser, readNotice, type SessionUser } from "~/services/session.server";
import { notFound } from "./api-errors.server";

export type WriteupRef = { id: number; slug: string; authorHull: number | null };

/** Who may remove anyone's comment (the author of a comment may always remove their own). */
export function canModerateComments(user: SessionUser): boolean {
  return can(user.roles, "writeup:review");
}

/**
 * Was this sent by a plain HTML form (no JavaScript), so that the answer should be a redirect back
 * to the page rather than JSON? Browsers mark a form navigation with Sec-Fetch-Mode: navigate;
 * without that header, an Accept that asks for HTML says the same.
 */
export function fromDocument(request: Request): boolean {
  const mode = request.headers.get("sec-fetch-mode");
  if (mode) return mode === "navigate";
  return (request.headers.get("accept") ?? "").includes("text/html");
}

export function writeupPath(slug: string, anchor?: string) {
  return `/writeups/${encodeURIComponent(slug)}${anchor ? `#${anchor}` : ""}`;
}

export function signInPath(slug: string, anchor: string) {
  return `/sign-in?redirectTo=${encodeURIComponent(writeupPath(slug, anchor))}`;
}

export function json(body: unknown, status = 200, headers?: HeadersInit) {
  return Response.json(body, { status, headers });
}

/**
 * The start both conversation actions share: the published write-up and the signed-in member, or
 * the answer that ends the request (404; a visitor is sent to sign in, or told so in JSON).
 */
export async function conversationPoster(request: Request, slug: string, anchor: string, signInMessage: string) {
  const document = fromDocument(request);
  const writeup = await findPublishedWriteupRef(db, slug);
  if (!writeup) {
    if (document) throw data("There is no published write-up at this address.", { status: 404 });
    return { answer: notFound("There is no published write-up at this address.") } as const;
  }
  const user = await getUser(request);
  if (!user) {
    if (document) return { answer: redirect(signInPath(writeup.slug, anchor)) } as const;
    return { answer: json({ error: "sign-in-needed", message: signInMessage }, 401) } as const;
  }
  return { document, writeup, user } as const;
}

const loopback = /^https?:\/\/(127\.0\.0\.1|localhost|\[::1\])(:\d+)?(\/|$)/.test(env.APP_URL);

// A comment refused on a page without JavaScript: the text and the message come back on the page
// once, through this short-lived cookie (the session cookie stays small).
const draftCookie = createCookie("__sistership_comment", {
  httpOnly: true,
  sameSite: "lax",
  path: "/",
  maxAge: 10 * 60,
  secure: env.NODE_ENV === "production" && !loopback,
  secrets: [env.SESSION_SECRET],
});
// Browsers keep a cookie of up to 4096 bytes; leave room for the name, the signature and attributes.
const DRAFT_COOKIE_BYTES = 3600;

type StoredDraft = CommentDraft & { slug: string };

/** The redirect back to the comment form, carrying the refused text and its message. */
export async function redirectWithDraft(slug: string, draft: CommentDraft) {
  let cookie = await draftCookie.serialize({ slug, ...draft } satisfies StoredDraft);
  if (cookie.length > DRAFT_COOKIE_BYTES) {
    cookie = await draftCookie.serialize({
      slug,
      body: "",
      error: `${draft.error} Your text was too long to keep on a page without JavaScript: use the back button of your browser to copy it.`,
    } satisfies StoredDraft);
  }
  return redirect(writeupPath(slug, "comment-form"), { headers: { "Set-Cookie": cookie } });
}

async function takeDraft(request: Request, slug: string): Promise<{ draft: CommentDraft | null; setCookie?: string }> {
  const cookieHeader = request.headers.get("Cookie");
  if (!cookieHeader?.includes("__sistership_comment=")) return { draft: null };
  const stored = (await draftCookie.parse(cookieHeader)) as StoredDraft | null;
  const setCookie = await draftCookie.serialize("", { maxAge: 0 });
  if (!stored || stored.slug !== slug || typeof stored.body !== "string" || typeof stored.error !== "string") {
    return { draft: null, setCookie };
  }
  return { draft: { body: stored.body, error: stored.error }, setCookie };
}

/** Everything the write-up page shows below the body, for the reader who asks. */
export async function loadConversation(request: Request, writeup: WriteupRef, appliesTo: HullRange) {
  const user = await getUser(request);
  const [comments, doneToo, boats, { notice, headers: noticeHeaders }, { draft, setCookie }] = await Promise.all([
    listComments(db, writeup.id),
    doneTooSummary(db, writeup),
    user ? listBoatsOf(db, user.id) : Promise.resolve(null),
    readNotice(request),
    takeDraft(request, writeup.slug),
  ]);
  const moderator = user ? canModerateComments(user) : false;
  const counted = new Set(doneToo.hulls.filter((h) => !h.isAuthors).map((h) => h.hullNumber));
  const commentViews: CommentView[] = comments.map((c) => ({
    id: c.id,
    authorName: c.authorName,
    body: c.body,
    createdAt: c.createdAt,
    mine: c.userId === user?.id,
    canDelete: user !== null && (c.userId === user.id || moderator),
  }));
  const doneTooView: DoneTooView = {
    appliesTo,
    count: doneToo.count,
    hulls: doneToo.hulls.map(({ hullNumber, boatName, isAuthors }) => ({ hullNumber, boatName, isAuthors })),
    mine: boats
      ? boats.map((b) => ({
          hullNumber: b.hullNumber,
          name: b.name,
          state: b.hullNumber === writeup.authorHull ? "authors" : counted.has(b.hullNumber) ? "counted" : "open",
        }))
      : null,
  };
  const headers = new Headers();
  const noticeCookie = noticeHeaders ? new Headers(noticeHeaders).get("Set-Cookie") : null;
  if (noticeCookie) headers.append("Set-Cookie", noticeCookie);
  if (setCookie) headers.append("Set-Cookie", setCookie);
  return {
    conversation: {
      slug: writeup.slug,
      signedIn: user !== null,
      notice,
      comments: commentViews,
      draft,
      doneToo: doneTooView,
    },
    headers,
  };
}
