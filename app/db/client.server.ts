import { drizzle, type NodePgDatabase } from "drizzle-orm/node-postgres";
import pg from "pg";
import * as schema from "./schema";

export type Db = NodePgDatabase<typeof schema>;

export function createDb(url: string, max = 10) {
  const pool = new pg.Pool({ connectionString: url, max, allowExitOnIdle: true });
  // An idle client that loses its connection (the server restarted) must not crash the app.
  pool.on("error", (err) => console.warn(`[db] idle client error: ${err.message}`));
  const db = drizzle(pool, { schema });
  return { db, pool };
}
