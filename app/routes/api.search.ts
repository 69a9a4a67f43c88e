import type { Route } from "./+types/api.search";
import { db } from "~/db/index.server";
import { hasFilters, parseSearchParams, snippetHtml } from "~/domain/search";
import { search, searchTaxonomy } from "~/models/search.server";
import { badParameter } from "./api-errors.server";

// GET /api/search?q=&system=&zone=&hull=&measured=&year=&type=&fit=&unit=&upright=&limit=&offset=
// One search over published write-ups, spaces and catalogue items, best first (see README, "API").
export async function loader({ request }: Route.LoaderArgs) {
  const started = performance.now();
  const parsed = parseSearchParams(new URL(request.url).searchParams, "api");
  if (!parsed.ok) return badParameter(parsed.parameter, parsed.message);
  const req = parsed.request;
  if (!req.q && !hasFilters(req.filters)) {
    return badParameter("q", "q: required: the words to search for (or a filter such as system, zone, hull or fit).");
  }
  if (req.filters.system || req.filters.zone) {
    const { systems, zones } = await searchTaxonomy(db);
    if (req.filters.system && !systems.some((x) => x.slug === req.filters.system)) {
      return badParameter("system", `system: no such system; use one of ${systems.map((x) => x.slug).join(", ")}.`);
    }
    if (req.filters.zone && !zones.some((x) => x.slug === req.filters.zone)) {
      return badParameter("zone", `zone: no such zone; use one of ${zones.map((x) => x.slug).join(", ")}.`);
    }
  }
  const answer = await search(db, req);
  const ms = performance.now() - started;
  return Response.json(
    {
      total: answer.total,
      // true: more than `total` results match; only the first of them were read and ranked.
      totalCapped: answer.capped,
      results: answer.results.map((r) => ({
        type: r.type,
        id: r.id,
        title: r.title,
        url: r.url,
        snippet: snippetHtml(r.snippet),
        systems: r.systems.map((x) => x.slug),
        score: Math.round(r.score * 1e6) / 1e6,
      })),
      suggestion: answer.suggestion,
      matched: answer.matched,
    },
    { headers: { "Server-Timing": `search;dur=${ms.toFixed(2)}`, "Cache-Control": "no-store" } },
  );
}
