// Calculations attached to write-ups (a weight move, a cable run): stored as their input
// (app/domain/calculations.ts), shown by <WeightMoveResult> and <CableRunResult>.
//
// The numbers go through review like the text (docs/decisions/0011): each row belongs to the
// revision that attached it and stays in the later revisions until one removes it
// (`removed_in_revision_id`). A revision's numbers are the rows attached in it or in an earlier
// revision and not removed by then; readers see those of the last published revision.
import { and, asc, desc, eq, gt, isNull, lte, or, sql } from "drizzle-orm";
import { alias } from "drizzle-orm/pg-core";
import * as s from "~/db/schema";
import { readCalculation, type Calculation } from "~/domain/calculations";
import { canEdit } from "~/domain/writeup-lifecycle";
import type { DbOrTx } from "./spaces.server";

export type StoredCalculation = Calculation & { id: number; writeupId: number; revisionId: number; title: string; position: number };

type Row = { id: number; writeupId: number; revisionId: number; kind: string; title: string; position: number; input: unknown };

function toStored(row: Row): StoredCalculation | null {
  const calc = readCalculation(row.kind, row.input);
  return calc ? { ...calc, id: row.id, writeupId: row.writeupId, revisionId: row.revisionId, title: row.title, position: row.position } : null;
}

const columns = {
  id: s.writeupCalculations.id,
  writeupId: s.writeupCalculations.writeupId,
  revisionId: s.writeupCalculations.revisionId,
  kind: s.writeupCalculations.kind,
  title: s.writeupCalculations.title,
  position: s.writeupCalculations.position,
  input: s.writeupCalculations.input,
};

const addedIn = alias(s.writeupRevisions, "added_in");
const removedIn = alias(s.writeupRevisions, "removed_in");

type RevisionRef = { id: number; writeupId: number; number: number; status: (typeof s.writeupStatusEnum.enumValues)[number] };
const revisionRef = { id: s.writeupRevisions.id, writeupId: s.writeupRevisions.writeupId, number: s.writeupRevisions.number, status: s.writeupRevisions.status };

/** The numbers of one revision (attached in it or before, not removed by then), in their order. */
async function listFor(db: DbOrTx, rev: RevisionRef): Promise<StoredCalculation[]> {
  const rows = await db
    .select(columns)
    .from(s.writeupCalculations)
    .innerJoin(addedIn, eq(addedIn.id, s.writeupCalculations.revisionId))
    .leftJoin(removedIn, eq(removedIn.id, s.writeupCalculations.removedInRevisionId))
    .where(and(
      eq(s.writeupCalculations.writeupId, rev.writeupId),
      lte(addedIn.number, rev.number),
      or(isNull(removedIn.id), gt(removedIn.number, rev.number)),
    ))
    .orderBy(asc(s.writeupCalculations.position), asc(s.writeupCalculations.id));
  return rows.map(toStored).filter((c): c is StoredCalculation => c !== null);
}

async function latestRevision(db: DbOrTx, writeupId: number): Promise<RevisionRef | null> {
  const [rev] = await db.select(revisionRef).from(s.writeupRevisions)
    .where(eq(s.writeupRevisions.writeupId, writeupId)).orderBy(desc(s.writeupRevisions.number)).limit(1);
  return rev ?? null;
}

/** The revision readers see: the last published one, or before the first publication the latest one (decision 0004). */
async function shownRevision(db: DbOrTx, writeupId: number): Promise<RevisionRef | null> {
  const [rev] = await db.select(revisionRef).from(s.writeupRevisions)
    .where(eq(s.writeupRevisions.writeupId, writeupId))
    .orderBy(desc(sql`${s.writeupRevisions.status} = 'published'`), desc(s.writeupRevisions.number))
    .limit(1);
  return rev ?? null;
}

/** One calculation by its id; null when there is none or its input no longer reads. */
export async function getCalculation(db: DbOrTx, id: number): Promise<StoredCalculation | null> {
  const [row] = await db.select(columns).from(s.writeupCalculations).where(eq(s.writeupCalculations.id, id));
  return row ? toStored(row) : null;
}

/** The numbers of one revision, in their order (the review page; empty for no such revision). */
export async function listRevisionCalculations(db: DbOrTx, revisionId: number): Promise<StoredCalculation[]> {
  const [rev] = await db.select(revisionRef).from(s.writeupRevisions).where(eq(s.writeupRevisions.id, revisionId));
  return rev ? listFor(db, rev) : [];
}

/** The numbers of the write-up's latest revision: the set its author works on (the editor). */
export async function listWriteupCalculations(db: DbOrTx, writeupId: number): Promise<StoredCalculation[]> {
  const rev = await latestRevision(db, writeupId);
  return rev ? listFor(db, rev) : [];
}

/** The numbers readers see: those of the last published revision (before a first publication, the latest one's). */
export async function listPublishedCalculations(db: DbOrTx, writeupId: number): Promise<StoredCalculation[]> {
  const rev = await shownRevision(db, writeupId);
  return rev ? listFor(db, rev) : [];
}

export type CalculationChanges = {
  /** The revision's numbers, each marked when the published revision does not have it. */
  numbers: (StoredCalculation & { added: boolean })[];
  /** Numbers readers see now that this revision takes off. */
  removed: StoredCalculation[];
};

/** A revision's numbers against those of the published revision (null: nothing published to compare with). */
export async function compareRevisionCalculations(db: DbOrTx, revisionId: number, publishedRevisionId: number | null): Promise<CalculationChanges> {
  const numbers = await listRevisionCalculations(db, revisionId);
  if (publishedRevisionId === null || publishedRevisionId === revisionId) return { numbers: numbers.map((c) => ({ ...c, added: false })), removed: [] };
  const published = await listRevisionCalculations(db, publishedRevisionId);
  const before = new Set(published.map((c) => c.id));
  const now = new Set(numbers.map((c) => c.id));
  return {
    numbers: numbers.map((c) => ({ ...c, added: !before.has(c.id) })),
    removed: published.filter((c) => !now.has(c.id)),
  };
}

/**
 * The revision a change of numbers goes into: the latest one while its author may still edit it
 * (a draft, one sent back); for a published or declined write-up a new draft revision with the
 * same text, as saving the editor would make, so the change waits for review while readers keep
 * the published numbers. Locks the write-up row, as saving the editor does.
 */
async function revisionForChanges(tx: DbOrTx, writeupId: number): Promise<RevisionRef> {
  await tx.select({ id: s.writeups.id }).from(s.writeups).where(eq(s.writeups.id, writeupId)).for("update");
  const [latest] = await tx.select().from(s.writeupRevisions)
    .where(eq(s.writeupRevisions.writeupId, writeupId)).orderBy(desc(s.writeupRevisions.number)).limit(1);
  if (!latest) throw new Error(`write-up ${writeupId} has no revision`);
  if (canEdit(latest.status)) return latest;
  if (latest.status !== "published" && latest.status !== "declined") {
    throw new Error(`write-up ${writeupId} is ${latest.status}; its numbers cannot change`);
  }
  const { id: _id, createdAt: _c, updatedAt: _u, submittedAt: _s, decidedAt: _d, ...text } = latest;
  const [rev] = await tx.insert(s.writeupRevisions)
    .values({ ...text, number: latest.number + 1, status: "draft" })
    .returning(revisionRef);
  return rev;
}

/**
 * Attaches a calculation (already checked by readCalculation) at the end of the write-up's list,
 * in the revision being edited (a new one for a published write-up). Callers check who may.
 */
export async function addWriteupCalculation(
  db: DbOrTx,
  writeupId: number,
  calc: Calculation,
  opts: { title?: string; userId?: number | null } = {},
): Promise<number> {
  return db.transaction(async (tx) => {
    const rev = await revisionForChanges(tx, writeupId);
    const [{ next }] = await tx
      .select({ next: sql<number>`coalesce(max(${s.writeupCalculations.position}) + 1, 0)::int` })
      .from(s.writeupCalculations)
      .where(eq(s.writeupCalculations.writeupId, writeupId));
    const [row] = await tx
      .insert(s.writeupCalculations)
      .values({ writeupId, revisionId: rev.id, kind: calc.kind, input: calc.input, title: opts.title ?? "", position: next, createdBy: opts.userId ?? null })
      .returning({ id: s.writeupCalculations.id });
    return row.id;
  });
}

/**
 * Takes one of the write-up's current numbers off, in the revision being edited: deleted when that
 * revision attached it, otherwise marked as removed by it (earlier revisions keep it). False when
 * the write-up's latest revision does not carry it.
 */
export async function removeWriteupCalculation(db: DbOrTx, writeupId: number, id: number): Promise<boolean> {
  return db.transaction(async (tx) => {
    await tx.select({ id: s.writeups.id }).from(s.writeups).where(eq(s.writeups.id, writeupId)).for("update");
    const latest = await latestRevision(tx, writeupId);
    if (!latest || !(await listFor(tx, latest)).some((c) => c.id === id)) return false;
    const rev = await revisionForChanges(tx, writeupId);
    const [row] = await tx.select({ revisionId: s.writeupCalculations.revisionId }).from(s.writeupCalculations).where(eq(s.writeupCalculations.id, id));
    if (row.revisionId === rev.id) {
      await tx.delete(s.writeupCalculations).where(eq(s.writeupCalculations.id, id));
    } else {
      await tx.update(s.writeupCalculations).set({ removedInRevisionId: rev.id }).where(eq(s.writeupCalculations.id, id));
    }
    return true;
  });
}
