import { sql } from "drizzle-orm";
import { db } from "~/db/index.server";

// GET /api/health: is the app up, and can it reach its database?
export async function loader() {
  const started = performance.now();
  try {
    await db.execute(sql`select 1`);
    return Response.json({ ok: true, database: "up", ms: Math.round(performance.now() - started) });
  } catch (error) {
    return Response.json(
      { ok: false, database: "down", message: error instanceof Error ? error.message : String(error) },
      { status: 503 },
    );
  }
}
