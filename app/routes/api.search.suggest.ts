import type { Route } from "./+types/api.search.suggest";
import { db } from "~/db/index.server";
import { suggest } from "~/models/search.server";
import { badParameter } from "./api-errors.server";

const MAX_TYPED = 100;

// GET /api/search/suggest?q= : type-ahead suggestions (write-up titles, systems, zones, spaces,
// items) for what has been typed so far; the search box asks for them as the reader types.
export async function loader({ request }: Route.LoaderArgs) {
  const q = new URL(request.url).searchParams.get("q") ?? "";
  if (q.length > MAX_TYPED) return badParameter("q", `q: at most ${MAX_TYPED} characters.`);
  const suggestions = await suggest(db, q);
  return Response.json({ q, suggestions }, { headers: { "Cache-Control": "no-store" } });
}
