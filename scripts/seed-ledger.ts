// Loads content-seed/ledger.yaml: the class particulars, the items offered to owners, the demo
// ledgers of a few boats (only into an empty ledger, so members' changes survive a re-seed) and
// the calculations attached to write-ups (replaced wholesale, like the write-ups themselves).
import fs from "node:fs";
import path from "node:path";
import { and, eq, inArray, sql } from "drizzle-orm";
import YAML from "yaml";
import { z } from "zod";
import type { Db } from "../app/db/client.server";
import * as s from "../app/db/schema";
import { readCalculation, type Calculation } from "../app/domain/calculations";
import type { ClassFigures } from "../app/domain/ledger";

const MM_PER_IN = 25.4; // exact by definition (NIST SP 811)
const MM_PER_FT = 304.8; // exact by definition (NIST SP 811)
const KG_PER_LB = 0.45359237; // exact by definition (NIST SP 811)

type Tx = Parameters<Parameters<Db["transaction"]>[0]>[0];

const position = z.object({
  aftOfBowIn: z.number().min(0),
  offCentreIn: z.number().min(0).default(0),
  side: z.enum(["port", "starboard", "centre"]).default("centre"),
  heightIn: z.number().optional(),
});

const ledgerSchema = z.object({
  particulars: z.object({
    demo: z.boolean().default(false),
    lightDisplacementLb: z.number().positive(),
    gmFt: z.number().positive(),
    loaIn: z.number().positive(),
    lwlIn: z.number().positive(),
    beamIn: z.number().positive(),
    lcfAftOfBowIn: z.number().min(0),
    waterlineForwardEndIn: z.number().min(0).default(0),
    gmLongitudinalFt: z.number().positive().optional(),
    mct1FtLbPerIn: z.number().positive().optional(),
  }),
  standardItems: z.array(z.object({
    slug: z.string().regex(/^[a-z0-9-]+$/),
    name: z.string().min(1),
    weightLb: z.number().positive(),
    position,
    note: z.string().default(""),
  })),
  boats: z.array(z.object({
    hull: z.number().int().min(1).max(612),
    items: z.array(z.object({
      standard: z.string().optional(),
      name: z.string().optional(),
      weightLb: z.number().positive().optional(),
      space: z.string().optional(),
      position: position.optional(),
    })),
  })).default([]),
  calculations: z.array(z.discriminatedUnion("kind", [
    z.object({
      writeup: z.string(),
      kind: z.literal("weight-move"),
      title: z.string().default(""),
      hull: z.number().int().optional(),
      items: z.array(z.object({ id: z.string(), name: z.string(), weightLb: z.number().positive(), position })).min(1),
      moved: z.string(),
      to: position,
    }),
    z.object({
      writeup: z.string(),
      kind: z.literal("cable-run"),
      title: z.string().default(""),
      label: z.string().default(""),
      currentA: z.number().positive(),
      oneWayFt: z.number().positive(),
      voltage: z.union([z.literal(12), z.literal(24)]),
      dropPct: z.union([z.literal(3), z.literal(10)]),
      insulationC: z.number(),
      engineSpace: z.boolean().default(false),
    }),
  ])).default([]),
});

function offCentreMm(p: z.infer<typeof position>): number {
  const sign = p.side === "port" ? -1 : p.side === "starboard" ? 1 : 0;
  return sign * p.offCentreIn * MM_PER_IN;
}

function positionMm(p: z.infer<typeof position>) {
  return { aftOfBowMm: p.aftOfBowIn * MM_PER_IN, offCentreMm: offCentreMm(p), heightMm: p.heightIn === undefined ? null : p.heightIn * MM_PER_IN };
}

export async function seedLedger(tx: Tx, dir: string): Promise<{ standardItems: number; ledgerItems: number; calculations: number }> {
  const file = path.join(dir, "ledger.yaml");
  const parsed = ledgerSchema.safeParse(YAML.parse(fs.readFileSync(file, "utf8")));
  if (!parsed.success) {
    const lines = parsed.error.issues.map((i) => `  ${i.path.join(".")}: ${i.message}`).join("\n");
    throw new Error(`content-seed: ledger.yaml is not valid:\n${lines}`);
  }
  const y = parsed.data;
  const p = y.particulars;
  const particulars: ClassFigures = {
    lightDisplacementKg: p.lightDisplacementLb * KG_PER_LB,
    gmMm: p.gmFt * MM_PER_FT,
    loaMm: p.loaIn * MM_PER_IN,
    lwlMm: p.lwlIn * MM_PER_IN,
    beamMm: p.beamIn * MM_PER_IN,
    lcfAftOfBowMm: p.lcfAftOfBowIn * MM_PER_IN,
    waterlineForwardEndMm: p.waterlineForwardEndIn * MM_PER_IN,
    gmLongitudinalMm: p.gmLongitudinalFt === undefined ? null : p.gmLongitudinalFt * MM_PER_FT,
    mct1FtLbPerIn: p.mct1FtLbPerIn ?? null,
    demo: p.demo,
  };
  const values = { id: 1, ...particulars, updatedBy: null, updatedAt: new Date() };
  await tx.insert(s.classParticulars).values(values).onConflictDoUpdate({ target: s.classParticulars.id, set: values });

  const standard = new Map(y.standardItems.map((i) => [i.slug, i]));
  for (const [i, item] of y.standardItems.entries()) {
    const row = { slug: item.slug, name: item.name, weightKg: item.weightLb * KG_PER_LB, ...positionMm(item.position), note: item.note, sortOrder: i };
    await tx.insert(s.ledgerStandardItems).values(row).onConflictDoUpdate({ target: s.ledgerStandardItems.slug, set: row });
  }

  const slugs = [...new Set(y.boats.flatMap((b) => b.items.flatMap((i) => (i.space ? [i.space] : []))))];
  const spaceRows = slugs.length ? await tx.select({ id: s.spaces.id, slug: s.spaces.slug }).from(s.spaces).where(inArray(s.spaces.slug, slugs)) : [];
  const spaceId = (slug: string) => {
    const row = spaceRows.find((r) => r.slug === slug);
    if (!row) throw new Error(`content-seed: ledger.yaml places an item in space ${slug}, which is not in spaces.yaml`);
    return row.id;
  };

  let ledgerItems = 0;
  for (const b of y.boats) {
    const [boat] = await tx.select({ id: s.boats.id }).from(s.boats).where(eq(s.boats.hullNumber, b.hull));
    if (!boat) throw new Error(`content-seed: ledger.yaml has a ledger for hull ${b.hull}, which no member in members.yaml owns`);
    const [{ n }] = await tx.select({ n: sql<number>`count(*)::int` }).from(s.boatLedgerItems).where(eq(s.boatLedgerItems.boatId, boat.id));
    if (n > 0) continue;
    for (const it of b.items) {
      const std = it.standard ? standard.get(it.standard) : undefined;
      if (it.standard && !std) throw new Error(`content-seed: ledger.yaml (hull ${b.hull}) names standard item ${it.standard}, which is not listed`);
      const pos = it.position ?? std?.position;
      const name = it.name ?? std?.name;
      const weightLb = it.weightLb ?? std?.weightLb;
      if (!pos || !name || !weightLb) throw new Error(`content-seed: ledger.yaml (hull ${b.hull}) has an item without a name, weight or position`);
      await tx.insert(s.boatLedgerItems).values({
        boatId: boat.id,
        name,
        weightKg: weightLb * KG_PER_LB,
        ...positionMm(pos),
        spaceId: it.space ? spaceId(it.space) : null,
        standardItemSlug: std?.slug ?? null,
      });
      ledgerItems++;
    }
  }

  const writeupSlugs = [...new Set(y.calculations.map((c) => c.writeup))];
  const writeupRows = writeupSlugs.length
    ? await tx.select({
      id: s.writeups.id, slug: s.writeups.slug,
      // The seeded numbers belong to the revision readers see: the last published one, else the latest.
      revisionId: sql<number>`(select r.id from writeup_revisions r where r.writeup_id = "writeups"."id" order by (r.status = 'published') desc, r.number desc limit 1)`,
    }).from(s.writeups).where(inArray(s.writeups.slug, writeupSlugs))
    : [];
  if (writeupRows.length) {
    await tx.delete(s.writeupCalculations).where(and(inArray(s.writeupCalculations.writeupId, writeupRows.map((w) => w.id))));
  }
  for (const [i, c] of y.calculations.entries()) {
    const writeup = writeupRows.find((w) => w.slug === c.writeup);
    if (!writeup) throw new Error(`content-seed: ledger.yaml attaches a calculation to ${c.writeup}, which is not in writeups/`);
    let raw: unknown;
    if (c.kind === "weight-move") {
      const [boat] = c.hull === undefined ? [] : await tx.select({ name: s.boats.name }).from(s.boats).where(eq(s.boats.hullNumber, c.hull));
      raw = {
        boat: c.hull === undefined ? null : { hullNumber: c.hull, name: boat?.name ?? null },
        particulars,
        gmMm: particulars.gmMm,
        gmSource: "class",
        items: c.items.map((it) => ({ id: it.id, name: it.name, weightKg: it.weightLb * KG_PER_LB, ...positionMm(it.position) })),
        moved: c.moved,
        to: positionMm(c.to),
      };
    } else {
      raw = {
        currentA: c.currentA,
        oneWayLengthMm: c.oneWayFt * MM_PER_FT,
        systemVoltage: c.voltage,
        allowedDropPct: c.dropPct,
        insulationRatingC: c.insulationC,
        inEngineSpace: c.engineSpace,
        label: c.label,
      };
    }
    const calc: Calculation | null = readCalculation(c.kind, raw);
    if (!calc) throw new Error(`content-seed: ledger.yaml calculation ${i + 1} (${c.kind} on ${c.writeup}) does not read`);
    if (!writeup.revisionId) throw new Error(`content-seed: ${c.writeup} has no revision to attach its numbers to`);
    await tx.insert(s.writeupCalculations).values({ writeupId: writeup.id, revisionId: writeup.revisionId, kind: calc.kind, input: calc.input, title: c.title, position: i });
  }

  return { standardItems: y.standardItems.length, ledgerItems, calculations: y.calculations.length };
}
