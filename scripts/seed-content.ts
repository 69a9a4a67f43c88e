// Loads the invented demo class from content-seed/ into the database. Idempotent: rows are
// matched by their natural keys (e-mail, hull number, slug) and updated in place.
import fs from "node:fs";
import path from "node:path";
import { eq, sql } from "drizzle-orm";
import YAML from "yaml";
import { z } from "zod";
import type { Db } from "../app/db/client.server";
import * as s from "../app/db/schema";
import { parseAppliesTo, type HullRange } from "../app/domain/hulls";
import { batteryGroupItems } from "../app/domain/items";
import { upsertItem } from "../app/models/items.server";
import { refreshSpaceConsensus } from "../app/models/spaces.server";
import { renderMarkdown } from "../app/domain/markdown";
import { hashPassword } from "../app/services/password.server";
import { seedLedger } from "./seed-ledger";

/** Every demo member signs in with this password (demo content only; see README). */
export const DEMO_PASSWORD = "brantwater-demo";

const MM_PER_IN = 25.4; // exact by definition (NIST SP 811)
const KG_PER_LB = 0.45359237; // exact by definition (NIST SP 811)

const hullRange = z.union([z.string(), z.number()]).transform((v, ctx): HullRange => {
  const r = parseAppliesTo(v);
  if ("error" in r) {
    ctx.addIssue({ code: "custom", message: r.error });
    return z.NEVER;
  }
  return r;
});
const isoDate = z.union([z.string(), z.date()]).transform((v) => new Date(v));

const taxonomySchema = z.object({
  systems: z.array(z.object({ slug: z.string(), name: z.string(), description: z.string().default("") })),
  zones: z.array(z.object({ slug: z.string(), name: z.string() })),
});

const memberSchema = z.object({
  email: z.string().email(),
  displayName: z.string().min(1),
  credit: z.string().optional(),
  units: z.enum(["in", "mm"]).default("in"),
  roles: z.array(z.enum(["member", "moderator", "secretary", "admin"])).default(["member"]),
  digest: z.boolean().default(true),
  // When the account was opened (the yearly digest counts the year's new members by it).
  joined: isoDate.optional(),
  boats: z.array(z.object({ hull: z.number().int().min(1).max(612), name: z.string().optional() })).default([]),
});

const writeupSchema = z.object({
  title: z.string().min(1),
  summary: z.string().default(""),
  author: z.string().email(),
  hull: z.number().int().min(1).max(612).optional(),
  systems: z.array(z.string()).min(1),
  zones: z.array(z.string()).default([]),
  appliesTo: hullRange.default({ from: 1, to: 612 }),
  status: z.enum(["draft", "awaiting-review", "needs-changes", "published", "declined", "withdrawn"]),
  publishedAt: isoDate.optional(),
  difficulty: z.enum(["easy", "moderate", "hard"]).optional(),
  hours: z.number().nonnegative().optional(),
  costUsd: z.number().nonnegative().optional(),
  parts: z
    .array(z.object({ name: z.string(), qty: z.number().default(1), weightLb: z.number().optional(), note: z.string().default("") }))
    .default([]),
  spaces: z.array(z.string()).default([]),
  // Hulls of other members who did the same job on their boat ("done on my boat too").
  doneToo: z.array(z.number().int().min(1).max(612)).default([]),
});

const inches = z.number().positive();
const spaceSchema = z.object({
  slug: z.string(),
  name: z.string(),
  zone: z.string(),
  appliesTo: hullRange.default({ from: 1, to: 612 }),
  position: z.object({
    aftOfBowIn: z.number().min(0),
    offCentreIn: z.number().min(0).default(0),
    side: z.enum(["port", "starboard", "centre"]).default("centre"),
    heightIn: z.number().optional(),
  }),
  sections: z.array(z.object({ label: z.string(), lengthIn: inches, widthIn: inches, heightIn: inches })).min(1),
  opening: z.object({ widthIn: inches, heightIn: inches, face: z.enum(["top", "front", "side", "end"]) }).optional(),
  obstructions: z.string().default(""),
  measurements: z
    .array(z.object({
      by: z.string().email(),
      hull: z.number().int().min(1).max(612),
      method: z.enum(["tape", "story-stick", "template", "laser"]),
      date: isoDate,
      lengthIn: inches, widthIn: inches, heightIn: inches,
    }))
    .default([]),
});

const itemSchema = z.object({
  slug: z.string().regex(/^[a-z0-9-]+$/),
  name: z.string().min(1),
  by: z.string().email(),
  lengthIn: inches, widthIn: inches, heightIn: inches,
  weightLb: z.number().positive().optional(),
  orientation: z.enum(["any", "upright"]),
  note: z.string().default(""),
});

function readYaml(file: string): unknown {
  return YAML.parse(fs.readFileSync(file, "utf8"));
}

function parseOrExplain<T>(schema: z.ZodType<T>, value: unknown, where: string): T {
  const r = schema.safeParse(value);
  if (!r.success) {
    const lines = r.error.issues.map((i) => `  ${i.path.join(".")}: ${i.message}`).join("\n");
    throw new Error(`content-seed: ${where} is not valid:\n${lines}`);
  }
  return r.data;
}

export function splitFrontMatter(source: string): { data: unknown; body: string } {
  const m = /^---\r?\n([\s\S]*?)\r?\n---\r?\n?([\s\S]*)$/.exec(source);
  if (!m) throw new Error("missing front matter (--- ... ---)");
  return { data: YAML.parse(m[1]), body: m[2] };
}

export type SeedCounts = { members: number; boats: number; writeups: number; spaces: number; measurements: number; items: number };

export async function seedDemo(db: Db, dir: string): Promise<SeedCounts> {
  const taxonomy = parseOrExplain(taxonomySchema, readYaml(path.join(dir, "taxonomy.yaml")), "taxonomy.yaml");
  const members = parseOrExplain(z.array(memberSchema), readYaml(path.join(dir, "members.yaml")), "members.yaml");
  const spaceList = parseOrExplain(z.array(spaceSchema), readYaml(path.join(dir, "spaces.yaml")), "spaces.yaml");
  const itemList = parseOrExplain(z.array(itemSchema), readYaml(path.join(dir, "items.yaml")), "items.yaml");
  const writeupDir = path.join(dir, "writeups");
  const writeupFiles = fs.readdirSync(writeupDir).filter((f) => f.endsWith(".md")).sort();

  const demoHash = await hashPassword(DEMO_PASSWORD);
  return db.transaction(async (tx) => {
    for (const [i, sys] of taxonomy.systems.entries()) {
      await tx.insert(s.systems).values({ ...sys, sortOrder: i })
        .onConflictDoUpdate({ target: s.systems.slug, set: { name: sys.name, description: sys.description, sortOrder: i } });
    }
    for (const [i, zone] of taxonomy.zones.entries()) {
      await tx.insert(s.zones).values({ ...zone, sortOrder: i })
        .onConflictDoUpdate({ target: s.zones.slug, set: { name: zone.name, sortOrder: i } });
    }

    const userIds = new Map<string, number>();
    const boatIds = new Map<number, number>();
    const hullOwners = new Map<number, number>();
    for (const m of members) {
      const email = m.email.toLowerCase();
      const values = { email, displayName: m.displayName, creditAs: m.credit ?? null, units: m.units, digestOptIn: m.digest, emailVerifiedAt: new Date("2024-01-01T00:00:00Z"), passwordHash: demoHash, ...(m.joined ? { createdAt: m.joined } : {}) };
      const [row] = await tx.insert(s.users).values(values)
        .onConflictDoUpdate({ target: s.users.email, set: { displayName: values.displayName, creditAs: values.creditAs, units: values.units, digestOptIn: values.digestOptIn, ...(m.joined ? { createdAt: m.joined } : {}) } })
        .returning({ id: s.users.id });
      userIds.set(email, row.id);
      for (const role of new Set(["member", ...m.roles] as const)) {
        await tx.insert(s.userRoles).values({ userId: row.id, role }).onConflictDoNothing();
      }
      for (const b of m.boats) {
        const [boat] = await tx.insert(s.boats).values({ hullNumber: b.hull, name: b.name ?? null })
          .onConflictDoUpdate({ target: s.boats.hullNumber, set: { name: b.name ?? null } })
          .returning({ id: s.boats.id });
        boatIds.set(b.hull, boat.id);
        if (!hullOwners.has(b.hull)) hullOwners.set(b.hull, row.id);
        await tx.insert(s.boatOwners).values({ boatId: boat.id, userId: row.id }).onConflictDoNothing();
      }
    }
    const userId = (email: string, where: string) => {
      const id = userIds.get(email.toLowerCase());
      if (!id) throw new Error(`content-seed: ${where} names ${email}, who is not in members.yaml`);
      return id;
    };

    const spaceIds = new Map<string, number>();
    let measurementCount = 0;
    for (const sp of spaceList) {
      const sign = sp.position.side === "port" ? -1 : sp.position.side === "starboard" ? 1 : 0;
      const values = {
        slug: sp.slug, name: sp.name, zoneSlug: sp.zone, hullFrom: sp.appliesTo.from, hullTo: sp.appliesTo.to,
        aftOfBowMm: sp.position.aftOfBowIn * MM_PER_IN,
        offCentreMm: sign * sp.position.offCentreIn * MM_PER_IN,
        heightMm: sp.position.heightIn === undefined ? null : sp.position.heightIn * MM_PER_IN,
        openingWidthMm: sp.opening ? sp.opening.widthIn * MM_PER_IN : null,
        openingHeightMm: sp.opening ? sp.opening.heightIn * MM_PER_IN : null,
        openingFace: sp.opening?.face ?? null,
        obstructions: sp.obstructions,
      };
      const [row] = await tx.insert(s.spaces).values(values)
        .onConflictDoUpdate({ target: s.spaces.slug, set: values }).returning({ id: s.spaces.id });
      spaceIds.set(sp.slug, row.id);
      // Sections and measurements belong to the seed file: replace them wholesale.
      await tx.delete(s.spaceSections).where(eq(s.spaceSections.spaceId, row.id));
      await tx.insert(s.spaceSections).values(sp.sections.map((sec, i) => ({
        spaceId: row.id, position: i, label: sec.label,
        lengthMm: sec.lengthIn * MM_PER_IN, widthMm: sec.widthIn * MM_PER_IN, heightMm: sec.heightIn * MM_PER_IN,
      })));
      await tx.delete(s.spaceMeasurements).where(eq(s.spaceMeasurements.spaceId, row.id));
      if (sp.measurements.length) {
        await tx.insert(s.spaceMeasurements).values(sp.measurements.map((m) => ({
          spaceId: row.id, userId: userId(m.by, `spaces.yaml (${sp.slug})`), hullNumber: m.hull,
          method: m.method.replace("-", "_") as "tape" | "story_stick" | "template" | "laser",
          measuredOn: m.date.toISOString().slice(0, 10),
          lengthMm: m.lengthIn * MM_PER_IN, widthMm: m.widthIn * MM_PER_IN, heightMm: m.heightIn * MM_PER_IN,
        })));
        measurementCount += sp.measurements.length;
      }
      // The fit uses the consensus of the measurements of the main section.
      await refreshSpaceConsensus(tx, row.id);
    }

    // The catalogue: the BCI battery groups, then the members' items.
    for (const g of batteryGroupItems()) {
      await upsertItem(tx, { ...g, weightKg: null, addedBy: null });
    }
    for (const it of itemList) {
      await upsertItem(tx, {
        slug: it.slug, name: it.name, kind: "member-item",
        box: { length: it.lengthIn * MM_PER_IN, width: it.widthIn * MM_PER_IN, height: it.heightIn * MM_PER_IN },
        weightKg: it.weightLb === undefined ? null : it.weightLb * KG_PER_LB,
        orientation: it.orientation, note: it.note, addedBy: userId(it.by, `items.yaml (${it.slug})`),
      });
    }

    for (const file of writeupFiles) {
      const slug = file.replace(/\.md$/, "");
      const { data, body } = splitFrontMatter(fs.readFileSync(path.join(writeupDir, file), "utf8"));
      const w = parseOrExplain(writeupSchema, data, `writeups/${file}`);
      const rendered = renderMarkdown(body);
      const status = w.status.replace("-", "_") as (typeof s.writeupStatusEnum.enumValues)[number];
      const values = {
        slug, title: w.title, summary: w.summary, bodyMarkdown: body, bodyText: rendered.text, status,
        authorId: userId(w.author, `writeups/${file}`),
        boatId: w.hull ? (boatIds.get(w.hull) ?? null) : null,
        hullFrom: w.appliesTo.from, hullTo: w.appliesTo.to,
        difficulty: w.difficulty ?? null, hoursSpent: w.hours ?? null, costUsd: w.costUsd ?? null,
        publishedAt: status === "published" ? (w.publishedAt ?? new Date()) : null,
        createdAt: w.publishedAt ?? new Date(),
        updatedAt: w.publishedAt ?? new Date(),
      };
      const [row] = await tx.insert(s.writeups).values(values)
        .onConflictDoUpdate({ target: s.writeups.slug, set: values }).returning({ id: s.writeups.id });
      await tx.delete(s.writeupSystems).where(eq(s.writeupSystems.writeupId, row.id));
      await tx.insert(s.writeupSystems).values(w.systems.map((systemSlug) => ({ writeupId: row.id, systemSlug })));
      await tx.delete(s.writeupZones).where(eq(s.writeupZones.writeupId, row.id));
      if (w.zones.length) await tx.insert(s.writeupZones).values(w.zones.map((zoneSlug) => ({ writeupId: row.id, zoneSlug })));
      await tx.delete(s.writeupParts).where(eq(s.writeupParts.writeupId, row.id));
      if (w.parts.length) {
        await tx.insert(s.writeupParts).values(w.parts.map((p, i) => ({
          writeupId: row.id, position: i, name: p.name, quantity: p.qty,
          weightKg: p.weightLb === undefined ? null : p.weightLb * KG_PER_LB, note: p.note,
        })));
      }
      // The seeded text is revision 1 of each write-up.
      const revision = {
        writeupId: row.id, number: 1, status, authorId: values.authorId, title: w.title, summary: w.summary,
        bodyMarkdown: body, systems: w.systems, zones: w.zones, hullFrom: w.appliesTo.from, hullTo: w.appliesTo.to,
        boatId: values.boatId, difficulty: values.difficulty, hoursSpent: values.hoursSpent, costUsd: values.costUsd,
        parts: w.parts.map((p) => ({ name: p.name, quantity: p.qty, weightKg: p.weightLb === undefined ? null : p.weightLb * KG_PER_LB, note: p.note })),
        createdAt: values.createdAt, updatedAt: values.updatedAt,
        submittedAt: status === "draft" ? null : values.createdAt,
        decidedAt: status === "published" ? values.publishedAt : null,
      };
      await tx.insert(s.writeupRevisions).values(revision)
        .onConflictDoUpdate({ target: [s.writeupRevisions.writeupId, s.writeupRevisions.number], set: revision });
      await tx.delete(s.writeupSpaces).where(eq(s.writeupSpaces.writeupId, row.id));
      for (const spaceSlug of w.spaces) {
        const spaceId = spaceIds.get(spaceSlug);
        if (!spaceId) throw new Error(`content-seed: writeups/${file} uses space ${spaceSlug}, which is not in spaces.yaml`);
        await tx.insert(s.writeupSpaces).values({ writeupId: row.id, spaceId });
      }
      await tx.delete(s.doneToo).where(eq(s.doneToo.writeupId, row.id));
      for (const hull of w.doneToo) {
        const owner = hullOwners.get(hull);
        if (!owner) throw new Error(`content-seed: writeups/${file} says hull ${hull} did it too, but no member in members.yaml has that hull`);
        await tx.insert(s.doneToo).values({ writeupId: row.id, hullNumber: hull, userId: owner, createdAt: values.createdAt });
      }
    }

    // Heel and trim: class particulars, standard items, demo ledgers, write-up calculations.
    await seedLedger(tx, dir);

    return {
      members: members.length, boats: boatIds.size, writeups: writeupFiles.length,
      spaces: spaceList.length, measurements: measurementCount, items: batteryGroupItems().length + itemList.length,
    };
  });
}

export async function databaseIsEmpty(db: Db): Promise<boolean> {
  const [row] = await db.select({ n: sql<number>`count(*)::int` }).from(s.users);
  return row.n === 0;
}

