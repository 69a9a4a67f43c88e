import { sql } from "drizzle-orm";
import { db, pool } from "~/db/index.server";
import { databaseState, isDatabaseUnavailable } from "~/db/client.server";
import { RETRY_AFTER_SECONDS } from "~/services/db-outage.server";

// GET /api/health: is the app up, and can it reach its database? 200 when both are, 503 (with
// Retry-After) when the database does not answer, so a load balancer or monitor can tell.
export async function loader() {
  const started = performance.now();
  try {
    await db.execute(sql`select 1`);
    return Response.json({ ok: true, database: "up", ms: Math.round(performance.now() - started) }, { headers: { "Cache-Control": "no-store" } });
  } catch (error) {
    const state = databaseState(pool);
    return Response.json(
      {
        ok: false,
        database: "down",
        error: isDatabaseUnavailable(error) ? "database-unavailable" : "database-error",
        message: "The database is not answering.",
        downSince: state.up ? null : new Date(state.since).toISOString(),
      },
      { status: 503, headers: { "Retry-After": String(RETRY_AFTER_SECONDS), "Cache-Control": "no-store" } },
    );
  }
}
