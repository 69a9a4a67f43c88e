// Seeds the invented demo class from content-seed/. `--if-empty` seeds only an empty database.
import path from "node:path";
import { createDb } from "../app/db/client.server";
import { databaseIsEmpty, seedDemo } from "./seed-content";

const url = process.env.DATABASE_URL;
if (!url) {
  console.error("[sistership] DATABASE_URL is not set: the seeder needs a database.");
  process.exit(1);
}
const { db, pool } = createDb(url, 2);
try {
  if (process.argv.includes("--if-empty") && !(await databaseIsEmpty(db))) {
    console.log("[sistership] the database already has content: demo seed skipped");
  } else {
    const counts = await seedDemo(db, path.resolve(import.meta.dirname, "../content-seed"));
    console.log(`[sistership] demo seed: ${JSON.stringify(counts)}`);
  }
} catch (error) {
  console.error(`[sistership] seeding failed: ${error instanceof Error ? error.message : error}`);
  process.exitCode = 1;
} finally {
  await pool.end();
}
