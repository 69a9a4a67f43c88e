// Comments under published write-ups: plain text, shown newest last.
import { and, asc, eq } from "drizzle-orm";
import type { Db } from "~/db/client.server";
import * as s from "~/db/schema";

/** The published write-up a comment or a "done too" belongs to, or null. */
export async function findPublishedWriteupRef(db: Db, slug: string) {
  const [row] = await db
    .select({ id: s.writeups.id, slug: s.writeups.slug, authorId: s.writeups.authorId, authorHull: s.boats.hullNumber })
    .from(s.writeups)
    .leftJoin(s.boats, eq(s.boats.id, s.writeups.boatId))
    .where(and(eq(s.writeups.slug, slug), eq(s.writeups.status, "published")));
  return row ?? null;
}

export type CommentRow = { id: number; userId: number; authorName: string; body: string; createdAt: Date };

export async function listComments(db: Db, writeupId: number): Promise<CommentRow[]> {
  return db
    .select({ id: s.comments.id, userId: s.comments.userId, authorName: s.users.displayName, body: s.comments.body, createdAt: s.comments.createdAt })
    .from(s.comments)
    .innerJoin(s.users, eq(s.users.id, s.comments.userId))
    .where(eq(s.comments.writeupId, writeupId))
    .orderBy(asc(s.comments.createdAt), asc(s.comments.id));
}

/** Stores the text as typed (already checked and trimmed by the form's schema). */
export async function addComment(db: Db, input: { writeupId: number; userId: number; body: string }) {
  const [row] = await db.insert(s.comments).values(input).returning({ id: s.comments.id, createdAt: s.comments.createdAt });
  return row;
}

export async function getComment(db: Db, writeupId: number, commentId: number) {
  const [row] = await db
    .select({ id: s.comments.id, userId: s.comments.userId })
    .from(s.comments)
    .where(and(eq(s.comments.id, commentId), eq(s.comments.writeupId, writeupId)));
  return row ?? null;
}

export async function deleteComment(db: Db, writeupId: number, commentId: number): Promise<boolean> {
  const gone = await db
    .delete(s.comments)
    .where(and(eq(s.comments.id, commentId), eq(s.comments.writeupId, writeupId)))
    .returning({ id: s.comments.id });
  return gone.length > 0;
}
