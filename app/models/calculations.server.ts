// Calculations attached to write-ups (a weight move, a cable run): stored as their input
// (app/domain/calculations.ts), shown by <WeightMoveResult> and <CableRunResult>.
import { and, asc, eq, sql } from "drizzle-orm";
import * as s from "~/db/schema";
import { readCalculation, type Calculation } from "~/domain/calculations";
import type { DbOrTx } from "./spaces.server";

export type StoredCalculation = Calculation & { id: number; writeupId: number; title: string; position: number };

function toStored(row: { id: number; writeupId: number; kind: string; title: string; position: number; input: unknown }): StoredCalculation | null {
  const calc = readCalculation(row.kind, row.input);
  return calc ? { ...calc, id: row.id, writeupId: row.writeupId, title: row.title, position: row.position } : null;
}

const columns = {
  id: s.writeupCalculations.id,
  writeupId: s.writeupCalculations.writeupId,
  kind: s.writeupCalculations.kind,
  title: s.writeupCalculations.title,
  position: s.writeupCalculations.position,
  input: s.writeupCalculations.input,
};

/** One calculation by its id; null when there is none or its input no longer reads. */
export async function getCalculation(db: DbOrTx, id: number): Promise<StoredCalculation | null> {
  const [row] = await db.select(columns).from(s.writeupCalculations).where(eq(s.writeupCalculations.id, id));
  return row ? toStored(row) : null;
}

/** The calculations of a write-up, in their order. */
export async function listWriteupCalculations(db: DbOrTx, writeupId: number): Promise<StoredCalculation[]> {
  const rows = await db
    .select(columns)
    .from(s.writeupCalculations)
    .where(eq(s.writeupCalculations.writeupId, writeupId))
    .orderBy(asc(s.writeupCalculations.position), asc(s.writeupCalculations.id));
  return rows.map(toStored).filter((c): c is StoredCalculation => c !== null);
}

/** Attaches a calculation (already checked by readCalculation) at the end of the write-up's list. */
export async function addWriteupCalculation(
  db: DbOrTx,
  writeupId: number,
  calc: Calculation,
  opts: { title?: string; userId?: number | null } = {},
): Promise<number> {
  const [{ next }] = await db
    .select({ next: sql<number>`coalesce(max(${s.writeupCalculations.position}) + 1, 0)::int` })
    .from(s.writeupCalculations)
    .where(eq(s.writeupCalculations.writeupId, writeupId));
  const [row] = await db
    .insert(s.writeupCalculations)
    .values({ writeupId, kind: calc.kind, input: calc.input, title: opts.title ?? "", position: next, createdBy: opts.userId ?? null })
    .returning({ id: s.writeupCalculations.id });
  return row.id;
}

export async function removeWriteupCalculation(db: DbOrTx, writeupId: number, id: number): Promise<boolean> {
  const rows = await db
    .delete(s.writeupCalculations)
    .where(and(eq(s.writeupCalculations.writeupId, writeupId), eq(s.writeupCalculations.id, id)))
    .returning({ id: s.writeupCalculations.id });
  return rows.length > 0;
}
