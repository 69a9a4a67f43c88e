import { sql } from "drizzle-orm";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { seedDemo } from "../../scripts/seed-content";
import { createTestDatabase } from "../support/db";
import { readSeedWriteups, readSeedYaml, SEED_DIR } from "../support/seed-files";

let t: Awaited<ReturnType<typeof createTestDatabase>>;
beforeAll(async () => {
  t = await createTestDatabase("template_empty");
});
afterAll(async () => t?.drop());

async function counts() {
  const r = await t.db.execute<{ users: number; boats: number; writeups: number; spaces: number; measurements: number; roles: number }>(sql`
    select (select count(*) from users)::int as users, (select count(*) from boats)::int as boats,
           (select count(*) from writeups)::int as writeups, (select count(*) from spaces)::int as spaces,
           (select count(*) from space_measurements)::int as measurements, (select count(*) from user_roles)::int as roles`);
  return r.rows[0];
}

describe("the demo seeder", () => {
  it("loads every file of content-seed/ and is idempotent", async () => {
    await seedDemo(t.db, SEED_DIR);
    const first = await counts();
    const members = readSeedYaml<{ email: string }[]>("members.yaml");
    const spaces = readSeedYaml<{ measurements?: unknown[] }[]>("spaces.yaml");
    expect(first.users).toBe(members.length);
    expect(first.writeups).toBe(readSeedWriteups().length);
    expect(first.spaces).toBe(spaces.length);
    expect(first.measurements).toBe(spaces.reduce((n, s) => n + (s.measurements?.length ?? 0), 0));
    await seedDemo(t.db, SEED_DIR);
    expect(await counts()).toEqual(first);
  });

  it("meets the demo scenario's minimums", async () => {
    const c = await counts();
    expect(c.writeups).toBeGreaterThanOrEqual(12);
    expect(c.spaces).toBeGreaterThanOrEqual(20);
    expect(c.users).toBeGreaterThanOrEqual(6);
    const roles = await t.db.execute<{ role: string }>(sql`select distinct role::text from user_roles order by 1`);
    expect(roles.rows.map((r) => r.role)).toEqual(["admin", "member", "moderator", "secretary"]);
  });
});
