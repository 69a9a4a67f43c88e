import { afterAll, beforeAll, describe, expect, it } from "vitest";
import {
  getPublishedWriteup, listPublishedBySystem, listRecentPublished, listSystemsWithCounts,
} from "~/models/writeups.server";
import { createTestDatabase } from "../support/db";
import fs from "node:fs";
import path from "node:path";
import YAML from "yaml";
import { splitFrontMatter } from "../../scripts/seed-content";
import { readSeedWriteups } from "../support/seed-files";

let t: Awaited<ReturnType<typeof createTestDatabase>>;
beforeAll(async () => {
  t = await createTestDatabase("template_seeded");
});
afterAll(async () => t?.drop());

const seed = readSeedWriteups();
const published = seed.filter((w) => w.status === "published");

describe("published write-ups on the seeded demo class", () => {
  it("lists only published write-ups, newest first", async () => {
    const recent = await listRecentPublished(t.db, 100);
    expect(recent.map((w) => w.slug).sort()).toEqual(published.map((w) => w.slug).sort());
    const dates = recent.map((w) => w.publishedAt!.getTime());
    expect(dates).toEqual([...dates].sort((a, b) => b - a));
  });

  it("counts per system match a count made from the seed files", async () => {
    const counts = await listSystemsWithCounts(t.db);
    for (const row of counts) {
      const expected = published.filter((w) => w.systems.includes(row.slug)).length;
      expect({ system: row.slug, count: row.count }).toEqual({ system: row.slug, count: expected });
    }
    const bySystem = await listPublishedBySystem(t.db, "electrical");
    expect(bySystem.length).toBe(published.filter((w) => w.systems.includes("electrical")).length);
  });

  it("does not show a write-up that is not published", async () => {
    const unpublished = seed.filter((w) => w.status !== "published");
    expect(unpublished.length).toBeGreaterThan(0);
    for (const w of unpublished) expect(await getPublishedWriteup(t.db, w.slug)).toBeNull();
  });

  it("returns a published write-up with its parts, systems and Markdown", async () => {
    const w = await getPublishedWriteup(t.db, published[0].slug);
    expect(w?.title).toBe(published[0].title);
    expect(w?.bodyMarkdown.trim()).toBe(published[0].body.trim());
    expect(w?.systems.map((s) => s.slug).sort()).toEqual([...published[0].systems].sort());
  });

  it("returns its parts in order, its zones and the spaces it used with their sections, as its seed file has them", async () => {
    const slug = "group-27-battery-under-starboard-settee";
    const seedDir = path.resolve(import.meta.dirname, "../../content-seed");
    const { data } = splitFrontMatter(fs.readFileSync(path.join(seedDir, "writeups", `${slug}.md`), "utf8")) as {
      data: { zones: string[]; spaces: string[]; parts: { name: string; qty: number; weightLb?: number; note?: string }[] };
    };
    const spaces = YAML.parse(fs.readFileSync(path.join(seedDir, "spaces.yaml"), "utf8")) as { slug: string; name: string; sections?: unknown[] }[];
    const w = await getPublishedWriteup(t.db, slug);
    expect(w).not.toBeNull();
    // The pound is 0.45359237 kg exactly (NIST Handbook 44, Appendix C).
    expect(w!.parts).toEqual(data.parts.map((p) => ({
      name: p.name, quantity: p.qty, weightKg: p.weightLb === undefined ? null : expect.closeTo(p.weightLb * 0.45359237, 9), note: p.note ?? "",
    })));
    expect(w!.zones.map((z) => z.slug).sort()).toEqual([...data.zones].sort());
    const used = spaces.filter((sp) => data.spaces.includes(sp.slug)).sort((a, b) => (a.name < b.name ? -1 : 1));
    expect(w!.spaces.map((sp) => sp.slug)).toEqual(used.map((sp) => sp.slug));
    for (const sp of w!.spaces) {
      expect(sp.sections.length).toBeGreaterThan(0);
      for (const sec of sp.sections) expect(sec.lengthMm * sec.widthMm * sec.heightMm).toBeGreaterThan(0);
    }
  });
});
