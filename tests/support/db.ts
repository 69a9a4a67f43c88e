// Each integration test file gets its own database, copied from a template that `npm test` made.
import { randomBytes } from "node:crypto";
import pg from "pg";
import { createDb } from "~/db/client.server";

function adminUrl(): string {
  const url = process.env.TEST_PG_ADMIN_URL;
  if (!url) throw new Error("TEST_PG_ADMIN_URL is not set: run the integration tests through `npm test`.");
  return url;
}

export async function createTestDatabase(template: "template_empty" | "template_seeded" = "template_seeded") {
  const name = `t_${randomBytes(6).toString("hex")}`;
  const admin = new pg.Client({ connectionString: adminUrl() });
  await admin.connect();
  await admin.query(`create database "${name}" template "${template}"`);
  await admin.end();
  const url = new URL(adminUrl());
  url.pathname = `/${name}`;
  const { db, pool } = createDb(url.toString(), 4);
  return {
    db,
    pool,
    url: url.toString(),
    async drop() {
      await pool.end();
      const c = new pg.Client({ connectionString: adminUrl() });
      await c.connect();
      await c.query(`drop database if exists "${name}" with (force)`);
      await c.end();
    },
  };
}
