// Members, their roles and their boats.
import { and, asc, count, eq, ilike, inArray, or, sql } from "drizzle-orm";
import type { Db } from "~/db/client.server";
import * as s from "~/db/schema";
import { ROLES, type Role } from "~/domain/permissions";

export async function findUserByEmail(db: Db, email: string) {
  const [row] = await db
    .select({ id: s.users.id, email: s.users.email, displayName: s.users.displayName, passwordHash: s.users.passwordHash, emailVerifiedAt: s.users.emailVerifiedAt })
    .from(s.users)
    .where(eq(s.users.email, email.trim().toLowerCase()));
  return row ?? null;
}

export async function getUserById(db: Db, id: number) {
  const [row] = await db.select().from(s.users).where(eq(s.users.id, id));
  return row ?? null;
}

/** A new member (not yet verified). Returns null when the e-mail is already registered. */
export async function createMember(db: Db, input: { email: string; displayName: string; passwordHash: string }) {
  const [row] = await db
    .insert(s.users)
    .values({ email: input.email.trim().toLowerCase(), displayName: input.displayName.trim(), passwordHash: input.passwordHash })
    .onConflictDoNothing({ target: s.users.email })
    .returning({ id: s.users.id });
  if (!row) return null;
  await db.insert(s.userRoles).values({ userId: row.id, role: "member" });
  return row.id;
}

export async function setPassword(db: Db, userId: number, passwordHash: string) {
  await db.update(s.users).set({ passwordHash }).where(eq(s.users.id, userId));
}

export async function markEmailVerified(db: Db, userId: number) {
  await db.update(s.users).set({ emailVerifiedAt: sql`coalesce(${s.users.emailVerifiedAt}, now())` }).where(eq(s.users.id, userId));
}

export type ProfileInput = { displayName: string; creditAs: string | null; units: "in" | "mm"; digestOptIn: boolean };

export async function updateProfile(db: Db, userId: number, input: ProfileInput) {
  await db.update(s.users).set(input).where(eq(s.users.id, userId));
}

/** A member's boats, each with all its owners. */
export async function listBoatsOf(db: Db, userId: number) {
  const boats = await db
    .select({ id: s.boats.id, hullNumber: s.boats.hullNumber, name: s.boats.name })
    .from(s.boatOwners)
    .innerJoin(s.boats, eq(s.boats.id, s.boatOwners.boatId))
    .where(eq(s.boatOwners.userId, userId))
    .orderBy(asc(s.boats.hullNumber));
  if (!boats.length) return [];
  const owners = await db
    .select({ boatId: s.boatOwners.boatId, userId: s.users.id, displayName: s.users.displayName })
    .from(s.boatOwners)
    .innerJoin(s.users, eq(s.users.id, s.boatOwners.userId))
    .where(inArray(s.boatOwners.boatId, boats.map((b) => b.id)))
    .orderBy(asc(s.users.displayName));
  return boats.map((b) => ({ ...b, owners: owners.filter((o) => o.boatId === b.id) }));
}

/**
 * Registers the member as an owner of hull `hullNumber`. A boat already registered by someone else
 * gains a co-owner; its name is set only when it has none.
 */
export async function registerBoat(db: Db, userId: number, hullNumber: number, name: string | null) {
  return db.transaction(async (tx) => {
    const [boat] = await tx
      .insert(s.boats)
      .values({ hullNumber, name })
      .onConflictDoUpdate({ target: s.boats.hullNumber, set: { name: sql`coalesce(${s.boats.name}, excluded.name)` } })
      .returning({ id: s.boats.id, name: s.boats.name });
    const added = await tx.insert(s.boatOwners).values({ boatId: boat.id, userId }).onConflictDoNothing().returning();
    return { boatId: boat.id, alreadyOwner: added.length === 0 };
  });
}

export async function leaveBoat(db: Db, userId: number, boatId: number) {
  await db.delete(s.boatOwners).where(and(eq(s.boatOwners.userId, userId), eq(s.boatOwners.boatId, boatId)));
}

export async function renameBoat(db: Db, userId: number, boatId: number, name: string | null) {
  const owns = await db.select().from(s.boatOwners).where(and(eq(s.boatOwners.userId, userId), eq(s.boatOwners.boatId, boatId)));
  if (!owns.length) return false;
  await db.update(s.boats).set({ name }).where(eq(s.boats.id, boatId));
  return true;
}

export const USERS_PAGE_SIZE = 20;

/** The admin's users table: search by name or e-mail, filter by role, paginated. */
export async function listUsers(db: Db, opts: { q?: string; role?: Role; page?: number }) {
  const page = Math.max(1, opts.page ?? 1);
  const filters = [];
  if (opts.q) {
    const pattern = `%${opts.q.replace(/[\\%_]/g, (c) => `\\${c}`)}%`;
    filters.push(or(ilike(s.users.email, pattern), ilike(s.users.displayName, pattern)));
  }
  if (opts.role) {
    filters.push(sql`exists (select 1 from ${s.userRoles} ur where ur.user_id = "users"."id" and ur.role = ${opts.role})`);
  }
  const where = filters.length ? and(...filters) : undefined;
  const [{ total }] = await db.select({ total: count() }).from(s.users).where(where);
  const rows = await db
    .select({
      id: s.users.id,
      email: s.users.email,
      displayName: s.users.displayName,
      emailVerified: sql<boolean>`${s.users.emailVerifiedAt} is not null`,
      createdAt: s.users.createdAt,
      roles: sql<Role[]>`coalesce(array(select ur.role::text from ${s.userRoles} ur where ur.user_id = "users"."id" order by ur.role), '{}')`,
      hulls: sql<number[]>`coalesce(array(select b.hull_number from ${s.boatOwners} bo join ${s.boats} b on b.id = bo.boat_id where bo.user_id = "users"."id" order by 1), '{}')`,
    })
    .from(s.users)
    .where(where)
    .orderBy(asc(s.users.displayName), asc(s.users.id))
    .limit(USERS_PAGE_SIZE)
    .offset((page - 1) * USERS_PAGE_SIZE);
  return { rows, total, page, pages: Math.max(1, Math.ceil(total / USERS_PAGE_SIZE)) };
}

/** Replaces a user's roles; every account keeps the member role. */
export async function setRoles(db: Db, userId: number, roles: Role[]) {
  const wanted = [...new Set<Role>(["member", ...roles.filter((r) => ROLES.includes(r))])];
  await db.transaction(async (tx) => {
    await tx.delete(s.userRoles).where(eq(s.userRoles.userId, userId));
    await tx.insert(s.userRoles).values(wanted.map((role) => ({ userId, role })));
  });
}

export async function countAdmins(db: Db) {
  const [{ n }] = await db.select({ n: count() }).from(s.userRoles).where(eq(s.userRoles.role, "admin"));
  return n;
}
