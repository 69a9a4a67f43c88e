// Applies the Drizzle migrations in drizzle/ to DATABASE_URL.
import { migrate } from "drizzle-orm/node-postgres/migrator";
import { createDb } from "../app/db/client.server";

const url = process.env.DATABASE_URL;
if (!url) {
  console.error("[sistership] DATABASE_URL is not set: the migrations need a database to apply to.");
  process.exit(1);
}
const { db, pool } = createDb(url);
await migrate(db, { migrationsFolder: "drizzle" });
await pool.end();
console.log("[sistership] migrations applied");
