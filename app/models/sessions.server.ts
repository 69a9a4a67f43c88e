import { and, desc, eq, gt, ne, sql } from "drizzle-orm";
import type { Db } from "~/db/client.server";
import * as s from "~/db/schema";
import type { Role } from "~/domain/permissions";

export type SessionUser = {
  id: number;
  email: string;
  displayName: string;
  units: "in" | "mm";
  emailVerified: boolean;
  roles: Role[];
};

export async function createSession(db: Db, row: typeof s.sessions.$inferInsert) {
  await db.insert(s.sessions).values(row);
}

export async function deleteSession(db: Db, id: string) {
  await db.delete(s.sessions).where(eq(s.sessions.id, id));
}

/** Signs a user out of every browser but (optionally) the one they are using. */
export async function deleteOtherSessions(db: Db, userId: number, keepId?: string) {
  const res = await db
    .delete(s.sessions)
    .where(keepId ? and(eq(s.sessions.userId, userId), ne(s.sessions.id, keepId)) : eq(s.sessions.userId, userId))
    .returning({ id: s.sessions.id });
  return res.length;
}

export async function listSessions(db: Db, userId: number) {
  return db
    .select({ id: s.sessions.id, createdAt: s.sessions.createdAt, lastSeenAt: s.sessions.lastSeenAt, userAgent: s.sessions.userAgent })
    .from(s.sessions)
    .where(and(eq(s.sessions.userId, userId), gt(s.sessions.expiresAt, sql`now()`)))
    .orderBy(desc(s.sessions.lastSeenAt));
}

export async function findSessionUser(db: Db, sessionId: string): Promise<SessionUser | null> {
  const rows = await db
    .select({
      id: s.users.id,
      email: s.users.email,
      displayName: s.users.displayName,
      units: s.users.units,
      emailVerified: sql<boolean>`${s.users.emailVerifiedAt} is not null`,
      roles: sql<Role[]>`coalesce(array(select ur.role::text from ${s.userRoles} ur where ur.user_id = "users"."id" order by ur.role), '{}')`,
      lastSeenAt: s.sessions.lastSeenAt,
    })
    .from(s.sessions)
    .innerJoin(s.users, eq(s.users.id, s.sessions.userId))
    .where(and(eq(s.sessions.id, sessionId), gt(s.sessions.expiresAt, sql`now()`)));
  const row = rows[0];
  if (!row) return null;
  // Refresh "last seen" at most once a minute.
  if (Date.now() - row.lastSeenAt.getTime() > 60_000) {
    await db.update(s.sessions).set({ lastSeenAt: new Date() }).where(eq(s.sessions.id, sessionId));
  }
  const { lastSeenAt: _seen, ...user } = row;
  return user;
}
