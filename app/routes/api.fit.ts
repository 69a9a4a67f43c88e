import type { Route } from "./+types/api.fit";
import { db } from "~/db/index.server";
import { fitAnswerJson, parseFitParams } from "~/domain/fit-search";
import { findFittingSpaces } from "~/models/spaces.server";
import { badParameter } from "./api-errors.server";

// GET /api/fit?length=&width=&height=&unit=in|mm&upright=&clearance=&count=&hull=&limit=
// Every space of the class that takes the item, snuggest first (see README, "API").
export async function loader({ request }: Route.LoaderArgs) {
  const params = parseFitParams(new URL(request.url).searchParams);
  if (!params.ok) return badParameter(params.parameter, params.message);
  const started = performance.now();
  const hits = await findFittingSpaces(db, params);
  const ms = performance.now() - started;
  return Response.json(fitAnswerJson(params, hits), {
    headers: { "Server-Timing": `fit;dur=${ms.toFixed(2)}`, "Cache-Control": "no-store" },
  });
}
