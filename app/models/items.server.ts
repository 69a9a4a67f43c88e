// Queries and writes for the catalogue of items (BCI battery groups and members' items).
// Every function takes the db (or a transaction) first.
import { asc, eq, like, sql } from "drizzle-orm";
import * as s from "~/db/schema";
import { slugify } from "~/domain/items";
import type { Orientation } from "~/domain/fit";
import type { Box } from "~/domain/units";
import type { DbOrTx } from "./spaces.server";

export type ItemKind = (typeof s.itemKindEnum.enumValues)[number];

export type CatalogueItem = {
  id: number;
  slug: string;
  name: string;
  kind: ItemKind;
  box: Box;
  weightKg: number | null;
  orientation: Orientation;
  note: string;
  addedBy: string | null;
};

/** The catalogue: battery groups first (in the chart's order), then members' items by name. */
export async function listItems(db: DbOrTx): Promise<CatalogueItem[]> {
  const rows = await db
    .select({
      id: s.items.id,
      slug: s.items.slug,
      name: s.items.name,
      kind: s.items.kind,
      length: s.items.lengthMm,
      width: s.items.widthMm,
      height: s.items.heightMm,
      weightKg: s.items.weightKg,
      orientation: s.items.orientation,
      note: s.items.note,
      addedBy: sql<string | null>`coalesce(${s.users.creditAs}, ${s.users.displayName})`,
    })
    .from(s.items)
    .leftJoin(s.users, eq(s.users.id, s.items.addedBy))
    .orderBy(sql`case when ${s.items.kind} = 'battery-group' then 0 else 1 end`, sql`case when ${s.items.kind} = 'battery-group' then ${s.items.id} end`, asc(s.items.name));
  return rows.map(({ length, width, height, ...r }) => ({ ...r, box: { length, width, height } }));
}

export async function getItem(db: DbOrTx, slug: string): Promise<CatalogueItem | null> {
  return (await listItems(db)).find((i) => i.slug === slug) ?? null;
}

export type NewItem = {
  name: string;
  kind: ItemKind;
  box: Box;
  weightKg: number | null;
  orientation: Orientation;
  note: string;
  addedBy: number | null;
  slug?: string;
};

function values(item: NewItem, slug: string) {
  return {
    slug,
    name: item.name,
    kind: item.kind,
    lengthMm: item.box.length,
    widthMm: item.box.width,
    heightMm: item.box.height,
    weightKg: item.weightKg,
    orientation: item.orientation,
    note: item.note,
    addedBy: item.addedBy,
  };
}

/** Adds a member's item under a slug made from its name (numbered when the name is taken). */
export async function addItem(db: DbOrTx, item: NewItem): Promise<{ id: number; slug: string }> {
  const base = item.slug ?? slugify(item.name);
  const taken = new Set(
    (await db.select({ slug: s.items.slug }).from(s.items).where(like(s.items.slug, `${base}%`))).map((r) => r.slug),
  );
  let slug = base;
  for (let n = 2; taken.has(slug); n++) slug = `${base}-${n}`;
  const [row] = await db.insert(s.items).values(values(item, slug)).returning({ id: s.items.id, slug: s.items.slug });
  return row;
}

/** Inserts or updates an item by its slug (the seeder's catalogue). */
export async function upsertItem(db: DbOrTx, item: NewItem & { slug: string }): Promise<number> {
  const v = values(item, item.slug);
  const [row] = await db
    .insert(s.items)
    .values(v)
    .onConflictDoUpdate({ target: s.items.slug, set: { ...v, slug: undefined } })
    .returning({ id: s.items.id });
  return row.id;
}
