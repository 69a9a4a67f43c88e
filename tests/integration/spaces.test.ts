import { sql } from "drizzle-orm";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import * as s from "~/db/schema";
import { rankSpaces, type Box, type Orientation } from "~/domain/fit";
import { addMeasurement, asFitSpace, endFitSearchPool, findFittingSpaces, getSpace, listSpaces, type FitQuery, type SpaceSummary } from "~/models/spaces.server";
import { createTestDatabase } from "../support/db";
import { mainForFit, medianOf, readSeedSpaces } from "../support/seed-spaces";

// 1 in = 25.4 mm exactly (NIST Handbook 44, Appendix C).
const IN = 25.4;

let t: Awaited<ReturnType<typeof createTestDatabase>>;
beforeAll(async () => {
  t = await createTestDatabase("template_seeded");
});
afterAll(async () => {
  if (t) await endFitSearchPool(t.db);
  await t?.drop();
});

/** Deterministic pseudo-random numbers (mulberry32), so a failing case can be replayed. */
function random(seed: number): () => number {
  return () => {
    seed = (seed + 0x6d2b79f5) | 0;
    let x = Math.imul(seed ^ (seed >>> 15), 1 | seed);
    x = (x + Math.imul(x ^ (x >>> 7), 61 | x)) ^ x;
    return ((x ^ (x >>> 14)) >>> 0) / 4294967296;
  };
}

describe("consensus on the seeded spaces", () => {
  it("the fit uses the median of each dimension of the main section's measurements (computed here from spaces.yaml)", async () => {
    const rows = await t.db.execute<{ slug: string; length: number | null; width: number | null; height: number | null }>(sql`
      select sp.slug, ss.consensus_length_mm as length, ss.consensus_width_mm as width, ss.consensus_height_mm as height
        from space_sections ss join spaces sp on sp.id = ss.space_id where ss.position = 0`);
    const bySlug = new Map(rows.rows.map((r) => [r.slug, r]));
    const seed = readSeedSpaces();
    expect(bySlug.size).toBe(seed.length);
    let measured = 0;
    for (const space of seed) {
      const row = bySlug.get(space.slug)!;
      if (!space.measurements?.length) {
        expect(row.length).toBeNull();
        continue;
      }
      measured++;
      const main = mainForFit(space);
      expect(row.length! / IN).toBeCloseTo(main.lengthIn, 9);
      expect(row.width! / IN).toBeCloseTo(main.widthIn, 9);
      expect(row.height! / IN).toBeCloseTo(main.heightIn, 9);
    }
    expect(measured).toBeGreaterThan(20);
  });

  it("spreads are largest minus smallest, per dimension", async () => {
    const spaces = await listSpaces(t.db);
    for (const space of readSeedSpaces()) {
      const got = spaces.find((x) => x.slug === space.slug)!;
      const ms = space.measurements ?? [];
      expect(got.measurementCount).toBe(ms.length);
      if (!ms.length) continue;
      for (const [axis, key] of [["length", "lengthIn"], ["width", "widthIn"], ["height", "heightIn"]] as const) {
        const values = ms.map((m) => m[key]);
        expect(got.consensus![axis].spread / IN).toBeCloseTo(Math.max(...values) - Math.min(...values), 9);
        expect(got.consensus![axis].consensus / IN).toBeCloseTo(medianOf(values), 9);
      }
    }
  });

  it("flags the one height far from the others under the port settee (by hand)", async () => {
    // Heights 11.75, 11.75, 12.75, 11.732 in. Median 11.75. Deviations 0, 0, 1, 0.018: MAD 0.009 in.
    // Limit max(3 x 1.4826 x 0.009 in, 1/4 in) = 1/4 in; 12.75 is 1 in away: flagged; nothing else.
    const space = (await getSpace(t.db, "port-settee-fwd"))!;
    const c = space.consensus!;
    expect(c.height.outliers.map((i) => space.measurements[i].box.height / IN)).toEqual([12.75]);
    expect(c.height.outlierLimit).toBeCloseTo(6.35, 9);
    expect(c.length.outliers).toEqual([]);
    expect(c.width.outliers).toEqual([]);
    expect(c.height.consensus / IN).toBeCloseTo(11.75, 9);
  });

  it("a new measurement moves the consensus and the fit search sees it", async () => {
    const before = (await getSpace(t.db, "lazarette"))!;
    const lengthsIn = before.measurements.map((m) => m.box.length / IN);
    const userId = before.measurements[0].userId;
    // A much longer length: with n measurements + 1, the median is recomputed here.
    await addMeasurement(t.db, {
      spaceId: before.id, userId, hullNumber: 402, method: "laser", measuredOn: "2026-01-10",
      box: { length: 80 * IN, width: before.measurements[0].box.width, height: before.measurements[0].box.height },
    });
    const after = (await getSpace(t.db, "lazarette"))!;
    expect(after.measurements).toHaveLength(before.measurements.length + 1);
    expect(after.sections[0].fit.length / IN).toBeCloseTo(medianOf([...lengthsIn, 80]), 9);
    expect(after.consensus!.length.consensus).toBeCloseTo(after.sections[0].fit.length, 9);
  });

  it("filters the register by hull number and by variant", async () => {
    const seed = readSeedSpaces();
    const mk1Only = seed.filter((x) => x.appliesTo === "mk1").map((x) => x.slug);
    const mk2Only = seed.filter((x) => x.appliesTo === "mk2").map((x) => x.slug);
    expect(mk1Only.length).toBeGreaterThan(0);
    expect(mk2Only.length).toBeGreaterThan(0);
    const onHull402 = (await listSpaces(t.db, { hull: 402 })).map((x) => x.slug);
    for (const slug of mk1Only) expect(onHull402).not.toContain(slug);
    for (const slug of mk2Only) expect(onHull402).toContain(slug);
    const mk1 = (await listSpaces(t.db, { range: { from: 1, to: 298 } })).map((x) => x.slug);
    for (const slug of mk2Only) expect(mk1).not.toContain(slug);
    for (const slug of mk1Only) expect(mk1).toContain(slug);
    expect((await listSpaces(t.db)).length).toBe(seed.length);
  });
});

// ---------------------------------------------------------------------------------------------

/** Every space checked in JavaScript, section by section, ranked by the domain code. */
async function checkEverySpace(q: FitQuery) {
  const all = (await listSpaces(t.db)).sort((a, b) => a.id - b.id);
  const eligible = all.filter((sp) => q.hull === null || (sp.hulls.from <= q.hull && q.hull <= sp.hulls.to));
  const spaces = eligible.map((sp) => ({ ...asFitSpace(sp), summary: sp }));
  return rankSpaces(q.item, spaces, { orientation: q.orientation, clearanceMm: q.clearanceMm, count: q.count })
    .slice(0, q.limit)
    .map((r) => ({ slug: r.space.summary.slug, verdict: r.result.verdict, section: r.space.summary.sections[r.section].position }));
}

function randomQuery(next: () => number, limit: number): FitQuery {
  const d = () => (2 + next() * 30) * IN; // 2 to 32 in
  const orientation: Orientation = next() < 0.5 ? "upright" : "any";
  return {
    item: { length: d(), width: d(), height: d() },
    orientation,
    clearanceMm: next() < 0.4 ? 0 : Math.floor(next() * 17) * (IN / 16),
    count: next() < 0.7 ? 1 : 2 + Math.floor(next() * 3),
    hull: next() < 0.5 ? null : 1 + Math.floor(next() * 612),
    limit,
  };
}

async function compare(queries: FitQuery[]) {
  let nonEmpty = 0;
  for (const q of queries) {
    const fromDb = (await findFittingSpaces(t.db, q)).map((h) => ({ slug: h.slug, verdict: h.verdict, section: h.section.position }));
    const inJs = await checkEverySpace(q);
    expect(fromDb, JSON.stringify(q)).toEqual(inJs);
    if (inJs.length) nonEmpty++;
  }
  return nonEmpty;
}

describe("the candidate filter in PostgreSQL (cube, GiST) against checking every section in JavaScript", () => {
  it("BCI group 31 upright, 1/2 in clearance: the same spaces, in the same order", async () => {
    const q: FitQuery = {
      item: { length: 13 * IN, width: (6 + 13 / 16) * IN, height: (9 + 7 / 16) * IN }, // BCI group size chart
      orientation: "upright", clearanceMm: IN / 2, count: 1, hull: null, limit: 1000,
    };
    const hits = await findFittingSpaces(t.db, q);
    expect(hits.length).toBeGreaterThan(5);
    expect(hits.map((h) => h.slug)).toEqual((await checkEverySpace(q)).map((r) => r.slug));
  });

  it("gives the same answer inside a caller's transaction, and leaves its planner settings as they were", async () => {
    const q: FitQuery = {
      item: { length: 13 * IN, width: (6 + 13 / 16) * IN, height: (9 + 7 / 16) * IN },
      orientation: "upright", clearanceMm: IN / 2, count: 1, hull: 402, limit: 1000,
    };
    const outside = await findFittingSpaces(t.db, q);
    const [inside, setting] = await t.db.transaction(async (tx) => {
      const hits = await findFittingSpaces(tx, q);
      const shown = await tx.execute<{ enable_bitmapscan: string }>(sql`show enable_bitmapscan`);
      return [hits, shown.rows[0].enable_bitmapscan] as const;
    });
    expect(inside).toEqual(outside);
    expect(setting).toBe("on");
    const after = await t.db.execute<{ enable_bitmapscan: string }>(sql`show enable_bitmapscan`);
    expect(after.rows[0].enable_bitmapscan).toBe("on");
  });

  it("never drops a space, over 300 random items on the seeded class", async () => {
    const next = random(2024);
    const queries = Array.from({ length: 300 }, () => randomQuery(next, 1000));
    expect(await compare(queries)).toBeGreaterThan(100);
  });

  it("the bare index query returns every section that takes the item, and perhaps more, never fewer", async () => {
    const next = random(7);
    const sections = await listSpaces(t.db);
    for (let i = 0; i < 100; i++) {
      const q = { ...randomQuery(next, 1000), count: 1 };
      const dims = (b: Box) => q.orientation === "upright"
        ? [Math.max(b.length, b.width), Math.min(b.length, b.width), b.height]
        : [b.length, b.width, b.height].sort((x, y) => y - x);
      const want = dims(q.item).map((d) => d + 2 * q.clearanceMm);
      const column = q.orientation === "upright" ? sql.raw("fit_upright") : sql.raw("fit_any");
      const rows = await t.db.execute<{ space_id: number; position: number }>(sql`
        select space_id, position from ${s.spaceSections}
         where ${column} <@ cube(array[${want[0] - 0.001}::float8, ${want[1] - 0.001}::float8, ${want[2] - 0.001}::float8, 0::float8],
                                 array[1e18::float8, 1e18::float8, 1e18::float8, 1e18::float8])`);
      const got = new Set(rows.rows.map((r) => `${r.space_id}/${r.position}`));
      for (const sp of sections as SpaceSummary[]) {
        for (const sec of sp.sections) {
          const fits = dims(sec.fit).every((d, k) => d + 1e-6 >= want[k]);
          if (fits) expect(got.has(`${sp.id}/${sec.position}`)).toBe(true);
        }
      }
    }
  });

  it("with 400 more generated spaces and small limits, reading page after page", async () => {
    const next = random(99);
    const [zone] = (await t.db.select({ slug: s.zones.slug }).from(s.zones).limit(1));
    for (let i = 0; i < 400; i++) {
      const from = 1 + Math.floor(next() * 612);
      const to = Math.min(612, from + Math.floor(next() * 400));
      const size = () => (4 + next() * 36) * IN;
      const [row] = await t.db.insert(s.spaces).values({
        slug: `generated-${i}`, name: `Generated space ${i}`, zoneSlug: zone.slug, hullFrom: from, hullTo: to, aftOfBowMm: 1000,
        openingWidthMm: next() < 0.7 ? size() : null, openingHeightMm: size(), openingFace: next() < 0.5 ? "top" : "front",
      }).returning({ id: s.spaces.id });
      const n = 1 + Math.floor(next() * 3);
      await t.db.insert(s.spaceSections).values(Array.from({ length: n }, (_, k) => ({
        spaceId: row.id, position: k, label: k ? `part ${k}` : "main", lengthMm: size(), widthMm: size(), heightMm: size(),
      })));
    }
    // A few equal sections in different spaces, to try the order of ties.
    await t.db.execute(sql`update space_sections set length_mm = 500, width_mm = 400, height_mm = 300
                            where space_id in (select id from spaces where slug in ('generated-1', 'generated-2', 'generated-3'))`);
    const queries = [
      ...Array.from({ length: 120 }, () => randomQuery(next, 1 + Math.floor(next() * 12))),
      ...Array.from({ length: 30 }, () => ({ ...randomQuery(next, 1000), item: { length: 60, width: 50, height: 40 } })),
    ];
    expect(await compare(queries)).toBeGreaterThan(80);
  }, 60_000); // 800 inserts and 150 searches on a machine shared with other test runs
});
