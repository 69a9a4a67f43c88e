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

function cardQuery(db: Db) {
  return db
    .select({
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
    })
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

/** One published write-up with everything its page shows. */
export async function getPublishedWriteup(db: Db, slug: string) {
  const [card] = await cardQuery(db).where(and(published, eq(s.writeups.slug, slug)));
  if (!card) return null;
  const [full] = await db
    .select({
      bodyMarkdown: s.writeups.bodyMarkdown,
      difficulty: s.writeups.difficulty,
      hoursSpent: s.writeups.hoursSpent,
      costUsd: s.writeups.costUsd,
      boatName: s.boats.name,
    })
    .from(s.writeups)
    .leftJoin(s.boats, eq(s.boats.id, s.writeups.boatId))
    .where(eq(s.writeups.id, card.id));
  const [withSystems] = await attachSystems(db, [card]);
  const zones = await db
    .select({ slug: s.zones.slug, name: s.zones.name })
    .from(s.writeupZones)
    .innerJoin(s.zones, eq(s.zones.slug, s.writeupZones.zoneSlug))
    .where(eq(s.writeupZones.writeupId, card.id))
    .orderBy(asc(s.zones.sortOrder));
  const parts = await db
    .select({ name: s.writeupParts.name, quantity: s.writeupParts.quantity, weightKg: s.writeupParts.weightKg, note: s.writeupParts.note })
    .from(s.writeupParts)
    .where(eq(s.writeupParts.writeupId, card.id))
    .orderBy(asc(s.writeupParts.position));
  const spaces = await db
    .select({ slug: s.spaces.slug, name: s.spaces.name, id: s.spaces.id })
    .from(s.writeupSpaces)
    .innerJoin(s.spaces, eq(s.spaces.id, s.writeupSpaces.spaceId))
    .where(eq(s.writeupSpaces.writeupId, card.id))
    .orderBy(asc(s.spaces.name));
  const sections = spaces.length
    ? await db
        .select({ spaceId: s.spaceSections.spaceId, label: s.spaceSections.label, lengthMm: s.spaceSections.lengthMm, widthMm: s.spaceSections.widthMm, heightMm: s.spaceSections.heightMm })
        .from(s.spaceSections)
        .where(inArray(s.spaceSections.spaceId, spaces.map((sp) => sp.id)))
        .orderBy(asc(s.spaceSections.position))
    : [];
  return {
    ...withSystems,
    ...full,
    zones,
    parts,
    spaces: spaces.map((sp) => ({ ...sp, sections: sections.filter((x) => x.spaceId === sp.id) })),
  };
}
