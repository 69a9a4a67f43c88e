// npm run db:backup and npm run db:restore, run as a person would run them, against a database of
// this file's own: back up, change data, restore, and every table holds what it held before.
// Expected behaviour from the PostgreSQL 15 documentation: pg_dump "--format=custom" archives are
// read by pg_restore, whose "--clean" drops each object before recreating it, "--if-exists" keeps
// that quiet for objects that are missing, and "--single-transaction" makes the restore all or
// nothing (PostgreSQL 15 docs, "pg_dump" and "pg_restore" reference pages).
import { spawnSync } from "node:child_process";
import fs from "node:fs";
import os from "node:os";
import path from "node:path";
import pg from "pg";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { createTestDatabase } from "../support/db";

const root = path.resolve(import.meta.dirname, "../..");
const tsx = path.join(root, "node_modules", ".bin", "tsx");

let t: Awaited<ReturnType<typeof createTestDatabase>>;
let dir: string;
beforeAll(async () => {
  t = await createTestDatabase("template_seeded");
  dir = fs.mkdtempSync(path.join(os.tmpdir(), "sistership-backup-test-"));
});
afterAll(async () => {
  await t?.drop();
  if (dir) fs.rmSync(dir, { recursive: true, force: true });
});

function run(script: string, args: string[]) {
  const env = { ...process.env, DATABASE_URL: t.url };
  return spawnSync(tsx, [path.join(root, "scripts", script), ...args], { cwd: root, env, encoding: "utf8", input: "" });
}

/** Every table of the database, each with its row count and a digest of all its rows. */
async function fingerprint(): Promise<Record<string, { rows: number; md5: string }>> {
  const client = new pg.Client({ connectionString: t.url });
  await client.connect();
  try {
    const tables = await client.query<{ name: string }>(
      `select quote_ident(schemaname) || '.' || quote_ident(tablename) as name from pg_tables
       where schemaname not in ('pg_catalog', 'information_schema') order by 1`,
    );
    const out: Record<string, { rows: number; md5: string }> = {};
    for (const { name } of tables.rows) {
      const r = await client.query<{ rows: number; md5: string }>(
        `select count(*)::int as rows, md5(coalesce(string_agg(x::text, E'\\n' order by x::text), '')) as md5 from ${name} x`,
      );
      out[name] = r.rows[0];
    }
    return out;
  } finally {
    await client.end();
  }
}

describe("npm run db:backup and npm run db:restore", () => {
  it("restores every table to what it held when the backup was made", async () => {
    const before = await fingerprint();
    expect(Object.keys(before).length).toBeGreaterThan(10);
    expect(before["public.writeups"].rows).toBeGreaterThan(0);

    const file = path.join(dir, "before.dump");
    const backup = run("db-backup.ts", [`--out=${file}`]);
    expect(backup.status, backup.stderr).toBe(0);
    // pg_dump's custom format starts with the magic "PGDMP" (PostgreSQL source, pg_backup_archiver.c).
    expect(fs.readFileSync(file).subarray(0, 5).toString()).toBe("PGDMP");

    // Changes of three kinds: an edit, a deletion and an addition.
    const [{ id: writeupId, title }] = (await t.pool.query<{ id: number; title: string }>("select id, title from writeups order by id limit 1")).rows;
    await t.pool.query("update writeups set title = 'Changed after the backup' where id = $1", [writeupId]);
    const deleted = await t.pool.query("delete from space_measurements where id = (select min(id) from space_measurements)");
    expect(deleted.rowCount).toBe(1);
    await t.pool.query("insert into users (email, display_name) values ('after.backup@example.org', 'After Backup')");
    const changed = await fingerprint();
    expect(changed["public.writeups"].md5).not.toBe(before["public.writeups"].md5);
    expect(changed["public.users"].rows).toBe(before["public.users"].rows + 1);

    // Without --yes and without a terminal to ask on, nothing happens.
    const refused = run("db-restore.ts", [file]);
    expect(refused.status).not.toBe(0);
    expect(refused.stderr).toContain("Nothing was restored");
    expect(await fingerprint()).toEqual(changed);

    const restore = run("db-restore.ts", [file, "--yes"]);
    expect(restore.status, restore.stderr).toBe(0);

    const after = await fingerprint();
    expect(after).toEqual(before);
    const client = new pg.Client({ connectionString: t.url });
    await client.connect();
    const row = await client.query<{ title: string }>("select title from writeups where id = $1", [writeupId]);
    const user = await client.query("select 1 from users where email = 'after.backup@example.org'");
    await client.end();
    expect(row.rows[0].title).toBe(title);
    expect(user.rowCount).toBe(0);
  });

  it("refuses a file that is not a backup, and changes nothing", async () => {
    const bogus = path.join(dir, "not-a-backup.dump");
    fs.writeFileSync(bogus, "select 1;\n");
    const before = await fingerprint();
    const r = run("db-restore.ts", [bogus, "--yes"]);
    expect(r.status).not.toBe(0);
    expect(r.stderr).toContain("is not a backup");
    expect(await fingerprint()).toEqual(before);
  });
});
