// Queries and writes for the hidden spaces of the class: the register, one space with its
// measurements, adding, changing and removing a measurement (each keeps the consensus the fit
// uses up to date, and a change or a removal is kept in the space's history), and the fit search
// over every space. Every function takes the db (or a transaction) first.
import { and, asc, desc, eq, inArray, sql, type SQL } from "drizzle-orm";
import { alias } from "drizzle-orm/pg-core";
import pg from "pg";
import type { Db } from "~/db/client.server";
import * as s from "~/db/schema";
import { consensusBySection, type BoxConsensus } from "~/domain/consensus";
import { rankSpaces, type Opening, type Orientation, type RowPlacement, type Space, type Verdict } from "~/domain/fit";
import { candidateRegions, fitOpening, openingBounds, type RecordedFace } from "~/domain/fit-search";
import type { HullRange } from "~/domain/hulls";
import type { Box } from "~/domain/units";

export type DbOrTx = Db | Parameters<Parameters<Db["transaction"]>[0]>[0];
export type MeasureMethod = (typeof s.measureMethodEnum.enumValues)[number];

export type SpaceSection = {
  position: number;
  label: string;
  /** The size as described when the space was recorded. */
  described: Box;
  /** The size the fit uses: the consensus of the measurements of this section if any. */
  fit: Box;
  /** Consensus of the members' measurements of this section; null when nobody has measured it. */
  consensus: BoxConsensus | null;
};

export type SpaceSummary = {
  id: number;
  slug: string;
  name: string;
  zone: { slug: string; name: string; sortOrder: number };
  hulls: HullRange;
  position: { aftOfBowMm: number; offCentreMm: number; heightMm: number | null };
  opening: { widthMm: number; heightMm: number; face: RecordedFace } | null;
  obstructions: string;
  sections: SpaceSection[];
  /** Measurements of all its sections. */
  measurementCount: number;
  /** Consensus of the measurements of the main section; null when nobody has measured it (each
   * section's own is on the section). */
  consensus: BoxConsensus | null;
};

export type Measurement = {
  id: number;
  /** The section measured (its position; 0 is the main one). */
  section: number;
  by: string;
  userId: number;
  hullNumber: number;
  method: MeasureMethod;
  measuredOn: string;
  box: Box;
  photoId: number | null;
  /** Object key of the photo, when there is one. */
  photoKey: string | null;
  createdAt: Date;
  /** The last change after it was added, and who made it; null when never changed. */
  updated: { at: Date; by: string | null } | null;
  /** Its dimensions that sit far from the other measurements of the same section. */
  flagged: (keyof Box)[];
};

export type MeasurementChange = {
  id: number;
  measurementId: number;
  kind: "edited" | "deleted";
  at: Date;
  /** Who changed it, and who had taken it (null once their account is gone). */
  by: string | null;
  takenBy: string | null;
  before: s.MeasurementRecord;
  after: s.MeasurementRecord | null;
  reason: string;
};

export type SpaceDetail = SpaceSummary & {
  measurements: Measurement[];
  writeups: { slug: string; title: string }[];
  /** Changes and removals of its measurements, newest first. */
  changes: MeasurementChange[];
};

/** The space as the fit sees it (app/domain/fit.ts). */
export function asFitSpace(space: Pick<SpaceSummary, "sections" | "opening">): Space {
  return {
    sections: space.sections.map((sec) => sec.fit),
    opening: space.opening ? fitOpening(space.opening.widthMm, space.opening.heightMm, space.opening.face) : undefined,
  };
}

const fitLength = sql<number>`coalesce(${s.spaceSections.consensusLengthMm}, ${s.spaceSections.lengthMm})`;
const fitWidth = sql<number>`coalesce(${s.spaceSections.consensusWidthMm}, ${s.spaceSections.widthMm})`;
const fitHeight = sql<number>`coalesce(${s.spaceSections.consensusHeightMm}, ${s.spaceSections.heightMm})`;

async function loadSpaces(db: DbOrTx, where: SQL | undefined): Promise<SpaceSummary[]> {
  const rows = await db
    .select({
      id: s.spaces.id,
      slug: s.spaces.slug,
      name: s.spaces.name,
      zoneSlug: s.zones.slug,
      zoneName: s.zones.name,
      zoneSort: s.zones.sortOrder,
      hullFrom: s.spaces.hullFrom,
      hullTo: s.spaces.hullTo,
      aftOfBowMm: s.spaces.aftOfBowMm,
      offCentreMm: s.spaces.offCentreMm,
      heightMm: s.spaces.heightMm,
      openingWidthMm: s.spaces.openingWidthMm,
      openingHeightMm: s.spaces.openingHeightMm,
      openingFace: s.spaces.openingFace,
      obstructions: s.spaces.obstructions,
    })
    .from(s.spaces)
    .innerJoin(s.zones, eq(s.zones.slug, s.spaces.zoneSlug))
    .where(where)
    .orderBy(asc(s.zones.sortOrder), asc(s.spaces.aftOfBowMm), asc(s.spaces.name));
  if (!rows.length) return [];
  const ids = rows.map((r) => r.id);
  const [sections, measured] = await Promise.all([
    db
      .select({
        spaceId: s.spaceSections.spaceId,
        position: s.spaceSections.position,
        label: s.spaceSections.label,
        lengthMm: s.spaceSections.lengthMm,
        widthMm: s.spaceSections.widthMm,
        heightMm: s.spaceSections.heightMm,
        fitLength,
        fitWidth,
        fitHeight,
      })
      .from(s.spaceSections)
      .where(inArray(s.spaceSections.spaceId, ids))
      .orderBy(asc(s.spaceSections.spaceId), asc(s.spaceSections.position)),
    db
      .select({
        spaceId: s.spaceMeasurements.spaceId,
        section: s.spaceMeasurements.section,
        length: s.spaceMeasurements.lengthMm,
        width: s.spaceMeasurements.widthMm,
        height: s.spaceMeasurements.heightMm,
      })
      .from(s.spaceMeasurements)
      .where(inArray(s.spaceMeasurements.spaceId, ids))
      .orderBy(asc(s.spaceMeasurements.measuredOn), asc(s.spaceMeasurements.id)),
  ]);
  return rows.map((r) => {
    const mine = measured.filter((m) => m.spaceId === r.id);
    const { bySection } = consensusBySection(mine.map(({ section, length, width, height }) => ({ section, box: { length, width, height } })));
    return {
      id: r.id,
      slug: r.slug,
      name: r.name,
      zone: { slug: r.zoneSlug, name: r.zoneName, sortOrder: r.zoneSort },
      hulls: { from: r.hullFrom, to: r.hullTo },
      position: { aftOfBowMm: r.aftOfBowMm, offCentreMm: r.offCentreMm, heightMm: r.heightMm },
      opening:
        r.openingWidthMm !== null && r.openingHeightMm !== null
          ? { widthMm: r.openingWidthMm, heightMm: r.openingHeightMm, face: r.openingFace ?? "front" }
          : null,
      obstructions: r.obstructions,
      sections: sections
        .filter((sec) => sec.spaceId === r.id)
        .map((sec) => ({
          position: sec.position,
          label: sec.label,
          described: { length: sec.lengthMm, width: sec.widthMm, height: sec.heightMm },
          fit: { length: Number(sec.fitLength), width: Number(sec.fitWidth), height: Number(sec.fitHeight) },
          consensus: bySection.get(sec.position) ?? null,
        })),
      measurementCount: mine.length,
      consensus: bySection.get(0) ?? null,
    };
  });
}

/**
 * The register: every space, by zone then from bow to stern. With a hull number, the spaces
 * that apply to that hull; with a range (a variant), those that apply to any hull in it.
 */
export async function listSpaces(db: DbOrTx, filter: { hull?: number | null; range?: HullRange | null } = {}) {
  const conditions: SQL[] = [];
  if (filter.hull) conditions.push(sql`${filter.hull} between ${s.spaces.hullFrom} and ${s.spaces.hullTo}`);
  if (filter.range) {
    conditions.push(sql`${s.spaces.hullFrom} <= ${filter.range.to} and ${s.spaces.hullTo} >= ${filter.range.from}`);
  }
  return loadSpaces(db, conditions.length ? and(...conditions) : undefined);
}

const changer = alias(s.users, "changer");

/**
 * One space by its id or its slug, with its measurements (by section, then oldest first), the
 * published write-ups that used it, and the history of changes to its measurements.
 */
export async function getSpace(db: DbOrTx, key: number | string): Promise<SpaceDetail | null> {
  const [space] = await loadSpaces(db, typeof key === "number" ? eq(s.spaces.id, key) : eq(s.spaces.slug, key));
  if (!space) return null;
  const [measurements, writeups, changes] = await Promise.all([
    db
      .select({
        id: s.spaceMeasurements.id,
        section: s.spaceMeasurements.section,
        by: sql<string>`coalesce(${s.users.creditAs}, ${s.users.displayName})`,
        userId: s.spaceMeasurements.userId,
        hullNumber: s.spaceMeasurements.hullNumber,
        method: s.spaceMeasurements.method,
        measuredOn: s.spaceMeasurements.measuredOn,
        length: s.spaceMeasurements.lengthMm,
        width: s.spaceMeasurements.widthMm,
        height: s.spaceMeasurements.heightMm,
        photoId: s.spaceMeasurements.photoId,
        photoKey: s.photos.storageKey,
        createdAt: s.spaceMeasurements.createdAt,
        updatedAt: s.spaceMeasurements.updatedAt,
        updatedBy: sql<string | null>`coalesce(${changer.creditAs}, ${changer.displayName})`,
      })
      .from(s.spaceMeasurements)
      .innerJoin(s.users, eq(s.users.id, s.spaceMeasurements.userId))
      .leftJoin(changer, eq(changer.id, s.spaceMeasurements.updatedBy))
      .leftJoin(s.photos, eq(s.photos.id, s.spaceMeasurements.photoId))
      .where(eq(s.spaceMeasurements.spaceId, space.id))
      .orderBy(asc(s.spaceMeasurements.section), asc(s.spaceMeasurements.measuredOn), asc(s.spaceMeasurements.id)),
    db
      .select({ slug: s.writeups.slug, title: s.writeups.title })
      .from(s.writeupSpaces)
      .innerJoin(s.writeups, eq(s.writeups.id, s.writeupSpaces.writeupId))
      .where(and(eq(s.writeupSpaces.spaceId, space.id), eq(s.writeups.status, "published")))
      .orderBy(asc(s.writeups.title)),
    listMeasurementChanges(db, space.id),
  ]);
  const boxes = measurements.map(({ section, length, width, height }) => ({ section, box: { length, width, height } }));
  const { flagged } = consensusBySection(boxes);
  return {
    ...space,
    measurements: measurements.map((row, i): Measurement => ({
      id: row.id,
      section: row.section,
      by: row.by,
      userId: row.userId,
      hullNumber: row.hullNumber,
      method: row.method,
      measuredOn: row.measuredOn,
      photoId: row.photoId,
      photoKey: row.photoKey,
      createdAt: row.createdAt,
      box: { length: row.length, width: row.width, height: row.height },
      updated: row.updatedAt ? { at: row.updatedAt, by: row.updatedBy } : null,
      flagged: flagged[i],
    })),
    writeups,
    changes,
  };
}

const taker = alias(s.users, "taker");

/** The history of a space's measurements: every change and removal, newest first. */
export async function listMeasurementChanges(db: DbOrTx, spaceId: number, limit = 50): Promise<MeasurementChange[]> {
  return db
    .select({
      id: s.measurementChanges.id,
      measurementId: s.measurementChanges.measurementId,
      kind: s.measurementChanges.kind,
      at: s.measurementChanges.changedAt,
      by: sql<string | null>`coalesce(${changer.creditAs}, ${changer.displayName})`,
      takenBy: sql<string | null>`coalesce(${taker.creditAs}, ${taker.displayName})`,
      before: s.measurementChanges.before,
      after: s.measurementChanges.after,
      reason: s.measurementChanges.reason,
    })
    .from(s.measurementChanges)
    .leftJoin(changer, eq(changer.id, s.measurementChanges.changedBy))
    .leftJoin(taker, eq(taker.id, s.measurementChanges.takenBy))
    .where(eq(s.measurementChanges.spaceId, spaceId))
    .orderBy(desc(s.measurementChanges.changedAt), desc(s.measurementChanges.id))
    .limit(limit);
}

/**
 * Recomputes the consensus of a space's measurements, section by section, and stores it on each
 * section, where the fit search reads it (PostgreSQL then recomputes the section's indexed cube
 * columns); clears it on a section no measurement is left of. Returns the consensus by section.
 */
export async function refreshSpaceConsensus(db: DbOrTx, spaceId: number): Promise<Map<number, BoxConsensus>> {
  const [rows, sections] = await Promise.all([
    db
      .select({
        section: s.spaceMeasurements.section,
        length: s.spaceMeasurements.lengthMm,
        width: s.spaceMeasurements.widthMm,
        height: s.spaceMeasurements.heightMm,
      })
      .from(s.spaceMeasurements)
      .where(eq(s.spaceMeasurements.spaceId, spaceId)),
    db
      .select({ position: s.spaceSections.position })
      .from(s.spaceSections)
      .where(eq(s.spaceSections.spaceId, spaceId)),
  ]);
  const { bySection } = consensusBySection(rows.map(({ section, ...box }) => ({ section, box })));
  for (const { position } of sections) {
    const c = bySection.get(position);
    await db
      .update(s.spaceSections)
      .set({
        consensusLengthMm: c?.length.consensus ?? null,
        consensusWidthMm: c?.width.consensus ?? null,
        consensusHeightMm: c?.height.consensus ?? null,
      })
      .where(and(eq(s.spaceSections.spaceId, spaceId), eq(s.spaceSections.position, position)));
  }
  return bySection;
}

export type NewMeasurement = {
  spaceId: number;
  /** The section measured; 0, the main one, when not given. */
  section?: number;
  userId: number;
  hullNumber: number;
  method: MeasureMethod;
  measuredOn: string;
  box: Box;
  photoId?: number | null;
};

/** Records a member's measurement of a section of a space and updates its consensus. */
export async function addMeasurement(db: Db, m: NewMeasurement): Promise<number> {
  return db.transaction(async (tx) => {
    const [row] = await tx
      .insert(s.spaceMeasurements)
      .values({
        spaceId: m.spaceId,
        section: m.section ?? 0,
        userId: m.userId,
        hullNumber: m.hullNumber,
        method: m.method,
        measuredOn: m.measuredOn,
        lengthMm: m.box.length,
        widthMm: m.box.width,
        heightMm: m.box.height,
        photoId: m.photoId ?? null,
      })
      .returning({ id: s.spaceMeasurements.id });
    await refreshSpaceConsensus(tx, m.spaceId);
    return row.id;
  });
}

/** One measurement as stored: who took it, of which space and section. */
export type StoredMeasurement = {
  id: number;
  spaceId: number;
  userId: number;
  record: s.MeasurementRecord;
};

const storedColumns = {
  id: s.spaceMeasurements.id,
  spaceId: s.spaceMeasurements.spaceId,
  userId: s.spaceMeasurements.userId,
  section: s.spaceMeasurements.section,
  hullNumber: s.spaceMeasurements.hullNumber,
  method: s.spaceMeasurements.method,
  measuredOn: s.spaceMeasurements.measuredOn,
  lengthMm: s.spaceMeasurements.lengthMm,
  widthMm: s.spaceMeasurements.widthMm,
  heightMm: s.spaceMeasurements.heightMm,
  photoId: s.spaceMeasurements.photoId,
};

type StoredRow = { id: number; spaceId: number; userId: number } & s.MeasurementRecord;

function asStored(row: StoredRow): StoredMeasurement {
  const { id, spaceId, userId, ...record } = row;
  return { id, spaceId, userId, record };
}

/** A measurement of the given space, or null (none, or one of another space). */
export async function getMeasurement(db: DbOrTx, spaceId: number, id: number): Promise<StoredMeasurement | null> {
  const [row] = await db
    .select(storedColumns)
    .from(s.spaceMeasurements)
    .where(and(eq(s.spaceMeasurements.id, id), eq(s.spaceMeasurements.spaceId, spaceId)));
  return row ? asStored(row) : null;
}

export type MeasurementEdit = {
  section: number;
  hullNumber: number;
  method: MeasureMethod;
  measuredOn: string;
  box: Box;
  /** A new photo's id; null removes the photo; undefined keeps it. */
  photoId?: number | null;
};

/**
 * Changes a measurement (by its author or a moderator: the caller checks), keeps what it said
 * before in the space's history with who changed it and why, and updates the consensus of the
 * space's sections, all in one transaction. Returns false when the measurement is gone.
 */
export async function updateMeasurement(
  db: Db,
  target: { spaceId: number; id: number },
  edit: MeasurementEdit,
  by: { userId: number; reason?: string },
): Promise<boolean> {
  return db.transaction(async (tx) => {
    const [old] = await tx
      .select(storedColumns)
      .from(s.spaceMeasurements)
      .where(and(eq(s.spaceMeasurements.id, target.id), eq(s.spaceMeasurements.spaceId, target.spaceId)))
      .for("update");
    if (!old) return false;
    const before = asStored(old);
    const after: s.MeasurementRecord = {
      section: edit.section,
      hullNumber: edit.hullNumber,
      method: edit.method,
      measuredOn: edit.measuredOn,
      lengthMm: edit.box.length,
      widthMm: edit.box.width,
      heightMm: edit.box.height,
      photoId: edit.photoId === undefined ? before.record.photoId : edit.photoId,
    };
    await tx
      .update(s.spaceMeasurements)
      .set({
        section: after.section,
        hullNumber: after.hullNumber,
        method: edit.method,
        measuredOn: after.measuredOn,
        lengthMm: after.lengthMm,
        widthMm: after.widthMm,
        heightMm: after.heightMm,
        photoId: after.photoId,
        updatedAt: sql`now()`,
        updatedBy: by.userId,
      })
      .where(eq(s.spaceMeasurements.id, target.id));
    await tx.insert(s.measurementChanges).values({
      spaceId: target.spaceId,
      measurementId: target.id,
      kind: "edited",
      changedBy: by.userId,
      takenBy: before.userId,
      before: before.record,
      after,
      reason: by.reason ?? "",
    });
    await refreshSpaceConsensus(tx, target.spaceId);
    return true;
  });
}

/**
 * Removes a measurement (by its author or a moderator: the caller checks), keeps what it said in
 * the space's history, and updates the consensus, in one transaction. False when already gone.
 */
export async function deleteMeasurement(
  db: Db,
  target: { spaceId: number; id: number },
  by: { userId: number; reason?: string },
): Promise<boolean> {
  return db.transaction(async (tx) => {
    const [old] = await tx
      .delete(s.spaceMeasurements)
      .where(and(eq(s.spaceMeasurements.id, target.id), eq(s.spaceMeasurements.spaceId, target.spaceId)))
      .returning(storedColumns);
    if (!old) return false;
    const before = asStored(old);
    await tx.insert(s.measurementChanges).values({
      spaceId: target.spaceId,
      measurementId: target.id,
      kind: "deleted",
      changedBy: by.userId,
      takenBy: before.userId,
      before: before.record,
      after: null,
      reason: by.reason ?? "",
    });
    await refreshSpaceConsensus(tx, target.spaceId);
    return true;
  });
}

/** Hull numbers of the boats a member owns (to suggest on the measurement form). */
export async function hullsOfUser(db: DbOrTx, userId: number): Promise<number[]> {
  const rows = await db
    .select({ hull: s.boats.hullNumber })
    .from(s.boatOwners)
    .innerJoin(s.boats, eq(s.boats.id, s.boatOwners.boatId))
    .where(eq(s.boatOwners.userId, userId))
    .orderBy(asc(s.boats.hullNumber));
  return rows.map((r) => r.hull);
}

// ---------------------------------------------------------------------------------------------
// The fit search.

export type FitQuery = {
  item: Box;
  orientation: Orientation;
  clearanceMm: number;
  count: number;
  hull: number | null;
  limit: number;
};

export type FitHit = {
  spaceId: number;
  slug: string;
  name: string;
  zone: { slug: string; name: string };
  hulls: HullRange;
  verdict: Exclude<Verdict, "does-not-fit">;
  /** Whether the item passes the opening; null when no opening is recorded. */
  throughOpening: boolean | null;
  opening: Opening | null;
  /** The section that takes it, at the size the fit used. */
  section: { position: number; label: string; box: Box };
  row: RowPlacement;
  leftoverVolumeMm3: number;
};

/** Far beyond any space of a small boat: the open upper corner of the candidate region. */
const UNBOUNDED = 1e18;
/** `cube ~> n` reads the lower corner's k-th coordinate for n = 2k - 1 (PostgreSQL cube
 * documentation, "Cube Functions and Operators"): 7 is the fourth, the volume. */
const VOLUME_COORDINATE = 7;
/** The largest page of candidates read at once (pages double from the first). */
const MAX_PAGE = 4096;

type CandidateRow = {
  space_id: number;
  position: number;
  label: string;
  slug: string;
  name: string;
  zone_slug: string;
  zone_name: string;
  hull_from: number;
  hull_to: number;
  volume: number;
  length: number;
  width: number;
  height: number;
  opening_width_mm: number | null;
  opening_height_mm: number | null;
  opening_face: RecordedFace | null;
};

type Candidate = { spaceId: number; sections: CandidateRow[]; opening: Opening | undefined };

/**
 * Every space that takes the item (or `count` of them in a row), ranked as `rankSpaces` ranks
 * them (snuggest first; those whose opening must be enlarged after those that fit outright),
 * up to `limit`.
 *
 * PostgreSQL reads the candidate sections from the GiST index: the sections whose sorted
 * dimensions (and volume) lie beyond the item's (cube `<@`), smallest volume first (cube `~>`,
 * an ordered index scan that stops at the LIMIT). The domain code makes the exact call on each;
 * as the sections come smallest first, the first that takes the item settles its space.
 *  1. Sections of spaces whose opening lets the item through (or that record none), page by
 *     page, until `limit` spaces fit outright or none are left: a space not yet read cannot
 *     rank before those, as all its sections are larger.
 *  2. Only when fewer than `limit` fit outright: the other candidates, smallest first, for the
 *     spaces whose opening must be enlarged, until `limit` spaces in all or none are left.
 *
 * The planner cannot tell how many sections a cube query matches, and would otherwise read all
 * of them and sort. Each page is therefore one simple-protocol query that first turns bitmap
 * scans and sorts off for itself (`set_config(..., true)`, which lasts to the end of that
 * query's implicit transaction), so that PostgreSQL reads the index in order and stops at the
 * limit. One round trip a page; the query holds only numbers, each checked (`literal`). Given
 * a transaction instead of the app's db, the same settings last to the end of a savepoint.
 */
export async function findFittingSpaces(db: DbOrTx, q: FitQuery): Promise<FitHit[]> {
  const { index, corners } = candidateRegions(q.item, q.orientation, q.clearanceMm, q.count);
  const column = index === "upright" ? "ss.fit_upright" : "ss.fit_any";
  const volume = `${column} ~> ${VOLUME_COORDINATE}`;
  const o = openingBounds(q.item, q.orientation, q.clearanceMm);
  const pool = poolOf(db);

  /**
   * Candidate sections from a volume on, smallest first: one ordered index scan per region. The
   * SQL text depends only on the shape of the search (index, number of regions, which side of the
   * opening filter), so that on the pool it is a named prepared statement, planned once per
   * connection; every number is a parameter. In a transaction, the numbers are written into the
   * text instead (`literal`).
   */
  const read = async (through: boolean, from: number, strict: boolean, equal: number | null, limit: number | null) => {
    const values: unknown[] = [];
    const param = (value: number | boolean | null, type: "float8" | "int" | "bool") => {
      if (!pool) return value === null ? `null::${type}` : typeof value === "boolean" ? String(value) : type === "int" ? integer(value) : literal(value);
      values.push(value);
      return `$${values.length}::${type}`;
    };
    const fromP = param(from, "float8");
    const strictP = param(strict, "bool");
    const equalP = param(equal, "float8");
    const hullP = param(q.hull, "int");
    const small = param(o.small, "float8");
    const large = param(o.large, "float8");
    const up = o.up === null ? null : param(o.up, "float8");
    const limitP = param(limit, "int");
    const sorted = `least(sp.opening_width_mm, sp.opening_height_mm) >= ${small}
      and greatest(sp.opening_width_mm, sp.opening_height_mm) >= ${large}`;
    const passes = `(sp.opening_width_mm is null or sp.opening_height_mm is null or ${
      up === null
        ? sorted
        : `case when sp.opening_face = 'top' then ${sorted}
           else sp.opening_width_mm >= ${small} and sp.opening_height_mm >= ${up} end`
    })`;
    const scans = corners.map((corner) => `(
        select ss.space_id, ss.position, ss.label, sp.slug, sp.name, sp.zone_slug, z.name as zone_name,
               sp.hull_from, sp.hull_to, ${volume} as volume,
               coalesce(ss.consensus_length_mm, ss.length_mm) as length,
               coalesce(ss.consensus_width_mm, ss.width_mm) as width,
               coalesce(ss.consensus_height_mm, ss.height_mm) as height,
               sp.opening_width_mm, sp.opening_height_mm, sp.opening_face
          from space_sections ss
          join spaces sp on sp.id = ss.space_id
          join zones z on z.slug = sp.zone_slug
         where ${column} <@ cube(array[${corner.map((c) => param(c, "float8")).join(", ")}, ${fromP}],
                                  array[${UNBOUNDED}::float8, ${UNBOUNDED}::float8, ${UNBOUNDED}::float8, coalesce(${equalP}, ${UNBOUNDED}::float8)])
           and (not ${strictP} or ${volume} > ${fromP})
           and (${equalP} is null or ${volume} = ${equalP})
           and (${hullP} is null or ${hullP} between sp.hull_from and sp.hull_to)
           and ${through ? passes : `not ${passes}`}
         order by ${volume} limit ${limitP})`);
    const text = scans.length === 1 ? scans[0] : `select * from (${scans.join(" union all ")}) rows order by volume limit ${limitP}`;
    if (pool) {
      const name = `fit_${index}_${corners.length}_${through ? "through" : "not_through"}_${o.up === null ? "sorted" : "faces"}`;
      return (await fitPool(pool).query<CandidateRow>({ name, text, values })).rows;
    }
    // In a transaction: the planner settings last only to the savepoint's end.
    await db.execute(sql.raw("savepoint fit_search"));
    await db.execute(sql.raw(`select ${PLANNER_SETTINGS.map(([k, v]) => `set_config('${k}', '${v}', true)`).join(", ")}`));
    const result = await db.execute<CandidateRow>(sql.raw(text));
    await db.execute(sql.raw("rollback to savepoint fit_search"));
    return result.rows;
  };

  /** The candidates in order of volume (ties by space and section), a page at a time. */
  async function* pages(through: boolean): AsyncGenerator<CandidateRow[]> {
    let from = 0;
    let strict = false;
    let size = Math.max(32, Math.min(q.limit, MAX_PAGE) + 8);
    for (;;) {
      const rows = await read(through, from, strict, null, size);
      if (rows.length < size) {
        yield sortRows(rows);
        return;
      }
      // Paging relies on the order; never loop on a page that is not in it.
      if (rows.some((r, i) => i > 0 && r.volume < rows[i - 1].volume)) {
        throw new Error("fit search: the candidates did not come in order of volume");
      }
      // A page may end part way through sections of equal volume: leave those for the next page.
      const last = rows[rows.length - 1].volume;
      const below = rows.filter((r) => r.volume < last);
      if (below.length) {
        yield sortRows(below);
        [from, strict] = [last, false];
      } else {
        yield sortRows(await read(through, last, false, last, null));
        [from, strict] = [last, true];
      }
      size = Math.min(size * 2, MAX_PAGE);
    }
  }

  const seen = new Map<number, Candidate>();
  const settled = new Map<number, Candidate>();
  let outright = 0;
  const take = (rows: CandidateRow[]) => {
    for (const row of rows) {
      if (settled.has(row.space_id)) continue;
      const candidate = seen.get(row.space_id) ?? {
        spaceId: row.space_id,
        sections: [],
        opening: fitOpening(row.opening_width_mm, row.opening_height_mm, row.opening_face),
      };
      if (!candidate.sections.some((sec) => sec.position === row.position)) candidate.sections.push(row);
      seen.set(row.space_id, candidate);
      const [hit] = rank(q, [candidate]);
      if (!hit) continue;
      settled.set(row.space_id, candidate);
      if (hit.result.verdict === "fits") outright++;
    }
  };
  search: {
    for await (const rows of pages(true)) {
      take(rows);
      if (outright >= q.limit) break search;
    }
    for await (const rows of pages(false)) {
      take(rows);
      if (settled.size >= q.limit) break search;
    }
  }

  return rank(q, [...settled.values()]).slice(0, q.limit).map((r) => {
    const row = r.space.sections[r.section];
    return {
      spaceId: row.space_id,
      slug: row.slug,
      name: row.name,
      zone: { slug: row.zone_slug, name: row.zone_name },
      hulls: { from: row.hull_from, to: row.hull_to },
      verdict: r.result.verdict === "fits" ? "fits" : "opening-too-small",
      throughOpening: r.result.passesOpening,
      opening: r.space.opening ?? null,
      section: { position: row.position, label: row.label, box: { length: row.length, width: row.width, height: row.height } },
      row: r.row,
      leftoverVolumeMm3: r.leftoverVolumeMm3,
    };
  });
}

/** The domain's ranking of the candidates read so far. */
function rank(q: FitQuery, candidates: Candidate[]) {
  const spaces = candidates.map((cand) => ({
    ...cand,
    sections: cand.sections.map((r) => ({ length: r.length, width: r.width, height: r.height })),
    rows: cand.sections,
  }));
  return rankSpaces(q.item, spaces, { orientation: q.orientation, clearanceMm: q.clearanceMm, count: q.count })
    .map((r) => ({ ...r, space: { ...r.space, sections: r.space.rows } }));
}

function sortRows(rows: CandidateRow[]): CandidateRow[] {
  return rows.sort((x, y) => x.volume - y.volume || x.space_id - y.space_id || x.position - y.position);
}

/**
 * The planner settings of the fit search. The planner cannot estimate how many sections a cube
 * containment matches (it assumes a thousandth) and would read every candidate with a bitmap scan
 * and sort them; without bitmap scans and sorts it reads the GiST index in order of volume and
 * stops at the limit.
 */
const PLANNER_SETTINGS = [["enable_bitmapscan", "off"], ["enable_sort", "off"]] as const;

const fitPools = new WeakMap<pg.Pool, pg.Pool>();

/**
 * A small pool beside the app's, to the same database, whose connections start with the fit
 * search's planner settings (the `options` startup parameter), so that each page of the search is
 * one round trip of a prepared statement. Only the fit search uses it.
 */
function fitPool(pool: pg.Pool): pg.Pool {
  let fit = fitPools.get(pool);
  if (!fit) {
    const base = (pool as unknown as { options: pg.PoolConfig }).options;
    const settings = PLANNER_SETTINGS.map(([k, v]) => `-c ${k}=${v}`).join(" ");
    fit = new pg.Pool({ ...base, max: Math.min(base.max ?? 10, 4), options: [base.options, settings].filter(Boolean).join(" ") });
    fit.on("error", (err) => console.warn(`[db] fit search: idle client error: ${err.message}`));
    // A checked-out client that loses its connection emits 'error' too, and an 'error' event that
    // nobody listens to ends the process: the query's own promise still rejects and is answered.
    fit.on("connect", (client) => {
      client.on("error", (err) => console.warn(`[db] fit search: client error: ${err.message}`));
    });
    fitPools.set(pool, fit);
  }
  return fit;
}

/** Closes the fit search's pool beside the app's (before the database goes, in scripts and tests). */
export async function endFitSearchPool(db: DbOrTx): Promise<void> {
  const pool = poolOf(db);
  const fit = pool ? fitPools.get(pool) : undefined;
  if (!fit || !pool) return;
  fitPools.delete(pool);
  await fit.end();
}

/** The pg Pool under the app's db (drizzle keeps it as `$client`; `Db` does not name it), or
 * null for a transaction. */
function poolOf(db: DbOrTx): pg.Pool | null {
  const client = (db as unknown as { $client?: pg.Pool }).$client;
  return client && typeof client.query === "function" ? client : null;
}

/** A number for the fit search's SQL text: finite, written as PostgreSQL reads it. */
function literal(value: number): string {
  if (!Number.isFinite(value)) throw new RangeError(`fit search: not a finite number: ${value}`);
  return `${String(value)}::float8`;
}

function integer(value: number): string {
  if (!Number.isSafeInteger(value)) throw new RangeError(`fit search: not a whole number: ${value}`);
  return String(value);
}
