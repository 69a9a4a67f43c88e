// "Done on my boat too": members record that they made the same change on one of their hulls.
import { and, asc, eq, sql } from "drizzle-orm";
import type { Db } from "~/db/client.server";
import * as s from "~/db/schema";

export type DoneTooHull = { hullNumber: number; boatName: string | null; userId: number | null; isAuthors: boolean };

/**
 * Every hull the change was done on: the author's own (when the write-up names one) first, then the
 * hulls members recorded, in hull-number order. `count` is the number of boats.
 */
export async function doneTooSummary(db: Db, writeup: { id: number; authorHull: number | null }) {
  const rows = await db
    .select({ hullNumber: s.doneToo.hullNumber, userId: s.doneToo.userId, boatName: s.boats.name })
    .from(s.doneToo)
    .leftJoin(s.boats, eq(s.boats.hullNumber, s.doneToo.hullNumber))
    .where(eq(s.doneToo.writeupId, writeup.id))
    .orderBy(asc(s.doneToo.hullNumber));
  const hulls: DoneTooHull[] = rows
    .filter((r) => r.hullNumber !== writeup.authorHull)
    .map((r) => ({ hullNumber: r.hullNumber, boatName: r.boatName, userId: r.userId, isAuthors: false }));
  if (writeup.authorHull !== null) {
    const [boat] = await db.select({ name: s.boats.name }).from(s.boats).where(eq(s.boats.hullNumber, writeup.authorHull));
    hulls.unshift({ hullNumber: writeup.authorHull, boatName: boat?.name ?? null, userId: null, isAuthors: true });
  }
  return { count: hulls.length, hulls };
}

/** Does the member own hull `hullNumber` (as registered on their account)? */
export async function ownsHull(db: Db, userId: number, hullNumber: number): Promise<boolean> {
  const rows = await db
    .select({ one: sql<number>`1` })
    .from(s.boatOwners)
    .innerJoin(s.boats, eq(s.boats.id, s.boatOwners.boatId))
    .where(and(eq(s.boatOwners.userId, userId), eq(s.boats.hullNumber, hullNumber)));
  return rows.length > 0;
}

/**
 * Records the hull. The caller checks that the member owns it. Returns "recorded", or
 * "already" when the hull is counted already (by this member or a co-owner).
 */
export async function recordDoneToo(db: Db, input: { writeupId: number; hullNumber: number; userId: number }) {
  const added = await db.insert(s.doneToo).values(input).onConflictDoNothing().returning({ hull: s.doneToo.hullNumber });
  return added.length > 0 ? ("recorded" as const) : ("already" as const);
}

/** Takes the hull back off the write-up. The caller checks that the member owns it. */
export async function takeBackDoneToo(db: Db, writeupId: number, hullNumber: number): Promise<boolean> {
  const gone = await db
    .delete(s.doneToo)
    .where(and(eq(s.doneToo.writeupId, writeupId), eq(s.doneToo.hullNumber, hullNumber)))
    .returning({ hull: s.doneToo.hullNumber });
  return gone.length > 0;
}
