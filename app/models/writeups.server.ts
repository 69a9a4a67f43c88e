// Queries for write-ups. Every function takes the db (or a transaction) as its first argument.
import { and, asc, desc, eq, inArray, sql } from "drizzle-orm";
import type { Db } from "~/db/client.server";
import * as s from "~/db/schema";

export type WriteupCard = {
  id: number;
  slug: string;
  title: string;
  summary: string;
  publishedAt: Date | null;
  hullFrom: number;
  hullTo: number;
  authorName: string;
  authorCredit: string;
  hullNumber: number | null;
  systems: { slug: string; name: string }[];
};

const published = eq(s.writeups.status, "published");

async function attachSystems(db: Db, rows: Omit<WriteupCard, "systems">[]): Promise<WriteupCard[]> {
  if (!rows.length) return [];
  const tags = await db
    .select({ writeupId: s.writeupSystems.writeupId, slug: s.systems.slug, name: s.systems.name })
    .from(s.writeupSystems)
    .innerJoin(s.systems, eq(s.systems.slug, s.writeupSystems.systemSlug))
    .where(inArray(s.writeupSystems.writeupId, rows.map((r) => r.id)))
    .orderBy(asc(s.systems.sortOrder));
  return rows.map((r) => ({
    ...r,
    systems: tags.filter((t) => t.writeupId === r.id).map(({ slug, name }) => ({ slug, name })),
  }));
}

/** What a write-up's card shows (from writeups, its author in users, and its boat). */
const cardFields = {
  id: s.writeups.id,
  slug: s.writeups.slug,
  title: s.writeups.title,
  summary: s.writeups.summary,
  publishedAt: s.writeups.publishedAt,
  hullFrom: s.writeups.hullFrom,
  hullTo: s.writeups.hullTo,
  authorName: s.users.displayName,
  authorCredit: sql<string>`coalesce(${s.users.creditAs}, ${s.users.displayName})`,
  hullNumber: s.boats.hullNumber,
};

function cardQuery(db: Db) {
  return db
    .select(cardFields)
    .from(s.writeups)
    .innerJoin(s.users, eq(s.users.id, s.writeups.authorId))
    .leftJoin(s.boats, eq(s.boats.id, s.writeups.boatId))
    .$dynamic();
}

export async function listRecentPublished(db: Db, limit = 8): Promise<WriteupCard[]> {
  const rows = await cardQuery(db).where(published).orderBy(desc(s.writeups.publishedAt)).limit(limit);
  return attachSystems(db, rows);
}

export async function listPublishedBySystem(db: Db, systemSlug: string): Promise<WriteupCard[]> {
  const rows = await cardQuery(db)
    .where(and(published, sql`exists (select 1 from ${s.writeupSystems} ws where ws.writeup_id = ${s.writeups.id} and ws.system_slug = ${systemSlug})`))
    .orderBy(desc(s.writeups.publishedAt));
  return attachSystems(db, rows);
}

/** The class's systems with the number of published write-ups in each. */
export async function listSystemsWithCounts(db: Db) {
  return db
    .select({
      slug: s.systems.slug,
      name: s.systems.name,
      description: s.systems.description,
      count: sql<number>`count(${s.writeups.id})::int`,
    })
    .from(s.systems)
    .leftJoin(s.writeupSystems, eq(s.writeupSystems.systemSlug, s.systems.slug))
    .leftJoin(s.writeups, and(eq(s.writeups.id, s.writeupSystems.writeupId), published))
    .groupBy(s.systems.slug)
    .orderBy(asc(s.systems.sortOrder));
}

export async function getSystem(db: Db, slug: string) {
  const [row] = await db.select().from(s.systems).where(eq(s.systems.slug, slug));
  return row ?? null;
}

type PageSpace = {
  slug: string;
  name: string;
  id: number;
  sections: { spaceId: number; label: string; lengthMm: number; widthMm: number; heightMm: number }[];
};

/**
 * One published write-up with everything its page shows, in one statement (its systems, zones,
 * parts, and the spaces it used with their sections come as JSON): the page is read by every
 * visitor, and each round trip to the database costs the server more than the database's work.
 */
export async function getPublishedWriteup(db: Db, slug: string) {
  const id = sql.raw('"writeups"."id"');
  const [page] = await db
    .select({
      ...cardFields,
      bodyMarkdown: s.writeups.bodyMarkdown,
      difficulty: s.writeups.difficulty,
      hoursSpent: s.writeups.hoursSpent,
      costUsd: s.writeups.costUsd,
      boatName: s.boats.name,
      systems: sql<{ slug: string; name: string }[]>`coalesce((
        select json_agg(json_build_object('slug', sy.slug, 'name', sy.name) order by sy.sort_order, sy.slug)
          from writeup_systems ws join systems sy on sy.slug = ws.system_slug where ws.writeup_id = ${id}), '[]'::json)`,
      zones: sql<{ slug: string; name: string }[]>`coalesce((
        select json_agg(json_build_object('slug', z.slug, 'name', z.name) order by z.sort_order, z.slug)
          from writeup_zones wz join zones z on z.slug = wz.zone_slug where wz.writeup_id = ${id}), '[]'::json)`,
      parts: sql<{ name: string; quantity: number; weightKg: number | null; note: string | null }[]>`coalesce((
        select json_agg(json_build_object('name', p.name, 'quantity', p.quantity, 'weightKg', p.weight_kg, 'note', p.note) order by p.position)
          from writeup_parts p where p.writeup_id = ${id}), '[]'::json)`,
      spaces: sql<PageSpace[]>`coalesce((
        select json_agg(json_build_object(
                 'slug', sp.slug, 'name', sp.name, 'id', sp.id,
                 'sections', coalesce((
                   select json_agg(json_build_object('spaceId', ss.space_id, 'label', ss.label, 'lengthMm', ss.length_mm,
                                                     'widthMm', ss.width_mm, 'heightMm', ss.height_mm) order by ss.position)
                     from space_sections ss where ss.space_id = sp.id), '[]'::json)) order by sp.name)
          from writeup_spaces x join spaces sp on sp.id = x.space_id where x.writeup_id = ${id}), '[]'::json)`,
    })
    .from(s.writeups)
    .innerJoin(s.users, eq(s.users.id, s.writeups.authorId))
    .leftJoin(s.boats, eq(s.boats.id, s.writeups.boatId))
    .where(and(published, eq(s.writeups.slug, slug)));
  return page ?? null;
}
