// Queries and writes for one boat: its page (owners, write-ups done on it), its weight ledger,
// its GM calibrations; and the class particulars and standard items its heel and trim use.
// Every function takes the db (or a transaction) first.
import { and, asc, desc, eq, inArray } from "drizzle-orm";
import type { Db } from "~/db/client.server";
import * as s from "~/db/schema";
import type { CalibrationInput, ClassParticularsInput } from "~/domain/boat-forms";
import type { ClassFigures, LedgerEntry } from "~/domain/ledger";
import { calibrateGm } from "~/domain/stability";
import { kgToPounds, mmToInches, MM_PER_FOOT } from "~/domain/units";
import type { DbOrTx } from "./spaces.server";

export type BoatPage = {
  id: number;
  hullNumber: number;
  name: string | null;
  owners: { userId: number; displayName: string }[];
};

export async function getBoatByHull(db: DbOrTx, hullNumber: number): Promise<BoatPage | null> {
  const [boat] = await db
    .select({ id: s.boats.id, hullNumber: s.boats.hullNumber, name: s.boats.name })
    .from(s.boats)
    .where(eq(s.boats.hullNumber, hullNumber));
  if (!boat) return null;
  const owners = await db
    .select({ userId: s.users.id, displayName: s.users.displayName })
    .from(s.boatOwners)
    .innerJoin(s.users, eq(s.users.id, s.boatOwners.userId))
    .where(eq(s.boatOwners.boatId, boat.id))
    .orderBy(asc(s.users.displayName));
  return { ...boat, owners };
}

export function isOwner(boat: BoatPage, userId: number): boolean {
  return boat.owners.some((o) => o.userId === userId);
}

/** The published write-ups of work done on this boat, newest first. */
export async function listBoatWriteups(db: DbOrTx, boatId: number) {
  return db
    .select({ slug: s.writeups.slug, title: s.writeups.title, summary: s.writeups.summary, publishedAt: s.writeups.publishedAt })
    .from(s.writeups)
    .where(and(eq(s.writeups.boatId, boatId), eq(s.writeups.status, "published")))
    .orderBy(desc(s.writeups.publishedAt));
}

// ---------------------------------------------------------------------------------------------
// The class particulars.

export async function getClassParticulars(db: DbOrTx): Promise<(ClassFigures & { updatedAt: Date }) | null> {
  const [row] = await db.select().from(s.classParticulars).where(eq(s.classParticulars.id, 1));
  if (!row) return null;
  return {
    lightDisplacementKg: row.lightDisplacementKg,
    gmMm: row.gmMm,
    lwlMm: row.lwlMm,
    beamMm: row.beamMm,
    loaMm: row.loaMm,
    lcfAftOfBowMm: row.lcfAftOfBowMm,
    waterlineForwardEndMm: row.waterlineForwardEndMm,
    gmLongitudinalMm: row.gmLongitudinalMm,
    mct1FtLbPerIn: row.mct1FtLbPerIn,
    demo: row.demo,
    updatedAt: row.updatedAt,
  };
}

export async function setClassParticulars(db: DbOrTx, input: ClassParticularsInput, userId: number | null) {
  const values = { id: 1, ...input, updatedBy: userId, updatedAt: new Date() };
  await db.insert(s.classParticulars).values(values).onConflictDoUpdate({ target: s.classParticulars.id, set: values });
}

// ---------------------------------------------------------------------------------------------
// Standard items of the class.

export type StandardItem = {
  slug: string;
  name: string;
  weightKg: number;
  aftOfBowMm: number;
  offCentreMm: number;
  heightMm: number | null;
  note: string;
};

export async function listStandardItems(db: DbOrTx): Promise<StandardItem[]> {
  return db
    .select({
      slug: s.ledgerStandardItems.slug,
      name: s.ledgerStandardItems.name,
      weightKg: s.ledgerStandardItems.weightKg,
      aftOfBowMm: s.ledgerStandardItems.aftOfBowMm,
      offCentreMm: s.ledgerStandardItems.offCentreMm,
      heightMm: s.ledgerStandardItems.heightMm,
      note: s.ledgerStandardItems.note,
    })
    .from(s.ledgerStandardItems)
    .orderBy(asc(s.ledgerStandardItems.sortOrder), asc(s.ledgerStandardItems.name));
}

export async function upsertStandardItem(db: DbOrTx, item: StandardItem & { sortOrder: number }) {
  await db.insert(s.ledgerStandardItems).values(item).onConflictDoUpdate({ target: s.ledgerStandardItems.slug, set: item });
}

// ---------------------------------------------------------------------------------------------
// The ledger.

export type LedgerRow = LedgerEntry & {
  itemId: number;
  spaceId: number | null;
  spaceName: string | null;
  spaceSlug: string | null;
  standardItemSlug: string | null;
};

export async function listLedger(db: DbOrTx, boatId: number): Promise<LedgerRow[]> {
  const rows = await db
    .select({
      itemId: s.boatLedgerItems.id,
      name: s.boatLedgerItems.name,
      weightKg: s.boatLedgerItems.weightKg,
      aftOfBowMm: s.boatLedgerItems.aftOfBowMm,
      offCentreMm: s.boatLedgerItems.offCentreMm,
      heightMm: s.boatLedgerItems.heightMm,
      spaceId: s.boatLedgerItems.spaceId,
      spaceName: s.spaces.name,
      spaceSlug: s.spaces.slug,
      standardItemSlug: s.boatLedgerItems.standardItemSlug,
    })
    .from(s.boatLedgerItems)
    .leftJoin(s.spaces, eq(s.spaces.id, s.boatLedgerItems.spaceId))
    .where(eq(s.boatLedgerItems.boatId, boatId))
    .orderBy(asc(s.boatLedgerItems.aftOfBowMm), asc(s.boatLedgerItems.id));
  return rows.map((r) => ({ ...r, id: String(r.itemId) }));
}

export type LedgerWrite = {
  name: string;
  weightKg: number;
  aftOfBowMm: number;
  offCentreMm: number;
  heightMm: number | null;
  spaceId: number | null;
  standardItemSlug?: string | null;
};

export async function addLedgerItem(db: DbOrTx, boatId: number, item: LedgerWrite): Promise<number> {
  const [row] = await db
    .insert(s.boatLedgerItems)
    .values({ boatId, ...item, standardItemSlug: item.standardItemSlug ?? null })
    .returning({ id: s.boatLedgerItems.id });
  return row.id;
}

/** Updates one item of this boat's ledger; false when the boat has no such item. */
export async function updateLedgerItem(db: DbOrTx, boatId: number, itemId: number, item: LedgerWrite): Promise<boolean> {
  const { standardItemSlug: _ignored, ...values } = item;
  const rows = await db
    .update(s.boatLedgerItems)
    .set({ ...values, updatedAt: new Date() })
    .where(and(eq(s.boatLedgerItems.boatId, boatId), eq(s.boatLedgerItems.id, itemId)))
    .returning({ id: s.boatLedgerItems.id });
  return rows.length > 0;
}

export async function removeLedgerItem(db: DbOrTx, boatId: number, itemId: number): Promise<boolean> {
  const rows = await db
    .delete(s.boatLedgerItems)
    .where(and(eq(s.boatLedgerItems.boatId, boatId), eq(s.boatLedgerItems.id, itemId)))
    .returning({ id: s.boatLedgerItems.id });
  return rows.length > 0;
}

/** Spaces by id with their positions (to place an item in one). */
export async function spacePositions(db: DbOrTx, ids: number[]) {
  if (!ids.length) return [];
  return db
    .select({ id: s.spaces.id, name: s.spaces.name, aftOfBowMm: s.spaces.aftOfBowMm, offCentreMm: s.spaces.offCentreMm, heightMm: s.spaces.heightMm })
    .from(s.spaces)
    .where(inArray(s.spaces.id, ids));
}

// ---------------------------------------------------------------------------------------------
// GM calibrations.

export type Calibration = {
  id: number;
  weightKg: number;
  shiftMm: number;
  displacementKg: number;
  heelDeg: number | null;
  deflectionMm: number | null;
  plumbLengthMm: number | null;
  gmMm: number;
  by: string | null;
  createdAt: Date;
};

export async function listCalibrations(db: DbOrTx, boatId: number): Promise<Calibration[]> {
  return db
    .select({
      id: s.boatGmCalibrations.id,
      weightKg: s.boatGmCalibrations.weightKg,
      shiftMm: s.boatGmCalibrations.shiftMm,
      displacementKg: s.boatGmCalibrations.displacementKg,
      heelDeg: s.boatGmCalibrations.heelDeg,
      deflectionMm: s.boatGmCalibrations.deflectionMm,
      plumbLengthMm: s.boatGmCalibrations.plumbLengthMm,
      gmMm: s.boatGmCalibrations.gmMm,
      by: s.users.displayName,
      createdAt: s.boatGmCalibrations.createdAt,
    })
    .from(s.boatGmCalibrations)
    .leftJoin(s.users, eq(s.users.id, s.boatGmCalibrations.userId))
    .where(eq(s.boatGmCalibrations.boatId, boatId))
    .orderBy(desc(s.boatGmCalibrations.createdAt), desc(s.boatGmCalibrations.id));
}

/** GM (mm) from a measured list (the inclining relation, ASTM F1321), stored as the boat's GM. */
export async function addCalibration(db: DbOrTx, boatId: number, userId: number, input: CalibrationInput): Promise<number> {
  const heel =
    "degrees" in input.heel
      ? { degrees: input.heel.degrees }
      : { deflection: input.heel.deflectionMm, plumbLength: input.heel.plumbLengthMm };
  const gmFt = calibrateGm({
    weightLb: kgToPounds(input.weightKg),
    shiftIn: mmToInches(input.shiftMm),
    displacementLb: kgToPounds(input.displacementKg),
    heel,
  });
  const gmMm = gmFt * MM_PER_FOOT;
  await db.insert(s.boatGmCalibrations).values({
    boatId,
    userId,
    weightKg: input.weightKg,
    shiftMm: input.shiftMm,
    displacementKg: input.displacementKg,
    heelDeg: "degrees" in input.heel ? input.heel.degrees : null,
    deflectionMm: "deflectionMm" in input.heel ? input.heel.deflectionMm : null,
    plumbLengthMm: "plumbLengthMm" in input.heel ? input.heel.plumbLengthMm : null,
    gmMm,
  });
  return gmMm;
}

/** Back to the class GM: the boat's calibrations are removed. */
export async function clearCalibrations(db: DbOrTx, boatId: number) {
  await db.delete(s.boatGmCalibrations).where(eq(s.boatGmCalibrations.boatId, boatId));
}

export type BoatForCalculations = {
  particulars: ClassFigures | null;
  calibrations: Calibration[];
  /** The GM to use: the latest calibration, else the class's; null without particulars. */
  gmMm: number | null;
  gmSource: "class" | "calibrated";
  ledger: LedgerRow[];
};

export async function loadBoatStability(db: DbOrTx, boatId: number): Promise<BoatForCalculations> {
  const [particulars, calibrations, ledger] = await Promise.all([getClassParticulars(db), listCalibrations(db, boatId), listLedger(db, boatId)]);
  const latest = calibrations[0];
  return {
    particulars,
    calibrations,
    gmMm: latest ? latest.gmMm : (particulars?.gmMm ?? null),
    gmSource: latest ? "calibrated" : "class",
    ledger,
  };
}

export type { Db };
